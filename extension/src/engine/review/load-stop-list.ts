import * as path from 'node:path';
import { parseStopList } from '../stoplist/parse-stop-list';
import { readStopListFile } from '../stoplist/read-stop-list-file';

export interface LoadedStopList {
  /** Absolute path of the stop list file, or null when the settings name none. */
  file: string | null;
  exists: boolean;
  /** Entries as the vocabulary spells them (through the tokenizer: lower-cased, stemmed, …). */
  terms: string[];
  /** Entries as written in the file, each with its vocabulary spelling. */
  entries: Array<{ written: string; term: string }>;
}

/**
 * `stopList` with `split`: its unused entries that the tokenizer does not read as one term, with
 * the terms it makes of each. Such an entry stops nothing ("Don't" is "do" + "not" to wink, "new
 * york" two words), and saying "never occurs" alone would send the user looking for a word that
 * is there.
 */
export function withSplit<S extends { unused: string[] }>(stopList: S, tokenize: (text: string) => string[]): S & { split?: Record<string, string[]> } {
  const split: Array<[string, string[]]> = [];
  for (const written of stopList.unused) {
    const tokens = tokenize(written);
    // One term, or a phrase kept whole as a term of its own (a pair, with ngrams 2): it simply never occurs.
    if (tokens.length === 1 || tokens.includes(written) || tokens.includes(written.toLowerCase())) continue;
    split.push([written, tokens]);
  }
  // fromEntries makes every entry an own key, "__proto__" too (an assignment would set the prototype).
  return split.length > 0 ? { ...stopList, split: Object.fromEntries(split) } : stopList;
}

/**
 * Reads the project's stop list (or the editor's unsaved text of it) for the baseline. Each
 * entry goes through the same tokenizer as the corpus, so "Running" matches the stem "run" when
 * stemming is on; an entry the tokenizer splits (a phrase) is kept as written, lower-cased.
 */
export async function loadStopList(
  setting: string | null,
  projectDir: string,
  unsavedText: string | undefined,
  tokenize: (text: string) => string[],
  lowercase: boolean,
): Promise<LoadedStopList> {
  if (setting === null) return { file: null, exists: false, terms: [], entries: [] };
  const file = path.resolve(projectDir, setting);
  const { text, exists } = unsavedText !== undefined ? { text: unsavedText, exists: true } : await readStopListFile(file);
  const entries = parseStopList(text).terms.map((written) => {
    const tokens = tokenize(written);
    const term = tokens.length === 1 ? tokens[0]! : lowercase ? written.toLowerCase() : written;
    return { written, term };
  });
  return { file, exists, terms: [...new Set(entries.map((e) => e.term))], entries };
}
