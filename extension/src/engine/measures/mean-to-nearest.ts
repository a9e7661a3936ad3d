/**
 * Relative contrast in the sense of He, Kumar & Chang (2012), "On the difficulty of nearest
 * neighbor search", ICML: C_r = E[D_mean]/E[D_min], the expectations taken over queries
 * (docs/methods.md §4). Near 1, the nearest neighbour is hardly nearer than an average document.
 *
 * Unlike the per-query ratio, a ratio of means stays finite when some queries have an exact
 * duplicate (D_min = 0), so those queries are kept: they are part of what a search would meet.
 * null when fewer than one valid query with a valid partner exists or every D_min is 0.
 */
export function meanToNearest(dist: Float64Array, m: number, valid: Uint8Array): number | null {
  const acc = meanToNearestSums();
  for (let i = 0; i < m; i++) addMeanToNearestRow(dist, i, m, valid, acc);
  return meanToNearestOf(acc);
}

/** Running sums of meanToNearest over queries. */
export interface MeanToNearestSums {
  sumMean: number;
  sumMin: number;
  queries: number;
}

export function meanToNearestSums(): MeanToNearestSums {
  return { sumMean: 0, sumMin: 0, queries: 0 };
}

/** Adds query i's mean and nearest distance (rows in order, so the sums are summed as in one loop). */
export function addMeanToNearestRow(dist: Float64Array, i: number, m: number, valid: Uint8Array, acc: MeanToNearestSums): void {
  if (!valid[i]) return;
  let dMin = Infinity;
  let sum = 0;
  let count = 0;
  const base = i * m;
  for (let j = 0; j < m; j++) {
    if (j === i || !valid[j]) continue;
    const d = dist[base + j]!;
    sum += d;
    count++;
    if (d < dMin) dMin = d;
  }
  if (count === 0) return;
  acc.sumMean += sum / count;
  acc.sumMin += dMin;
  acc.queries++;
}

export function meanToNearestOf(acc: MeanToNearestSums): number | null {
  if (acc.queries === 0 || !(acc.sumMin > 0)) return null;
  return acc.sumMean / acc.sumMin;
}
