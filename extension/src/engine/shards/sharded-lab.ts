import type { Csr } from '../matrix/csr';
import type { MaskedTermSums } from '../measures/masked-term-sums';
import { DistanceLab } from '../what-if/distance-lab';
import { maskColumns, maskId, type MaskRequest } from './partials';

/**
 * A DistanceLab for a review spread over shards: it holds only the sampled rows, and answers the
 * exact whole-corpus sums from the shards' summed partials, by mask. A mask no round computed
 * yet is noted in `missing` and answered with zeros; the caller then runs another sums round
 * for the missing masks and reviews again, until nothing is missing. The choices a review makes
 * depend only on the sample and on sums already known, so the second pass repeats the first.
 */
export class ShardedLab extends DistanceLab {
  readonly missing = new Map<string, number[]>();

  constructor(
    sampleRows: Csr,
    k: number,
    seed: number,
    sampleLabels: Int32Array | null,
    private readonly masked: Map<string, MaskedTermSums>,
    private readonly full: MaskedTermSums | null,
  ) {
    super(sampleRows, new Uint32Array(sampleRows.rows).map((_, i) => i), k, seed, sampleLabels);
  }

  protected override exactSums(removed: Uint8Array): MaskedTermSums {
    return this.sums(removed);
  }

  override sums(removed: Uint8Array): MaskedTermSums {
    const columns = maskColumns(removed);
    const id = maskId(columns);
    const known = this.masked.get(id);
    if (known !== undefined) return known;
    this.missing.set(id, columns);
    return zeroSums(this.weights.cols);
  }

  /** The columns of `removed` and their mask id, if no round has computed their sums yet. */
  unknown(removed: Uint8Array): MaskRequest | null {
    const columns = maskColumns(removed);
    const id = maskId(columns);
    return this.masked.has(id) ? null : { id, columns };
  }

  /** Sums a later round computed (a what-if's mask). */
  learn(id: string, sums: MaskedTermSums): void {
    this.masked.set(id, sums);
  }

  override fullSums(): MaskedTermSums {
    if (this.full === null) throw new Error('ShardedLab: the unmasked sums were not computed in round 2');
    return this.full;
  }
}

function zeroSums(cols: number): MaskedTermSums {
  return { sums: { s1: new Float64Array(cols), s2: new Float64Array(cols), df: new Uint32Array(cols), sxlogx: new Float64Array(cols) }, rowsWithWeight: 0 };
}
