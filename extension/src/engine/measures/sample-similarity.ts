import type { Csr } from '../matrix/csr';

/**
 * The dense m×m matrix of dot products between the sampled rows (row-major, symmetric; the
 * diagonal holds each row's squared norm). On l2-normalised rows that is the cosine matrix.
 *
 * Rows are taken in sample order and each is scored against an inverted index of the rows
 * already seen, then added to it; the row of the output is the dense accumulator. The work is
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
  for (let i = 0; i < m; i++) {
    const r = sample[i];
    const rowBase = i * m;
    let self = 0;
    for (let p = indptr[r]; p < indptr[r + 1]; p++) {
      const t = indices[p];
      const x = data[p];
      if (x === 0) continue;
      self += x * x;
      for (let q = start[t], e = fill[t]; q < e; q++) sims[rowBase + postPos[q]] += x * postVal[q];
      postPos[fill[t]] = i;
      postVal[fill[t]] = x;
      fill[t]++;
    }
    sims[rowBase + i] = self;
  }
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < i; j++) sims[j * m + i] = sims[i * m + j];
  }
  return sims;
}
