import { quantilesOf } from './quantile';

export interface ContrastSummary {
  median: number;
  p10: number;
  p90: number;
}

/**
 * Relative contrast per query, RC(q) = (Dmax − Dmin)/Dmin over the other valid sample rows
 * (Beyer, Goldstein, Ramakrishnan & Shaft 1999, "When is 'nearest neighbor' meaningful?",
 * ICDT; docs/methods.md §4). As dimensionality concentrates distances, RC falls towards 0.
 *
 * Queries with Dmin = 0 have an exact duplicate in the sample: their RC is infinite and says
 * nothing about concentration, so they are left out (text corpora often hold many duplicates).
 * Returns the per-query values (NaN where left out).
 */
export function relativeContrastPerQuery(dist: Float64Array, m: number, valid: Uint8Array): Float64Array {
  const rc = new Float64Array(m).fill(NaN);
  for (let i = 0; i < m; i++) rc[i] = contrastOfRow(dist, i, m, valid);
  return rc;
}

/** Row i's RC (NaN where left out, see relativeContrastPerQuery). */
export function contrastOfRow(dist: Float64Array, i: number, m: number, valid: Uint8Array): number {
  if (!valid[i]) return NaN;
  let dMin = Infinity;
  let dMax = -Infinity;
  const base = i * m;
  for (let j = 0; j < m; j++) {
    if (j === i || !valid[j]) continue;
    const d = dist[base + j]!;
    if (d < dMin) dMin = d;
    if (d > dMax) dMax = d;
  }
  return dMin > 0 && dMin < Infinity ? (dMax - dMin) / dMin : NaN;
}

/** Median, 10th and 90th percentile of RC over the queries that have one; null if none. */
export function relativeContrast(dist: Float64Array, m: number, valid: Uint8Array): ContrastSummary | null {
  return contrastSummary(relativeContrastPerQuery(dist, m, valid));
}

/** The summary of per-query RC values (NaN = none). */
export function contrastSummary(perQuery: Float64Array): ContrastSummary | null {
  const at = quantilesOf(perQuery, [0.5, 0.1, 0.9]);
  return at === null ? null : { median: at[0]!, p10: at[1]!, p90: at[2]! };
}
