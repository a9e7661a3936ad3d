import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { strict as assert } from 'node:assert';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { createTermCoder, createTokenizer } from '../extension/src/engine/tokenize/create-tokenizer';
import { IdList } from '../extension/src/engine/tokenize/id-list';
import { wordUnitsByTest, wordUnitsFromRanges } from '../extension/src/engine/tokenize/word-run-coder';
import { translatePythonPattern } from '../extension/src/engine/tokenize/pattern-tokenizer';
import { UserError } from '../extension/src/engine/user-error';
import { requireSklearn } from './reference/run-sklearn';
import { assertSameTokens, base, sklearnTokensMany } from './support/sklearn-analyzer';

// tokens.tokenizer "pattern" must give the tokens scikit-learn's analyzer gives
// (CountVectorizer(...).build_analyzer(), Debian's python3-sklearn), token for token.

/**
 * Seeded text from pieces that test where Python's and JavaScript's ideas of a word character
 * could part (our choice of cases, no source): accents precomposed and decomposed (combining
 * marks are not \w in Python), CJK, Hangul, Devanagari and Thai (marks inside words), Arabic and
 * Hebrew, digits of other scripts, superscripts and fractions (No), Roman numerals (Nl),
 * underscores, apostrophes, hyphens, emoji, case pairs with special lowercasing (İ, Σ at a word's
 * end, ẞ), and odd spaces.
 */
function unicodeDocs(n: number, seed: number): string[] {
  const pieces = [
    'café', 'cafe\u0301', 'naïve', 'nai\u0308ve', 'Ångström', 'A\u030angstro\u0308m', 'Ærøskøbing', 'straße', 'STRASSE', 'ẞ', 'İstanbul', 'ΟΔΥΣΣΕΥΣ', 'Σίσυφος', 'ΣΑΣ',
    '東京', '日本語のテキスト', '中文分词', '한국어', 'हिन्दी', 'ภาษาไทย', 'العربية', 'עברית', 'Привет', 'ǅemal', 'ﬁle',
    '٣٤٥', '१२३', '１２３', 'x²', '½', 'Ⅻ', 'ⅻ', '㉑', '3.14', '1,000', '2024-01-01', 'snake_case', '__init__', '_', 'a_b',
    "don't", "it's", 'well-known', 'e-mail', 'a', 'I', 'x', 'ab', 'AB', '😀', '👍🏽', '#tag', '@user', 'https://example.com/a_b?c=1', 'user@example.com',
    '\u200b', 'a\u200db', 'x\u00ady', '\u2060',
  ];
  const seps = [' ', ' ', ' ', '  ', '\n', '\t', ', ', '. ', '; ', '', '\u00a0', '\u3000', '\u2009', '-', '/', '(', ')'];
  const random = mulberry32(seed);
  const docs: string[] = [];
  for (let d = 0; d < n; d++) {
    let s = '';
    const len = 1 + Math.floor(random() * 30);
    for (let i = 0; i < len; i++) s += pieces[Math.floor(random() * pieces.length)]! + seps[Math.floor(random() * seps.length)]!;
    docs.push(s);
  }
  return docs;
}

