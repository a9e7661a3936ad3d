/**
 * TwoNN intrinsic dimension (Facco, d'Errico, Rodriguez & Laio 2017, "Estimating the intrinsic
 * dimension of datasets by a minimal neighborhood information", Scientific Reports 7; docs/methods.md
 * §6). For each point μ = r2/r1, the ratio of its second to first neighbour distance, follows a
 * Pareto law with exponent d, whose maximum-likelihood estimate is d = N / Σ ln μ.
 *
 * The paper also fits −ln(1 − F(μ)) = d·ln μ by least squares through the origin after dropping
 * the largest 10% of μ, which is less sensitive to outliers; the maximum-likelihood form is used
 * here because it needs no tuning and its bias is small for the N of a sample.
 *
 * Points with r1 = 0 (exact duplicates, common in text) are removed first: their μ is infinite.
 * `nnDist` is m×k neighbour distances, ascending, NaN where a row has no neighbour.
 * null when fewer than 2 points remain or Σ ln μ = 0 (every point equidistant from two others).
 */
export function twoNN(nnDist: Float64Array, m: number, k: number): number | null {
  if (k < 2) return null;
  let n = 0;
  let sumLog = 0;
  for (let i = 0; i < m; i++) {
    const r1 = nnDist[i * k];
    const r2 = nnDist[i * k + 1];
    if (!(r1 > 0) || Number.isNaN(r2)) continue;
    n++;
    // Neighbours within the k-NN tie tolerance may come out a rounding error below r1: μ = 1.
    sumLog += Math.log(Math.max(1, r2 / r1));
  }
  if (n < 2 || !(sumLog > 0)) return null;
  return n / sumLog;
}
