// Builders of small count matrices for the matrix and weighting tests (no module under test here).
import type { CountMatrix } from '../extension/src/engine/matrix/csr';

/** Dense counts → a CountMatrix with terms t000, t001, … (so code-point order is column order). */
export function countMatrix(dense: number[][], cols = dense[0]?.length ?? 0): CountMatrix {
  const indptr = [0];
  const indices: number[] = [];
  const data: number[] = [];
  for (const row of dense) {
    row.forEach((c, j) => {
      if (c !== 0) {
        indices.push(j);
        data.push(c);
      }
    });
    indptr.push(indices.length);
  }
  return {
    rows: dense.length,
    cols,
    indptr: Uint32Array.from(indptr),
    indices: Uint32Array.from(indices),
    data: Float64Array.from(data),
    terms: Array.from({ length: cols }, (_, j) => `t${String(j).padStart(3, '0')}`),
    tokensPerDoc: Uint32Array.from(dense.map((r) => r.reduce((a, b) => a + b, 0))),
  };
}
