import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import type { CountMatrix, Csr } from '../extension/src/engine/matrix/csr';
import { maskTerms } from '../extension/src/engine/matrix/mask-terms';
import { pruneTerms } from '../extension/src/engine/matrix/prune-terms';
import { weigh, type WeightingSettings } from '../extension/src/engine/matrix/weigh';
import { countMatrix } from './matrix-fixtures';

function rowEntries(m: Csr, terms: readonly string[], r: number): Map<string, number> {
  const out = new Map<string, number>();
  for (let k = m.indptr[r]!; k < m.indptr[r + 1]!; k++) out.set(terms[m.indices[k]!]!, m.data[k]!);
  return out;
}

function rowNorm(m: Csr, r: number, norm: 'l2' | 'l1'): number {
  let s = 0;
  for (let k = m.indptr[r]!; k < m.indptr[r + 1]!; k++) s += norm === 'l2' ? m.data[k]! ** 2 : Math.abs(m.data[k]!);
  return norm === 'l2' ? Math.sqrt(s) : s;
}

/** Masking compared with the slow way: drop the terms from the counts, weigh again. */
function assertMaskEqualsRecount(counts: CountMatrix, removedTerms: Set<string>, w: WeightingSettings): void {
  const masked = maskTerms(weigh(counts, w).weights, Uint8Array.from(counts.terms, (t) => (removedTerms.has(t) ? 1 : 0)), w.norm);
  const recount = pruneTerms(counts, { minDf: 0, maxDf: 1, stopTerms: removedTerms }).counts;
  const reweighed = weigh(recount, w).weights;
  for (let r = 0; r < counts.rows; r++) {
    const a = rowEntries(masked, counts.terms, r);
    const b = rowEntries(reweighed, recount.terms, r);
    assert.deepEqual([...a.keys()], [...b.keys()], `row ${r} terms`);
    for (const [t, v] of a) assert.ok(Math.abs(v - b.get(t)!) <= 1e-12 * Math.max(1, Math.abs(v)), `row ${r} ${t}: ${v} vs ${b.get(t)}`);
  }
}

// Random small count matrices: a dense grid of counts 0–4 (common practice, no source).
const countsArb = fc
  .record({ rows: fc.integer({ min: 1, max: 12 }), cols: fc.integer({ min: 1, max: 10 }) })
  .chain(({ rows, cols }) =>
    fc.record({
      dense: fc.array(fc.array(fc.integer({ min: 0, max: 4 }), { minLength: cols, maxLength: cols }), { minLength: rows, maxLength: rows }),
      removed: fc.array(fc.boolean(), { minLength: cols, maxLength: cols }),
      cols: fc.constant(cols),
    }),
  );
const weightingArb = fc.record({
  tf: fc.constantFrom<WeightingSettings['tf']>('raw', 'sublinear', 'binary'),
  idf: fc.constantFrom<WeightingSettings['idf']>('smooth', 'plain', 'plainPlusOne', 'none'),
  norm: fc.constantFrom<WeightingSettings['norm']>('l2', 'l1', 'none'),
});

describe('matrix/mask-terms', () => {
  const guide = countMatrix([[3, 0, 1], [2, 0, 0], [3, 0, 0], [4, 0, 0], [3, 2, 0], [3, 0, 2]], 3);

  it('maskTerms equals weighting the recounted matrix without those terms', () => {
    // Counts from the scikit-learn user guide's TfidfTransformer example (docs/methods.md §1).
    for (const norm of ['l2', 'l1', 'none'] as const) {
      assertMaskEqualsRecount(guide, new Set(['t000']), { tf: 'raw', idf: 'smooth', norm });
      assertMaskEqualsRecount(guide, new Set(['t002']), { tf: 'sublinear', idf: 'plainPlusOne', norm });
    }
  });

  it('maskTerms with no terms removed returns the input exactly', () => {
    const { weights } = weigh(guide, { tf: 'raw', idf: 'smooth', norm: 'l2' });
    const same = maskTerms(weights, new Uint8Array(3), 'l2');
    assert.deepEqual(same.indptr, weights.indptr);
    assert.deepEqual(same.indices, weights.indices);
    assert.deepEqual(same.data, weights.data);
  });

  it('maskTerms empties a row whose only terms are removed, and keeps column ids', () => {
    const { weights } = weigh(guide, { tf: 'raw', idf: 'smooth', norm: 'l2' });
    const masked = maskTerms(weights, Uint8Array.from([1, 0, 0]), 'l2');
    assert.equal(masked.cols, 3);
    assert.equal(masked.indptr[2]! - masked.indptr[1]!, 0, 'row 2 held only t000');
    // Row 5 keeps only t001, which renormalises to 1 (common practice, no source: a unit vector
    // with one non-zero entry has that entry equal to 1).
    assert.deepEqual([...rowEntries(masked, guide.terms, 4)], [['t001', 1]]);
  });

  it('maskTerms writes into caller buffers without changing the answer', () => {
    const { weights } = weigh(guide, { tf: 'binary', idf: 'smooth', norm: 'l1' });
    const removed = Uint8Array.from([0, 1, 0]);
    const fresh = maskTerms(weights, removed, 'l1');
    const out = { indptr: new Uint32Array(weights.rows + 1), indices: new Uint32Array(weights.data.length), data: new Float64Array(weights.data.length) };
    const reused = maskTerms(weights, removed, 'l1', out);
    assert.equal(reused.data.buffer, out.data.buffer);
    assert.deepEqual([...reused.indptr], [...fresh.indptr]);
    assert.deepEqual([...reused.indices], [...fresh.indices]);
    assert.deepEqual([...reused.data], [...fresh.data]);
    assert.throws(() => maskTerms(weights, new Uint8Array(2), 'l1'), RangeError);
  });

  it('property: weigh gives every row l2 norm 1 or 0; masking nothing is the identity; masking keeps norms 1 or 0 and equals a recount', () => {
    let cases = 0;
    fc.assert(
      fc.property(countsArb, weightingArb, ({ dense, removed, cols }, w) => {
        cases++;
        const counts = countMatrix(dense, cols);
        const { weights } = weigh(counts, { ...w, norm: 'l2' });
        for (let r = 0; r < counts.rows; r++) {
          const n = rowNorm(weights, r, 'l2');
          assert.ok(n === 0 || Math.abs(n - 1) <= 1e-12, `row ${r} norm ${n}`);
        }
        const same = maskTerms(weights, new Uint8Array(cols), 'l2');
        assert.deepEqual(same.data, weights.data);
        assert.deepEqual(same.indices, weights.indices);
        const mask = Uint8Array.from(removed, (b) => (b ? 1 : 0));
        for (const norm of ['l2', 'l1'] as const) {
          const normed = norm === 'l2' ? weights : weigh(counts, { ...w, norm }).weights;
          const masked = maskTerms(normed, mask, norm);
          for (let r = 0; r < counts.rows; r++) {
            const n = rowNorm(masked, r, norm);
            assert.ok(n === 0 || Math.abs(n - 1) <= 1e-12, `${norm} row ${r} norm ${n}`);
            for (let k = masked.indptr[r]!; k < masked.indptr[r + 1]!; k++) assert.equal(mask[masked.indices[k]!], 0);
          }
        }
        const removedTerms = new Set(counts.terms.filter((_, j) => removed[j]));
        assertMaskEqualsRecount(counts, removedTerms, w);
      }),
      { numRuns: 300, seed: 20240611 },
    );
    console.log(`      mask/weigh property cases generated: ${cases}`);
    assert.equal(cases, 300);
  });
});
