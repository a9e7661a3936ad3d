import { pairShift, reduceSweep, SweepRows, type SampleRowMeasures, type SweepOutputs } from './measure-sample-rows';
import { sharedMemoryFor } from '../wasm/shared-memory';
import { outputsAt, sweepLayout, sweepRowsModule, WasmSweepRows, type GramRoom, type SweepLayout } from './sweep-rows-wasm';

/** The shared memory of a SharedRowSweep, to post to the thread that helps. */
export interface SharedRowSweepBuffers {
  m: number;
  k: number;
  blockRows: number;
  /** How many states (dot products m×m and row scales m) the memory holds. */
  states: number;
  /** Room for the states' updates beside them (see SweepState), if any. */
  gram?: GramRoom;
  control: SharedArrayBuffer;
  shift: SharedArrayBuffer;
  /**
   * The rows' validity, the sweep's outputs, each thread's scratch and the states, as
   * sweepLayout(m, k, blocks, states, 2) lays them out: in a shared WebAssembly memory, so that the
   * sweep's rows run in WebAssembly (sweep-rows-wasm.ts), or, where no such memory can be had, in
   * a plain shared buffer (the rows then run in JavaScript: the same bits).
   */
  memory: WebAssembly.Memory | null;
  buffer: SharedArrayBuffer;
}

// Slots of the control array.
/** (ticket & 0x7fff)·2^16 + the next block to claim: a claim and the sweep it is for in one word. */
const CLAIM = 0;
/** Blocks finished in the open sweep. */
const DONE = 1;
/** The ticket of the latest sweep opened. */
const OPENED = 2;
/** Which pair of `grams` the open sweep reads. */
const GRAM = 3;
/** Set by a helper whose block failed: the owner then sweeps every block again itself. */
const FAILED = 4;
/** 1 when each block of the open sweep is prepared first (the owner's `prepare`, the helper's too). */
const PREPARE = 5;
/** The block the owner prepared before opening the sweep (for pairShift), −1 if none. */
const PREPARED = 6;
const CONTROL_SLOTS = 7;

/** Whose scratch a sweep's rows use (sweepLayout's threads): the owner's sweeps, the helper's blocks. */
const OWNER = 0;
const HELPER = 1;

/**
 * One state of a SharedRowSweep: the dot products and row scales a sweep reads; where the memory
 * was made with room for them (SharedRowSweep.create's `gram`), the state's shared-term counts and
 * the sample's postings (one copy for every state) as IncrementalGram keeps them, and the
 * WebAssembly memory all of them are in, so that the state's update runs there (gram-update.wat).
 */
export interface SweepState {
  dots: Float64Array;
  scale: Float64Array;
  counts?: Uint16Array | Uint32Array;
  postPos?: Uint32Array;
  postVal?: Float64Array;
  memory?: WebAssembly.Memory;
}

/**
 * Work a sweep's rows need before they are read, on rows [first, end) of the state the sweep reads
 * (the what-if's dot-product update of those rows, what-if/gram-rows-update.ts): it writes only
 * those rows, so whichever thread sweeps a block prepares it, just before (the rows are then in
 * its cache when swept). Each thread passes its own (SharedRowSweep.sweep, help).
 */
export type PrepareRows = (first: number, end: number) => void;

/**
 * One sweep of the sampled measures (measureSampleRows' rows, in blocks) shared by two threads:
 * the owner (the what-if's sample thread) opens it under a ticket once its dot products are up
 * to date (or, with a `prepare`, once their diagonal and the row scales are, each block's rows
 * then brought up to date by the thread that sweeps them), and it and a helper (the review's
 * thread, once its exact sums are done) claim blocks of rows one at a time from a counter in
 * shared memory until none is left. Each block writes
 * its own rows' outputs and its own partial sums, and the owner adds them up in row order
 * (reduceSweep) once every claimed block is done, so the answer is the same bits whoever swept
 * which block, and the same as one thread sweeping every block (measureSampleRows with the same
 * blockRows). Blocks are claimed with a compare-and-swap on one word holding the ticket and the
 * next block, so a helper late for its sweep can never claim a block of the next one.
 * The rows run in WebAssembly (sweep-rows-wasm.ts: the same bits as SweepRows, about half its
 * CPU), each thread with its own instance and scratch, over the one shared memory that holds the
 * states and the outputs; where no such memory or module can be had, SweepRows sweeps them.
 */
