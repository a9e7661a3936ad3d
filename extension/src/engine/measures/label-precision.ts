import { NO_NEIGHBOR } from './knn';

/**
 * Leave-one-out k-NN precision@k (docs/methods.md §7): for each labelled query with neighbours, the
 * fraction of its neighbours that carry the same label; the mean over those queries. A
 * neighbour without a label (−1) counts as a miss — it is not evidence of the same class.
 * Slots without a neighbour are not counted. `labels` is per sample position.
 * null when no labelled query has a neighbour.
 */
export function labelPrecisionAtK(neighbors: Uint32Array, labels: Int32Array, k: number): number | null {
  const m = labels.length;
  if (neighbors.length !== m * k) throw new RangeError(`labelPrecisionAtK: expected ${m}×${k} neighbours, got ${neighbors.length}`);
  // Read once into a local: a module loader may reach an import through a getter (tsx's does),
  // a call per neighbour here (the what-if computes this on every click).
  const none = NO_NEIGHBOR;
  let sum = 0;
  let queries = 0;
  for (let i = 0; i < m; i++) {
    const label = labels[i];
    if (label < 0) continue;
    let hits = 0;
    let present = 0;
    for (let r = 0; r < k; r++) {
      const j = neighbors[i * k + r];
      if (j === none) continue;
      present++;
      if (labels[j] === label) hits++;
    }
    if (present === 0) continue;
    sum += hits / present;
    queries++;
  }
  return queries === 0 ? null : sum / queries;
}
