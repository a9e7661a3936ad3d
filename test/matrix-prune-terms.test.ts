import { strict as assert } from 'node:assert';
import type { CountMatrix } from '../extension/src/engine/matrix/csr';
import { pruneTerms } from '../extension/src/engine/matrix/prune-terms';
import { UserError } from '../extension/src/engine/user-error';

// Four documents; df: a=4, b=2, c=1, d=2 (by hand from the rows below).
const counts: CountMatrix = {
  rows: 4,
  cols: 4,
  indptr: Uint32Array.from([0, 3, 5, 7, 9]),
  indices: Uint32Array.from([0, 1, 2, 0, 3, 0, 3, 0, 1]),
  data: Float64Array.from([1, 2, 1, 1, 1, 3, 1, 1, 1]),
  terms: ['a', 'b', 'c', 'd'],
  tokensPerDoc: Uint32Array.from([4, 2, 4, 2]),
  // The documents open with c, d, a and b.
  firstTerms: Int32Array.from([2, 3, 0, 1]),
};

describe('matrix/prune-terms', () => {
  // The semantics follow scikit-learn's CountVectorizer min_df/max_df (scikit-learn API docs:
  // "float = proportion of documents, integer = absolute counts", bounds inclusive); the
  // scikit-learn comparison on a real corpus is in weighting-sklearn.test.ts.
  it('pruneTerms with minDf 1 and maxDf 1 keeps every term (the defaults)', () => {
    const r = pruneTerms(counts, { minDf: 1, maxDf: 1, stopTerms: new Set() });
    assert.deepEqual(r.counts.terms, ['a', 'b', 'c', 'd']);
    assert.equal(r.prunedByDf, 0);
  });

  it('pruneTerms reads maxDf ≤ 1 as a proportion and minDf ≥ 1 as a count', () => {
    // maxDf 0.75 → df ≤ 3 drops a (df 4); minDf 2 drops c (df 1).
    const r = pruneTerms(counts, { minDf: 2, maxDf: 0.75, stopTerms: new Set() });
    assert.deepEqual(r.counts.terms, ['b', 'd']);
    assert.equal(r.prunedByDf, 2);
    assert.deepEqual([...r.counts.indptr], [0, 1, 2, 3, 4]);
    assert.deepEqual([...r.counts.indices], [0, 1, 1, 0]);
    assert.deepEqual([...r.counts.data], [2, 1, 1, 1]);
    assert.equal(r.counts.tokensPerDoc, counts.tokensPerDoc);
    // Opening with c, d, a, b: the dropped c and a open nothing now; d and b are columns 1 and 0.
    assert.deepEqual([...r.counts.firstTerms], [-1, 1, -1, 0]);
  });

  it('pruneTerms with the df given (a=4, b=2, c=1, d=2, by hand) prunes as when it counts them, and refuses a df of the wrong length', () => {
    const r = pruneTerms(counts, { minDf: 2, maxDf: 0.75, stopTerms: new Set(), df: Float64Array.from([4, 2, 1, 2]) });
    assert.deepEqual(r.counts, pruneTerms(counts, { minDf: 2, maxDf: 0.75, stopTerms: new Set() }).counts);
    assert.deepEqual(r.counts.terms, ['b', 'd']);
    assert.throws(() => pruneTerms(counts, { minDf: 1, maxDf: 1, stopTerms: new Set(), df: [1, 1] }), RangeError);
  });

  it('pruneTerms reads maxDf > 1 as a count and minDf < 1 as a proportion', () => {
    // minDf 0.5 → df ≥ 2 drops c; maxDf 3 → df ≤ 3 drops a (as a proportion, 3·n would keep it).
    const r = pruneTerms(counts, { minDf: 0.5, maxDf: 3, stopTerms: new Set() });
    assert.deepEqual(r.counts.terms, ['b', 'd']);
    // minDf 0.75 → df ≥ 3 keeps only a.
    assert.deepEqual(pruneTerms(counts, { minDf: 0.75, maxDf: 1, stopTerms: new Set() }).counts.terms, ['a']);
  });

  it('pruneTerms counts stopped terms apart and lists unused stop terms in order', () => {
    const r = pruneTerms(counts, { minDf: 2, maxDf: 1, stopTerms: new Set(['zz', 'a', 'c', 'yy']) });
    assert.deepEqual(r.counts.terms, ['b', 'd']);
    assert.equal(r.stopped, 2);
    assert.equal(r.prunedByDf, 0, 'c is counted as stopped, not pruned');
    assert.deepEqual(r.unusedStopTerms, ['zz', 'yy']);
  });

  it('pruneTerms rejects settings that cannot mean anything with a UserError', () => {
    assert.throws(() => pruneTerms(counts, { minDf: -1, maxDf: 1, stopTerms: new Set() }), UserError);
    assert.throws(() => pruneTerms(counts, { minDf: 1, maxDf: 2.5, stopTerms: new Set() }), UserError);
    assert.throws(() => pruneTerms(counts, { minDf: 3, maxDf: 2, stopTerms: new Set() }), UserError);
    assert.throws(() => pruneTerms(counts, { minDf: Number.NaN, maxDf: 1, stopTerms: new Set() }), UserError);
  });
});