export class SharedRowSweep {
  private readonly control: Int32Array;
  private readonly shift: Float64Array;
  private readonly valid: Uint8Array;
  private readonly out: SweepOutputs;
  private readonly grams: SweepState[];
  private readonly layout: SweepLayout;
  /** The WebAssembly rows of the owner's sweeps and of the helper's (each its own scratch); null: JavaScript. */
  private wasmRows: [WasmSweepRows | null | undefined, WasmSweepRows | null | undefined] = [undefined, undefined];
  readonly blocks: number;

  private constructor(readonly buffers: SharedRowSweepBuffers) {
    const { m, k, blockRows, buffer, gram, memory } = buffers;
    this.control = new Int32Array(buffers.control);
    this.shift = new Float64Array(buffers.shift);
    this.blocks = Math.ceil(m / blockRows);
    this.layout = sweepLayout(m, k, this.blocks, buffers.states, 2, gram);
    this.valid = new Uint8Array(buffer, this.layout.valid, m);
    this.out = outputsAt(buffer, this.layout);
    const { postPos, postVal } = this.layout;
    this.grams = this.layout.states.map((g) => {
      const state: SweepState = { dots: new Float64Array(buffer, g.dots, m * m), scale: new Float64Array(buffer, g.scale, m) };
      if (gram === undefined) return state;
      state.counts = gram.countBytes === 2 ? new Uint16Array(buffer, g.counts, m * m) : new Uint32Array(buffer, g.counts, m * m);
      state.postPos = new Uint32Array(buffer, postPos, gram.postings);
      state.postVal = new Float64Array(buffer, postVal, gram.postings);
      if (memory !== null) state.memory = memory;
      return state;
    });
  }

  /**
   * Shared memory for sweeps over m rows and k neighbours, reading one of `states` m×m states;
   * with `gram`, room beside each state for its update (SweepState).
   */
  static create(m: number, k: number, blockRows: number, states = 2, gram?: GramRoom): SharedRowSweep {
    if (!(blockRows >= 1) || Math.ceil(m / blockRows) >= 0x10000) throw new RangeError(`SharedRowSweep: ${m} rows in blocks of ${blockRows}`);
    const layout = sweepLayout(m, k, Math.ceil(m / blockRows), states, 2, gram);
    // Beyond a WebAssembly memory's 4 GiB (m above ~16,000) the rows run in JavaScript.
    const { memory, buffer } = sharedMemoryFor(layout.bytes, sweepRowsModule() !== null);
    return new SharedRowSweep({ m, k, blockRows, states, ...(gram === undefined ? {} : { gram }), control: new SharedArrayBuffer(4 * CONTROL_SLOTS), shift: new SharedArrayBuffer(8), memory, buffer });
  }

  /** The same shared memory seen from another thread. */
  static from(buffers: SharedRowSweepBuffers): SharedRowSweep {
    return new SharedRowSweep(buffers);
  }

  /** State `index`'s arrays, for the owner to keep its state in. */
  state(index: number): SweepState {
    return this.grams[index]!;
  }

  /** Which state `dots` is (−1 when it is not in this shared memory). */
  stateOf(dots: Float64Array): number {
    return this.grams.findIndex((g) => g.dots.buffer === dots.buffer && g.dots.byteOffset === dots.byteOffset && g.dots.length === dots.length);
  }

