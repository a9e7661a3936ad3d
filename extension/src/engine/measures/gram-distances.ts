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

/** Overwrites the Gram matrix with distances (the diagonal becomes 0) and returns it. */
export function distancesFromGram(gram: Float64Array, m: number): Float64Array {
  const norms = new Float64Array(m);
  for (let i = 0; i < m; i++) norms[i] = gram[i * m + i];
  for (let i = 0; i < m; i++) {
    const base = i * m;
    const ni = norms[i];
    for (let j = 0; j < m; j++) {
      const sq = ni + norms[j] - 2 * gram[base + j];
      // Rounding can leave a tiny negative for identical rows.
      gram[base + j] = sq > 0 ? Math.sqrt(sq) : 0;
    }
    gram[base + i] = 0;
  }
  return gram;
}
