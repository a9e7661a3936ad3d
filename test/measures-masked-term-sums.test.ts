// maskedTermSums must equal termSums of the masked matrix, which the scikit-learn checks in
// test/weighting-sklearn.test.ts tie to TfidfVectorizer without those terms (docs/methods.md §1, §3).
import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { maskTerms } from '../extension/src/engine/matrix/mask-terms';
import { maskedTermSums } from '../extension/src/engine/measures/masked-term-sums';
import { termSums } from '../extension/src/engine/measures/term-sums';
import type { Csr } from '../extension/src/engine/matrix/csr';

function unitRows(rows: number[][], cols: number): Csr {
  const indptr = new Uint32Array(rows.length + 1);
  const indices: number[] = [];
  const data: number[] = [];
  rows.forEach((row, r) => {
    const norm = Math.hypot(...row) || 1;
    row.forEach((v, c) => {
      if (v !== 0) {
        indices.push(c);
        data.push(v / norm);
      }
    });
    indptr[r + 1] = indices.length;
  });
  return { rows: rows.length, cols, indptr, indices: Uint32Array.from(indices), data: Float64Array.from(data) };
}

describe('maskedTermSums', () => {
  it('maskedTermSums equals termSums of the masked, renormalised matrix (generated matrices)', () => {
    const cols = 6;
    const matrix = fc.array(fc.array(fc.nat({ max: 4 }), { minLength: cols, maxLength: cols }), { minLength: 1, maxLength: 12 });
    const mask = fc.array(fc.boolean(), { minLength: cols, maxLength: cols });
    let cases = 0;
    fc.assert(
      fc.property(matrix, mask, (rows, m) => {
        cases++;
        const X = unitRows(rows, cols);
        const removed = Uint8Array.from(m, (b) => (b ? 1 : 0));
        const expected = termSums(maskTerms(X, removed, 'l2'));
        const got = maskedTermSums(X, removed, true);
        for (let t = 0; t < cols; t++) {
          assert.ok(Math.abs(got.sums.s1[t]! - expected.s1[t]!) < 1e-12);
          assert.ok(Math.abs(got.sums.s2[t]! - expected.s2[t]!) < 1e-12);
          assert.ok(Math.abs(got.sums.sxlogx[t]! - expected.sxlogx[t]!) < 1e-12);
          assert.equal(got.sums.df[t], expected.df[t]);
        }
        const nonEmpty = rows.filter((row) => row.some((v, c) => v !== 0 && !m[c])).length;
        assert.equal(got.rowsWithWeight, nonEmpty);
      }),
      { numRuns: 500, seed: 11 },
    );
    console.log(`      maskedTermSums generated cases: ${cases}`);
  });
});
