import type { Csr } from './csr';

/** The given rows of m, in that order, as a new CSR matrix with the same columns. */
export function selectRows(m: Csr, rows: Uint32Array): Csr {
  let nnz = 0;
  for (let i = 0; i < rows.length; i++) nnz += m.indptr[rows[i]! + 1]! - m.indptr[rows[i]!]!;
  const indptr = new Uint32Array(rows.length + 1);
  const indices = new Uint32Array(nnz);
  const data = new Float64Array(nnz);
  let at = 0;
  for (let i = 0; i < rows.length; i++) {
    const start = m.indptr[rows[i]!]!;
    const end = m.indptr[rows[i]! + 1]!;
    indices.set(m.indices.subarray(start, end), at);
    data.set(m.data.subarray(start, end), at);
    at += end - start;
    indptr[i + 1] = at;
  }
  return { rows: rows.length, cols: m.cols, indptr, indices, data };
}
