import Papa from 'papaparse';
import type { CorpusFormatName } from '../../protocol';

const EXTENSIONS: Readonly<Record<string, CorpusFormatName>> = {
  '.csv': 'csv',
  '.tsv': 'tsv',
  '.tab': 'tsv',
  '.jsonl': 'jsonl',
  '.ndjson': 'jsonl',
  '.json': 'json',
  '.txt': 'text',
  '.text': 'text',
};

export function formatFromExtension(file: string): CorpusFormatName | null {
  const dot = file.lastIndexOf('.');
  if (dot < 0 || dot < Math.max(file.lastIndexOf('/'), file.lastIndexOf('\\'))) return null;
  return EXTENSIONS[file.slice(dot).toLowerCase()] ?? null;
}

/** Delimiters tried for a .csv, in order of preference on a tie. */
export const CSV_DELIMITERS: readonly string[] = [',', ';', '\t', '|'];

export interface DelimiterGuess {
  delimiter: string;
  /** Fields in the first record (the header). */
  fields: number;
  /** Share of the sampled records with exactly the header's field count. */
  consistency: number;
  records: number;
}

/**
 * Picks the delimiter that splits the header into at least two fields and gives the most
 * records the header's field count (ties: more fields, then the listed order). A wrong
 * delimiter gives a one-field header or ragged records.
 */
export function sniffDelimiter(head: string, headComplete: boolean, candidates: readonly string[] = CSV_DELIMITERS): DelimiterGuess | null {
  let best: DelimiterGuess | null = null;
  for (const delimiter of candidates) {
    const parsed = new Papa.Parser({ delimiter, newline: '\n', quoteChar: '"', escapeChar: '"', preview: 60 }).parse(head, 0, !headComplete) as Papa.ParseResult<string[]>;
    const rows = parsed.data.filter((r) => !(r.length === 1 && (r[0] as string).trim() === ''));
    if (rows.length === 0) continue;
    const fields = (rows[0] as string[]).length;
    if (fields < 2) continue;
    let same = 0;
    for (const r of rows) if (r.length === fields) same++;
    const guess: DelimiterGuess = { delimiter, fields, consistency: same / rows.length, records: rows.length };
    if (best === null || guess.consistency > best.consistency || (guess.consistency === best.consistency && guess.fields > best.fields)) {
      best = guess;
    }
  }
  return best;
}

/**
 * The delimiter a first line "sep=;" names: spreadsheets write and honour that line before the
 * header so that a file opens with its columns wherever the locale's list separator differs
 * (common practice, no source); null when the file has none. The line is no record.
 */
export function delimiterHint(head: string): string | null {
  const match = /^sep=([^\n])[ \t]*(?:\n|$)/.exec(head);
  return match === null ? null : match[1]!;
}

/** Content sniffing for files whose extension says nothing. */
export function sniffFormat(head: string, headComplete: boolean): { format: CorpusFormatName; delimiter: string | null } {
  const hint = delimiterHint(head);
  if (hint !== null) return { format: hint === '\t' ? 'tsv' : 'csv', delimiter: hint };
  const firstLine = firstNonBlankLine(head)?.text ?? null;
  if (firstLine !== null && firstLine.trimStart().startsWith('{')) return { format: 'jsonl', delimiter: null };
  // A JSON array of records opens with "[" and then "{" or a line break; a log line's "[INFO]" does not.
  if (firstLine !== null && /^\s*\[\s*(\{|$)/.test(firstLine)) return { format: 'json', delimiter: null };
  const guess = sniffDelimiter(head, headComplete);
  if (guess !== null && isTable(guess)) return { format: guess.delimiter === '\t' ? 'tsv' : 'csv', delimiter: guess.delimiter };
  return { format: 'text', delimiter: null };
}

/** A table needs a header and rows that agree with it; prose with a comma here and there does not. */
function isTable(guess: DelimiterGuess): boolean {
  return guess.records >= 2 && guess.consistency >= 0.9;
}

/**
 * The fields of the first line when a head of plain text is a tab-separated table by the same
 * test a file with no telling name gets (a spreadsheet's "Unicode text" export is a .txt of
 * tab-separated columns); null when it is not one.
 */
export function tabSeparatedFirstLine(head: string, headComplete: boolean): string[] | null {
  const guess = sniffDelimiter(head, headComplete, ['\t']);
  if (guess === null || !isTable(guess)) return null;
  return firstNonBlankLine(head)?.text.split('\t') ?? null;
}

/** The first line with more than whitespace, and its 1-based number. */
export function firstNonBlankLine(text: string): { text: string; line: number } | null {
  let start = 0;
  let line = 1;
  while (start < text.length) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = text.length;
    const piece = text.slice(start, end);
    if (piece.trim() !== '') return { text: piece, line };
    start = end + 1;
    line++;
  }
  return null;
}
