import { strict as assert } from 'node:assert';
import type { WinkMethods } from 'wink-nlp';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { mulberry32, randomBelow } from '../extension/src/engine/random/seeded-random';
import { createTermCoder, createTokenizer, type TokenSettings } from '../extension/src/engine/tokenize/create-tokenizer';
import { deferredLexemesOf } from '../extension/src/engine/tokenize/deferred-lexemes';
import { batchEncoding } from '../extension/src/engine/tokenize/encode-batch';
import { freshWinkInstance } from '../extension/src/engine/tokenize/wink-instance';
import { ALL_KINDS } from './support/tokenize-oracle';
import { standInTokens } from './support/stand-in-wink';

// chunk-cached-unigrams.ts point 7: a plain word that is not a wink lexeme is tokenised without
// wink, and its addition to wink's lexemes is deferred until a wink run could look it up. The
// oracle is each whole document through wink on a second fresh instance fed the same documents
// in the same order (test/support/tokenize-oracle.ts explains why). The documents are random
// (seeded) mixtures built to hit the proof's edges (common practice, no source for the pieces):
// a small alphabet so that words recur in other shapes and cases, with letters of wink's word
// class that are easy to miss (ÿ/Ÿ, the Greek iota the i flag lets in, combining marks, the word
// joiner); the same words inside chunks wink splits by lookups ("(w", "w's", "w-v", "w.v",
// "w5", "#w", URLs); signs that lowercase into letters (KELVIN SIGN, ANGSTROM SIGN, İ); words
// whose lowercase wink spells another way ("Dyke" → "dike"); contractions; numbers.

const LETTERS = ['a', 'b', 'c', 'd', 'e', 'A', 'B', 'E', 'é', 'É', 'ÿ', 'Ÿ', 'ι', 'Ι', 'k', 'K', 's', 'S', 'i', 'n', 't', 'o', '\u0301', '\u2060'];
const KNOWN = ['the', 'The', 'THE', 'Dyke', 'dyke', 'DYKE', "don't", "Don't", 'cannot', 'ca', 'wo', 'USD', 'usd', 'am', 'pm', 'st', 'th', 'it', 'is', 'Kelvin', 'kelvin', 'istanbul'];
const SIGNS = [',', '.', ')', '!', '?', ':', '/', ';', '"', '…', '’'];
const SEPARATORS = [' ', ' ', ' ', '  ', '\n', '\t', '\u00a0', '\u3000', '\r\n'];

function randomDocs(seed: number, count: number): string[] {
  const random = mulberry32(seed);
  const pick = <T>(xs: readonly T[]): T => xs[randomBelow(random, xs.length)]!;
  const word = (): string => {
    if (random() < 0.15) return pick(KNOWN);
    let w = '';
    const n = 1 + randomBelow(random, 4);
    for (let i = 0; i < n; i++) w += pick(LETTERS);
    return w;
  };
  const shapes: ((w: string, v: string) => string)[] = [
    (w) => w, (w) => w, (w) => w, (w) => w.toUpperCase(), (w) => w.toLowerCase(),
    (w) => w + pick(SIGNS), (w) => w + pick(SIGNS), (w) => `(${w}`, (w) => `"${w}"`, (w) => `${w}'s`, (w) => `${w}’s`,
    (w, v) => `${w}-${v}`, (w, v) => `${w}.${v}`, (w, v) => `${w}.${v}.`, (w, v) => w + v, (w) => `${w}5`, (w) => `5${w}`,
    (w) => `#${w}`, (w) => `@${w}`, (w) => `http://${w}.com/${w}`, (w) => `\u212A${w}`, (w) => `\u212B${w}`, (w) => `İ${w}`,
    (w) => `${w}n't`, (w) => `${w}...`, (w) => `${w}--`, () => String(randomBelow(random, 10000)), () => `${randomBelow(random, 100)},`,
  ];
  const docs: string[] = [];
  for (let d = 0; d < count; d++) {
    let text = '';
    const n = randomBelow(random, 16);
    for (let i = 0; i < n; i++) text += pick(shapes)(word(), word()) + pick(SEPARATORS);
    docs.push(text);
  }
  return docs;
}

function countsOf(terms: readonly string[]): Map<string, number> {
  const m = new Map<string, number>();
  for (const t of terms) m.set(t, (m.get(t) ?? 0) + 1);
  return m;
}

const VARIANTS: TokenSettings[] = [
  { ...DEFAULT_SETTINGS.tokens, kinds: [...DEFAULT_SETTINGS.tokens.kinds], ngrams: 1 },
  { lowercase: false, stem: true, minLength: 1, kinds: [...ALL_KINDS], ngrams: 1 },
];

