import { splitStopListLines, stopListTerm } from './stop-list-lines';

export interface ParsedStopList {
  /** Distinct terms in file order, as written (case-sensitive; the tokenizer lower-cases by default). */
  terms: string[];
  /** Every entry line, 1-based. */
  entries: Array<{ term: string; line: number }>;
  /** Entries that repeat an earlier one, 1-based. */
  duplicates: Array<{ term: string; line: number }>;
}

/** Reads a stop list file: one term a line, '#' comment lines, blank lines allowed, any line break. */
export function parseStopList(text: string): ParsedStopList {
  const source = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const seen = new Set<string>();
  const parsed: ParsedStopList = { terms: [], entries: [], duplicates: [] };
  const lines = splitStopListLines(source);
  for (let i = 0; i < lines.length; i++) {
    const term = stopListTerm((lines[i] as { text: string }).text);
    if (term === null) continue;
    parsed.entries.push({ term, line: i + 1 });
    if (seen.has(term)) parsed.duplicates.push({ term, line: i + 1 });
    else {
      seen.add(term);
      parsed.terms.push(term);
    }
  }
  return parsed;
}
