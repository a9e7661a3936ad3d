import type { Csr } from '../matrix/csr';
import { sampledMeasures, type SampledFields } from '../measures/measure-distances';
import { SharedRowSweep, type SharedRowSweepBuffers } from '../measures/shared-row-sweep';
import { GRAM_ROWS_UPDATE_TERMS, GramRowsUpdate } from './gram-rows-update';
import { IncrementalGram } from './incremental-gram';
import { sameMask } from './incremental-term-sums';

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
  /**
   * Shared memory for the sweep over the dot products (SharedRowSweep.create(m, k,
   * WHAT_IF_BLOCK_ROWS)), so that another thread can take part in it: the dot products live
   * there, and, made with room for them (IncrementalGram.storageNeeds), the shared-term counts and
   * the postings the updates read, which then run in WebAssembly. Without it everything stays in
   * this thread; the answers are the same bits.
   */
  sweep?: SharedRowSweepBuffers;
  /**
   * With `sweep`: the shared list of a click's toggled terms (GramRowsUpdate.buffer()), so that the
   * dot products' update runs row by row as the sweep reaches each block, on either thread
   * (the helper opens its own GramRowsUpdate over it). Without it the update runs whole first.
   */
  rowsUpdate?: SharedArrayBuffer;
}

/**
 * Rows per block of the what-if's sweep over the sample's products (measureSampleRows): the unit
 * two threads share it in, so the one-thread answer (DistanceLab.whatIf) sums in the same blocks.
 * 16 rows at m = 2,000 are ~1 ms of work: small enough that neither thread waits long for the
 * other's last block. A choice of ours, no source.
 */
export const WHAT_IF_BLOCK_ROWS = 16;

/**
 * The sample's half of a what-if: the kept dot products of the sampled rows (IncrementalGram,
 * updated from the toggled terms' sample postings) and every measure read off them. It holds
 * nothing of the whole corpus, so it can run on a thread of its own (sample-thread.ts) while
 * the exact sums are updated on the review's thread; DistanceLab.whatIf runs the same two
 * calls in one thread.
 */
export class SampleSide {
  private gram: IncrementalGram;
  /** The second state speculative answers are computed in (IncrementalGram.twin), once needed. */
  private spare: IncrementalGram | null = null;
  /** The latest speculative answer and its mask, computed from the current state: every call to measures drops it. */
  private speculation: { mask: Uint8Array; measures: SampledFields } | null = null;

  private readonly shared: SharedRowSweep | null;
  /** The update run row by row in the sweep (GramRowsUpdate), or null (it runs whole first). */
  private readonly rowsUpdate: GramRowsUpdate | null;

  constructor(private readonly input: SampleSideInput) {
    this.shared = input.sweep !== undefined ? SharedRowSweep.from(input.sweep) : null;
    this.rowsUpdate = this.shared !== null && input.rowsUpdate !== undefined ? GramRowsUpdate.open(this.shared, input.rowsUpdate) : null;
    this.gram = new IncrementalGram(input.rows, this.shared?.state(0));
  }

  /**
   * The sampled Measures with `removed` stopped; `incremental` as in IncrementalGram.scaled. An
   * incremental call for the mask of the latest speculation, with no call between them, adopts
   * the speculation's state and answer (see speculate). With a `ticket` (above every earlier
   * one) the sweep is opened to a helping thread under it (SharedRowSweep).
   */
  measures(removed: Uint8Array, incremental = true, ticket?: number): SampledFields {
    const held = this.speculation;
    this.speculation = null;
    if (incremental && held !== null && this.spare !== null && held.mask.length === removed.length && sameMask(removed, held.mask)) {
      [this.gram, this.spare] = [this.spare, this.gram];
      return held.measures;
    }
    return this.read(this.gram, removed, incremental, undefined, ticket);
  }

  /**
   * measures(removed)'s answer computed in a copy of the dot products (the panel's prefetch on a
   * hover): the state the clicks walk does not move, and a measures(removed) that comes next
   * adopts the copy, so its answer and the state it leaves are a plain call's, bit for bit.
   * The copy costs one pass over the m×m products (idle time: no click waits for it).
   * `interrupt` is called every few rows and throws to abandon it (a click came).
   */
  speculate(removed: Uint8Array, interrupt?: () => void, ticket?: number): SampledFields {
    this.speculation = null;
    const spare = (this.spare ??= this.gram.twin(this.shared?.state(1)));
    spare.copyFrom(this.gram);
    const measures = this.read(spare, removed, true, interrupt, ticket);
    this.speculation = { mask: removed.slice(), measures };
    return measures;
  }

  /** The dot products' drift reset, if due (IncrementalGram.settle): for the time between requests. */
  settle(): void {
    this.gram.settle();
  }

  private read(gram: IncrementalGram, removed: Uint8Array, incremental: boolean, interrupt?: () => void, ticket?: number): SampledFields {
    const sweep = ticket !== undefined ? this.shared : null;
    const rowsUpdate = sweep !== null ? this.rowsUpdate : null;
    // In a shared sweep an update's pair loops run block by block as the sweep reaches them.
    const { dots, scale, pending } = rowsUpdate !== null ? gram.scaledPending(removed, incremental, GRAM_ROWS_UPDATE_TERMS, interrupt) : { ...gram.scaled(removed, incremental, interrupt), pending: null };
    if (pending !== null) rowsUpdate!.set(dots, pending);
    const { k, seed, labels, baselineNeighbors } = this.input;
    // Only the Measures leave here: the sweep's per-row arrays need not be copied out.
    const shared = sweep !== null ? { shared: { sweep, ticket: ticket!, views: true, ...(pending === null ? {} : { prepare: rowsUpdate!.rows }) } } : {};
    const measures = sampledMeasures({ k, seed, labels, baselineNeighbors, gram: dots, rowScale: scale, blockRows: WHAT_IF_BLOCK_ROWS, ...(interrupt === undefined ? {} : { interrupt }), ...shared }).measures;
    // Every row was swept, so every row ran its pair loops (a throw above leaves the state to be built again).
    if (pending !== null) gram.rowsUpdated();
    return measures;
  }
}