describe('tokenize: plain words tokenised without wink (deferred lexemes) equal whole-document wink', function () {
  this.timeout(300_000);

  VARIANTS.forEach((settings, v) => {
    it(`3,000 random documents in batches of 1 to 300 (lowercase ${settings.lowercase}, ${settings.kinds.length} kinds): same terms in each document`, () => {
      const docs = randomDocs(20261202 + v, 3000);
      const nlp = freshWinkInstance('tokens');
      const encode = batchEncoding(createTermCoder(settings, { nlp }));
      const plain = createTokenizer(settings, { nlp: freshWinkInstance('tokens'), chunkCache: false });
      const random = mulberry32(7 + v);
      const terms: string[] = [];
      for (let start = 0; start < docs.length; ) {
        const batch = docs.slice(start, start + 1 + randomBelow(random, 300));
        const b = encode(batch);
        terms.push(...b.newTerms);
        let k = 0;
        batch.forEach((text, d) => {
          const got = new Map<string, number>();
          for (; k < b.rowEnds[d]!; k++) got.set(terms[b.cols[k]!]!, b.counts[k]!);
          const want = plain(text);
          const where = `document ${start + d}: ${JSON.stringify(text)}`;
          assert.equal(b.tokens[d], want.length, where);
          assert.deepEqual(got, countsOf(want), where);
        });
        start += batch.length;
      }
      // The shortcut must have been taken, and its replay needed, or this checks nothing new.
      const deferred = deferredLexemesOf(nlp);
      assert.ok(deferred.deferredEver > 1000, `only ${deferred.deferredEver} words deferred`);
      assert.ok(deferred.replayed > 50, `only ${deferred.replayed} deferred words replayed`);
    });

    it(`3,000 random documents one at a time (lowercase ${settings.lowercase}, ${settings.kinds.length} kinds): the same terms in the same order`, () => {
      const docs = randomDocs(41 + v, 3000);
      const nlp = freshWinkInstance('tokens');
      const cached = createTokenizer(settings, { nlp });
      const plain = createTokenizer(settings, { nlp: freshWinkInstance('tokens'), chunkCache: false });
      docs.forEach((text, d) => assert.deepEqual(cached(text), plain(text), `document ${d}: ${JSON.stringify(text)}`));
      assert.ok(deferredLexemesOf(nlp).replayed > 50);
    });
  });

  it('a whole-document run on an instance first gives wink the words a chunk-cached coder deferred there', () => {
    const settings = VARIANTS[0]!;
    const nlp = freshWinkInstance('tokens');
    const cached = createTokenizer(settings, { nlp });
    const plainSame = createTokenizer(settings, { nlp, chunkCache: false });
    const oracle = createTokenizer(settings, { nlp: freshWinkInstance('tokens'), chunkCache: false });
    const docs = randomDocs(99, 600);
    docs.forEach((text, d) => {
      const tokenize = d % 3 === 2 ? plainSame : cached;
      assert.deepEqual(tokenize(text), oracle(text), `document ${d}: ${JSON.stringify(text)}`);
    });
    assert.equal(deferredLexemesOf(nlp).size, 0, 'the last document went through wink whole, after every deferred word');
  });
});

describe('tokenize: deferred words, the two guards, on a stand-in wink whose word types depend on order', () => {
  // With the English model no text we found makes a plain word's type depend on when it became a
  // lexeme, so this stand-in wink, whose rules we choose, does (as the stand-in of
  // tokenize-chunk-cache.test.ts does for point 4): a new plain word becomes a lexeme of type
  // "word" (as in wink), but "5abc" emits "5" and "abc" typed "symbol" when "abc" is new; a
  // lexeme keeps the type it was first added with, and its lowercase is added with it (wink's
  // cache.add). The settings keep words and numbers only, so the type decides whether "abc" is
  // counted. The plain path on a second stand-in is the oracle.
  function standInWink(): WinkMethods {
    const types = new Map<string, string>([['5', 'number']]);
    const add = (t: string, type: string): string => {
      if (!types.has(t)) types.set(t, type);
      if (!types.has(t.toLowerCase())) types.set(t.toLowerCase(), type);
      return types.get(t)!;
    };
    const chunkTokens = (chunk: string): [string, string][] => {
      if (types.has(chunk)) return [[chunk, types.get(chunk)!]];
      const numbered = /^(\d+)([a-z]+)$/i.exec(chunk);
      if (numbered !== null) return [[numbered[1]!, add(numbered[1]!, 'number')], [numbered[2]!, add(numbered[2]!, 'symbol')]];
      return [[chunk, add(chunk, /^[a-z]+$/i.test(chunk) ? 'word' : 'symbol')]];
    };
    const its = { normal: Symbol('normal'), type: Symbol('type'), precedingSpaces: Symbol('precedingSpaces'), contractionFlag: Symbol('contractionFlag') };
    const readDoc = (text: string) => {
      const { tokens, spaces } = standInTokens(text, chunkTokens);
      const out = (f?: unknown): unknown[] =>
        f === its.normal ? tokens.map(([t]) => t.toLowerCase()) : f === its.type ? tokens.map(([, type]) => type) : f === its.precedingSpaces ? spaces : f === its.contractionFlag ? tokens.map(() => false) : tokens.map(([t]) => t);
      return { isLexeme: (t: string) => (types.has(t) ? [1] : null), tokens: () => ({ out }) };
    };
    return { its, readDoc } as unknown as WinkMethods;
  }
  const settings: TokenSettings = { lowercase: true, stem: false, minLength: 1, kinds: ['word', 'number'], ngrams: 1 };

  for (const [name, docs] of [
    ['a deferred word is given to wink before a later chunk that looks it up ("abc" then "5abc": "abc" stays a word)', ['abc xy', 'q 5abc', 'ABC 5xy']],
    ['a word is not deferred while an earlier pending chunk could add it ("5abc" then "abc": "abc" is a symbol)', ['5abc abc', 'r 5Rs rs RS', 'abc']],
  ] as const) {
    it(name, () => {
      const encode = batchEncoding(createTermCoder(settings, { nlp: standInWink() }));
      const plain = createTokenizer(settings, { nlp: standInWink(), chunkCache: false });
      const b = encode([...docs]);
      let k = 0;
      docs.forEach((text, d) => {
        const got = new Map<string, number>();
        for (; k < b.rowEnds[d]!; k++) got.set(b.newTerms[b.cols[k]!]!, b.counts[k]!);
        assert.deepEqual(got, countsOf(plain(text)), `document ${d}: ${text}`);
      });
    });
  }
});
