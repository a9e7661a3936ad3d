// Builders of small count matrices for the matrix and weighting tests (no module under test here).
import type { CountMatrix } from '../extension/src/engine/matrix/csr';
import { denseToCsr } from './measures-fixtures';

/**
 * Dense counts → a CountMatrix with terms t000, t001, … (so code-point order is column order);
 * each document's first token is taken to be its lowest column with a count.
 */
export function countMatrix(dense: number[][], cols = dense[0]?.length ?? 0): CountMatrix {
  return {
    ...denseToCsr(dense, cols),
    terms: Array.from({ length: cols }, (_, j) => `t${String(j).padStart(3, '0')}`),
    tokensPerDoc: Uint32Array.from(dense.map((r) => r.reduce((a, b) => a + b, 0))),
    firstTerms: Int32Array.from(dense.map((r) => r.findIndex((c) => c > 0))),
  };
}
