import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import type { WinkMethods } from 'wink-nlp';
import { createTokenizer } from '../extension/src/engine/tokenize/create-tokenizer';
import { winkSplitsLikeThis } from '../extension/src/engine/tokenize/wink-splitter';
import { ALL_KINDS, CORNER_VARIANTS, TICKETS, VARIANTS, describeVariant, makeOracle, readAllFortunes, readCsvColumn } from './support/tokenize-oracle';
import { standInTokens } from './support/stand-in-wink';

// The chunk-cached tokenizer must give, token for token, what the plain path gives: each whole
// document through wink-nlp (see test/support/tokenize-oracle.ts). No expected values are written
// here: the plain path is the oracle. The checks share one oracle, so they run in file order.
// This file covers two opposite corners of the 24 option variants on the real corpora and all 24
// on generated strings; tokenize-chunk-cache.slow.test.ts sweeps all 24 over every corpus.

const { pair, assertSameOverCorpus } = makeOracle();

describe('tokenize: chunk-cached unigrams equal whole-document wink', function () {
  this.timeout(600_000);

  it('the installed wink-nlp splits text the way the fast path assumes (else the fast path is off)', () => {
    // Source: wink-nlp 2.4.0 src/tokenizer.js and wink-eng-lite-web-model 1.8.1 trex.helpers.splitter.
    assert.equal(winkSplitsLikeThis(), true);
  });

  describe('Debian fortunes (every saying; source: Debian package "fortunes")', () => {
    let docs: string[] = [];
    before(() => {
      docs = readAllFortunes();
    });
    for (const v of CORNER_VARIANTS) {
      it(describeVariant(v), () => {
        const { winkShare } = assertSameOverCorpus(v, docs);
        // The cache must actually spare wink most of the text once warm, or this path is pointless.
        assert.ok(winkShare < 0.5, `fast path still sent ${(winkShare * 100).toFixed(0)}% of the text to wink`);
      });
    }
  });

  describe('demo corpus samples/support-tickets.csv, message column (our invented corpus: a regression check only)', () => {
    const docs = readCsvColumn(TICKETS, 'message');
    for (const v of CORNER_VARIANTS) it(describeVariant(v), () => assertSameOverCorpus(v, docs));
  });

  describe('fast-check strings from tricky pieces (2000 runs per variant, fixed seed)', () => {
    // Pieces chosen for wink rules that split, merge or type text (common practice, no source):
    // contractions and possessives, URLs, e-mails, hashtags, mentions, emoji and emoticons,
    // numbers with separators, times, ordinals, decades, currency, hyphens and dashes,
    // abbreviations, quotes, punctuation runs, CJK and other scripts, odd Unicode spaces.
    const pieces = [
      "don't", "Don't", "can't", "won't", "ain't", "I'm", "y'all", "o'clock", "it's", "we'd", 'cannot', "ABC's", "John's", "people's", "people's,", "'s", "n't",
      'https://example.com/a?b=1', 'http://x.org', 'www.foo.org', 'user@example.com', 'a.b@c.co.uk', '#Hashtag', '#tag1', '@user', '@', '#',
      '😀', '👍🏽', '❤️', '🇫🇷', ':)', ':-(', '<3', ';-)', '\\o/',
      '1,000,000', '3.5', '-5', '+7', '3/4', '5pm', '10:30', '10:30am', '1st', '22nd', '2020s', "'90s", '$20', '$', '€5', 'US$', '50%', '%', '12-34',
      'well-known', 'e-mail', 'anti-war', 'co-op', 'state-of-the-art', '—', '–', '--', '-', 'x-ray',
      'U.S.A.', 'U.S.', 'e.g.', 'i.e.', 'Mr.', 'a.m.', 'p.m.', 'etc.', 'No.', 'a.',
      '"', "'", '“', '”', '‘', '’', '«', '»', '(', ')', '[', ']', '{', '}',
      '...', '…', '!!!', '?!', ',', ';', ':', '.', '!', '?', '/', '&', '+', '=', '*', '|', '~', '^', '½', '≠', '→', '§',
      '東京', '日本語テキスト', '한국어', 'Привет', 'Ελληνικά', 'مرحبا', 'café', 'naïve', 'e\u0301', 'Ä', 'İstanbul',
      'the', 'The', 'THE', 'Running', 'cats', 'a', 'I', 'x', 'hello', 'world', 'Hello', 'stemming', 'generously',
    ];
    const separators = ['', '', ' ', ' ', ' ', '  ', '\t', '\n', '\r\n', '\n\n', '\u00a0', '\u2003', '\u202f', '\u3000', '\u2028', '\u000b', '\u200b', '\ufeff', ' \t '];
    const text = fc
      .array(fc.tuple(fc.constantFrom(...pieces), fc.constantFrom(...separators)), { minLength: 0, maxLength: 14 })
      .map((parts) => parts.map(([p, s]) => p + s).join(''));
    for (const v of VARIANTS) {
      it(describeVariant(v), () => {
        const { plain, cached } = pair(v);
        fc.assert(
          fc.property(text, (s) => {
            assert.deepEqual(cached(s), plain(s));
          }),
          { numRuns: 2000, seed: 20261202 },
        );
      });
    }
  });
});

