import type { CountedPart } from './rows-in-rank-order';

/**
 * Per-term sums of the raw counts c(d,t) over some rows, with L_d = Σ_t c(d,t) (rows with
 * L_d = 0 left out): the fields of the suggestion rule's TermCountStats (terms/term-count-stats.ts),
 * which the review's thread adds up as the counted batches come in (PartCountSums), so that nobody
 * passes over every non-zero once more for them. Every term is a whole number, so the sums are
 * exact in any order below 2^53 (Σ c·L at a million documents is ~10^10): added up part by part
 * and term id by term id, they are termCountStats's of the whole matrix to the bit.
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
 * RowCountSums of counted parts (encode-batch.ts) as they come, kept by each coder's own term ids
 * and moved to the matrix's columns once the vocabulary is complete (`result`). A coder numbers
 * its terms in order of first use, so the frequent terms have small ids and their sums stay in
 * cache; added in column order by the threads that write the rows instead, the same sums were a
 * third of that writing (~0.2–0.3 s of CPU at 100k documents, each entry's four sums a cache miss
 * across 3.7 MB), while everything else waited for those threads.
 */
export class PartCountSums {
  documents = 0;
  totalTokens = 0;
  sumLengthSq = 0;
  /** Per stream: [df, cf, Σc², Σc·L] of the coder's term id at 4·id. */
  private readonly byStream: Float64Array[] = [];

  /** Adds `part`'s rows (its ids are stream `part.stream`'s; `terms`: how many ids that stream has so far). */
  add(part: CountedPart, terms: number): void {
    const { rowEnds, cols, counts } = part;
    let sums = this.byStream[part.stream] ?? new Float64Array(0);
    if (sums.length < 4 * terms) {
      const grown = new Float64Array(4 * Math.max(terms, sums.length / 2, 1024));
      grown.set(sums);
      sums = grown;
    }
    this.byStream[part.stream] = sums;
    let k = 0;
    for (let d = 0; d < rowEnds.length; d++) {
      const end = rowEnds[d]!;
      let length = 0;
      for (let j = k; j < end; j++) length += counts[j]!;
      if (length > 0) {
        this.documents++;
        this.totalTokens += length;
        this.sumLengthSq += length * length;
      }
      // Every stored count is ≥ 1, so a row with entries has a length > 0.
      for (; k < end; k++) {
        const q = 4 * cols[k]!;
        const c = counts[k]!;
        sums[q] += 1;
        sums[q + 1] += c;
        sums[q + 2] += c * c;
        sums[q + 3] += c * length;
      }
    }
  }

  /** The sums by column: ranks[stream][id] is the column of a stream's term id. */
  result(ranks: readonly Uint32Array[], columns: number): RowCountSums {
    const df = new Float64Array(columns);
    const cf = new Float64Array(columns);
    const sumCountSq = new Float64Array(columns);
    const sumCountLength = new Float64Array(columns);
    this.byStream.forEach((sums, stream) => {
      const rank = ranks[stream]!;
      for (let id = 0; id < rank.length; id++) {
        const t = rank[id]!;
        const q = 4 * id;
        df[t] += sums[q]!;
        cf[t] += sums[q + 1]!;
        sumCountSq[t] += sums[q + 2]!;
        sumCountLength[t] += sums[q + 3]!;
      }
    });
    return { documents: this.documents, totalTokens: this.totalTokens, sumLengthSq: this.sumLengthSq, df, cf, sumCountSq, sumCountLength };
  }
}
