import { formatCount } from './number-format';
import type { Report } from './protocol';

/**
 * How the CLI and the panel say the size of the stop list in force: "41 terms", or, for a file
 * the settings name but nobody has written yet, that it is not there — "0 terms" beside a path
 * reads as an empty file the user made, and sends them looking for it; the first term added
 * creates it.
 */
export function stopListSize(stopList: Report['stopList']): string {
  if (stopList.file !== null && !stopList.exists) return 'not created yet';
  return `${formatCount(stopList.terms)} term${stopList.terms === 1 ? '' : 's'}`;
}

/**
 * Why one unused stop list entry stops nothing, for the editor's diagnostic and the CLI: an entry
 * the tokenizer reads as several terms (or none) is no term of the vocabulary, however often its
 * words occur; any other simply never occurs in `corpusName`.
 */
export function unusedEntrySentence(stopList: Report['stopList'], written: string, corpusName: string): string {
  const tokens = splitOf(stopList, written);
  if (tokens === undefined) return `'${written}' never occurs in ${corpusName}; the entry has no effect.`;
  if (tokens.length === 0) return `'${written}' gives no term under the token settings (too short, or a kind of token not kept); the entry has no effect.`;
  return `'${written}' is ${tokens.length} terms to the tokenizer (${tokens.join(' + ')}), and an entry stops one term; to stop them, write each on a line of its own.`;
}

/** The unused entries in a few words each, for one line of the CLI: "Don't (do + not), new york (new + york), qwerty". */
export function unusedEntriesInBrief(stopList: Report['stopList'], max = 8): string {
  const shown = stopList.unused.slice(0, max).map((written) => {
    const tokens = splitOf(stopList, written);
    return tokens === undefined ? written : tokens.length === 0 ? `${written} (no term)` : `${written} (${tokens.join(' + ')})`;
  });
  const more = stopList.unused.length - shown.length;
  return more > 0 ? `${shown.join(', ')}, and ${formatCount(more)} more` : shown.join(', ');
}

/** "stoplist.txt (7 terms, 2 never occur: Don't (do + not), qwerty)": the stop list in force, for the CLI, the Markdown and the panel. */
export function stopListInForce(stopList: Report['stopList']): string {
  const n = stopList.unused.length;
  const unused = n > 0 ? `, ${formatCount(n)} never ${n === 1 ? 'occurs' : 'occur'}: ${unusedEntriesInBrief(stopList)}` : '';
  return `${stopList.file ?? 'none'} (${stopListSize(stopList)}${unused})`;
}

/**
 * The terms the tokenizer makes of an unused entry that is not one term, or undefined. Own keys
 * only: the keys are what the user wrote, and an entry "constructor" must not read Object's.
 */
function splitOf(stopList: Report['stopList'], written: string): string[] | undefined {
  return stopList.split !== undefined && Object.hasOwn(stopList.split, written) ? stopList.split[written] : undefined;
}
