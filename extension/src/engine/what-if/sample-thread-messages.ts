import type { SampledFields } from '../measures/measure-distances';
import type { SampleSideInput } from './sample-side';

/** workerData of sample-thread.ts: the sampled rows as plain arrays, and the measures' settings. */
export type SampleThreadData = SampleSideInput;

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
}

/** Sample thread → review thread: the answer to request `seq`, or why there is none. */
export type SampleReply = { seq: number; measures: SampledFields; error: null } | { seq: number; measures: null; error: string };
