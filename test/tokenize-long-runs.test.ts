import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import type { WinkMethods } from 'wink-nlp';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { buildCountMatrix } from '../extension/src/engine/matrix/build-count-matrix';
import { startReview } from '../extension/src/engine/review/start-review';
import { createTokenizer, type TokenSettings } from '../extension/src/engine/tokenize/create-tokenizer';
import { cutLongRuns, cutRun, MAX_PIECE, MAX_RUN } from '../extension/src/engine/tokenize/long-runs';
import { freshWinkInstance } from '../extension/src/engine/tokenize/wink-instance';
import { arrayCorpusSource } from './reference/array-corpus-source';
import { ALL_KINDS, makeOracle } from './support/tokenize-oracle';

// A run without spaces (a base64 blob, a minified line) costs wink-nlp time quadratic in its
// length, so runs longer than MAX_RUN are cut into pieces of at most MAX_PIECE before wink sees
// them. The bound is checked by what reaches wink (counts and lengths), never by a timer.

const tokens: TokenSettings = { ...DEFAULT_SETTINGS.tokens, kinds: [...DEFAULT_SETTINGS.tokens.kinds], ngrams: 1 };

/** Seeded base64-looking text (letters, digits, + and /): the worst case measured for wink. */
function base64Blob(length: number, seed = 7): string {
  const alphabet = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
  let x = seed;
  let s = '';
  for (let i = 0; i < length; i++) {
    x = (Math.imul(x, 1103515245) + 12345) >>> 0;
    s += alphabet[(x >>> 8) % 64];
  }
  return s;
}

/** A wink instance that records the longest run without spaces and the characters it was given. */
function watchedWink(): { nlp: WinkMethods; longestRun: () => number; chars: () => number } {
  const nlp = freshWinkInstance('tokens');
  let longest = 0;
  let chars = 0;
  const watched: WinkMethods = {
    ...nlp,
    readDoc: (text: string) => {
      chars += text.length;
      for (const run of text.split(/[\s\u00a0\u2002-\u2005\u2009\u200a\u202f\u205f]+/)) longest = Math.max(longest, run.length);
      return nlp.readDoc(text);
    },
  };
  return { nlp: watched, longestRun: () => longest, chars: () => chars };
}

