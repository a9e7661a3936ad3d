import { nnz, type Csr } from './csr';

/**
 * The transpose (for a document × term matrix: the term × document inverted index), by a
 * counting sort on column ids: O(nnz + rows + cols), and the row ids within each output row come
 * out ascending because input rows are visited in order.
 */
export function transpose(m: Csr): Csr {
  const total = nnz(m);
  const indptr = new Uint32Array(m.cols + 1);
  for (let k = 0; k < total; k++) indptr[m.indices[k] + 1]++;
  for (let c = 0; c < m.cols; c++) indptr[c + 1] += indptr[c];
  const next = indptr.slice(0, m.cols);
  const indices = new Uint32Array(total);
  const data = new Float64Array(total);
  for (let r = 0; r < m.rows; r++) {
    for (let k = m.indptr[r]; k < m.indptr[r + 1]; k++) {
      const slot = next[m.indices[k]]++;
      indices[slot] = r;
      data[slot] = m.data[k];
    }
  }
  return { rows: m.cols, cols: m.rows, indptr, indices, data };
}
