import type { WinkMethods } from 'wink-nlp';
import { cutRun, isOverlongRun } from './long-runs';
import { isWinkSpacing, WINK_SPLITTER } from './wink-splitter';

/** Entries kept before the cache starts over; a bound on memory, not on correctness. */
const MAX_CACHED_CHUNKS = 200_000;

/**
 * Unigram terms of a document, identical token for token to running wink-nlp on the whole
 * document (then `termOf` on each token), but with most of wink's work skipped.
 *
 * Why this is exact (wink-nlp 2.4 src/tokenizer.js, recursive-tokenizer.js, dd-wrapper.js,
 * cache.js; guarded by winkSplitsLikeThis):
 * 1. wink splits the text on WINK_SPLITTER and tokenises each non-spacing piece ("chunk") on
 *    its own; the only state carried from one chunk to the next is the count of preceding
 *    spaces, which changes no token's text, type or normal form. With the empty pipe nothing
 *    looks across chunks afterwards (no sentence boundaries, entities or patterns).
 * 2. But wink is not a pure function of the chunk: its lexeme cache grows with every token it
 *    emits and is consulted while splitting (`addTokenIfInCache`, `isLexeme`), so "people's"
 *    comes out as "people" + "'s" until some other chunk has emitted "people's" whole, and an
 *    unknown string keeps the type it was first emitted with. A cache of every chunk's result
 *    would therefore freeze stale splits (seen on Debian's fortunes: 85 documents differed).
 * 3. So a chunk is cached only when wink turned it into exactly one token whose text is the
 *    chunk itself. From then on the chunk is in wink's lexeme cache for good (entries are never
 *    removed or re-indexed), and wink's first step on any later occurrence is that lookup: one
 *    token, same lexeme index, hence the same text, type and normal form — and no change to
 *    wink's state. Skipping wink for it leaves wink's state exactly where the whole-document
 *    run would leave it, so every chunk that does go through wink sees the same state too.
 * 4. The chunks not in the cache ("misses") go through one readDoc, joined by single spaces
 *    (the same chunks in the same order as the whole-document run, so the same state changes).
 *    Their tokens are given back to their chunks by the preceding-space count: wink passes a
 *    chunk's spaces to its first token only and 0 to the rest, so with one space between
 *    chunks a new chunk starts exactly at a token with spaces > 0. That needs every miss to
 *    yield at least one token; a chunk that is blank to String.prototype.trim (e.g. U+3000,
 *    which wink does not split on, can vanish inside its recursive tokenizer) might not, so a
 *    document with such a miss runs each miss through its own readDoc instead.
 * 5. A chunk longer than MAX_RUN is replaced by its pieces (long-runs.ts), exactly what
 *    whole-document wink sees once `cutLongRuns` has put a space at each cut; `onLongRun` is
 *    called once per run cut.
 * The result is bound to `nlp`: the cache is valid only for that instance's lexeme cache.
 */
export function chunkCachedUnigrams(
  nlp: WinkMethods,
  lowercase: boolean,
  termOf: (form: string, winkType: string) => string | null,
  onLongRun: () => void = () => undefined,
): (text: string) => string[] {
  const its = nlp.its;
  // chunk → its one term, or null when that token is dropped by the settings.
  let cache = new Map<string, string | null>();

  const remember = (chunk: string, term: string | null): void => {
    if (cache.size >= MAX_CACHED_CHUNKS) cache = new Map();
    // A long substring can be a slice that keeps its whole document alive; store a copy.
    cache.set(chunk.length >= 13 ? (chunk + ' ').slice(0, -1) : chunk, term);
  };

  /** Runs wink once on the chunks joined by single spaces; element k holds chunk k's terms. */
  const runJoined = (chunks: readonly string[]): string[][] => {
    const tokens = nlp.readDoc(chunks.join(' ')).tokens();
    const values = tokens.out() as string[];
    const forms = lowercase ? (tokens.out(its.normal) as string[]) : values;
    const types = tokens.out(its.type) as string[];
    const spaces = chunks.length > 1 ? (tokens.out(its.precedingSpaces) as string[]) : [];
    const out: string[][] = [];
    if (chunks.length === 1) {
      // Every token is this chunk's, however many (a blank chunk may give none).
      const terms: string[] = [];
      for (let j = 0; j < values.length; j++) {
        const term = termOf(forms[j]!, types[j]!);
        if (term !== null) terms.push(term);
      }
      if (values.length === 1 && values[0] === chunks[0]) remember(chunks[0]!, terms.length === 1 ? terms[0]! : null);
      out.push(terms);
      return out;
    }
    let firstOfChunk = 0;
    for (let i = 0; i <= values.length; i++) {
      if (i > 0 && (i === values.length || spaces[i]! !== '')) {
        const k = out.length;
        if (k >= chunks.length) break;
        const terms: string[] = [];
        for (let j = firstOfChunk; j < i; j++) {
          const term = termOf(forms[j]!, types[j]!);
          if (term !== null) terms.push(term);
        }
        if (i - firstOfChunk === 1 && values[firstOfChunk] === chunks[k]) remember(chunks[k]!, terms.length === 1 ? terms[0]! : null);
        out.push(terms);
        firstOfChunk = i;
      }
    }
    if (out.length !== chunks.length) {
      // Point 4 above says this cannot happen; fail loudly rather than misplace terms.
      throw new Error(`tokenizer: wink gave ${out.length} token groups for ${chunks.length} chunks (wink-nlp changed how it counts spaces?)`);
    }
    return out;
  };

  // Reused by every call (emptied first): the chunks wink must see and where their terms go in `out`.
  const misses: string[] = [];
  const missAt: number[] = [];
  let blankMiss = false;
  let out: string[] = [];
  const visit = (chunk: string): void => {
    const term = cache.get(chunk);
    if (term !== undefined) {
      if (term !== null) out.push(term);
      return;
    }
    misses.push(chunk);
    missAt.push(out.length);
    if (chunk.trim() === '') blankMiss = true;
  };

  return (text: string): string[] => {
    const pieces = text.split(WINK_SPLITTER);
    out = [];
    misses.length = 0;
    missAt.length = 0;
    blankMiss = false;
    for (let p = 0; p < pieces.length; p++) {
      const chunk = pieces[p]!;
      if (chunk === '' || isWinkSpacing(chunk)) continue;
      if (isOverlongRun(chunk)) {
        onLongRun();
        for (const piece of cutRun(chunk)) visit(piece);
      } else {
        visit(chunk);
      }
    }
    if (misses.length === 0) return out;

    let missTerms: string[][];
    if (blankMiss) {
      missTerms = [];
      for (const m of misses) missTerms.push(runJoined([m])[0]!);
    } else {
      missTerms = runJoined(misses);
    }
    const merged: string[] = [];
    let from = 0;
    for (let k = 0; k < misses.length; k++) {
      const at = missAt[k]!;
      for (let i = from; i < at; i++) merged.push(out[i]!);
      for (const t of missTerms[k]!) merged.push(t);
      from = at;
    }
    for (let i = from; i < out.length; i++) merged.push(out[i]!);
    return merged;
  };
}
