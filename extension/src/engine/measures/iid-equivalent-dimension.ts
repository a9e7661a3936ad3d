/**
 * Coefficient of variation (sd/mean) of the distances, raised to `power`, over all unordered
 * pairs of valid sample rows; null with fewer than two pairs or a zero mean.
 */
export function pairDistanceCv(dist: Float64Array, m: number, valid: Uint8Array, power: 1 | 2 = 1): number | null {
  // Two passes (mean, then squared deviations) keep the variance accurate when the spread is
  // small next to the mean — exactly the concentrated case this measure is for.
  const first = { sum: 0, count: 0 };
  for (let i = 0; i < m; i++) addUpperRow(dist, i, m, valid, power, first);
  return pairDistanceCvAfter(dist, m, valid, power, first);
}

/** The first pass of pairDistanceCv for row i (pairs with the rows after it), rows in order. */
export function addUpperRow(dist: Float64Array, i: number, m: number, valid: Uint8Array, power: 1 | 2, acc: { sum: number; count: number }): void {
  if (!valid[i]) return;
  const base = i * m;
  let { sum, count } = acc;
  for (let j = i + 1; j < m; j++) {
    if (!valid[j]) continue;
    const d = dist[base + j]!;
    sum += power === 1 ? d : d * d;
    count++;
  }
  acc.sum = sum;
  acc.count = count;
}

/** pairDistanceCv's second pass, given the first pass's sum and count over every row. */
export function pairDistanceCvAfter(dist: Float64Array, m: number, valid: Uint8Array, power: 1 | 2, first: { sum: number; count: number }): number | null {
  const { sum, count } = first;
  if (count < 2) return null;
  const mean = sum / count;
  let m2 = 0;
  for (let i = 0; i < m; i++) {
    if (!valid[i]) continue;
    const base = i * m;
    for (let j = i + 1; j < m; j++) {
      if (!valid[j]) continue;
      const d = dist[base + j]!;
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
  return iidDimensionOfCv(pairDistanceCv(dist, m, valid, 1));
}

/** d_eq = 1/(2·CV²) from the distances' CV; null when it is undefined or 0. */
export function iidDimensionOfCv(cv: number | null): number | null {
  if (cv === null || !(cv > 0)) return null;
  return 1 / (2 * cv * cv);
}
