/**
 * Coefficient of variation (sd/mean) of the distances, raised to `power`, over all unordered
 * pairs of valid sample rows; null with fewer than two pairs or a zero mean.
 */
export function pairDistanceCv(dist: Float64Array, m: number, valid: Uint8Array, power: 1 | 2 = 1): number | null {
  // Two passes (mean, then squared deviations) keep the variance accurate when the spread is
  // small next to the mean — exactly the concentrated case this measure is for.
  let count = 0;
  let sum = 0;
  for (let i = 0; i < m; i++) {
    if (!valid[i]) continue;
    const base = i * m;
    for (let j = i + 1; j < m; j++) {
      if (!valid[j]) continue;
      const d = dist[base + j];
      sum += power === 1 ? d : d * d;
      count++;
    }
  }
  if (count < 2) return null;
  const mean = sum / count;
  let m2 = 0;
  for (let i = 0; i < m; i++) {
    if (!valid[i]) continue;
    const base = i * m;
    for (let j = i + 1; j < m; j++) {
      if (!valid[j]) continue;
      const d = dist[base + j];
      const dev = (power === 1 ? d : d * d) - mean;
      m2 += dev * dev;
    }
  }
  if (!(mean > 0)) return null;
  return Math.sqrt(m2 / count) / mean;
}

/**
 * The "iid-equivalent dimension" of the sampled pair distances (docs/methods.md §4): for iid standard
 * normal points in d dimensions ‖x − y‖² = 2·χ²_d, and the distances' coefficient of variation
 * is ≈ 1/√(2d) for large d, so d_eq = 1/(2·CV²) reads a distance spread as the dimension of an
 * iid Gaussian cloud with the same concentration. null when the CV is undefined or 0.
 */
export function iidEquivalentDimension(dist: Float64Array, m: number, valid: Uint8Array): number | null {
  const cv = pairDistanceCv(dist, m, valid, 1);
  if (cv === null || !(cv > 0)) return null;
  return 1 / (2 * cv * cv);
}
