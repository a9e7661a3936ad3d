import type { WinkMethods } from 'wink-nlp';
import { peekCoreModel } from './wink-core-model';

/**
 * The plain words (letters only, wink's first category) that a whole-document wink run would
 * have added to an instance's lexeme cache by now, but that the chunk-cached coder tokenised
 * without wink (chunk-cached-unigrams.ts point 7). Each is a lexeme of type "word" whose normal
 * form is its lowercase in the whole-document run; wink's instance does not have it yet. It is
 * added ("replayed") just before a wink run that might look it up, so every run sees what it
 * would have seen. Kept per wink instance (not per coder), because the lexeme cache is the
 * instance's: every coder and whole-document tokenizer on one instance must see the same words.
 */
export class DeferredLexemes {
  /**
   * The deferred strings by their lowercase (the key a run's lookup can reach them by): the one
   * string, or a list when there are several (~185k words for half the 100k bench corpus, nearly
   * all alone under their key: a list each was as many small objects for the collector).
   */
  private readonly byLower = new Map<string, string | string[]>();
  private count = 0;
  /** Longest lowercase key, in code units: no longer substring needs looking at. */
  private longest = 0;
  /**
   * One bit per hash of a key ever added (keysHash), so that the substrings of a miss, nearly all
   * of which are no key, are ruled out by a multiply and a bit test rather than by a new string
   * and a map lookup each (on long documents of markup or code, where most chunks are misses,
   * that lookup was ~11% of a tokenising thread's CPU). A set bit only means "look it up": keys
   * taken out leave their bit, which costs a lookup, never a miss.
   */
  private readonly seen = new Int32Array(1 << (FILTER_BITS_LOG2 - 5));
  /** Strings deferred, and given back to wink, so far (figures for tests). */
  deferredEver = 0;
  replayed = 0;

  get size(): number {
    return this.count;
  }

  /** Records `word` (not a wink lexeme; `lower` is its lowercase) as deferred. */
  add(word: string, lower: string): void {
    const held = this.byLower.get(lower);
    if (held === undefined) this.byLower.set(lower, word);
    else if (typeof held === 'string') {
      if (held === word) return;
      this.byLower.set(lower, [held, word]);
    } else if (!held.includes(word)) held.push(word);
    else return;
    this.count++;
    this.deferredEver++;
    if (lower.length > this.longest) this.longest = lower.length;
    const bit = filterBit(keysHash(lower));
    this.seen[bit >>> 5]! |= 1 << (bit & 31);
  }

  /**
   * Moves to `out` every deferred string that a wink run on `chunk` could look up or add. wink
   * only ever looks up or adds substrings of the chunk and their lowercase (src/tokenizer.js,
   * recursive-tokenizer.js, cache.js `add` and the model's features), so a deferred string `d`
   * can be reached only if lowercase(d) is a substring of lowercase(chunk) made of letters of
   * wink's word class (every deferred string is such letters, and lowercasing them is per
   * character and stays in the class); only those substrings are tried.
   */
  takeReachableFrom(chunk: string, out: string[]): void {
    if (this.count === 0) return;
    const lower = chunk.toLowerCase();
    const n = lower.length;
    let i = 0;
    while (i < n) {
      if (!isWordLetter(lower.charCodeAt(i))) {
        i++;
        continue;
      }
      let end = i + 1;
      while (end < n && isWordLetter(lower.charCodeAt(end))) end++;
      for (let a = i; a < end; a++) {
        const last = Math.min(end, a + this.longest);
        let h = 0;
        for (let b = a + 1; b <= last; b++) {
          h = keysHashStep(h, lower.charCodeAt(b - 1));
          const bit = filterBit(h);
          if ((this.seen[bit >>> 5]! & (1 << (bit & 31))) !== 0) this.take(lower.slice(a, b), out);
        }
      }
      i = end;
    }
  }

  /** Moves every deferred string to `out`. */
  takeAll(out: string[]): void {
    for (const held of this.byLower.values()) pushHeld(held, out);
    this.byLower.clear();
    this.count = 0;
    this.longest = 0;
    this.seen.fill(0);
  }

  private take(key: string, out: string[]): void {
    const held = this.byLower.get(key);
    if (held === undefined) return;
    this.byLower.delete(key);
    this.count -= pushHeld(held, out);
  }
}

