/**
 * Scales each CSR row of `data` in place to unit l2 or l1 norm; rows whose norm is 0 are left
 * as they are. The l2 norm uses a plain sum of squares, as scikit-learn's normalize does, so the
 * results agree with it to the last bits rather than only to rounding.
 */
export function normalizeRows(indptr: Uint32Array, data: Float64Array, rows: number, norm: 'l2' | 'l1' | 'none'): void {
  if (norm === 'none') return;
  for (let r = 0; r < rows; r++) normalizeRow(data, indptr[r], indptr[r + 1], norm);
}

/** Scales data[start..end) to unit l2 or l1 norm, unless it is all zeros. */
export function normalizeRow(data: Float64Array, start: number, end: number, norm: 'l2' | 'l1' | 'none'): void {
  if (norm === 'none') return;
  let sum = 0;
  if (norm === 'l2') for (let k = start; k < end; k++) sum += data[k] * data[k];
  else for (let k = start; k < end; k++) sum += Math.abs(data[k]);
  if (sum === 0) return;
  const scale = norm === 'l2' ? Math.sqrt(sum) : sum;
  for (let k = start; k < end; k++) data[k] /= scale;
}