describe('tokenize: over-long runs without spaces are cut before wink sees them', function () {
  this.timeout(120_000);

  it('cutRun gives pieces of at most MAX_PIECE that join back to the run, cut after ASCII punctuation when there is some, never inside a surrogate pair', () => {
    // Property check (fast-check, fixed seed); the rule is ours (common practice, no source).
    const piece = fc.constantFrom('a', 'Z', '7', '+', '/', '=', ';', '(', 'é', '東', '😀', '_');
    fc.assert(
      fc.property(fc.array(piece, { minLength: MAX_RUN + 1, maxLength: 3000 }), (parts) => {
        const run = parts.join('');
        const pieces = cutRun(run);
        assert.equal(pieces.join(''), run);
        for (const p of pieces) {
          assert.ok(p.length >= 1 && p.length <= MAX_PIECE, `piece of ${p.length}`);
          const last = p.charCodeAt(p.length - 1);
          assert.ok(!(last >= 0xd800 && last <= 0xdbff), 'a piece ends in a high surrogate');
        }
      }),
      { numRuns: 200, seed: 20261202 },
    );
    // Minified code keeps its identifiers and numbers whole: every cut falls after punctuation.
    const minified = Array.from({ length: 200 }, (_, i) => `alpha${i}=beta.gamma(${i});`).join('');
    assert.ok(minified.length > MAX_RUN);
    for (const p of cutRun(minified).slice(0, -1)) assert.match(p, /[^A-Za-z0-9]$/);
  });

  it('text whose runs are at most MAX_RUN is passed through unchanged: a 1,000-character URL stays one token', () => {
    const url = `https://example.com/${'a'.repeat(MAX_RUN - 'https://example.com/'.length)}`;
    assert.equal(url.length, MAX_RUN);
    assert.deepEqual(cutLongRuns(`see ${url} now`), { text: `see ${url} now`, runs: 0 });
    const t = createTokenizer({ ...tokens, kinds: [...ALL_KINDS] });
    assert.deepEqual(t(`see ${url} now`), ['see', url, 'now']);
    assert.equal(t.longRunsCut, 0);
    // One character more and the run is cut (and counted).
    const cut = cutLongRuns(`see ${url}b now`);
    assert.equal(cut.runs, 1);
    assert.ok(cut.text.length > url.length + 9);
  });

  for (const [name, chunkCache] of [['chunk-cached path', true], ['whole-document path', false]] as const) {
    it(`${name}: a 200 KB base64 run reaches wink in pieces of at most ${MAX_PIECE} characters, counted once`, () => {
      const blob = base64Blob(200_000);
      const watch = watchedWink();
      const t = createTokenizer(tokens, { nlp: watch.nlp, chunkCache });
      const terms = t(`header words ${blob} trailing words`);
      assert.equal(t.longRunsCut, 1);
      assert.ok(watch.longestRun() <= MAX_PIECE, `wink saw a run of ${watch.longestRun()} characters`);
      // Each piece costs at most one extra separator: the text wink saw is the run and ~1/128 more.
      assert.ok(watch.chars() <= blob.length * (1 + 2 / MAX_PIECE) + 100, `wink was given ${watch.chars()} characters`);
      assert.deepEqual(terms.slice(0, 2), ['header', 'words']);
      assert.deepEqual(terms.slice(-2), ['trailing', 'words']);
    });
  }

  it('the chunk-cached path equals whole-document wink on text with over-long runs (fast-check, fixed seed)', () => {
    // Source of truth: wink-nlp on the whole document after cutLongRuns (the plain path).
    const { pair } = makeOracle();
    const { plain, cached } = pair({ ...tokens, kinds: [...ALL_KINDS], minLength: 1 });
    const word = fc.constantFrom('the', 'data', "don't", 'x=1;', 'https://example.com/a', '3.5', '😀', 'café');
    const blob = fc.tuple(fc.integer({ min: 900, max: 2600 }), fc.integer({ min: 1, max: 1e6 })).map(([n, seed]) => base64Blob(n, seed));
    const minified = fc.integer({ min: 60, max: 200 }).map((n) => Array.from({ length: n }, (_, i) => `f${i}(a,b);`).join(''));
    const text = fc.array(fc.oneof(word, word, blob, minified), { maxLength: 8 }).map((parts) => parts.join(' '));
    fc.assert(
      fc.property(text, (s) => {
        assert.deepEqual(cached(s), plain(s));
      }),
      { numRuns: 150, seed: 20261202 },
    );
  });

  it('buildCountMatrix notes how many runs were cut and names the first lines', async () => {
    const rows = [
      { text: 'plain words here', label: null, line: 2 },
      { text: `a blob ${base64Blob(5000)} in a ticket and ${base64Blob(3000, 9)}`, label: null, line: 3 },
      { text: 'more plain words', label: null, line: 4 },
      { text: `x ${base64Blob(1500, 11)}`, label: null, line: 9 },
    ];
    const built = await buildCountMatrix(arrayCorpusSource(rows), tokens, { workers: 0, batchSize: 3 });
    assert.equal(built.notes.length, 1);
    assert.match(built.notes[0]!, /^3 runs of text without spaces longer than 1,000 characters in 2 documents \(lines 3, 9\) were cut into pieces of at most 256 characters/);
    const clean = await buildCountMatrix(arrayCorpusSource([rows[0]!, rows[2]!]), tokens, { workers: 0 });
    assert.deepEqual(clean.notes, []);
  });

  it("startReview puts the note in the Report's input notes", async () => {
    const lines = ['text'];
    for (let i = 0; i < 40; i++) lines.push(`ticket ${i} about billing and shipping number ${i % 7} with words`);
    lines.push(`attachment ${base64Blob(4000)}`);
    const session = await startReview({ file: 'tickets.csv', text: `${lines.join('\n')}\n`, configPath: null, overrides: { text: 'text', stopList: null } });
    const notes = session.report.input.notes ?? [];
    assert.ok(notes.some((n) => /^1 run of text without spaces .* in 1 document \(line 42\) was cut/.test(n)), JSON.stringify(notes));
  });
});
