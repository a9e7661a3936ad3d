import type { WinkMethods } from 'wink-nlp';
import { ABSENT, ChunkTable, FNV_OFFSET, FNV_PRIME, hashOf } from './chunk-table';
import { deferredLexemesOf, isWordLetter, replay, wordClassKnown } from './deferred-lexemes';
import type { IdList } from './id-list';
import { cutRun, MAX_RUN } from './long-runs';
import { lowercaseForms } from './lowercase-forms';
import { Vocabulary, type TermCoder } from './term-coder';
import { winkLexemeFilter } from './wink-instance';
import { WINK_SPLITTER_SOURCE } from './wink-splitter';
import { peekCoreModel } from './wink-core-model';

/** Table values below ABSENT (≥ 0 is the chunk's one term id). */
const DROPPED = -2; // one token, dropped by the settings
const REDO = -3; // a conditional entry that no longer holds: send the chunk to wink again
const MULTI = -4; // MULTI - k: the ids of multis' list k

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
 *    chunk — the only way a string becomes a lexeme. Misses wait to be run together, so when a
 *    conditional entry comes after a pending miss that might do that, the misses are run first
 *    (`flush`) and the entry is looked up again (`cannotMakeWordRPLexeme` says which can't). When the word and the sign
 *    are both cached for good, even the first occurrence skips wink (`composeWordRP`, which
 *    checks that wink would add no lexeme). These are ~13% of the chunks of English
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
 * 7. A plain word (letters of wink's first category only) that is not a lexeme is, in wink,
 *    `_addTokenIfInCache` failing, then `processDefault` → `cache.add(word, word)`: one token
 *    whose text is the chunk, of type "word" and no contraction, so its form is the chunk
 *    lower-cased (lowercase-forms.ts; wink's normal form, which may respell it, is not used);
 *    the word becomes a lexeme of type "word", and so does its lowercase if it was none. So such
 *    a token is known without wink (`resolvePlainWord`), and so is the word part of "word." when the word is not a lexeme (`composeWordRP`: wink's
 *    `processWordRP` adds it with type "word" the same way). What is skipped is the addition to
 *    wink's lexeme cache; it is recorded instead (deferred-lexemes.ts, per wink instance) and
 *    made before any wink run that could see it, which keeps every wink run exact:
 *    - wink looks up or adds only substrings of the chunk it is given and their lowercase, so a
 *      run can reach a deferred word d only if lowercase(d) is a substring of lowercase(chunk)
 *      (`takeReachableFrom`); those are added, as plain words, right before the run (`flush`).
 *    - A plain word or "word." that wink runs on reaches only the word and its lowercase, and
 *      adds them as type "word": what the deferred record says, so such runs need no replay
 *      (in either order).
 *    - A word is not deferred (nor a "word." composed) while a pending miss of another kind
 *      with letters (`unsafeMisses`) could reach it (`reachedByPending`, the same substring
 *      test), since the whole-document run sees that miss first and it might add the word
 *      otherwise. So such a miss reaches only words deferred before it, and replaying them
 *      before the whole flush changes nothing for the misses ahead of it: they are plain words,
 *      "word." and chunks without letters (point above), or misses that cannot reach them.
 *    - Nothing else reads wink's lexemes: lexeme indices and feature tables change with the
 *      order of additions, but no token's text, type or normal form does.
 *    The coder's own checks (`lexemeEntry`) then see the instance without the deferred words,
 *    which is why a word that is not a wink lexeme is treated alike whether deferred or new.
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
  const multis = new IdLists();
  let conditional: boolean[] = [];
  let conditionals = 0;
  // Any document of `nlp` answers isLexeme from the instance's one lexeme cache.
  const lexemes = nlp.readDoc('');
  // Most strings asked about are no lexemes; the filter says so without asking wink.
  const lexemeFilter = winkLexemeFilter(nlp);
  const { isWord, isWordRP } = categoryTests();
  const deferred = deferredLexemesOf(nlp);
  const defer = wordClassKnown();

  const store = (chunk: string, value: number): void => {
    if (!table.set(chunk, value)) {
      // The table was full and started over: what it pointed to goes too (but not `value`'s).
      const keep = value <= MULTI ? multis.copy(MULTI - value) : null;
      const keepConditional = value <= MULTI ? conditional[MULTI - value]! : false;
      multis.clear();
      conditional = [];
      conditionals = 0;
      if (keep !== null) {
        multis.add(keep);
        conditional.push(keepConditional);
        if (keepConditional) conditionals++;
        table.set(chunk, MULTI);
      }
    }
  };

  const remember = (chunk: string, values: readonly string[], from: number, to: number, ids: readonly number[]): void => {
    if (to - from === 1 && values[from] === chunk) {
      store(chunk, ids.length === 1 ? ids[0]! : DROPPED);
    } else if (isWordRP(chunk) && lexemeEntry(chunk) === null) {
      const k = multis.add(ids);
      conditional.push(true);
      conditionals++;
      store(chunk, MULTI - k);
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

  /**
   * True when wink, whatever its state, cannot turn `chunk` into a token shaped like a word with
   * a trailing sign (so it cannot make a conditional entry's chunk a lexeme): a plain word is
   * looked up (adding nothing) or added as it is, letters only; a wordRP chunk is looked up or
   * split into its letters and its sign; a chunk without letters only ever adds substrings of
   * itself (with their lowercase), and a wordRP string has letters. Anything else might.
   */
  const cannotMakeWordRPLexeme = (chunk: string): boolean => isWord(chunk) || isWordRP(chunk) || letterless(chunk);

  /**
   * Point 4 without wink: a wordRP chunk that is no lexeme is, the first time too, the word's
   * token then the sign's, provided the sign is a lexeme cached for good that is no contraction
   * and whose lowercase is a lexeme (so `_addToken` of it adds nothing), and the word is either
   * the same (a lexeme cached for good, no contraction, its lowercase a lexeme) or not a lexeme
   * (point 7: a new word, deferred). Appends the ids and caches them conditionally; false
   * (nothing done) when any of that does not hold. Not while a pending miss might change any of
   * it: one that could reach the word could reach the chunk, which holds it, too.
   */
  const composeWordRP = (text: string, start: number, end: number, hash: number, out: IdList): boolean => {
    const chunk = text.slice(start, end);
    if (!isWordRP(chunk) || lexemeEntry(chunk, hash) !== null) return false;
    const w = chunk.slice(0, -1);
    // A pending miss that could reach the word could also make the chunk (which holds it) a lexeme.
    if (unsafeMisses > 0 && reachedByPending(w.toLowerCase())) return false;
    const sign = signValue(chunk.slice(-1));
    if (sign === ABSENT) return false;
    const entry = lexemeEntry(w, hashOf(text, start, end - 1));
    let word: number;
    if (entry === null) {
      if (!defer) return false;
      word = deferWord(w);
    } else {
      if (entry.length !== 1) return false;
      word = cachedForGood(w);
      if (word < 0 && word !== DROPPED) return false;
      const lower = w.toLowerCase();
      if (lower !== w && lexemeEntry(lower) === null) return false;
    }
    const ids: number[] = [];
    if (word >= 0) ids.push(word);
    if (sign >= 0) ids.push(sign);
    for (const id of ids) out.push(id);
    const k = multis.add(ids);
    conditional.push(true);
    conditionals++;
    store(chunk, MULTI - k);
    return true;
  };
  /**
   * The sign's part of composeWordRP's conditions: its table value (an id or DROPPED) when it is a
   * lexeme cached for good, no contraction, whose lowercase is a lexeme; else ABSENT. Once they
   * hold they hold for good (lexemes are never removed, ids never change), so they are kept.
   */
  const signValue = (p: string): number => {
    const known = signs.get(p);
    if (known !== undefined) return known;
    if (lexemeEntry(p)?.length !== 1) return ABSENT;
    const sign = cachedForGood(p);
    if (sign < 0 && sign !== DROPPED) return ABSENT;
    if (p.toLowerCase() !== p && lexemeEntry(p.toLowerCase()) === null) return ABSENT;
    signs.set(p, sign);
    return sign;
  };
  const signs = new Map<string, number>();
  /**
   * Point 7: the term id (or DROPPED) of `word`, a plain word that is not a wink lexeme, as wink
   * would make it, recording the word and its lowercase as deferred additions.
   */
  const deferWord = (word: string): number => {
    const lower = word.toLowerCase();
    const term = termOf(lowercase ? lower : word, 'word');
    deferred.add(word, lower);
    if (lower !== word && lexemeEntry(lower) === null) deferred.add(lower, lower);
    return term === null ? DROPPED : vocabulary.id(term);
  };

  /** Point 7 for a plain-word chunk: appends its id and caches it for good; false if it is a lexeme. */
  const resolvePlainWord = (text: string, start: number, end: number, hash: number, out: IdList): boolean => {
    const chunk = text.slice(start, end);
    if (!defer || !isWord(chunk) || lexemeEntry(chunk, hash) !== null) return false;
    if (unsafeMisses > 0 && reachedByPending(chunk.toLowerCase())) return false;
    const id = deferWord(chunk);
    if (id >= 0) out.push(id);
    store(chunk, id);
    return true;
  };
  /**
   * The table's value for `lexeme` (a string wink already knows), running wink on it alone first
   * when the table has none: wink's only step for a lexeme is the lookup, so that run changes
   * nothing in wink and caches it (point 3). A sign such as "." is seldom a chunk of its own.
   */
  const cachedForGood = (lexeme: string): number => {
    const v = table.getKey(lexeme);
    if (v !== ABSENT) return v;
    runJoined([lexeme]);
    return table.getKey(lexeme);
  };
  /**
   * wink's `cache.lookup`: null, or [lexeme index], or 4 numbers per part of a contraction.
   * `hash`: text's FNV-1a hash, where the caller has it.
   */
  const lexemeEntry = (text: string, hash?: number): readonly number[] | null => {
    if (lexemeFilter !== null && !lexemeFilter.mayHave(hash ?? hashOf(text, 0, text.length))) return null;
    return lexemes.isLexeme(text) as unknown as readonly number[] | null;
  };

  /** Runs wink once on the chunks joined by single spaces; element k holds chunk k's term ids. */
  const runJoined = (chunks: readonly string[]): number[][] => {
    const tokens = nlp.readDoc(chunks.join(' ')).tokens();
    const values = tokens.out() as string[];
    const forms = lowercase ? lowercaseForms(tokens, its, values) : values;
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

  // The chunks wink must see, where their terms go in `out` and which document they are in;
  // emptied by each flush. They wait across documents, so one readDoc serves many of them.
  const misses: string[] = [];
  const missAt: number[] = [];
  const missDoc: number[] = [];
  // The batch being encoded (set by encodeAll): `visit` may have to flush mid-batch.
  let docEnds: Uint32Array = new Uint32Array(0);
  let doc = 0;
  let blankMiss = false;
  // Pending misses that might make a conditional entry's chunk a lexeme (see `visit`), and
  // their lowercase (what they can reach: point 7).
  let unsafeMisses = 0;
  const unsafeLower: string[] = [];
  /** Whether a pending miss that is not a plain word, "word." or without letters might look up `lower`. */
  const reachedByPending = (lower: string): boolean => {
    for (let i = 0; i < unsafeLower.length; i++) if (unsafeLower[i]!.includes(lower)) return true;
    return false;
  };
  let longRunsCut = 0;

  /** Appends the cached ids of text[start, end), or notes it as a miss. */
  const visit = (text: string, start: number, end: number, hash: number, out: IdList, found = table.get(text, start, end, hash)): void => {
    let v = found;
    if (v <= MULTI && unsafeMisses > 0 && conditional[MULTI - v]) {
      // An earlier miss of this document may make this chunk a lexeme: wink sees the misses first.
      flush(out);
      v = table.get(text, start, end, hash);
    }
    if (v >= 0) {
      out.push(v);
    } else if (v <= MULTI) {
      const k = MULTI - v;
      const { ids, ends } = multis;
      for (let i = k === 0 ? 0 : ends[k - 1]!, end = ends[k]!; i < end; i++) out.push(ids[i]!);
    } else if (v !== DROPPED) {
      if (v === ABSENT) {
        if (resolvePlainWord(text, start, end, hash, out)) return;
        if (end - start > 2 && composeWordRP(text, start, end, hash, out)) return;
      }
      const chunk = text.slice(start, end);
      misses.push(chunk);
      missAt.push(out.length);
      missDoc.push(doc);
      if (chunk.trim() === '') blankMiss = true;
      if (!cannotMakeWordRPLexeme(chunk)) {
        unsafeMisses++;
        unsafeLower.push(chunk.toLowerCase());
      }
    }
  };

  /**
   * Runs the pending misses through wink, splices their ids in at their places in `out`, and
   * moves the ends of the documents already finished by the ids inserted at or before them.
   */
  const flush = (out: IdList): void => {
    if (misses.length === 0) return;
    if (unsafeMisses > 0 && deferred.size > 0) {
      // Point 7: the deferred words these misses could reach become lexemes first.
      const words: string[] = [];
      for (const m of misses) if (!cannotMakeWordRPLexeme(m)) deferred.takeReachableFrom(m, words);
      replay(nlp, deferred, words);
    }
    let missIds: number[][];
    if (blankMiss) {
      missIds = [];
      for (const m of misses) missIds.push(runJoined([m])[0]!);
    } else {
      missIds = runJoined(misses);
    }
    const first = missAt[0]!;
    const after = out.slice(first);
    out.length = first;
    let from = first;
    for (let k = 0; k < misses.length; k++) {
      const at = missAt[k]!;
      for (let j = from; j < at; j++) out.push(after[j - first]!);
      for (const id of missIds[k]!) out.push(id);
      from = at;
    }
    for (let j = from - first; j < after.length; j++) out.push(after[j]!);
    let added = 0;
    for (let d = missDoc[0]!, k = 0; d < doc; d++) {
      while (k < misses.length && missDoc[k]! <= d) added += missIds[k++]!.length;
      docEnds[d] += added;
    }
    misses.length = 0;
    missAt.length = 0;
    missDoc.length = 0;
    blankMiss = false;
    unsafeMisses = 0;
    unsafeLower.length = 0;
  };

  const visitLongRun = (text: string, start: number, end: number, out: IdList): void => {
    longRunsCut++;
    for (const piece of cutRun(text.slice(start, end))) visit(piece, 0, piece.length, hashOf(piece, 0, piece.length), out);
  };

  const encodeAll = (texts: readonly string[], out: IdList, ends: Uint32Array, longRunDocs: number[]): void => {
    misses.length = 0;
    missAt.length = 0;
    missDoc.length = 0;
    blankMiss = false;
    unsafeMisses = 0;
    unsafeLower.length = 0;
    docEnds = ends;
    for (doc = 0; doc < texts.length; doc++) {
      const runsBefore = longRunsCut;
      scan(texts[doc]!, out);
      if (longRunsCut !== runsBefore) longRunDocs.push(doc);
      docEnds[doc] = out.length;
    }
    flush(out);
    docEnds = new Uint32Array(0);
  };

  /** Visits every chunk of `text`, as `text.split(wink's splitter)` would cut it. */
  const scan = (text: string, out: IdList): void => {
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
      if (want === OTHER && i - start > MAX_RUN) {
        visitLongRun(text, start, i, out);
        continue;
      }
      // The common case (a chunk cached as one term) stays in this loop; the rest in `visit`.
      const v = table.get(text, start, i, h);
      if (v >= 0) out.push(v);
      else visit(text, start, i, h, out, v);
    }
  };

  return {
    encodeAll,
    terms: vocabulary.terms,
    get longRunsCut() {
      return longRunsCut;
    },
  };
}

/** Every letter wink's word patterns know (their class, case-insensitive) and more: any Latin letter or mark. */
const WORDRP_LETTER = /[a-z\u00c0-\u024f\u0300-\u036f\u1e00-\u1eff\u2060]/i;

/**
 * True when neither `chunk` nor its lowercase has a letter wink's word patterns could use
 * (WORDRP_LETTER, or the word class itself, which also has Greek iota): such a chunk can add
 * only strings without them. The lowercase counts because wink adds each string's lowercase
 * too, and a few signs lowercase to letters (KELVIN SIGN to "k", ANGSTROM SIGN to "å").
 */
function letterless(chunk: string): boolean {
  if (WORDRP_LETTER.test(chunk)) return false;
  const lower = chunk.toLowerCase();
  if (WORDRP_LETTER.test(lower)) return false;
  for (let i = 0; i < chunk.length; i++) if (isWordLetter(chunk.charCodeAt(i))) return false;
  for (let i = 0; i < lower.length; i++) if (isWordLetter(lower.charCodeAt(i))) return false;
  return true;
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
 * wink's first two category tests (point 4), read from the model so they follow it: a plain
 * word (letters only) and wordRP (letters then one sign; the first test cannot also match).
 * When the model does not have that layout, nothing is cached conditionally.
 */
function categoryTests(): { isWord(chunk: string): boolean; isWordRP(chunk: string): boolean } {
  const none = { isWord: () => false, isWordRP: () => false };
  try {
    const model = peekCoreModel();
    const ltc = model.trex?.ltc;
    // 1 = word, 15 = wordRP in wink-nlp 2.4's categories (src/constants.js is not exported).
    if (ltc === undefined || ltc.length < 2 || ltc[0]![2] !== 1 || ltc[1]![2] !== 15) return none;
    const word = new RegExp(ltc[0]![0], ltc[0]![1]);
    const wordRP = new RegExp(ltc[1]![0], ltc[1]![1]);
    return { isWord: (chunk) => word.test(chunk), isWordRP: (chunk) => wordRP.test(chunk) && !word.test(chunk) };
  } catch {
    return none;
  }
}

/**
 * The id lists of the chunks that give several (or no) terms, one after another in one array
 * (list k is ids[ends[k-1] .. ends[k]), ends[-1] = 0): ~80k lists for half the 100k bench
 * corpus, which as a typed array each were as many small objects for the young generation to
 * copy and promote.
 */
class IdLists {
  ids: Uint32Array = new Uint32Array(1 << 12);
  ends: Uint32Array = new Uint32Array(1 << 10);
  count = 0;

  /** Appends a list; its index. */
  add(list: ArrayLike<number>): number {
    const start = this.count === 0 ? 0 : this.ends[this.count - 1]!;
    const end = start + list.length;
    if (end > this.ids.length) this.ids = grownTo(this.ids, end);
    if (this.count === this.ends.length) this.ends = grownTo(this.ends, this.count + 1);
    for (let i = 0; i < list.length; i++) this.ids[start + i] = list[i]!;
    this.ends[this.count] = end;
    return this.count++;
  }

  /** List k, copied out. */
  copy(k: number): number[] {
    return Array.from(this.ids.subarray(k === 0 ? 0 : this.ends[k - 1]!, this.ends[k]!));
  }

  clear(): void {
    this.count = 0;
  }
}

/** `a`'s contents in an array at least `size` long (twice as long, or more). */
function grownTo(a: Uint32Array, size: number): Uint32Array {
  const grown = new Uint32Array(Math.max(size, 2 * a.length));
  grown.set(a);
  return grown;
}