describe('tokenize: tokenizer "pattern" equals scikit-learn\'s analyzer', function () {
  this.timeout(300_000);
  before(() => requireSklearn());

  // Debian fortunes are compared in tokenize-pattern.slow.test.ts (~25 s).
  const unicode = unicodeDocs(3000, 20261202);

  const name = 'generated Unicode text (3,000 documents, seed 20261202)';
  let theirs: string[][][] = [];
  before(() => {
    theirs = sklearnTokensMany(unicode, [
      { lowercase: true, ngram_range: [1, 1] },
      { lowercase: false, ngram_range: [1, 2] },
    ]);
  });
  it(`${name}: default token_pattern, lowercase, unigrams`, () => {
    assertSameTokens(createTokenizer(base), theirs[0]!, unicode);
  });
  it(`${name}: default token_pattern, case kept, unigrams and bigrams`, () => {
    assertSameTokens(createTokenizer({ ...base, lowercase: false, ngrams: 2 }), theirs[1]!, unicode);
  });

  it('the default pattern\'s word-run scan (word-run-coder.ts) gives the regex path\'s terms: both cases, minLength 3, lone surrogates, astral letters', () => {
    // "(?:\\b\\w\\w+\\b)" means the default pattern but is not spelled like it, so it takes the regex
    // path; the ids of both coders must decode to the same terms, document by document.
    const docs = [...unicode, 'x\ud800y ab\udc00cd \ud835\udc9c\ud835\udcb7 \ud835\udc9c\ud835\udcb7\ud835\udcb8 \ud801\udc00\ud801\udc01z \ud83d\ude00a', 'a', '', '__ _ ab'];
    for (const options of [{ lowercase: true, minLength: 1 }, { lowercase: false, minLength: 1 }, { lowercase: true, minLength: 3 }]) {
      const settings = { ...base, ...options };
      const decode = (regexPath: boolean): string[][] => {
        const coder = createTermCoder(regexPath ? { ...settings, pattern: '(?:\\b\\w\\w+\\b)' } : settings);
        const ids = new IdList();
        const ends = new Uint32Array(docs.length);
        coder.encodeAll(docs, ids, ends, []);
        return docs.map((_, d) => Array.from(ids.array.subarray(d === 0 ? 0 : ends[d - 1], ends[d]), (id) => coder.terms[id]!));
      };
      const scanned = decode(false);
      assert.ok(scanned.some((terms) => terms.includes('\ud835\udc9c\ud835\udcb7\ud835\udcb8')), 'an astral word run is a term');
      // minLength counts code points: at 3 the two-letter astral run (4 code units) is dropped.
      assert.equal(scanned.some((terms) => terms.includes('\ud835\udc9c\ud835\udcb7')), options.minLength < 3);
      assert.deepEqual(scanned, decode(true), JSON.stringify(options));
    }
  });

  it('the word-character table from the build\'s ranges (scripts/word-ranges.mjs) is the one testing every code unit gives, and the bundle carries those ranges', async () => {
    // The reference is the scan's own test of each code unit (wordUnitsByTest), the same one the
    // regex path makes (checked against Python above); the build must change nothing but when the
    // table is made. Common practice, no source.
    const script = pathToFileURL(join(__dirname, '..', 'scripts', 'word-ranges.mjs')).href;
    const { wordRanges } = (await import(script)) as { wordRanges(): number[] };
    const ranges = wordRanges();
    assert.ok(ranges.length > 200, `only ${ranges.length / 2} ranges`);
    assert.deepEqual(wordUnitsFromRanges(ranges), wordUnitsByTest());
    // npm test builds first: the tokenising threads' bundle has the ranges written in.
    const bundle = readFileSync(join(__dirname, '..', 'dist', 'tokenize-worker.js'), 'utf8');
    const written = /wordUnitsFromRanges\(JSON\.parse\(("(?:[^"\\]|\\.)*")\)/.exec(bundle);
    assert.ok(written !== null, 'dist/tokenize-worker.js does not build the table from ranges');
    assert.deepEqual(JSON.parse(JSON.parse(written[1]!) as string), ranges);
  });

  it('user patterns in Python syntax: \\w+ with \\b, a class with \\d, a capturing group (the group is the token)', () => {
    const docs = unicode.slice(0, 500);
    const patterns = ['(?u)\\b\\w+\\b', '[\\w\\-]{3,}', '\\d+|[a-zé]{2,}', '#?(\\w\\w+)', '\\b[a-zA-Z]{3,}\\b', '\\B\\w\\w\\B'];
    const theirs = sklearnTokensMany(docs, patterns.map((token_pattern) => ({ token_pattern, lowercase: true, ngram_range: [1, 1] })));
    patterns.forEach((pattern, i) => assertSameTokens(createTokenizer({ ...base, pattern }), theirs[i]!, docs));
  });

  it('translatePythonPattern: \\w is [\\p{L}\\p{N}_], a leading (?u) is dropped; bad patterns are UserErrors naming tokens.pattern', () => {
    assert.equal(translatePythonPattern('(?u)\\w\\w+'), '[\\p{L}\\p{N}_][\\p{L}\\p{N}_]+');
    assert.equal(translatePythonPattern('[\\w\\-]+'), '[\\p{L}\\p{N}_\\-]+');
    assert.throws(() => createTokenizer({ ...base, pattern: '(' }), (e: unknown) => e instanceof UserError && /^tokens\.pattern: /.test(e.message));
    assert.throws(() => createTokenizer({ ...base, pattern: '(a)(b)' }), (e: unknown) => e instanceof UserError && /2 capturing groups/.test(e.message));
    assert.throws(() => createTokenizer({ ...base, pattern: '(?i)abc' }), (e: unknown) => e instanceof UserError && /inline flags/.test(e.message));
  });

  it('minLength and stem apply to pattern tokens as to wink words; kinds do not', () => {
    const t = createTokenizer({ ...base, minLength: 3, stem: true, kinds: ['number'] });
    // Porter stems (wink's stemmer): "running" → "run", "cats" → "cat"; "ab" is under 3 code points.
    assert.deepEqual(t('Running cats ab 2024'), ['run', 'cat', '2024']);
  });
});
