import { ABSENT, ChunkTable, FNV_OFFSET, FNV_PRIME } from './chunk-table';
import { IdList } from './id-list';
import { Vocabulary, type TermCoder } from './term-coder';

/**
 * The coder of scikit-learn's default token pattern, `(?u)\b\w\w+\b`, for unigrams: its matches
 * are exactly the maximal runs of word characters (Python's Unicode `\w`: letters, numbers, "_",
 * by code point) of two code points or more — a match starts where a run starts and `\w+` is
 * greedy up to the run's end, while a run of one code point matches nowhere. So instead of a
 * regular expression, a substring per token and a `Map` lookup per token (the larger part of the
 * regex path's time), one scan classifies code units through a table, hashes each run as it goes,
 * and looks the run up in place (chunk-table.ts); only a term met for the first time in a while
 * becomes a string. The terms equal the regex path's (pattern-tokenizer.ts), which equals
 * scikit-learn's `build_analyzer()`; test/tokenize-pattern.test.ts compares all three.
 *
 * `minLength` drops runs shorter than that many code points (as the regex path does after it).
 */
export function wordRunCoder(lowercase: boolean, minLength: number): TermCoder {
  warmUp();
  return new WordRunCoder(lowercase, Math.max(2, minLength));
}

let warmedUp = false;

/**
 * Runs a coder of its own, once per thread, over a few texts that take every branch of the scan
 * and of the table (a new and a known run, short and long keys, a run too short, a word character
 * outside the ASCII range, a word character and an emoji beyond the BMP, a lone surrogate; and,
 * with a table of 16 slots, probing past a taken slot, the table growing and its long keys'
 * store growing), so that when the first real batch makes the scan hot, the optimising compiler
 * sees feedback for all of them and the table's fields already replaced once. Compiled before a
 * branch had run, the scan was deoptimised when a batch first took it ("insufficient type
 * feedback" in --trace-deopt: the first probe past a slot, the first growth, the first astral
 * character), or when a growth replaced a field the code had taken as constant ("code
 * dependencies"), and compiled again: 9 compiles of the scan in the two tokenising threads of a
 * 100k pattern review, ~70-110 ms each on V8's helper threads. The coder and its table are
 * dropped; the module's cache of astral code points keeps what it learnt, which is the same for
 * every text.
 */
function warmUp(): void {
  if (warmedUp) return;
  warmedUp = true;
  const coder = new WordRunCoder(true, 2, 16);
  const out = new IdList(16);
  const ends = new Uint32Array(WARM_UP_TEXTS.length);
  // Twice: the second time every run is known.
  for (let round = 0; round < 2; round++) {
    out.length = 0;
    coder.encodeAll(WARM_UP_TEXTS, out, ends);
  }
}

const WARM_UP_TEXTS: readonly string[] = [
  'The cat and the hat, a b c: x_1 42 3.14 internationalisation internationalisation',
  'Caf\u00e9 na\u00efve \u00c9cole \u03b1\u03b2\u03b3 \u4e2d\u6587 over-the-top',
  'ab\ud835\udc00cd \ud835\udc00\ud835\udc01 x\ud83d\ude00y \ud83d\ude00 z\ud800 \udc00q w',
  'ends with a lone \ud800',
];

/**
 * The coder's state. The scan of one text is a function of its own (`encodeRuns`) that gets
 * what it reads as arguments, and the rare work (a term met for the first time, stored in the
 * table without hashing it again or comparing keys on the way to its slot) is a call out of it.
 * Written as one closure over the same state, with the miss path and the table's insertion
 * inline, the same scan took ~12% more CPU (half the 100k bench corpus, one thread: median 946
 * against 829 ms over ten alternating passes; 1,060 against 920 ms in fresh processes).
 */
class WordRunCoder implements TermCoder {
  private readonly vocabulary = new Vocabulary();
  // A cache in front of the vocabulary: when it starts over (a bound on its memory), runs are
  // found through the vocabulary again and get the ids they had.
  private readonly table: ChunkTable;
  // Until the table first starts over, it holds every term met so far (each is stored as soon as
  // it gets its id), so a run it lacks is a new term: appended without a look-up in the vocabulary.
  private tableHoldsAll = true;
  private readonly units = wordUnits();
  readonly terms: readonly string[] = this.vocabulary.terms;
  readonly longRunsCut = 0;

  constructor(
    private readonly lowercase: boolean,
    /** Fewest code points a run needs to be a token (2 or more). */
    private readonly shortest: number,
    tableCapacity?: number,
  ) {
    this.table = new ChunkTable(undefined, tableCapacity);
  }

  encodeAll(texts: readonly string[], out: IdList, docEnds: Uint32Array): void {
    for (let d = 0; d < texts.length; d++) {
      const s = this.lowercase ? texts[d]!.toLowerCase() : texts[d]!;
      out.reserve(s.length >>> 2);
      encodeRuns(s, this.units, this.table, this.shortest, this, out);
      docEnds[d] = out.length;
    }
  }

