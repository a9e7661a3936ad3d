import type { Csr } from '../matrix/csr';

/**
 * The dense m×m matrix of dot products between the sampled rows (row-major, symmetric; the
 * diagonal holds each row's squared norm). On l2-normalised rows that is the cosine matrix.
 *
 * Rows are taken in sample order and each is scored against an inverted index of the rows
 * already seen, then added to it, with a dense accumulator for the row. The work is
 * Σ_t df_sample(t)²/2 multiply-adds instead of m²·nnz, and only the lower triangle is
 * computed before mirroring.
 */
export function sampleSimilarities(X: Csr, sample: Uint32Array): Float64Array {
  const m = sample.length;
  const { indptr, indices, data, cols } = X;
  for (let i = 0; i < m; i++) {
    if (sample[i] >= X.rows) throw new RangeError(`sampleSimilarities: sample index ${sample[i]} ≥ rows ${X.rows}`);
  }

  // Posting lists: for term t, slots start[t] .. start[t+1]) hold (position, weight).
  const start = new Uint32Array(cols + 1);
  for (let i = 0; i < m; i++) {
    const r = sample[i];
    for (let p = indptr[r]; p < indptr[r + 1]; p++) start[indices[p] + 1]++;
  }
  for (let t = 0; t < cols; t++) start[t + 1] += start[t];
  const postPos = new Uint32Array(start[cols]);
  const postVal = new Float64Array(start[cols]);
  const fill = start.slice(0, cols);

  const sims = new Float64Array(m * m);
  // A row-sized accumulator stays in the first-level cache while the long posting lists of
  // common terms are scattered into it; writing straight into the m×m array was ~2× slower.
  const acc = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const r = sample[i];
    let self = 0;
    for (let p = indptr[r], pEnd = indptr[r + 1]; p < pEnd; p++) {
      const x = data[p];
      if (x === 0) continue;
      const t = indices[p];
      self += x * x;
      const end = fill[t];
      for (let q = start[t]; q < end; q++) acc[postPos[q]] += x * postVal[q];
      postPos[end] = i;
      postVal[end] = x;
      fill[t] = end + 1;
    }
    const rowBase = i * m;
    for (let j = 0; j < i; j++) {
      sims[rowBase + j] = acc[j];
      acc[j] = 0;
    }
    sims[rowBase + i] = self;
  }
  mirrorLowerTriangle(sims, m);
  return sims;
}

/**
 * Copies the lower triangle onto the upper one in square tiles: a plain column-order copy
 * touches a new cache line on every write and cost more than the products themselves.
 */
function mirrorLowerTriangle(a: Float64Array, m: number): void {
  const tile = 64;
  for (let bi = 0; bi < m; bi += tile) {
    const iEnd = Math.min(m, bi + tile);
    for (let bj = 0; bj <= bi; bj += tile) {
      const jEnd = Math.min(m, bj + tile);
      for (let i = bi; i < iEnd; i++) {
        const row = i * m;
        const jStop = Math.min(jEnd, i);
        for (let j = bj; j < jStop; j++) a[j * m + i] = a[row + j];
      }
    }
  }
}
