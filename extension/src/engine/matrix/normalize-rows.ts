/**
 * Scales each CSR row of `data` in place to unit l2 or l1 norm; rows whose norm is 0 are left
 * as they are. The l2 norm uses a plain sum of squares, as scikit-learn's normalize does, so the
 * results agree with it to the last bits rather than only to rounding.
 */
export function normalizeRows(indptr: Uint32Array, data: Float64Array, rows: number, norm: 'l2' | 'l1' | 'none'): void {
  if (norm === 'none') return;
  for (let r = 0; r < rows; r++) {
    const s = indptr[r];
    const e = indptr[r + 1];
    let sum = 0;
    if (norm === 'l2') for (let k = s; k < e; k++) sum += data[k] * data[k];
    else for (let k = s; k < e; k++) sum += Math.abs(data[k]);
    if (sum === 0) continue;
    const scale = norm === 'l2' ? Math.sqrt(sum) : sum;
    for (let k = s; k < e; k++) data[k] /= scale;
  }
}