/** log2 of the bits in DeferredLexemes' filter: 4M bits (512 KB), ~4% of them set by 185k keys. */
const FILTER_BITS_LOG2 = 22;

/** One step of the keys' polynomial hash (base 31, 32-bit): the hash of s + c from that of s. */
function keysHashStep(h: number, c: number): number {
  return (Math.imul(h, 31) + c) | 0;
}

function keysHash(key: string): number {
  let h = 0;
  for (let i = 0; i < key.length; i++) h = keysHashStep(h, key.charCodeAt(i));
  return h;
}

/** The filter's bit for a hash: its top bits after a multiplication by 2^32/φ (Fibonacci hashing). */
function filterBit(h: number): number {
  return Math.imul(h, 0x9e3779b1) >>> (32 - FILTER_BITS_LOG2);
}

/** Appends the string or strings held under one key to `out`; how many. */
function pushHeld(held: string | string[], out: string[]): number {
  if (typeof held === 'string') {
    out.push(held);
    return 1;
  }
  for (const w of held) out.push(w);
  return held.length;
}

/** False when the model's word class could not be read: then nothing may be deferred. */
export function wordClassKnown(): boolean {
  return (WORD_LETTER ?? wordLetters()).includes(1);
}

/** True for a UTF-16 code unit of wink's word class (either case; see WORD_LETTER). */
export function isWordLetter(c: number): boolean {
  return (WORD_LETTER ?? wordLetters())[c] === 1;
}

/**
 * Each UTF-16 code unit's membership in the letter class of wink's first category test (plain
 * words, model trex.ltc[0]: `[a-z\u00C0-\u00D6\u00D8-\u00F6\u00F8-\u00FF\u0300-\u036f\u2060]`
 * with the i flag, which also lets in U+0178 and three forms of the Greek iota), read from the
 * model so it cannot drift from it. Every member lowercases to one member (checked here: else the
 * table is empty, and with it nothing is deferred, since chunk-cached-unigrams.ts reads the same
 * test).
 */
let WORD_LETTER: Uint8Array | null = null;

/**
 * WORD_LETTER, read from the model on first use rather than when this module loads: the
 * pattern tokenizer never defers a word, and loading the model's 2.9 MB JSON in each of its
 * tokenising threads only delayed their first batch.
 */
function wordLetters(): Uint8Array {
  WORD_LETTER = readWordLetters();
  return WORD_LETTER;
}

function readWordLetters(): Uint8Array {
  const table = new Uint8Array(0x10000);
  try {
    const model = peekCoreModel();
    const first = model.trex?.ltc?.[0];
    const body = first !== undefined && first[2] === 1 ? /^\^(\[[^\]]+\])\+\$$/.exec(first[0]) : null;
    if (first === undefined || body === null) return table;
    const one = new RegExp(`^${body[1]!}$`, first[1]);
    for (let c = 0; c < 0x10000; c++) if (one.test(String.fromCharCode(c))) table[c] = 1;
    for (let c = 0; c < 0x10000; c++) {
      if (table[c] !== 1) continue;
      const lower = String.fromCharCode(c).toLowerCase();
      if (lower.length !== 1 || table[lower.charCodeAt(0)] !== 1) return new Uint8Array(0x10000);
    }
  } catch {
    table.fill(0);
  }
  return table;
}

const registry = new WeakMap<WinkMethods, DeferredLexemes>();

/** The deferred words of `nlp` (one record per wink instance). */
export function deferredLexemesOf(nlp: WinkMethods): DeferredLexemes {
  let d = registry.get(nlp);
  if (d === undefined) {
    d = new DeferredLexemes();
    registry.set(nlp, d);
  }
  return d;
}

/**
 * Gives wink every deferred word of `nlp` (as plain words, so each becomes the lexeme a
 * whole-document run made of it), for code that is about to run wink on that instance without
 * the chunk cache's bookkeeping. Cheap when nothing is deferred.
 */
export function settleDeferredLexemes(nlp: WinkMethods): void {
  const d = registry.get(nlp);
  if (d === undefined || d.size === 0) return;
  const words: string[] = [];
  d.takeAll(words);
  replay(nlp, d, words);
}

/** Runs the deferred `words` through wink, separated by single spaces (each a chunk of its own). */
export function replay(nlp: WinkMethods, d: DeferredLexemes, words: readonly string[]): void {
  if (words.length === 0) return;
  d.replayed += words.length;
  nlp.readDoc(words.join(' '));
}
