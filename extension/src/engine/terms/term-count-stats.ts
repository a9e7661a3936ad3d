import type { Csr } from '../matrix/csr';
import type { RowCountSums } from '../tokenize/row-count-sums';

/**
 * Exact per-term sums over the raw counts c(d,t) of the whole corpus, before any stop list:
 * everything the suggestion signals need. Each field is a sum over documents, so shards merge by
 * adding them. Document length L_d is the number of kept tokens in d (Σ_t c(d,t)). The same
 * fields as the sums the row-writing threads add up for their rows, so those are used as they are.
 */
export type TermCountStats = RowCountSums;

/** One pass over the non-zeros of the raw count matrix (rows = documents). */
export function termCountStats(counts: Csr): TermCountStats {
  const { rows, cols, indptr, indices, data } = counts;
  const df = new Float64Array(cols);
  const cf = new Float64Array(cols);
  const sumCountSq = new Float64Array(cols);
  const sumCountLength = new Float64Array(cols);
  let totalTokens = 0;
  let sumLengthSq = 0;
  let documents = 0;
  for (let r = 0; r < rows; r++) {
    let length = 0;
    for (let p = indptr[r]!; p < indptr[r + 1]!; p++) length += data[p]!;
    if (length === 0) continue;
    documents++;
    totalTokens += length;
    sumLengthSq += length * length;
    for (let p = indptr[r]!; p < indptr[r + 1]!; p++) {
      const t = indices[p]!;
      const c = data[p]!;
      df[t]! += 1;
      cf[t]! += c;
      sumCountSq[t]! += c * c;
      sumCountLength[t]! += c * length;
    }
  }
  return { documents, totalTokens, sumLengthSq, df, cf, sumCountSq, sumCountLength };
}
