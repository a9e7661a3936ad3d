import { quantilesOf } from './quantile';

/**
 * Neighbour standout: per query, the z-score of its nearest neighbour's similarity against
 * the query's similarities to all other valid sample rows, (s_nn − mean_q)/sd_q; the median
 * over queries. docs/methods.md §4 found this tracks k-NN precision on text where relative contrast
 * does not. Queries whose similarities are all equal (sd = 0) have no z-score and are skipped.
 * `nearest` holds each row's best similarity (NaN for rows without neighbours).
 */
export function neighborStandout(sims: Float64Array, m: number, valid: Uint8Array, nearest: Float64Array): number | null {
  return medianStandout(standoutPerQuery(sims, m, valid, nearest));
}

/** The median of per-query z-scores (NaN = none); null if none. */
export function medianStandout(perQuery: Float64Array): number | null {
  return quantilesOf(perQuery, [0.5])?.[0] ?? null;
}

/** Each query's z-score (see neighborStandout); NaN where a query has none. */
export function standoutPerQuery(sims: Float64Array, m: number, valid: Uint8Array, nearest: Float64Array): Float64Array {
  const z = new Float64Array(m).fill(Number.NaN);
  for (let i = 0; i < m; i++) z[i] = standoutOfRow(sims, i, m, valid, nearest[i]!);
  return z;
}

/** Row i's z-score of its nearest similarity `nearest` (NaN where it has none). */
export function standoutOfRow(sims: Float64Array, i: number, m: number, valid: Uint8Array, nearest: number): number {
  if (!valid[i] || Number.isNaN(nearest)) return Number.NaN;
  let sum = 0;
  let n = 0;
  const base = i * m;
  for (let j = 0; j < m; j++) {
    if (j === i || !valid[j]) continue;
    sum += sims[base + j]!;
    n++;
  }
  return standoutGivenSum(sims, i, m, valid, nearest, sum, n);
}

/**
 * standoutOfRow once the first pass is done: `sum` of row i's n similarities to the other valid
 * rows, summed in row order (measureSampleRows shares that pass with the histograms).
 */
export function standoutGivenSum(sims: Float64Array, i: number, m: number, valid: Uint8Array, nearest: number, sum: number, n: number): number {
  if (n < 2 || Number.isNaN(nearest)) return Number.NaN;
  const mean = sum / n;
  // Two passes: Σs² − n·mean² cancels badly when a query's similarities are (nearly) equal,
  // and would turn rounding noise into a huge z-score.
  const base = i * m;
  let sumSq = 0;
  for (let j = 0; j < m; j++) {
    if (j === i || !valid[j]) continue;
    const dev = sims[base + j]! - mean;
    sumSq += dev * dev;
  }
  const sd = Math.sqrt(sumSq / n);
  // Relative guard: a spread at rounding level is no spread.
  if (!(sd > 1e-12 * Math.max(1, Math.abs(mean)))) return Number.NaN;
  return (nearest - mean) / sd;
}