  /** The id of s[start, end) (FNV-1a hash `hash`), a run the table has just been found to lack. */
  idOfNew(s: string, start: number, end: number, hash: number): number {
    const term = s.slice(start, end);
    const id = this.tableHoldsAll ? this.vocabulary.append(term) : this.vocabulary.id(term);
    if (!this.table.insertAbsent(s, start, end, hash, id)) this.tableHoldsAll = false;
    return id;
  }
}

/** Appends the id of each word run of `s` that is at least `shortest` code points long to `out`. */
function encodeRuns(s: string, bmp: Uint8Array, table: ChunkTable, shortest: number, coder: WordRunCoder, out: IdList): void {
  const n = s.length;
  let i = 0;
  while (i < n) {
    let c = s.charCodeAt(i);
    let kind = bmp[c]!;
    if (kind === 0) {
      i++;
      continue;
    }
    if (kind === SURROGATE && !isAstralWord(s, i)) {
      i += isPair(s, i) ? 2 : 1;
      continue;
    }
    // A run starts at i: hash its code units up to its end; its code points are its code
    // units less one per surrogate pair.
    const start = i;
    let h = FNV_OFFSET;
    let pairs = 0;
    for (;;) {
      if (kind === WORD) {
        h = Math.imul(h ^ c, FNV_PRIME);
        i++;
      } else if (kind === SURROGATE && isAstralWord(s, i)) {
        h = Math.imul(h ^ c, FNV_PRIME);
        h = Math.imul(h ^ s.charCodeAt(i + 1), FNV_PRIME);
        i += 2;
        pairs++;
      } else {
        break;
      }
      if (i >= n) break;
      c = s.charCodeAt(i);
      kind = bmp[c]!;
    }
    if (i - start - pairs < shortest) continue;
    let id = table.get(s, start, i, h);
    if (id === ABSENT) id = coder.idOfNew(s, start, i, h);
    out.push(id);
  }
}

/** Values of the code unit table: not a word character, a word character, a surrogate. */
const WORD = 1;
const SURROGATE = 2;

/** Python's `\w` on str patterns as pattern-tokenizer.ts translates it. */
const WORD_POINT = /^[\p{L}\p{N}_]$/u;

/**
 * The word code units worked out at build time by the same test as wordUnitsByTest
 * (scripts/word-ranges.mjs, put in place by esbuild's `define`): [start, end) pairs as JSON text (a
 * string: an array there would be a module of its own, initialised from every module of the
 * bundle). Absent when running from source (tests under tsx), where the table is made by the test
 * itself.
 */
declare const LOUDWORD_WORD_RANGES: string | undefined;

let units: Uint8Array | null = null;

/**
 * For each UTF-16 code unit: 1 when it is a word character alone, 2 for a surrogate, else 0.
 * From the build's ranges where there are some: testing all 65,536 code units took ~25 ms of each
 * tokenising thread's CPU as it started, before its first batch.
 */
function wordUnits(): Uint8Array {
  if (units !== null) return units;
  units = typeof LOUDWORD_WORD_RANGES === 'undefined' ? wordUnitsByTest() : wordUnitsFromRanges(JSON.parse(LOUDWORD_WORD_RANGES) as number[]);
  return units;
}

/** wordUnits' table from [start, end) pairs of word code units (none of them a surrogate). */
export function wordUnitsFromRanges(ranges: readonly number[]): Uint8Array {
  const t = new Uint8Array(0x10000);
  t.fill(SURROGATE, 0xd800, 0xe000);
  for (let r = 0; r + 1 < ranges.length; r += 2) t.fill(WORD, ranges[r]!, ranges[r + 1]!);
  return t;
}

/** wordUnits' table by testing every code unit against `WORD_POINT`. */
export function wordUnitsByTest(): Uint8Array {
  const t = new Uint8Array(0x10000);
  for (let c = 0; c < 0x10000; c++) {
    if (c >= 0xd800 && c <= 0xdfff) t[c] = SURROGATE;
    else if (WORD_POINT.test(String.fromCharCode(c))) t[c] = WORD;
  }
  return t;
}

/** s[i] is a high surrogate followed by a low one. */
function isPair(s: string, i: number): boolean {
  const c = s.charCodeAt(i);
  if (c < 0xd800 || c > 0xdbff || i + 1 >= s.length) return false;
  const d = s.charCodeAt(i + 1);
  return d >= 0xdc00 && d <= 0xdfff;
}

/** Astral code points known to be word characters (true) or not (false), as met. */
const astral = new Map<number, boolean>();

/** s[i] starts a surrogate pair whose code point is a word character (a lone surrogate is not). */
function isAstralWord(s: string, i: number): boolean {
  if (!isPair(s, i)) return false;
  const point = s.codePointAt(i)!;
  let word = astral.get(point);
  if (word === undefined) {
    word = WORD_POINT.test(String.fromCodePoint(point));
    astral.set(point, word);
  }
  return word;
}
