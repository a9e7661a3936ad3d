import type { Csr } from '../matrix/csr';
import type { RowCountSums } from '../tokenize/row-count-sums';

/**
 * Exact per-term sums over the raw counts c(d,t) of the whole corpus, before any stop list:
 * everything the suggestion signals need. Each field is a sum over documents, so shards merge by
 * adding them. Document length L_d is the number of kept tokens in d (Σ_t c(d,t)). The same
 * fields as the sums the row-writing threads add up for their rows, so those are used as they are.
 */
export interface TermCountStats extends RowCountSums {
  /**
   * Per term: the documents whose first token it is (CountMatrix.firstTerms). A grammar word
   * that opens most of the documents it occurs in heads the corpus's formula ("Someone who …",
   * "Of or pertaining to …"): the suggestion rule keeps it (choose-suggestions.ts).
   */
  opens: Float64Array;
}

/** The raw-count sums with how many documents each term opens (`firstTerms`: each document's first column, −1 for none). */
export function withOpenings(sums: RowCountSums, firstTerms: Int32Array): TermCountStats {
  const opens = new Float64Array(sums.df.length);
  for (let r = 0; r < firstTerms.length; r++) if (firstTerms[r]! >= 0) opens[firstTerms[r]!]! += 1;
  return { ...sums, opens };
}

/**
 * One pass over the non-zeros of the raw count matrix (rows = documents); `firstTerms` as in
 * withOpenings (a review passes the matrix's; without it no term opens a document).
 */
export function termCountStats(counts: Csr, firstTerms: Int32Array = new Int32Array(counts.rows).fill(-1)): TermCountStats {
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
  return withOpenings({ documents, totalTokens, sumLengthSq, df, cf, sumCountSq, sumCountLength }, firstTerms);
}
