/**
 * Per-term sums of the raw counts c(d,t) over some rows, with L_d = Σ_t c(d,t) (rows with
 * L_d = 0 left out): the fields of the suggestion rule's TermCountStats (terms/term-count-stats.ts),
 * which the threads that write the count matrix's rows add up for their own rows as they write
 * them (rows-in-rank-order.ts), so that the review's thread does not pass over every non-zero once
 * more for them. Every term is a whole number, so the sums are exact in any order below 2^53
 * (Σ c·L at a million documents is ~10^10): the shares' sums, added together, are
 * termCountStats's of the whole matrix to the bit.
 */
export interface RowCountSums {
  documents: number;
  /** Σ_d L_d and Σ_d L_d². */
  totalTokens: number;
  sumLengthSq: number;
  /** Per term: df, Σ c, Σ c², Σ c·L_d. */
  df: Float64Array;
  cf: Float64Array;
  sumCountSq: Float64Array;
  sumCountLength: Float64Array;
}

/**
 * RowCountSums while they are being added: a term's four sums side by side (one cache line), as
 * the writer adds them in column order.
 */
export class RowCountAccumulator {
  documents = 0;
  totalTokens = 0;
  sumLengthSq = 0;
  /** [df, cf, Σc², Σc·L] of term t at 4t. */
  readonly perTerm: Float64Array;

  constructor(readonly cols: number) {
    this.perTerm = new Float64Array(4 * cols);
  }

  /** The sums in RowCountSums' layout. */
  result(): RowCountSums {
    const { cols, perTerm } = this;
    const df = new Float64Array(cols);
    const cf = new Float64Array(cols);
    const sumCountSq = new Float64Array(cols);
    const sumCountLength = new Float64Array(cols);
    for (let t = 0; t < cols; t++) {
      df[t] = perTerm[4 * t]!;
      cf[t] = perTerm[4 * t + 1]!;
      sumCountSq[t] = perTerm[4 * t + 2]!;
      sumCountLength[t] = perTerm[4 * t + 3]!;
    }
    return { documents: this.documents, totalTokens: this.totalTokens, sumLengthSq: this.sumLengthSq, df, cf, sumCountSq, sumCountLength };
  }
}

/** Adds `from` into `into` (the same columns). */
export function addRowCountSums(into: RowCountSums, from: RowCountSums): void {
  into.documents += from.documents;
  into.totalTokens += from.totalTokens;
  into.sumLengthSq += from.sumLengthSq;
  for (const key of ['df', 'cf', 'sumCountSq', 'sumCountLength'] as const) {
    const a = into[key];
    const b = from[key];
    for (let t = 0; t < a.length; t++) a[t] += b[t]!;
  }
}
