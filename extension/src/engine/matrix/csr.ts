/**
 * A sparse matrix in compressed sparse row form: row r holds the entries
 * indices[indptr[r] .. indptr[r+1]) with values data[...]; column ids are ascending within a row.
 * Rows are documents, columns are terms.
 */
export interface Csr {
  readonly rows: number;
  readonly cols: number;
  readonly indptr: Uint32Array; // length rows + 1
  readonly indices: Uint32Array; // length nnz
  readonly data: Float64Array; // length nnz
}

/** Raw term counts with the vocabulary they index. */
export interface CountMatrix extends Csr {
  /** Column j's term. */
  readonly terms: readonly string[];
  /** Tokens per document before pruning (for meanDocLength and the Report). */
  readonly tokensPerDoc: Uint32Array;
  /**
   * Each document's first token's column, −1 for a document without one (or whose first term
   * was pruned): how many documents a term opens, for the suggestion rule's formula heads
   * (terms/term-count-stats.ts, docs/methods.md §9).
   */
  readonly firstTerms: Int32Array;
}

/** `firstTerms` under a new numbering of the columns: `columnOf[c]` is column c's new one, < 0 where it is dropped. */
export function renumberFirstTerms(firstTerms: Int32Array, columnOf: ArrayLike<number>): Int32Array {
  return firstTerms.map((c) => (c < 0 || columnOf[c]! < 0 ? -1 : columnOf[c]!));
}

export function nnz(m: Csr): number {
  return m.indptr[m.rows] ?? 0;
}
