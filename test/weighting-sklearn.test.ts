import { strict as assert } from 'node:assert';
import { buildCountMatrix } from '../extension/src/engine/matrix/build-count-matrix';
import type { CountMatrix, Csr } from '../extension/src/engine/matrix/csr';
import { maskTerms } from '../extension/src/engine/matrix/mask-terms';
import { pruneTerms } from '../extension/src/engine/matrix/prune-terms';
import { weigh, type WeightingSettings } from '../extension/src/engine/matrix/weigh';
import { createTokenizer, type TokenSettings } from '../extension/src/engine/tokenize/create-tokenizer';
import { arrayCorpusSource } from './reference/array-corpus-source';
import { readFortunes } from './reference/read-fortunes';
import { requireSklearn, runSklearn, type SklearnAnswer, type SklearnCsr, type SklearnDf, type SklearnVariant } from './reference/run-sklearn';

// Source for every expected value in this file: scikit-learn (Debian python3-sklearn, 1.2.1 when
// written) run by /usr/bin/python3 through test/reference/sklearn-tfidf.py, fed OUR tokens of the
// first 300 fortunes of Debian's `fortunes` package via a pass-through analyzer.
const tokens: TokenSettings = { lowercase: true, minLength: 2, kinds: ['word', 'number', 'hashtag', 'emoji'], stem: false, ngrams: 1 };
const TOLERANCE = 1e-12;

const TFS: WeightingSettings['tf'][] = ['raw', 'sublinear', 'binary'];
const IDFS: WeightingSettings['idf'][] = ['smooth', 'plainPlusOne', 'none'];
const NORMS: WeightingSettings['norm'][] = ['l2', 'l1', 'none'];

function sklearnVariant(w: WeightingSettings): SklearnVariant {
  return {
    sublinear_tf: w.tf === 'sublinear',
    binary: w.tf === 'binary',
    use_idf: w.idf !== 'none',
    smooth_idf: w.idf === 'smooth',
    norm: w.norm === 'none' ? null : w.norm,
  };
}

function assertSameCsr(ours: Csr, terms: readonly string[], theirs: SklearnCsr, what: string, exact = false): void {
  assert.deepEqual(terms, theirs.vocabulary, `${what}: vocabulary order`);
  assert.deepEqual([...ours.indptr], theirs.indptr, `${what}: indptr`);
  assert.deepEqual([...ours.indices], theirs.indices, `${what}: indices`);
  assert.equal(ours.data.length, theirs.data.length);
  for (let k = 0; k < ours.data.length; k++) {
    const a = ours.data[k]!;
    const b = theirs.data[k]!;
    if (exact) assert.equal(a, b, `${what}: entry ${k}`);
    else assert.ok(Math.abs(a - b) <= TOLERANCE * Math.max(1, Math.abs(b)), `${what}: entry ${k}: ${a} vs ${b}`);
  }
}

