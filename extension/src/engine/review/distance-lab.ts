import type { Csr } from '../matrix/csr';
import { maskTerms } from '../matrix/mask-terms';
import { measureDistances } from '../measures/measure-distances';

export type DistanceResult = ReturnType<typeof measureDistances>;

/**
 * Holds the full weight matrix (no stop list applied) and measures it under any set of removed
 * columns: mask, renormalise each row (O(nnz)), then the measures on the seeded sample.
 * This is the what-if behind the suggestions and the panel's toggles; nothing is re-tokenised.
 */
export class DistanceLab {
  private readonly scratch: { indptr: Uint32Array; indices: Uint32Array; data: Float64Array };

  constructor(
    /** l2-normalised weights of every kept term; removing a column and renormalising equals
     *  weighting without that term, because idf depends only on the term's own df. */
    readonly weights: Csr,
    readonly sample: Uint32Array,
    readonly k: number,
    readonly seed: number,
    /** Label id per sample position, −1 where the document has none; null without labels. */
    readonly sampleLabels: Int32Array | null,
  ) {
    const nnz = weights.indptr[weights.rows] ?? 0;
    this.scratch = {
      indptr: new Uint32Array(weights.rows + 1),
      indices: new Uint32Array(nnz),
      data: new Float64Array(nnz),
    };
  }

  /** The masked matrix: rows renormalised over the terms that remain. */
  masked(removed: Uint8Array): Csr {
    return maskTerms(this.weights, removed, 'l2', this.scratch);
  }

  measure(removed: Uint8Array, baselineNeighbors: Uint32Array | null): DistanceResult {
    const x = this.masked(removed);
    return measureDistances(x, {
      sample: this.sample,
      k: this.k,
      seed: this.seed,
      labels: this.sampleLabels,
      baselineNeighbors,
    });
  }

  /** Column mask with `base` plus `extra` columns set. */
  static union(base: Uint8Array, extra: Iterable<number>): Uint8Array {
    const mask = base.slice();
    for (const col of extra) mask[col] = 1;
    return mask;
  }
}
