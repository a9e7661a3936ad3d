/**
 * Turning a dense m×m Gram matrix (dot products, from sampleSimilarities) into Euclidean
 * distances, and telling which rows take part in the neighbour measures.
 *
 * ‖a − b‖² = ‖a‖² + ‖b‖² − 2·a·b; on unit rows this is 2 − 2·cos(a, b) (docs/methods.md §2), so the
 * distance ranking equals the cosine ranking. The general form keeps the same code usable on
 * raw, unnormalised points, which is how the textbook checks of §4–§6 are run.
 */

/**
 * 1 where a row has a non-zero vector. An all-zero row (a document emptied by tokenising or by
 * a stop list) has no direction: it is kept out of every neighbour list and every query-based
 * measure rather than counted as a point at equal distance from everything.
 */
export function validRowsFromGram(gram: Float64Array, m: number): Uint8Array {
  const valid = new Uint8Array(m);
  for (let i = 0; i < m; i++) valid[i] = gram[i * m + i] > 0 ? 1 : 0;
  return valid;
}

/**
 * Squared distances below this fraction of ‖a‖² + ‖b‖² are taken as 0: cosines carry ~1e-16 of
 * rounding, so a cosine within 5e-13 of 1 cannot be told from 1 by how it was summed.
 */
export const SAME_POINT = 1e-12;

/** Overwrites the Gram matrix with distances (the diagonal becomes 0) and returns it. */
export function distancesFromGram(gram: Float64Array, m: number): Float64Array {
  const norms = diagonalOf(gram, m);
  for (let i = 0; i < m; i++) rowToDistances(gram, i, m, norms);
  return gram;
}

/** The diagonal of an m×m matrix (the squared norms, before rows become distances). */
export function diagonalOf(gram: Float64Array, m: number): Float64Array {
  const norms = new Float64Array(m);
  for (let i = 0; i < m; i++) norms[i] = gram[i * m + i]!;
  return norms;
}

/** Row i of the Gram matrix turned into distances in place (see distancesFromGram). */
export function rowToDistances(gram: Float64Array, i: number, m: number, norms: Float64Array): void {
  const base = i * m;
  const ni = norms[i]!;
  for (let j = 0; j < m; j++) {
    const sq = ni + norms[j]! - 2 * gram[base + j]!;
    // Identical rows give ±1e-16 from rounding, and its square root (1e-8) would be noise that
    // ratio measures (TwoNN's r2/r1) blow up; below SAME_POINT they are the same point.
    gram[base + j] = sq > SAME_POINT * (ni + norms[j]!) ? Math.sqrt(sq) : 0;
  }
  gram[base + i] = 0;
}
