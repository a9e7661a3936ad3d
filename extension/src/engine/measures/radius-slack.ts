import { quantilesOf } from './quantile';
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
  const scratch = radiusScratch(m);
  for (let i = 0; i < m; i++) out[i] = slackOfRow(dist, i, m, valid, k, scratch);
  return out;
}

export interface RadiusScratch {
  counts: Uint32Array;
  nearPart: Float64Array;
  farPart: Float64Array;
}

/** Working space of slackOfRow for an m-row sample. */
export function radiusScratch(m: number): RadiusScratch {
  return { counts: new Uint32Array(BUCKETS + 1), nearPart: new Float64Array(m), farPart: new Float64Array(m) };
}

/** Row i's radius slack (NaN where it has none, see radiusSlackPerQuery). */
export function slackOfRow(dist: Float64Array, i: number, m: number, valid: Uint8Array, k: number, scratch: RadiusScratch): number {
  if (!valid[i]) return NaN;
  const { counts } = scratch;
  const base = i * m;
  counts.fill(0);
  let n = 0;
  for (let j = 0; j < m; j++) {
    if (j === i || !valid[j]) continue;
    counts[bucketOf(dist[base + j]!)]++;
    n++;
  }
  return slackFromCounts(dist, i, m, valid, k, n, scratch);
}

/**
 * The slack of row i once `scratch.counts` holds the bucket counts of its n valid distances.
 * The two order statistics come through the counts (buckets are monotone in the distance, so a
 * rank's bucket holds it), then a quickselect inside that bucket alone: the same values as a
 * quickselect over the whole row, for about one pass over it instead of three.
 */
export function slackFromCounts(dist: Float64Array, i: number, m: number, valid: Uint8Array, k: number, n: number, scratch: RadiusScratch): number {
  if (n < k) return NaN;
  const { counts, nearPart, farPart } = scratch;
  const base = i * m;
  const far = Math.min(10 * k, n);
  let below = 0;
  let b = 0;
  while (below + counts[b]! < k) below += counts[b++]!;
  const nearBucket = b;
  const nearRank = k - 1 - below;
  while (below + counts[b]! < far) below += counts[b++]!;
  const farBucket = b;
  const farRank = far - 1 - below;
  let nNear = 0;
  let nFar = 0;
  const bucket = bucketOf;
  for (let j = 0; j < m; j++) {
    if (j === i || !valid[j]) continue;
    const d = dist[base + j]!;
    const at = bucket(d);
    if (at === nearBucket) nearPart[nNear++] = d;
    if (at === farBucket) farPart[nFar++] = d;
  }
  const rK = selectRank(nearPart, 0, nNear - 1, nearRank);
  const rFar = selectRank(farPart, 0, nFar - 1, farRank);
  return rK > 0 ? (rFar - rK) / rK : NaN;
}

/** Buckets over [0, SPAN): unit rows are at most 2 apart; anything farther shares the last one. */
const BUCKETS = 512;
const SPAN = 2;

/** The bucket of a distance (the last one for any at or past SPAN). */
export function bucketOf(d: number): number {
  const b = d * (BUCKETS / SPAN);
  return b < BUCKETS ? (b > 0 ? Math.floor(b) : 0) : BUCKETS;
}

/** Median radius slack over queries that have one; null if none. */
export function radiusSlack(dist: Float64Array, m: number, valid: Uint8Array, k: number): { median: number } | null {
  return radiusSlackSummary(radiusSlackPerQuery(dist, m, valid, k));
}

/** The median of per-query slacks (NaN = none); null if none. */
export function radiusSlackSummary(perQuery: Float64Array): { median: number } | null {
  const at = quantilesOf(perQuery, [0.5]);
  return at === null ? null : { median: at[0]! };
}
