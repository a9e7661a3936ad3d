import type { Csr } from '../matrix/csr';
import type { TermSums } from './term-sums';

export interface MaskedTermSums {
  sums: TermSums;
  /** Rows with at least one kept non-zero weight (rowsWithWeight of the masked matrix). */
  rowsWithWeight: number;
  /** Each row's kept Σw² (before renormalising), when the pass was asked to write them. */
  rowNorm2?: Float64Array;
}

/**
 * termSums of X with the `removed` columns dropped and every row renormalised to unit l2 length
 * — the exact part of a what-if — without writing the masked matrix: each row's kept norm is
 * found first, then its scaled weights are added in. Same O(nnz) as a mask, but no n-sized
 * copy (at a million documents the copy alone is ~1 GB). `withSpread` adds Σ x ln x, the only
 * part that needs a logarithm per entry; the what-if's measures do not use it. With `rowNorm2`,
 * each row's kept Σw² is written there too (0 for a row with nothing kept): with them the pass is
 * the whole state of a full pass of the what-if's IncrementalTermSums, which can adopt it.
 */
export function maskedTermSums(X: Csr, removed: Uint8Array, withSpread: boolean, rowNorm2: Float64Array | null = null, into?: TermSums): MaskedTermSums {
  const cols = X.cols;
  // `into`: arrays of X.cols zeros that the sums are added into (a pass thread's shared answer,
  // make-passes.ts), instead of fresh ones copied there afterwards.
  const s1 = into?.s1 ?? new Float64Array(cols);
  const s2 = into?.s2 ?? new Float64Array(cols);
  const df = into?.df ?? new Uint32Array(cols);
  const sxlogx = into?.sxlogx ?? new Float64Array(cols);
  const { indptr, indices, data } = X;
  let rowsWithWeight = 0;
  for (let r = 0; r < X.rows; r++) {
    const start = indptr[r]!;
    const end = indptr[r + 1]!;
    let norm2 = 0;
    for (let p = start; p < end; p++) if (removed[indices[p]!] === 0) norm2 += data[p]! * data[p]!;
    if (rowNorm2 !== null) rowNorm2[r] = norm2;
    if (!(norm2 > 0)) continue;
    rowsWithWeight++;
    addKeptRow({ s1, s2, df }, X, start, end, removed, 1 / Math.sqrt(norm2), withSpread ? sxlogx : null);
  }
  return rowNorm2 === null ? { sums: { s1, s2, df, sxlogx }, rowsWithWeight } : { sums: { s1, s2, df, sxlogx }, rowsWithWeight, rowNorm2 };
}

/**
 * Adds one row's kept weights (entries start..end of X), times `scale`, into the sums; with
 * `sxlogx`, also Σ x ln x for the spread. Shared by the full sums here and the what-if's
 * incremental ones, so both add the same numbers in the same order.
 */
export function addKeptRow(
  sums: { s1: Float64Array; s2: Float64Array; df: Uint32Array },
  X: Pick<Csr, 'indices' | 'data'>,
  start: number,
  end: number,
  removed: Uint8Array,
  scale: number,
  sxlogx: Float64Array | null = null,
): void {
  const { indices, data } = X;
  const { s1, s2, df } = sums;
  for (let p = start; p < end; p++) {
    const t = indices[p]!;
    if (removed[t] !== 0) continue;
    const x = data[p]! * scale;
    if (x === 0) continue;
    s1[t] += x;
    s2[t] += x * x;
    df[t]++;
    if (sxlogx !== null && x > 0) sxlogx[t] += x * Math.log(x);
  }
}
