import { validRowsFromGram } from './gram-distances';

/** Marks an unused slot of a k-NN list (the sample holds fewer than k other valid rows). */
export const NO_NEIGHBOR = 0xffffffff;

export interface KnnLists {
  /** m×k sample positions, best first; NO_NEIGHBOR where there is none. */
  neighbors: Uint32Array;
  /** m×k similarities matching `neighbors`; NaN where there is none. */
  sims: Float64Array;
}

/**
 * k nearest neighbours from a dense m×m similarity matrix, self excluded, similarities
 * descending, ties to the lower position so results never depend on scan order. Values within
 * TIE_TOLERANCE (relative above 1) count as ties: the same cosine reached by another order of
 * additions — the incremental what-if's, a shard merge's — must pick the same neighbours.
 *
 * Rows not in `valid` get no neighbours and are nobody's neighbour. By default `valid` is read
 * from the diagonal (a zero squared norm = an all-zero row, see validRowsFromGram).
 */
export function knnFromSimilarities(sims: Float64Array, m: number, k: number, valid?: Uint8Array): KnnLists {
  return selectNearest(sims, m, k, valid ?? validRowsFromGram(sims, m));
}

/** The distance matrix's entries at each row's neighbour positions (NaN where none). */
export function neighborDistances(dist: Float64Array, m: number, neighbors: Uint32Array, k: number): Float64Array {
  const out = new Float64Array(m * k).fill(NaN);
  for (let i = 0; i < m; i++) {
    for (let r = 0; r < k; r++) {
      const j = neighbors[i * k + r];
      if (j !== NO_NEIGHBOR) out[i * k + r] = dist[i * m + j];
    }
  }
  return out;
}

/** Relative gap below which two similarities (or distances) are one value for the ranking. */
export const TIE_TOLERANCE = 1e-12;

/** Top-k per row by value; an insertion list is enough for the small k in use. */
function selectNearest(values: Float64Array, m: number, k: number, valid: Uint8Array): KnnLists {
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`k must be a positive integer, got ${k}`);
  if (values.length !== m * m) throw new RangeError(`expected an ${m}×${m} matrix, got ${values.length} entries`);
  const lists = emptyKnnLists(m, k);
  const best = nearestScratch(k);
  for (let i = 0; i < m; i++) if (valid[i]) nearestOfRow(values, i, m, k, valid, lists, best);
  return lists;
}

/** m×k lists with no neighbour anywhere yet. */
export function emptyKnnLists(m: number, k: number): KnnLists {
  return { neighbors: new Uint32Array(m * k).fill(NO_NEIGHBOR), sims: new Float64Array(m * k).fill(NaN) };
}

/** Working space of nearestOfRow for one k. */
export function nearestScratch(k: number): { score: Float64Array; pos: Uint32Array } {
  return { score: new Float64Array(k), pos: new Uint32Array(k) };
}

/**
 * Row i's k nearest (the rule of knnFromSimilarities) written into `lists`; the row's other
 * measures (engine/measures/measure-sample-rows.ts) run on the same row while it is in cache.
 */
export function nearestOfRow(values: Float64Array, i: number, m: number, k: number, valid: Uint8Array, lists: KnnLists, best: { score: Float64Array; pos: Uint32Array }): void {
  const bestScore = best.score;
  const bestPos = best.pos;
  let filled = 0;
  // What a candidate must beat once the list is full (kept, not recomputed per candidate).
  let bar = -Infinity;
  const base = i * m;
  for (let j = 0; j < m; j++) {
    if (j === i || !valid[j]) continue;
    const s = values[base + j]!;
    if (filled === k && !(s > bar)) continue;
    // Shift clearly worse entries down; equal scores stay ahead (lower position wins).
    let slot = filled < k ? filled++ : k - 1;
    while (slot > 0 && s > clearlyAbove(bestScore[slot - 1]!)) {
      bestScore[slot] = bestScore[slot - 1]!;
      bestPos[slot] = bestPos[slot - 1]!;
      slot--;
    }
    bestScore[slot] = s;
    bestPos[slot] = j;
    if (filled === k) bar = clearlyAbove(bestScore[k - 1]!);
  }
  for (let r = 0; r < filled; r++) {
    lists.neighbors[i * k + r] = bestPos[r]!;
    lists.sims[i * k + r] = bestScore[r]!;
  }
}

/** The least score that beats `score` rather than ties with it (TIE_TOLERANCE). */
export function clearlyAbove(score: number): number {
  return score + TIE_TOLERANCE * Math.max(1, Math.abs(score));
}
