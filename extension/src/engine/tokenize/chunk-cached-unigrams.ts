import type { WinkMethods } from 'wink-nlp';
import { ChunkTable, FNV_OFFSET, FNV_PRIME, hashOf } from './chunk-table';
import type { IdList } from './id-list';
import { cutRun, MAX_RUN } from './long-runs';
import { Vocabulary, type TermCoder } from './term-coder';
import { WINK_SPLITTER_SOURCE } from './wink-splitter';

/** Table values below ABSENT (≥ 0 is the chunk's one term id). */
const DROPPED = -2; // one token, dropped by the settings
const REDO = -3; // a conditional entry that no longer holds: send the chunk to wink again
const MULTI = -4; // MULTI - k: the ids in multis[k]

/**
 * Unigram term ids of a document, identical token for token to running wink-nlp on the whole
 * document (then `termOf` on each token), but with most of wink's work skipped.
 *
 * Why this is exact (wink-nlp 2.4 src/tokenizer.js, recursive-tokenizer.js, dd-wrapper.js,
 * cache.js; guarded by winkSplitsLikeThis):
 * 1. wink splits the text on its splitter (wink-splitter.ts) and tokenises each non-spacing piece
 *    ("chunk") on its own; the only state carried from one chunk to the next is the count of
 *    preceding spaces, which changes no token's text, type or normal form. With the empty pipe
 *    nothing looks across chunks afterwards (no sentence boundaries, entities or patterns).
 *    The scan below cuts the same chunks as `text.split(splitter)` without making substrings.
 * 2. But wink is not a pure function of the chunk: its lexeme cache grows with every token it
 *    emits and is consulted while splitting (`addTokenIfInCache`, `isLexeme`), so "people's"
 *    comes out as "people" + "'s" until some other chunk has emitted "people's" whole, and an
 *    unknown string keeps the type it was first emitted with. A cache of every chunk's result
 *    would therefore freeze stale splits (seen on Debian's fortunes: 85 documents differed).
 * 3. So a chunk is cached for good only when wink turned it into exactly one token whose text
 *    is the chunk itself. From then on the chunk is in wink's lexeme cache for good (entries are
 *    never removed or re-indexed), and wink's first step on any later occurrence is that lookup:
 *    one token, same lexeme index, hence the same text, type and normal form — and no change to
 *    wink's state. Skipping wink for it leaves wink's state exactly where the whole-document
 *    run would leave it, so every chunk that does go through wink sees the same state too.
 * 4. A word with one trailing sign ("word." "word," "word)", wink's category wordRP: the
 *    model's second category pattern, the first being plain letters, which cannot also match)
 *    is split by wink as: if the chunk is itself a lexeme, that lexeme's tokens; otherwise
 *    `processWordRP`, which adds the word and the sign with `_addToken`. `_addToken` of a
 *    string that is already a lexeme (and, after the first time, both parts are, with their
 *    lowercase forms) returns the same index and changes nothing. So while the chunk is not a
 *    lexeme, wink's output for it is what it was the first time, and skipping wink leaves its
 *    state unchanged. Such a chunk is cached *conditionally*: only when, after its wink run, the
 *    chunk is not a lexeme (`isLexeme`), and the entry is dropped (REDO) as soon as a wink run
 *    emits a token whose text or lowercase (the two strings `cache.add` registers) is the
 *    chunk — the only way a string becomes a lexeme. Misses run after the document's scan, so
 *    a conditional entry met after a miss in the same document is treated as a miss (wink sees
 *    it in order, after whatever the earlier miss makes a lexeme). These are ~13% of the chunks of English
 *    text (every word before a comma or full stop); the rest of wink's categories are either
 *    single tokens (point 3) or go through lookups of their parts (left to wink every time).
 * 5. The chunks not in the cache ("misses") go through one readDoc, joined by single spaces
 *    (the same chunks in the same order as the whole-document run, so the same state changes).
 *    Their tokens are given back to their chunks by the preceding-space count: wink passes a
 *    chunk's spaces to its first token only and 0 to the rest, so with one space between
 *    chunks a new chunk starts exactly at a token with spaces > 0. That needs every miss to
 *    yield at least one token; a chunk that is blank to String.prototype.trim (e.g. U+3000,
 *    which wink does not split on, can vanish inside its recursive tokenizer) might not, so a
 *    document with such a miss runs each miss through its own readDoc instead.
 * 6. A chunk longer than MAX_RUN is replaced by its pieces (long-runs.ts), exactly what
 *    whole-document wink sees once `cutLongRuns` has put a space at each cut; `longRunsCut`
 *    counts the runs cut.
 * The coder is bound to `nlp`: the cache is valid only for that instance's lexeme cache.
 */
