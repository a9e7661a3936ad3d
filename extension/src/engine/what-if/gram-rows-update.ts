import type { SharedRowSweep, SweepState } from '../measures/shared-row-sweep';
import { gramUpdateModule } from './incremental-gram';

interface GramUpdateExports {
  update(dots: number, counts: number, wide: number, pos: number, val: number, m: number, from: number, to: number, aFrom: number, aTo: number, sign: number): void;
}

/** Slots of the shared list before the terms: the state's index, then how many terms follow. */
const STATE = 0;
const TERMS = 1;
const HEAD = 2;

/**
 * The most toggled terms a click's update can leave to the sweep's rows (IncrementalGram.
 * scaledPending); a click with more updates its dot products first, as before. A panel click
 * toggles one term; 64 covers a stop list's worth of suggestions ticked at once.
 */
export const GRAM_ROWS_UPDATE_TERMS = 64;

/**
 * The what-if's dot-product update run row by row, by whichever thread sweeps those rows
 * (SharedRowSweep's `prepare`): the pair loops IncrementalGram.scaledPending left, over the
 * rows [first, end) of the state the sweep reads, in the same WebAssembly (gram-update.wat) on
 * the same memory. Row i's pairs of a term write only D_i· and the counts of row i, so running
 * each term's postings of rows [first, end) just before those rows are swept gives every entry
 * the same operations in the same order (term by term, as the update runs them) as the whole
 * update before the sweep: the same bits (test/what-if-gram-rows-update.test.ts). Why: the rows
 * are then in the sweeping thread's cache when it reads them, instead of being written by the
 * update and read back from memory by the sweep, and the update's work is shared by both threads
 * instead of running on the sample's thread alone before the sweep opens (docs/performance.md).
 *
 * The list of terms lives in shared memory (`buffer`): the sample's thread sets it before it
 * opens the sweep (the sweep's opening publishes it), the review's thread reads it for the blocks
 * it takes.
 */
export class GramRowsUpdate {
  private readonly list: Int32Array;
  private readonly exports: GramUpdateExports;
  private readonly wide: number;

  private constructor(
    private readonly sweep: SharedRowSweep,
    private readonly states: SweepState[],
    buffer: SharedArrayBuffer,
    exports: GramUpdateExports,
  ) {
    this.list = new Int32Array(buffer);
    this.exports = exports;
    this.wide = states[0]!.counts!.BYTES_PER_ELEMENT === 4 ? 1 : 0;
  }

  /** Shared memory for the list of terms, to hand to both threads. */
  static buffer(): SharedArrayBuffer {
    return new SharedArrayBuffer(4 * (HEAD + 3 * GRAM_ROWS_UPDATE_TERMS));
  }

  /**
   * This thread's update of `sweep`'s states, or null where the states have no room for their
   * update in a WebAssembly memory, or the module cannot be had (each update then runs whole
   * before its sweep, as IncrementalGram runs it).
   */
  static open(sweep: SharedRowSweep, buffer: SharedArrayBuffer): GramRowsUpdate | null {
    const all = Array.from({ length: sweep.buffers.states }, (_, i) => sweep.state(i));
    const memory = all[0]?.memory;
    if (memory === undefined || all.some((s) => s.counts === undefined || s.postPos === undefined || s.postVal === undefined || s.memory !== memory)) return null;
    const module = gramUpdateModule();
    if (module === null) return null;
    try {
      return new GramRowsUpdate(sweep, all, buffer, new WebAssembly.Instance(module, { env: { memory } }).exports as unknown as GramUpdateExports);
    } catch {
      return null;
    }
  }

  /** The sample's thread: the pair loops of `pending` (IncrementalGram.scaledPending's) for the state `dots` is, before its sweep opens. */
  set(dots: Float64Array, pending: Int32Array): void {
    const state = this.sweep.stateOf(dots);
    if (state < 0 || this.states[state] === undefined) throw new Error('GramRowsUpdate: the dot products are not one of the sweep\'s states');
    if (pending.length > 3 * GRAM_ROWS_UPDATE_TERMS) throw new RangeError(`GramRowsUpdate: ${pending.length / 3} terms, at most ${GRAM_ROWS_UPDATE_TERMS}`);
    this.list[STATE] = state;
    this.list[TERMS] = pending.length / 3;
    this.list.set(pending, HEAD);
  }

  /** The pair loops of the list's terms for the rows [first, end), term by term (SharedRowSweep's `prepare`). */
  readonly rows = (first: number, end: number): void => {
    const { list, exports, wide } = this;
    const state = this.states[list[STATE]!]!;
    const pos = state.postPos!;
    const dots = state.dots.byteOffset;
    const counts = state.counts!.byteOffset;
    const m = state.scale.length;
    for (let n = 0, terms = list[TERMS]!; n < terms; n++) {
      const from = list[HEAD + 3 * n]!;
      const to = list[HEAD + 3 * n + 1]!;
      // A term's postings are in row order: those of rows [first, end) are one run.
      const a = firstAtLeast(pos, from, to, first);
      const aTo = firstAtLeast(pos, a, to, end);
      if (a < aTo) exports.update(dots, counts, wide, pos.byteOffset, state.postVal!.byteOffset, m, from, to, a, aTo, list[HEAD + 3 * n + 2]!);
    }
  };
}

/** The first index in [lo, hi) whose row is at least `row` (hi if none); `pos` ascending there. */
function firstAtLeast(pos: Uint32Array, lo: number, hi: number, row: number): number {
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (pos[mid]! < row) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
