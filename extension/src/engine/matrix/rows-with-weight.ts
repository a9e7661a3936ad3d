import type { Csr } from './csr';

/**
 * Whether row r has at least one non-zero value: a document with a direction, which can take part
 * in cosine pairs and in the sample. Stored entries are not enough — a mask, or idf = ln(n/df) of a
 * term in every document, leaves explicit zeros behind.
 */
export function rowHasWeight(X: Csr, r: number): boolean {
  for (let p = X.indptr[r]!; p < X.indptr[r + 1]!; p++) if (X.data[p] !== 0) return true;
  return false;
}

/** How many rows have at least one non-zero value (see rowHasWeight): the n of the all-pairs sums. */
export function rowsWithWeight(X: Csr): number {
  let count = 0;
  for (let r = 0; r < X.rows; r++) if (rowHasWeight(X, r)) count++;
  return count;
}