export function chunkCachedUnigrams(
  nlp: WinkMethods,
  lowercase: boolean,
  termOf: (form: string, winkType: string) => string | null,
): TermCoder {
  const its = nlp.its;
  const vocabulary = new Vocabulary();
  const table = new ChunkTable();
  // Ids of the chunks that give several (or no) terms, and whether each entry is conditional.
  let multis: Uint32Array[] = [];
  let conditional: boolean[] = [];
  let conditionals = 0;
  // Any document of `nlp` answers isLexeme from the instance's one lexeme cache.
  const lexemes = nlp.readDoc('');
  const isWordRP = wordRPTest();

  const store = (chunk: string, value: number): void => {
    if (!table.set(chunk, value)) {
      // The table was full and started over: what it pointed to goes too (but not `value`'s).
      const keep = value <= MULTI ? multis[MULTI - value]! : null;
      const keepConditional = value <= MULTI ? conditional[MULTI - value]! : false;
      multis = [];
      conditional = [];
      conditionals = 0;
      if (keep !== null) {
        multis.push(keep);
        conditional.push(keepConditional);
        if (keepConditional) conditionals++;
        table.set(chunk, MULTI);
      }
    }
  };

  const remember = (chunk: string, values: readonly string[], from: number, to: number, ids: readonly number[]): void => {
    if (to - from === 1 && values[from] === chunk) {
      store(chunk, ids.length === 1 ? ids[0]! : DROPPED);
    } else if (isWordRP(chunk) && !lexemes.isLexeme(chunk)) {
      multis.push(Uint32Array.from(ids));
      conditional.push(true);
      conditionals++;
      store(chunk, MULTI - (multis.length - 1));
    }
  };

  /** Point 4: `text` (a token wink just emitted) and its lowercase are lexemes now. */
  const invalidate = (text: string): void => {
    for (let pass = 0; pass < 2; pass++) {
      const key = pass === 0 ? text : text.toLowerCase();
      if (pass === 1 && key === text) return;
      const v = table.getKey(key);
      if (v <= MULTI && conditional[MULTI - v]) {
        conditional[MULTI - v] = false;
        conditionals--;
        table.set(key, REDO);
      }
    }
  };

  /** Runs wink once on the chunks joined by single spaces; element k holds chunk k's term ids. */
  const runJoined = (chunks: readonly string[]): number[][] => {
    const tokens = nlp.readDoc(chunks.join(' ')).tokens();
    const values = tokens.out() as string[];
    const forms = lowercase ? (tokens.out(its.normal) as string[]) : values;
    const types = tokens.out(its.type) as string[];
    const spaces = chunks.length > 1 ? (tokens.out(its.precedingSpaces) as string[]) : [];
    if (conditionals > 0) for (const v of values) invalidate(v);
    const out: number[][] = [];
    const group = (k: number, from: number, to: number): void => {
      const ids: number[] = [];
      for (let j = from; j < to; j++) {
        const term = termOf(forms[j]!, types[j]!);
        if (term !== null) ids.push(vocabulary.id(term));
      }
      remember(chunks[k]!, values, from, to, ids);
      out.push(ids);
    };
    if (chunks.length === 1) {
      // Every token is this chunk's, however many (a blank chunk may give none).
      group(0, 0, values.length);
      return out;
    }
    let firstOfChunk = 0;
    for (let i = 1; i <= values.length; i++) {
      if (i === values.length || spaces[i]! !== '') {
        if (out.length >= chunks.length) break;
        group(out.length, firstOfChunk, i);
        firstOfChunk = i;
      }
    }
    if (out.length !== chunks.length) {
      // Point 5 above says this cannot happen; fail loudly rather than misplace terms.
      throw new Error(`tokenizer: wink gave ${out.length} token groups for ${chunks.length} chunks (wink-nlp changed how it counts spaces?)`);
    }
    return out;
  };

  // Reused by every call (emptied first): the chunks wink must see and where their terms go.
  const misses: string[] = [];
  const missAt: number[] = [];
  let blankMiss = false;
  let longRunsCut = 0;

  /** Appends the cached ids of text[start, end), or notes it as a miss. */
  const visit = (text: string, start: number, end: number, hash: number, out: IdList): void => {
    const v = table.get(text, start, end, hash);
    if (v >= 0) {
      out.push(v);
    } else if (v <= MULTI && !(misses.length > 0 && conditional[MULTI - v])) {
      const ids = multis[MULTI - v]!;
      for (let i = 0; i < ids.length; i++) out.push(ids[i]!);
    } else if (v !== DROPPED) {
      const chunk = text.slice(start, end);
      misses.push(chunk);
      missAt.push(out.length);
      if (chunk.trim() === '') blankMiss = true;
    }
  };

  const visitLongRun = (text: string, start: number, end: number, out: IdList): void => {
    longRunsCut++;
    for (const piece of cutRun(text.slice(start, end))) visit(piece, 0, piece.length, hashOf(piece, 0, piece.length), out);
  };

  const encode = (text: string, out: IdList): void => {
    const docStart = out.length;
    misses.length = 0;
    missAt.length = 0;
    blankMiss = false;
    const n = text.length;
    let i = 0;
    while (i < n) {
      let c = text.charCodeAt(i);
      let kind = SPLIT_CLASS[c]!;
      if (kind === SPACING) {
        i++;
        continue;
      }
      const start = i;
      let h = FNV_OFFSET;
      // A chunk is a run of line breaks/tabs, or a run of anything but those and spacing.
      const want = kind;
      do {
        h = Math.imul(h ^ c, FNV_PRIME);
        if (++i === n) break;
        c = text.charCodeAt(i);
        kind = SPLIT_CLASS[c]!;
      } while (kind === want);
      if (want === OTHER && i - start > MAX_RUN) visitLongRun(text, start, i, out);
      else visit(text, start, i, h, out);
    }
    if (misses.length === 0) return;

    let missIds: number[][];
    if (blankMiss) {
      missIds = [];
      for (const m of misses) missIds.push(runJoined([m])[0]!);
    } else {
      missIds = runJoined(misses);
    }
    // Splice the misses' ids in at their places among the hits.
    const hits = out.slice(docStart);
    out.length = docStart;
    let from = 0;
    for (let k = 0; k < misses.length; k++) {
      const at = missAt[k]! - docStart;
      for (let j = from; j < at; j++) out.push(hits[j]!);
      for (const id of missIds[k]!) out.push(id);
      from = at;
    }
    for (let j = from; j < hits.length; j++) out.push(hits[j]!);
  };

  return {
    encode,
    terms: vocabulary.terms,
    get longRunsCut() {
      return longRunsCut;
    },
  };
}

