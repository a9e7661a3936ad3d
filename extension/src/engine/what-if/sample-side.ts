import type { Csr } from '../matrix/csr';
import { sampledMeasures, type SampledFields } from '../measures/measure-distances';
import { IncrementalGram } from './incremental-gram';

/** What a SampleSide needs: the review's sampled rows and the settings of its measures. */
export interface SampleSideInput {
  /** The sampled rows, unmasked, in sample order (DistanceLab.sampleRows). */
  rows: Csr;
  k: number;
  seed: number;
  /** Label id per sample position, −1 where none; null without labels. */
  labels: Int32Array | null;
  /** The baseline's neighbours on the same sample and k (for the neighbour turnover). */
  baselineNeighbors: Uint32Array | null;
}

/**
 * The sample's half of a what-if: the kept dot products of the sampled rows (IncrementalGram,
 * updated from the toggled terms' sample postings) and every measure read off them. It holds
 * nothing of the whole corpus, so it can run on a thread of its own (sample-thread.ts) while
 * the exact sums are updated on the review's thread; DistanceLab.whatIf runs the same two
 * calls in one thread.
 */
export class SampleSide {
  private readonly gram: IncrementalGram;

  constructor(private readonly input: SampleSideInput) {
    this.gram = new IncrementalGram(input.rows);
  }

  /** The sampled Measures with `removed` stopped; `incremental` as in IncrementalGram.scaled. */
  measures(removed: Uint8Array, incremental = true): SampledFields {
    const { dots, scale } = this.gram.scaled(removed, incremental);
    const { k, seed, labels, baselineNeighbors } = this.input;
    return sampledMeasures({ k, seed, labels, baselineNeighbors, gram: dots, rowScale: scale }).measures;
  }

  /** The dot products' drift reset, if due (IncrementalGram.settle): for the time between requests. */
  settle(): void {
    this.gram.settle();
  }
}