  /** The control word the ticket of the latest sweep is in, for Atomics.wait/waitAsync on it. */
  get openedWord(): { array: Int32Array; index: number } {
    return { array: this.control, index: OPENED };
  }

  /**
   * The owner's sweep under `ticket` (> the previous one) of the state `gram`, `rowScale` (both
   * one of `state`'s): measureSampleRows' answer with these blockRows, to the bit. `interrupt` is
   * called before each claim; when it throws, no block is claimed any more and the throw goes on
   * once the helper's block is done. With `views`, the per-row arrays of the answer (knn,
   * standoutPerQuery, nnDist) are the shared outputs themselves, valid until the next sweep opens
   * (reduceSweep's `copy`); without, copies.
   * With `prepare`, each block's rows are prepared by the thread that sweeps them, just before (the
   * helper then needs its own `prepare`, or it takes no block); the diagonal and the row scales
   * must be final already, and the first valid row's block is prepared before the sweep opens
   * (pairShift reads that row). A sweep whose rows were prepared cannot be swept again, so when a
   * helper's block fails this throws instead of sweeping every block again.
   */
  sweep(ticket: number, gram: Float64Array, rowScale: Float64Array | undefined, valid: Uint8Array, interrupt?: () => void, views = false, prepare?: PrepareRows): SampleRowMeasures {
    const { control, buffers } = this;
    const index = this.stateOf(gram);
    const { dots, scale } = this.grams[index] ?? {};
    if (dots === undefined || scale === undefined || rowScale === undefined || rowScale.buffer !== scale.buffer || rowScale.byteOffset !== scale.byteOffset) throw new Error('SharedRowSweep: the dot products and scales are not one of its states');
    this.valid.set(valid);
    let prepared = -1;
    if (prepare !== undefined) {
      let first = 0;
      while (first < buffers.m && !valid[first]) first++;
      if (first < buffers.m) {
        prepared = Math.floor(first / buffers.blockRows);
        this.prepareBlock(prepare, prepared);
      }
    }
    this.shift[0] = pairShift(dots, buffers.m, this.valid, scale);
    Atomics.store(control, DONE, 0);
    Atomics.store(control, FAILED, 0);
    Atomics.store(control, PREPARE, prepare === undefined ? 0 : 1);
    Atomics.store(control, PREPARED, prepared);
    Atomics.store(control, GRAM, index);
    Atomics.store(control, CLAIM, claimWord(ticket, 0));
    Atomics.store(control, OPENED, ticket);
    Atomics.notify(control, OPENED);
    const rows = this.rows(index, OWNER);
    try {
      for (;;) {
        // Before the claim: a block claimed is always swept.
        interrupt?.();
        const b = this.claim(ticket);
        if (b < 0) break;
        if (prepare !== undefined && b !== prepared) this.prepareBlock(prepare, b);
        rows.block(b);
        Atomics.add(control, DONE, 1);
      }
    } finally {
      // No more claims; then wait for the blocks the helper still sweeps.
      const claimed = this.close(ticket);
      for (let done = Atomics.load(control, DONE); done < claimed; done = Atomics.load(control, DONE)) Atomics.wait(control, DONE, done, 1000);
    }
    if (Atomics.load(control, FAILED) !== 0) {
      if (prepare !== undefined) throw new Error('SharedRowSweep: a helper failed on a block whose rows it may have prepared part way');
      for (let b = 0; b < this.blocks; b++) rows.block(b);
    }
    return reduceSweep(rows.reads, this.out, this.blocks, !views);
  }

