import { medianOf } from './quantile';
import { selectRank } from './select-rank';

/**
 * Radius slack per query: r_k is the distance to the k-th neighbour, r_10k the distance at which
 * the count of valid sample rows within the radius reaches 10k, and slack = (r_10k − r_k)/r_k.
 * Where neighbours stand out, a radius can grow well past r_k before it sweeps in ten times as
 * many documents; under concentration the slack shrinks towards 0, and a similarity threshold
 * becomes fragile. For points filling a d-dimensional volume the count grows like r^d, so the
 * slack is 10^{1/d} − 1 (geometry of the ball, no source needed).
 *
 * Within the sample: when fewer than 10k other valid rows exist, r_10k is the distance to the
 * farthest one (a smaller growth than 10×, stated here so a small sample is not misread). Queries
 * with fewer than k others or r_k = 0 get NaN.
 */
export function radiusSlackPerQuery(dist: Float64Array, m: number, valid: Uint8Array, k: number): Float64Array {
  const out = new Float64Array(m).fill(NaN);
  const scratch = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    if (!valid[i]) continue;
    let n = 0;
    const base = i * m;
    for (let j = 0; j < m; j++) if (j !== i && valid[j]) scratch[n++] = dist[base + j];
    if (n < k) continue;
    const far = Math.min(10 * k, n);
    // Select the far rank first; the near rank then lies in the left part, already partitioned.
    const rFar = selectRank(scratch, 0, n - 1, far - 1);
    const rK = selectRank(scratch, 0, far - 1, k - 1);
    if (rK > 0) out[i] = (rFar - rK) / rK;
  }
  return out;
}

/** Median radius slack over queries that have one; null if none. */
export function radiusSlack(dist: Float64Array, m: number, valid: Uint8Array, k: number): { median: number } | null {
  const perQuery = radiusSlackPerQuery(dist, m, valid, k);
  const kept = perQuery.filter((v) => !Number.isNaN(v));
  return kept.length === 0 ? null : { median: medianOf(kept) };
}