describe('weighting against scikit-learn (Debian fortunes)', function () {
  this.timeout(120000);
  let counts: CountMatrix;
  let docs: string[][];
  const variants: WeightingSettings[] = [];
  for (const tf of TFS) for (const idf of IDFS) for (const norm of NORMS) variants.push({ tf, idf, norm });
  // Our setting → scikit-learn's min_df/max_df (int = count, float = proportion).
  const prunes: { minDf: number; maxDf: number; sk: { min_df: SklearnDf; max_df: SklearnDf } }[] = [
    { minDf: 1, maxDf: 1, sk: { min_df: { int: 1 }, max_df: { float: 1.0 } } },
    { minDf: 2, maxDf: 1, sk: { min_df: { int: 2 }, max_df: { float: 1.0 } } },
    { minDf: 0.01, maxDf: 0.5, sk: { min_df: { float: 0.01 }, max_df: { float: 0.5 } } },
    { minDf: 3, maxDf: 0.05, sk: { min_df: { int: 3 }, max_df: { float: 0.05 } } },
    { minDf: 1, maxDf: 20, sk: { min_df: { int: 1 }, max_df: { int: 20 } } },
    { minDf: 0.02, maxDf: 40, sk: { min_df: { float: 0.02 }, max_df: { int: 40 } } },
  ];
  let answer: SklearnAnswer;
  let stopAnswer: SklearnAnswer;
  const stopTerms = new Set(['the', 'of', 'and', 'to', 'you', 'zzz-not-in-corpus']);
  const maskVariants: WeightingSettings[] = [
    { tf: 'raw', idf: 'smooth', norm: 'l2' },
    { tf: 'sublinear', idf: 'plainPlusOne', norm: 'l1' },
    { tf: 'binary', idf: 'smooth', norm: 'l2' },
  ];

  before(async () => {
    requireSklearn();
    const rows = readFortunes(300);
    counts = (await buildCountMatrix(arrayCorpusSource(rows), tokens, { workers: 0 })).counts;
    const tokenize = createTokenizer(tokens);
    docs = rows.map((r) => tokenize(r.text));
    answer = runSklearn(docs, variants.map(sklearnVariant), prunes.map((p) => p.sk));
    // scikit-learn drops stop words while analysing; with a pass-through analyzer we drop them here.
    const stoppedDocs = docs.map((d) => d.filter((t) => !stopTerms.has(t)));
    stopAnswer = runSklearn(stoppedDocs, maskVariants.map(sklearnVariant), prunes.map((p) => p.sk));
  });

  it('buildCountMatrix has CountVectorizer\'s vocabulary order and counts', () => {
    assert.equal(counts.rows, 300);
    assertSameCsr(counts, counts.terms, answer.prunes[0]!, 'counts', true);
  });

  for (const [i, w] of variants.entries()) {
    it(`weigh tf=${w.tf} idf=${w.idf} norm=${w.norm} equals TfidfVectorizer to 1e-12`, () => {
      const { weights, idf } = weigh(counts, w);
      const theirs = answer.variants[i]!;
      assertSameCsr(weights, counts.terms, theirs, `${w.tf}/${w.idf}/${w.norm}`);
      if (theirs.idf !== null) {
        for (let j = 0; j < idf.length; j++) assert.ok(Math.abs(idf[j]! - theirs.idf[j]!) <= TOLERANCE * theirs.idf[j]!);
      } else {
        assert.ok(idf.every((v) => v === 1));
      }
    });
  }

  it('weigh idf=plain is scikit-learn\'s smooth_idf=False idf_ minus 1', () => {
    // ln(n/df) + 1 is scikit-learn's non-smooth idf; ours without the + 1 (Salton & Buckley 1988).
    const plusOne = answer.variants[variants.findIndex((v) => v.tf === 'raw' && v.idf === 'plainPlusOne' && v.norm === 'none')]!;
    const { idf } = weigh(counts, { tf: 'raw', idf: 'plain', norm: 'none' });
    for (let j = 0; j < idf.length; j++) assert.ok(Math.abs(idf[j]! - (plusOne.idf![j]! - 1)) <= TOLERANCE);
  });

  for (const [i, p] of prunes.entries()) {
    it(`pruneTerms minDf=${p.minDf} maxDf=${p.maxDf} keeps what min_df=${JSON.stringify(p.sk.min_df)} max_df=${JSON.stringify(p.sk.max_df)} keeps`, () => {
      const pruned = pruneTerms(counts, { minDf: p.minDf, maxDf: p.maxDf, stopTerms: new Set() });
      assertSameCsr(pruned.counts, pruned.counts.terms, answer.prunes[i]!, 'pruned', true);
      assert.equal(pruned.prunedByDf, counts.cols - pruned.counts.cols);
      assert.equal(pruned.stopped, 0);
    });

    it(`pruneTerms minDf=${p.minDf} maxDf=${p.maxDf} with a stop list equals scikit-learn on the stopped tokens`, () => {
      const pruned = pruneTerms(counts, { minDf: p.minDf, maxDf: p.maxDf, stopTerms });
      assertSameCsr(pruned.counts, pruned.counts.terms, stopAnswer.prunes[i]!, 'pruned+stopped', true);
      assert.equal(pruned.stopped, stopTerms.size - 1);
      assert.deepEqual(pruned.unusedStopTerms, ['zzz-not-in-corpus']);
      assert.equal(pruned.stopped + pruned.prunedByDf + pruned.counts.cols, counts.cols);
    });
  }

  for (const [i, w] of maskVariants.entries()) {
    it(`maskTerms on ${w.tf}/${w.idf}/${w.norm} weights equals TfidfVectorizer on the corpus without those terms`, () => {
      const { weights } = weigh(counts, w);
      const masked = maskTerms(weights, Uint8Array.from(counts.terms, (t) => (stopTerms.has(t) ? 1 : 0)), w.norm);
      const theirs = stopAnswer.variants[i]!;
      const column = new Map(theirs.vocabulary.map((t, j) => [t, j]));
      let compared = 0;
      for (let r = 0; r < counts.rows; r++) {
        const s = masked.indptr[r]!;
        assert.equal(masked.indptr[r + 1]! - s, theirs.indptr[r + 1]! - theirs.indptr[r]!, `row ${r} length`);
        for (let k = s; k < masked.indptr[r + 1]!; k++) {
          const kk = theirs.indptr[r]! + (k - s);
          assert.equal(column.get(counts.terms[masked.indices[k]!]!), theirs.indices[kk]);
          assert.ok(Math.abs(masked.data[k]! - theirs.data[kk]!) <= TOLERANCE, `row ${r}`);
          compared++;
        }
      }
      assert.ok(compared > 0 && masked.data.length < weights.data.length);
    });
  }

  it('pruneTerms actually removes terms for the non-trivial limits (the checks above are not vacuous)', () => {
    for (const i of [1, 2, 3, 4, 5]) assert.ok(answer.prunes[i]!.vocabulary.length < counts.cols, `prune ${i}`);
    assert.ok(answer.prunes[3]!.vocabulary.length < answer.prunes[1]!.vocabulary.length, 'maxDf 0.05 cuts frequent terms');
    assert.ok(answer.prunes[3]!.vocabulary.length > 0);
  });
});