  /**
   * The helper's part of sweep `ticket`, if it is the one open: blocks claimed and swept until
   * none is left. Returns how many it swept (0 when that sweep is over or not open). A sweep whose
   * blocks are prepared first (the owner's `prepare`) is helped only with a `prepare` of this
   * thread's, which it calls before sweeping each block it claims.
   */
  help(ticket: number, prepare?: PrepareRows): number {
    const { control } = this;
    if (Atomics.load(control, OPENED) !== ticket) return 0;
    const preparing = Atomics.load(control, PREPARE) !== 0;
    if (preparing && prepare === undefined) return 0;
    const prepared = Atomics.load(control, PREPARED);
    let swept = 0;
    let rows: { block(b: number): void } | null = null;
    for (let b = this.claim(ticket); b >= 0; b = this.claim(ticket)) {
      try {
        // Read only once a block is claimed: until then the owner may still be writing them.
        rows ??= this.rows(Atomics.load(control, GRAM), HELPER);
        if (preparing && b !== prepared) this.prepareBlock(prepare!, b);
        rows.block(b);
        swept++;
      } catch {
        Atomics.store(control, FAILED, 1);
      } finally {
        Atomics.add(control, DONE, 1);
        Atomics.notify(control, DONE);
      }
    }
    return swept;
  }

  /**
   * The rows of a sweep of state `index` by `role` (the owner's, OWNER, or the helper's): what
   * reduceSweep reads (the inputs) and what sweeps the blocks, WebAssembly where this memory is
   * one, else the SweepRows itself.
   */
  private rows(index: number, role: typeof OWNER | typeof HELPER): { reads: SweepRows; block(b: number): void } {
    const { dots, scale } = this.grams[index]!;
    const { m, k, blockRows, memory } = this.buffers;
    const shift = this.shift[0]!;
    const reads = new SweepRows(dots, m, k, this.valid, scale, shift, this.out, blockRows);
    let wasm = this.wasmRows[role];
    if (wasm === undefined) {
      const module = memory !== null ? sweepRowsModule() : null;
      wasm = this.wasmRows[role] = module !== null && memory !== null ? new WasmSweepRows(module, memory, this.layout, blockRows, role) : null;
    }
    if (wasm === null) return { reads, block: (b) => reads.block(b) };
    const at = this.layout.states[index]!;
    wasm.state(at.dots, at.scale, shift);
    return { reads, block: (b) => wasm.block(b) };
  }

  /** `prepare` on block b's rows. */
  private prepareBlock(prepare: PrepareRows, b: number): void {
    const { m, blockRows } = this.buffers;
    const first = b * blockRows;
    prepare(first, Math.min(m, first + blockRows));
  }

  /** The next block of sweep `ticket`, claimed; −1 when none is left or another sweep is open. */
  private claim(ticket: number): number {
    return claimBlock(this.control, CLAIM, ticket, this.blocks);
  }

  /** Stops the claims of sweep `ticket`; returns how many blocks were claimed. */
  private close(ticket: number): number {
    return closeClaims(this.control, CLAIM, ticket, this.blocks);
  }
}

/**
 * The word a work shared in blocks is claimed by: (ticket & 0x7fff)·2^16 + the next block, so a
 * claim and the work it is for change together (SharedRowSweep, what-if/shared-column-gather.ts).
 */
export function claimWord(ticket: number, next: number): number {
  return (ticket & 0x7fff) * 0x10000 + next;
}

/** Claims the next of `blocks` blocks of work `ticket` at control[slot]; −1 when none is left or other work is open. */
export function claimBlock(control: Int32Array, slot: number, ticket: number, blocks: number): number {
  for (;;) {
    const word = Atomics.load(control, slot);
    if (word >>> 16 !== (ticket & 0x7fff)) return -1;
    const next = word & 0xffff;
    if (next >= blocks) return -1;
    if (Atomics.compareExchange(control, slot, word, word + 1) === word) return next;
  }
}

/** Stops the claims of work `ticket` at control[slot]; returns how many blocks were claimed. */
export function closeClaims(control: Int32Array, slot: number, ticket: number, blocks: number): number {
  for (;;) {
    const word = Atomics.load(control, slot);
    const next = Math.min(word & 0xffff, blocks);
    if (Atomics.compareExchange(control, slot, word, claimWord(ticket, blocks)) === word) return next;
  }
}
