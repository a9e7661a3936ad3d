/** Fixed bins over [0, 1] so histograms of different settings line up on one chart. */
export const SIMILARITY_BINS = 40;

export interface SimilarityHistograms {
  start: number;
  binWidth: number;
  /** Counts of cosine over all unordered pairs of valid sample rows. */
  pairs: number[];
  /** Counts of each valid query's nearest-neighbour cosine. */
  nearest: number[];
}

/**
 * Histograms of sampled pair similarities and nearest-neighbour similarities (counts, not
 * densities: the chart normalises, and counts keep the sample size visible). Values are clamped
 * into [0, 1]; a cosine of exactly 1 falls in the last bin. `nearest` is one value per row
 * (NaN = no neighbour).
 */
export function similarityHistograms(sims: Float64Array, m: number, valid: Uint8Array, nearest: Float64Array, bins: number = SIMILARITY_BINS): SimilarityHistograms {
  const pairs: number[] = new Array(bins).fill(0);
  const near: number[] = new Array(bins).fill(0);
  const counts = new Float64Array(bins);
  for (let i = 0; i < m; i++) {
    if (!valid[i]) continue;
    binPairsOfRow(sims, i, m, valid, counts);
    if (!Number.isNaN(nearest[i])) near[binOf(nearest[i], bins)]++;
  }
  for (let b = 0; b < bins; b++) pairs[b] = counts[b];
  return { start: 0, binWidth: 1 / bins, pairs, nearest: near };
}

/** Adds row i's pairs with the rows after it (each unordered pair once) to `counts` (its length = bins). */
export function binPairsOfRow(sims: Float64Array, i: number, m: number, valid: Uint8Array, counts: Float64Array): void {
  const bins = counts.length;
  const base = i * m;
  for (let j = i + 1; j < m; j++) {
    if (valid[j]) counts[binOf(sims[base + j]!, bins)]++;
  }
}

export function binOf(s: number, bins: number): number {
  const b = Math.floor(s * bins);
  return b < 0 ? 0 : b >= bins ? bins - 1 : b;
}