const OTHER = 0;
const SPACING = 1;
const BREAK = 2;

/**
 * Each UTF-16 code unit's part in wink's splitter `(SPACES+|BREAKS+)`: spacing (a piece wink
 * skips), a line break or tab (runs of them are chunks of their own), or other. Built from the
 * splitter's source, so it cannot drift from wink-splitter.ts.
 */
const SPLIT_CLASS: Uint8Array = (() => {
  const alternatives = /^\((\[[^\]]+\])\+\|(\[[^\]]+\])\+\)$/.exec(WINK_SPLITTER_SOURCE);
  if (alternatives === null) throw new Error(`tokenizer: unexpected wink splitter ${WINK_SPLITTER_SOURCE}`);
  const spacing = new RegExp(`^${alternatives[1]!}$`);
  const breaks = new RegExp(`^${alternatives[2]!}$`);
  const classes = new Uint8Array(0x10000);
  for (let c = 0; c < 0x10000; c++) {
    const ch = String.fromCharCode(c);
    classes[c] = spacing.test(ch) ? SPACING : breaks.test(ch) ? BREAK : OTHER;
  }
  return classes;
})();

/**
 * wink's wordRP test (point 4): the model's second category pattern, given that the first
 * (plain letters) does not match. Read from the model so it follows it; null-safe on a model
 * without that layout (then nothing is cached conditionally).
 */
function wordRPTest(): (chunk: string) => boolean {
  try {
    const model = require('wink-eng-lite-web-model/dist/languages/cur/models/eng-core-web-model.json') as { trex?: { ltc?: [string, string, number][] } };
    const ltc = model.trex?.ltc;
    // 1 = word, 15 = wordRP in wink-nlp 2.4's categories (src/constants.js is not exported).
    if (ltc === undefined || ltc.length < 2 || ltc[0]![2] !== 1 || ltc[1]![2] !== 15) return () => false;
    const word = new RegExp(ltc[0]![0], ltc[0]![1]);
    const wordRP = new RegExp(ltc[1]![0], ltc[1]![1]);
    return (chunk) => wordRP.test(chunk) && !word.test(chunk);
  } catch {
    return () => false;
  }
}
