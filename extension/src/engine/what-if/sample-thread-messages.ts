import type { SampledFields } from '../measures/measure-distances';
import type { SampleSideInput } from './sample-side';
import type { SharedColumnGatherBuffers } from './shared-column-gather';

/**
 * workerData of sample-thread.ts: the sampled rows as plain arrays, and the measures' settings;
 * with `gather`, the shared memory of the exact sums' gather, which the thread helps with once
 * a click's own half is done (SharedColumnGather).
 */
export type SampleThreadData = SampleSideInput & { gather?: SharedColumnGatherBuffers };

/**
 * Review thread → sample thread: the sampled measures with `removed` stopped. `full` asks for a
 * full build of the dot products (the opening state, kept as a checkpoint), not an update.
 */
export interface SampleRequest {
  seq: number;
  removed: Uint8Array;
  full: boolean;
  /** SampleSide.speculate: computed in a copy, adopted only by a request for the same mask that comes next. */
  speculative?: boolean;
  /**
   * With `speculative`: the host's count of clicks sent (shared memory) and its value when the
   * prefetch was asked; the thread abandons the prefetch once it moves (stopOnClick).
   */
  clicks?: { counter: Int32Array; seen: number };
  /**
   * Open the sweep to the review's thread under this ticket (above every earlier one): it takes
   * blocks of rows once its own half is done (SharedRowSweep).
   */
  ticket?: number;
  /**
   * With `ticket`: once this request is answered, help with the exact sums' gather of the same
   * ticket (the review's thread opens it, or passes it over when the click does not gather).
   */
  gather?: boolean;
}

/** Sample thread → review thread: the answer to request `seq`, or why there is none. */
export type SampleReply = { seq: number; measures: SampledFields; error: null } | { seq: number; measures: null; error: string };
