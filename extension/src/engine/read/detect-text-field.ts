import { isStringList } from './jsonl-value';

/** How many rows the field and format detection look at. */
export const DETECT_ROWS = 200;

/**
 * Picks the text field: the one with the longest mean text over the sampled rows, among fields
 * that hold text (mostly non-numeric strings). Documents are the long free-text column; ids,
 * dates, labels and scores are short or numeric (common practice, no source).
 *
 * A field whose values are nearly all one token of printable ASCII without a space — URLs, file
 * paths, hashes, e-mail addresses, slugs — is passed over while another field holds text: a
 * news export's `url` column is longer than its `title`, yet the URL is one token of a kind the
 * tokenizer does not keep, and the review found no terms at all. Text in a script written without
 * spaces (Chinese, Japanese, Thai) is not ASCII, so it still counts as text.
 */
export function detectTextField(
  fields: readonly string[],
  sample: ReadonlyArray<ReadonlyMap<string, unknown>>,
  exclude: string | null,
): string | null {
  let best: { field: string; mean: number; oneToken: boolean } | null = null;
  for (const field of fields) {
    if (field === exclude) continue;
    let total = 0;
    let strings = 0;
    let numeric = 0;
    let oneTokens = 0;
    let present = 0;
    for (const row of sample) {
      const raw = row.get(field);
      // A list of strings is read as their text (jsonl-value.ts documentText).
      const v = isStringList(raw) ? raw.join('\n') : raw;
      if (v === undefined || v === null || v === '') continue;
      present++;
      if (typeof v !== 'string') continue;
      strings++;
      total += v.length;
      if (NUMBER_LIKE.test(v)) numeric++;
      if (ONE_ASCII_TOKEN.test(v)) oneTokens++;
    }
    if (present === 0 || strings * 2 < present || numeric * 10 > strings * 9) continue;
    const candidate = { field, mean: total / sample.length, oneToken: oneTokens * 10 >= strings * 9 };
    if (best === null || better(candidate, best)) best = candidate;
  }
  return best?.field ?? null;
}

/** Text before one-token values, then the longer mean. */
function better(a: { mean: number; oneToken: boolean }, b: { mean: number; oneToken: boolean }): boolean {
  if (a.oneToken !== b.oneToken) return !a.oneToken;
  return a.mean > b.mean;
}

const NUMBER_LIKE = /^\s*[-+]?(\d[\d,_]*)?(\.\d+)?([eE][-+]?\d+)?\s*$/;

/** One token of printable ASCII, no space inside (surrounding spaces allowed). */
const ONE_ASCII_TOKEN = /^\s*[\x21-\x7e]+\s*$/;
