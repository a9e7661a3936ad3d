import { strict as assert } from 'node:assert';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import Papa from 'papaparse';
import type { WinkMethods } from 'wink-nlp';
import { TOKEN_KINDS, type TokenKind } from '../extension/src/protocol';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { createTokenizer, type TokenSettings } from '../extension/src/engine/tokenize/create-tokenizer';
import { freshWinkInstance } from '../extension/src/engine/tokenize/wink-instance';
import { winkSplitsLikeThis } from '../extension/src/engine/tokenize/wink-splitter';
import { FORTUNES_DIR, fortunesAvailable } from './corpora/fortunes';

// The chunk-cached tokenizer must give, token for token, what the plain path gives: each whole
// document through wink-nlp. wink's output depends on its lexeme cache (what it has tokenised
// before), so each comparison runs the two paths on two fresh wink instances fed the same
// documents in the same order. No expected values are written here: the plain path is the oracle.
// The checks share those two instances (see `pair`), so they must run in file order: each path
// sees exactly the documents the other saw.

const ALL_KINDS: readonly TokenKind[] = TOKEN_KINDS;

/** Every combination of the options that change what a token becomes (24 variants). */
const VARIANTS: TokenSettings[] = [];
for (const lowercase of [true, false]) {
  for (const stem of [false, true]) {
    for (const minLength of [1, 2, 3]) {
      for (const kinds of [DEFAULT_SETTINGS.tokens.kinds, ALL_KINDS]) VARIANTS.push({ lowercase, stem, minLength, kinds: [...kinds], ngrams: 1 });
    }
  }
}
const describeVariant = (v: TokenSettings): string =>
  `lowercase ${v.lowercase}, stem ${v.stem}, minLength ${v.minLength}, ${v.kinds.length === ALL_KINDS.length ? 'all kinds' : 'default kinds'}`;

/**
 * One wink instance for each path, shared by every check in this file and fed the same documents
 * in the same order (plain path on one, cached path on the other), so their lexeme caches stay in
 * step. Fresh instances per check would be cleaner but wink-eng-lite-web-model grows with each
 * instance loaded (RangeError after a few dozen).
 */
let shared: { plainNlp: WinkMethods; cachedNlp: WinkMethods; chars: number } | null = null;

/** Both paths for `settings`; `winkChars` counts the text the cached path sent to wink. */
function pair(settings: TokenSettings): { plain: (t: string) => string[]; cached: (t: string) => string[]; winkChars: () => number } {
  if (shared === null) {
    const nlp = freshWinkInstance('tokens');
    const s = { plainNlp: freshWinkInstance('tokens'), cachedNlp: nlp, chars: 0 };
    s.cachedNlp = { ...nlp, readDoc: (text: string) => ((s.chars += text.length), nlp.readDoc(text)) };
    shared = s;
  }
  const s = shared;
  const plain = createTokenizer(settings, { nlp: s.plainNlp, chunkCache: false });
  const cached = createTokenizer(settings, { nlp: s.cachedNlp });
  return { plain, cached, winkChars: () => s.chars };
}

/** Runs both paths over `docs` in order; fails on the first document where they differ. */
function assertSameOverCorpus(settings: TokenSettings, docs: readonly string[]): { winkShare: number } {
  const { plain, cached, winkChars } = pair(settings);
  let secondHalfChars = 0;
  let secondHalfWink = 0;
  for (let d = 0; d < docs.length; d++) {
    const before = winkChars();
    const got = cached(docs[d]!);
    const want = plain(docs[d]!);
    if (d >= docs.length / 2) {
      secondHalfChars += docs[d]!.length;
      secondHalfWink += winkChars() - before;
    }
    if (got.length !== want.length || got.some((t, i) => t !== want[i])) {
      assert.deepEqual(got, want, `document ${d} (${describeVariant(settings)}): ${JSON.stringify(docs[d]!.slice(0, 300))}`);
    }
  }
  return { winkShare: secondHalfWink / Math.max(1, secondHalfChars) };
}

/**
 * Every saying of every category file, raw (tabs, newlines and layout kept), entries separated
 * by lines holding a single '%'. Source: the Debian package `fortunes` (fortune-mod data files).
 */
function readAllFortunes(): string[] {
  const out: string[] = [];
  for (const f of readdirSync(FORTUNES_DIR).sort()) {
    if (f.endsWith('.dat') || f.endsWith('.u8')) continue;
    const file = path.join(FORTUNES_DIR, f);
    if (!statSync(file).isFile()) continue;
    for (const s of readFileSync(file, 'latin1').split(/\r?\n%\r?\n/)) if (s.trim() !== '' && s !== '%') out.push(s);
  }
  return out;
}

function readCsvColumn(file: string, column: string): string[] {
  const parsed = Papa.parse<Record<string, string>>(readFileSync(file, 'utf8'), { header: true, skipEmptyLines: true });
  return parsed.data.map((r) => r[column]).filter((t): t is string => typeof t === 'string');
}

const ROOT = path.join(__dirname, '..');
const TICKETS = path.join(ROOT, 'samples', 'support-tickets.csv');
const GENERATED = path.join(ROOT, 'test', 'bench', 'data', 'corpus-v1-10k-seed1.csv');

describe('tokenize: chunk-cached unigrams equal whole-document wink', function () {
  this.timeout(600_000);

  it('the installed wink-nlp splits text the way the fast path assumes (else the fast path is off)', () => {
    // Source: wink-nlp 2.4.0 src/tokenizer.js and wink-eng-lite-web-model 1.8.1 trex.helpers.splitter.
    assert.equal(winkSplitsLikeThis(), true);
  });

  describe('Debian fortunes (every saying; source: Debian package "fortunes")', () => {
    let docs: string[] = [];
    before(function () {
      if (!fortunesAvailable()) {
        console.log(`      note: ${FORTUNES_DIR} missing (Debian package "fortunes"); skipping`);
        this.skip();
      }
      docs = readAllFortunes();
    });
    for (const v of VARIANTS) {
      it(describeVariant(v), () => {
        const { winkShare } = assertSameOverCorpus(v, docs);
        // The cache must actually spare wink most of the text once warm, or this path is pointless.
        assert.ok(winkShare < 0.5, `fast path still sent ${(winkShare * 100).toFixed(0)}% of the text to wink`);
      });
    }
  });

  describe('demo corpus samples/support-tickets.csv, message column (our invented corpus: a regression check only)', () => {
    const docs = readCsvColumn(TICKETS, 'message');
    for (const v of VARIANTS) it(describeVariant(v), () => assertSameOverCorpus(v, docs));
  });

  describe('generated bench corpus test/bench/data/corpus-v1-10k-seed1.csv (test/bench/generate-corpus.mjs; a regression check)', () => {
    let docs: string[] = [];
    before(function () {
      if (!existsSync(GENERATED)) {
        console.log(`      note: ${GENERATED} not present (run test/bench/generate-corpus.mjs); skipping`);
        this.skip();
      }
      docs = readCsvColumn(GENERATED, 'text');
    });
    for (const v of VARIANTS) it(describeVariant(v), () => assertSameOverCorpus(v, docs));
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
