import { NO_NEIGHBOR } from './knn';

/**
 * Neighbour turnover between two settings on the same sample positions (docs/methods.md §7):
 * 1 − mean Jaccard |A ∩ B| / |A ∪ B| of each row's k-NN sets. Rows with no neighbours in either
 * setting are skipped (nothing to compare); a row with neighbours in only one has Jaccard 0.
 * null when no row has neighbours in either.
 */
export function neighborTurnover(a: Uint32Array, b: Uint32Array, m: number, k: number): number | null {
  if (a.length !== m * k || b.length !== m * k) throw new RangeError(`neighborTurnover: expected two ${m}×${k} neighbour lists`);
  const none = NO_NEIGHBOR;
  // seen[x] = i + 1 while row i's B list holds position x: each of A's entries is then looked up
  // once instead of against all k of B's (the what-if computes this on every click). The count of
  // A's entries found in B is the same as the search's, so the same bits; a row with a position
  // past m (never in a sample's lists) is searched entry by entry.
  const seen = new Int32Array(m);
  let sum = 0;
  let rows = 0;
  for (let i = 0; i < m; i++) {
    const base = i * k;
    let sizeA = 0;
    let sizeB = 0;
    let common = 0;
    let outside = false;
    for (let r = 0; r < k; r++) {
      const y = b[base + r]!;
      if (y === none) continue;
      sizeB++;
      if (y < m) seen[y] = i + 1;
      else outside = true;
    }
    for (let r = 0; r < k; r++) {
      const x = a[base + r]!;
      if (x === none) continue;
      sizeA++;
      if (x < m && !outside) {
        if (seen[x] === i + 1) common++;
        continue;
      }
      for (let s = 0; s < k; s++) {
        if (b[base + s] === x) {
          common++;
          break;
        }
      }
    }
    const union = sizeA + sizeB - common;
    if (union === 0) continue;
    sum += common / union;
    rows++;
  }
  return rows === 0 ? null : 1 - sum / rows;
}
