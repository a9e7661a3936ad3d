import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { winkSplitsLikeThis } from '../extension/src/engine/tokenize/wink-splitter';
import { CORNER_VARIANTS, TICKETS, VARIANTS, describeVariant, makeOracle, readAllFortunes, readCsvColumn } from './support/tokenize-oracle';

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
