import type { Csr } from '../matrix/csr';
import { validRowsFromGram } from '../measures/gram-distances';
import { knnFromSimilarities, NO_NEIGHBOR } from '../measures/knn';
import { standoutPerQuery } from '../measures/neighbor-standout';
import { sampleSimilarities } from '../measures/sample-similarity';

/**
 * Per-query neighbour quality of one setting on the sample, for paired comparisons:
 * - standout: the z-score of the query's nearest-neighbour similarity against its similarities
 *   to all other valid rows (the per-query term of neighbour standout, docs/methods.md §4);
 * - precision: the share of its k neighbours with the query's label (docs/methods.md §7).
 * NaN where a query has no value (no neighbours, no spread, no label).
 */
export interface PerQueryQuality {
  standout: Float64Array;
  precision: Float64Array | null;
}

export function perQueryQuality(rows: Csr, k: number, labels: Int32Array | null): PerQueryQuality {
  const m = rows.rows;
  const identity = new Uint32Array(m).map((_, i) => i);
  const gram = sampleSimilarities(rows, identity);
  const valid = validRowsFromGram(gram, m);
  const knn = knnFromSimilarities(gram, m, k, valid);
  const nearest = Float64Array.from({ length: m }, (_, i) => knn.sims[i * k]!);
  const standout = standoutPerQuery(gram, m, valid, nearest);
  let precision: Float64Array | null = null;
  if (labels !== null) {
    precision = new Float64Array(m).fill(Number.NaN);
    for (let i = 0; i < m; i++) {
      if (labels[i]! < 0) continue;
      let hits = 0;
      let present = 0;
      for (let r = 0; r < k; r++) {
        const j = knn.neighbors[i * k + r]!;
        if (j === NO_NEIGHBOR) continue;
        present++;
        if (labels[j] === labels[i]) hits++;
      }
      if (present > 0) precision[i] = hits / present;
    }
  }
  return { standout, precision };
}
