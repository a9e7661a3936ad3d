import { peekCoreModel } from './wink-core-model';

/**
 * How wink-nlp 2.4 cuts a text before tokenising (src/tokenizer.js): `text.split(splitter)` with
 * the model's `trex.helpers.splitter`, then each piece on its own. A piece whose first character
 * is a space or that holds one of the no-break spaces below is spacing (it only sets the next
 * token's precedingSpaces); every other non-empty piece — runs of \n \r \t included — is
 * tokenised with no look at its neighbours. Other Unicode spaces (U+2000, U+2001, U+2006–U+2008,
 * U+3000, U+000B, U+000C, U+0085, U+2028, U+2029, U+FEFF) do not split: they stay inside chunks.
 */
export const WINK_SPLITTER_SOURCE = '([ \\u00a0\\u2002-\\u2005\\u2009\\u200a\\u202f\\u205f]+|[\\n\\r\\t]+)';
export const WINK_SPLITTER = new RegExp(WINK_SPLITTER_SOURCE);
/** wink's own `hasNBSP` test in src/tokenizer.js. */
const WINK_NBSP = /[\u00a0\u2002-\u2005\u2009\u200a\u202f\u205f]/;

/** The wink-nlp version whose tokenizer source was read to write this file. */
const AUDITED_WINK_VERSION = '2.4.0';

/** True for a piece of `text.split(WINK_SPLITTER)` that wink treats as spacing, not as a token source. */
export function isWinkSpacing(piece: string): boolean {
  return piece.charCodeAt(0) === 0x20 || WINK_NBSP.test(piece);
}

let verdict: boolean | null = null;

/**
 * Whether the loaded wink-nlp and model split text exactly as above: the audited wink-nlp
 * version and the same splitter in the model. When either differs (an upgrade), callers must
 * tokenise whole documents instead of cutting them here.
 */
export function winkSplitsLikeThis(): boolean {
  if (verdict !== null) return verdict;
  try {
    const pkg = require('wink-nlp/package.json') as { version?: string };
    // In the bundles this parse is the one the first wink instance then takes (wink-core-model.ts).
    const splitter = peekCoreModel().trex?.helpers?.splitter;
    verdict = pkg.version === AUDITED_WINK_VERSION && splitter !== undefined && splitter[0] === WINK_SPLITTER_SOURCE && splitter[1] === '';
  } catch {
    verdict = false;
  }
  return verdict;
}
