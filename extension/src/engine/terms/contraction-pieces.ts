import { DEFAULT_SETTINGS } from '../config/default-settings';
import { createTokenizer, type Tokenizer } from '../tokenize/create-tokenizer';

/**
 * English contractions whose parts are grammar words. wink-nlp expands each into words ("don't" →
 * "do" + "not", "we'll" → "we" + "will"); scikit-learn's default token pattern (runs of two or
 * more word characters, the pattern tokenizer's default) keeps a piece of it instead ("don",
 * "ll"). Left out: "won't" and "can't", whose pieces ("won", "can") are words of their own. With
 * them "cannot", which wink splits the same way ("can" + "not") and scikit-learn keeps whole.
 */
export const CONTRACTIONS: readonly string[] = [
  "aren't", "couldn't", "didn't", "doesn't", "don't", "hadn't", "hasn't", "haven't", "isn't", "mightn't",
  "mustn't", "needn't", "shan't", "shouldn't", "wasn't", "weren't", "wouldn't", "ain't", "we'll", "we've", "we're",
  'cannot',
];

/**
 * The pieces another pipeline's tokens make of the contractions that this tokenizer expands, each
 * with the terms it stands for: with wink's tokens, "don" stands for "do" and "not", "ll" for
 * "will". A stop list that removes those terms removes the whole contraction from the review's
 * tokens but would leave its piece in a scikit-learn pipeline that reads the same list, so the
 * list gets the piece too (docs/methods.md §9, "Spelling"). None where the tokenizer's own tokens
 * are the pieces (the pattern tokenizer).
 */
export function contractionPieces(tokenize: (text: string) => string[]): Map<string, string[]> {
  const pattern = defaultPatternTokenizer();
  const out = new Map<string, string[]>();
  for (const word of CONTRACTIONS) {
    const parts = tokenize(word);
    const pieces = pattern(word);
    const shared = pieces.filter((p) => parts.includes(p));
    const standsFor = parts.filter((t) => !shared.includes(t));
    const left = pieces.filter((p) => !shared.includes(p));
    // One piece for the parts it replaces; anything else ("y'all") is not a case of this table.
    if (left.length !== 1 || standsFor.length === 0) continue;
    const piece = left[0]!;
    const known = out.get(piece);
    if (known === undefined) out.set(piece, standsFor);
    else if (known.join(' ') !== standsFor.join(' ')) out.delete(piece);
  }
  return out;
}

/**
 * The pieces a stop list gets when it stops `adding` (suggested terms) on top of the terms
 * already stopped: each piece whose terms are all stopped then and at least one of them is
 * among `adding` (the others were stopped before: their piece is the stop list's business, not
 * this suggestion's). Not a piece the corpus also uses as a word of its own (`isWord`: "Don
 * Knuth", "a safe haven", "re-cast"): there it stands for more than the contraction, and the
 * list would stop that word too.
 */
export function piecesCompleted(
  pieces: ReadonlyMap<string, readonly string[]>,
  adding: ReadonlySet<string>,
  isStopped: (term: string) => boolean,
  isWord: (piece: string) => boolean,
): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const [piece, terms] of pieces) {
    if (isWord(piece)) continue;
    const added = terms.filter((t) => adding.has(t));
    if (added.length > 0 && terms.every((t) => adding.has(t) || isStopped(t))) out[piece] = added;
  }
  return out;
}

/**
 * The stop list entries that can be told "never occurs": all but the pieces of contractions this
 * tokenizer expands. Those are in the list for other pipelines' tokens, where they do occur.
 */
export function entriesOfThisTokenizer<E extends { written: string }>(entries: readonly E[], tokenize: (text: string) => string[]): E[] {
  if (entries.length === 0) return [];
  const pieces = contractionPieces(tokenize);
  return entries.filter((e) => !pieces.has(e.written));
}

let patternTokenizer: Tokenizer | null = null;

/** scikit-learn's default analyzer's tokens (lower-cased, its default token pattern). */
function defaultPatternTokenizer(): Tokenizer {
  return (patternTokenizer ??= createTokenizer({ ...DEFAULT_SETTINGS.tokens, tokenizer: 'pattern', lowercase: true, stem: false, minLength: 0 }));
}