describe('tokenize: chunk-cached unigrams, conditional entries for a word with a trailing sign', () => {
  // wink-nlp 2.4 splits "word." as "word" + "." only while "word." is not a lexeme
  // (src/tokenizer.js processWordRP; see chunk-cached-unigrams.ts point 4). With the English model
  // we found no text that makes such a string a lexeme later, so this stand-in wink, whose rules
  // we choose, does: "«rest" emits "«" and "rest" whole, and an emitted token becomes a lexeme
  // with its lowercase (wink's cache.add). The plain path on a second stand-in is the oracle.
  function standInWink(): WinkMethods {
    const lexemes = new Set<string>(['.', ',', '«']);
    const its = { normal: Symbol('normal'), type: Symbol('type'), precedingSpaces: Symbol('precedingSpaces'), contractionFlag: Symbol('contractionFlag') };
    const chunkTokens = (chunk: string): string[] => {
      if (lexemes.has(chunk)) return [chunk];
      if (chunk.length > 2 && /^[a-z]+[.,]$/i.test(chunk)) return [chunk.slice(0, -1), chunk.slice(-1)];
      if (chunk.startsWith('«') && chunk.length > 1) return ['«', chunk.slice(1)];
      return [chunk];
    };
    const readDoc = (text: string) => {
      const { tokens, spaces } = standInTokens(text, chunkTokens, (chunk) => {
        for (const t of chunk) lexemes.add(t).add(t.toLowerCase());
      });
      const out = (f?: unknown): unknown[] =>
        f === its.normal ? tokens.map((t) => t.toLowerCase()) : f === its.type ? tokens.map((t) => (/[a-z]/i.test(t) ? 'word' : 'punctuation')) : f === its.precedingSpaces ? spaces : f === its.contractionFlag ? tokens.map(() => false) : tokens;
      return { isLexeme: (t: string) => lexemes.has(t), tokens: () => ({ out }) };
    };
    return { its, readDoc } as unknown as WinkMethods;
  }

  it('an entry is dropped once a wink run makes its chunk a lexeme, so the chunk is split as wink would split it then', () => {
    const settings = { ...CORNER_VARIANTS[0]!, kinds: [...ALL_KINDS] };
    const plain = createTokenizer(settings, { nlp: standInWink(), chunkCache: false });
    const cached = createTokenizer(settings, { nlp: standInWink() });
    const docs = ['abc. abc.', 'abc, xy «abc.', 'abc. Abc,', 'abc.', 'Abc, «ABC, abc, Abc,'];
    const want = [['abc', '.', 'abc', '.'], ['abc', ',', 'xy', '«', 'abc.'], ['abc.', 'abc', ','], ['abc.'], ['abc', ',', '«', 'abc,', 'abc,', 'abc', ',']];
    docs.forEach((d, i) => {
      const expected = plain(d);
      assert.deepEqual(expected, want[i], `the stand-in itself, document ${i}`);
      assert.deepEqual(cached(d), expected, `document ${i}: ${d}`);
    });
  });
});
