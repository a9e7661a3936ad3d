import type { Csr } from './csr';
import { normalizeRow } from './normalize-rows';

/** Preallocated arrays for maskTerms: indptr of rows + 1, indices and data of at least nnz. */
export interface CsrBuffers {
  indptr: Uint32Array;
  indices: Uint32Array;
  data: Float64Array;
}

/**
 * The what-if: `weights` without the columns marked non-zero (1) in `removed`, each row renormalised, in
 * one O(nnz) pass and no re-tokenising. Columns keep their ids (removed ones are just empty).
 *
 * Renormalising the already normalised row gives the same as weighting the recounted corpus:
 * a row is x = v/‖v‖ with v = tf·idf, and dropping columns gives x' = v'/‖v‖, so
 * x'/‖x'‖ = v'/‖v'‖ (the factor ‖v‖ cancels; for l1 likewise, weights being ≥ 0). And v' itself
 * is unchanged by the removal, because tf depends only on the entry's count and idf only on n
 * and the column's own df, neither of which dropping other columns alters.
 *
 * With `out` the result is written into those arrays (views of them are returned), so a panel
 * toggle allocates nothing; `norm` must be the norm `weights` was built with.
 */
export function maskTerms(weights: Csr, removed: Uint8Array, norm: 'l2' | 'l1' | 'none', out?: CsrBuffers): Csr {
  const rows = weights.rows;
  const total = weights.indptr[rows];
  if (removed.length < weights.cols) throw new RangeError(`removed has ${removed.length} entries for ${weights.cols} columns`);
  if (out !== undefined && (out.indptr.length < rows + 1 || out.indices.length < total || out.data.length < total)) {
    throw new RangeError('maskTerms: out buffers are smaller than the matrix');
  }
  const indptr = out?.indptr ?? new Uint32Array(rows + 1);
  const indices = out?.indices ?? new Uint32Array(total);
  const data = out?.data ?? new Float64Array(total);
  const srcIndptr = weights.indptr;
  const srcIndices = weights.indices;
  const srcData = weights.data;
  let at = 0;
  indptr[0] = 0;
  for (let r = 0; r < rows; r++) {
    const s = srcIndptr[r];
    const e = srcIndptr[r + 1];
    const rowStart = at;
    for (let k = s; k < e; k++) {
      const c = srcIndices[k];
      if (removed[c] !== 0) continue;
      indices[at] = c;
      data[at++] = srcData[k];
    }
    indptr[r + 1] = at;
    // A row that lost nothing is already normalised: leave its bits alone, so masking nothing
    // returns exactly the input.
    if (at - rowStart !== e - s && norm !== 'none') normalizeRow(data, rowStart, at, norm);
  }
  const result: Csr = {
    rows,
    cols: weights.cols,
    indptr: indptr.length === rows + 1 ? indptr : indptr.subarray(0, rows + 1),
    indices: indices.length === at ? indices : indices.subarray(0, at),
    data: data.length === at ? data : data.subarray(0, at),
  };
  return result;
}
