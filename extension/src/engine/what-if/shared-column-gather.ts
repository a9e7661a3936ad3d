import { assembledModule } from '../wasm/assembled-module';
import { lineAllocator, sharedMemoryFor } from '../wasm/shared-memory';
import { claimBlock, claimWord, closeClaims } from '../measures/shared-row-sweep';

/** Defined by scripts/build.mjs in the Node bundles: column-gather.wat's bytes, base64. */
declare const LOUDWORD_COLUMN_GATHER_WASM: string | undefined;

/** The compiled column gather, or null where it cannot be had (the gather then runs in JavaScript). */
export function columnGatherModule(): WebAssembly.Module | null {
  return assembledModule('what-if/column-gather.wat', typeof LOUDWORD_COLUMN_GATHER_WASM !== 'undefined' ? LOUDWORD_COLUMN_GATHER_WASM : undefined);
}

/** The shared memory of a SharedColumnGather, to post to the thread that helps. */
export interface SharedColumnGatherBuffers {
  rows: number;
  cols: number;
  nnz: number;
  blocks: number;
  /**
   * The arrays, as gatherLayout(rows, cols, nnz, blocks) lays them out: in a shared WebAssembly
   * memory, so that the columns are gathered in WebAssembly (column-gather.wat), or, where no such
   * memory or module can be had, in a plain shared buffer (then in JavaScript: the same bits).
   */
  memory: WebAssembly.Memory | null;
  buffer: SharedArrayBuffer;
  control: SharedArrayBuffer;
}

/** Byte offsets of a gather's arrays in its memory, and the memory's size. */
export interface GatherLayout {
  /** Column t's entries are start[t]..start[t+1] of rowIds and values (Uint32, cols + 1). */
  start: number;
  /** Row ids per column, rows ascending (Uint32, one per non-zero). */
  rowIds: number;
  /** The weights in the same order (Float64). */
  values: number;
  /** The first column of each block and the end (Uint32, blocks + 1). */
  blockStart: number;
  /** Per row, the rescaled rows' two factors side by side (Float64, 2 per row). */
  rowChange: number;
  /** The mask the open gather skips (Uint8, one per column). */
  mask: number;
  /** Per column, the gathered Σ w·Δinv and Σ w²·Δ(1/norm²) side by side (Float64, 2 per column). */
  out: number;
  /**
   * Room for two states' sums (IncrementalTermSums and its twin): S1 then S2 of the first, S1 then
   * S2 of the second (Float64, cols each), so that a gather adds its columns' changes to them as
   * each column ends (SharedColumnGather.claimSums).
   */
  sums: number;
  bytes: number;
}

/** The layout of a gather's memory (each array on a 64-byte line). */
export function gatherLayout(rows: number, cols: number, nnz: number, blocks: number): GatherLayout {
  const lines = lineAllocator();
  const take = lines.take;
  const start = take(4 * (cols + 1));
  const rowIds = take(4 * nnz);
  const values = take(8 * nnz);
  const blockStart = take(4 * (blocks + 1));
  const rowChange = take(8 * 2 * rows);
  const mask = take(cols);
  const out = take(8 * 2 * cols);
  const sums = take(8 * SUMS_PLACES * 2 * cols);
  return { start, rowIds, values, blockStart, rowChange, mask, out, sums, bytes: lines.bytes };
}

interface ColumnGatherExports {
  layout(start: number, rowIds: number, values: number, rowChange: number, mask: number, out: number): void;
  gather(t: number, from: number, to: number, s1: number, s2: number): void;
}

/** How many states' sums the memory has room for (gatherLayout's `sums`): a state and its twin. */
const SUMS_PLACES = 2;

/**
 * Thrown by SharedColumnGather.gather when a helper's block failed in a gather that adds to the
 * sums as it goes: the columns that block had added cannot be told from the others, so it cannot be
 * gathered again (IncrementalTermSums then makes a full pass).
 */
export class GatherFailed extends Error {
  constructor() {
    super('SharedColumnGather: a helper failed on a block whose columns it may have added to the sums part way');
  }
}

// Slots of the control array.
/** (ticket & 0x7fff)·2^16 + the next block to claim: a claim and the gather it is for in one word. */
const CLAIM = 0;
/** Blocks finished in the open gather. */
const DONE = 1;
/** The ticket of the latest gather opened, or passed over (see pass). */
const OPENED = 2;
/** The toggled column of the open gather (its own sums are not gathered). */
const TERM = 3;
/** Set by a helper whose block failed: the owner then gathers every block again itself. */
const FAILED = 4;
/** Blocks the helper has gathered, over every gather (for the tests and the benchmark). */
const HELPED = 5;
/** The byte offsets of the open gather's S1 and S2 in the memory, or 0: its sums go to `out`. */
const S1 = 6;
const S2 = 7;
const CONTROL_SLOTS = 8;

/**
 * Blocks of columns a gather is claimed in. The bounds are set by entries (each block holds about
 * 1/GATHER_BLOCKS of the non-zeros; a column is never cut), so a block is ~1–3 ms at 100k
 * documents whether it holds one function word or thousands of rare terms: small enough that
 * neither thread waits long for the other's last one. A choice of ours, no source.
 */
const GATHER_BLOCKS = 64;

/**
 * The gather of IncrementalTermSums.updateOne (a click on a term in most rows) shared by two
 * threads: each kept column u's change Σ w·Δinv and Σ w²·Δ(1/norm²), summed down its postings in
 * row order, is a function of that column's run of the column-major copy and the per-row factors
 * alone. So the owner (the review's thread) writes the factors, opens the gather under a ticket,
 * and it and a helper (the what-if's sample thread, once its own half is done) claim blocks of
 * columns from a counter in shared memory until none is left; each column's two sums are added to
 * its S1 and S2 as the column ends where those live in this memory (claimSums), else written to its
 * own slots and added by the owner in column order once every claimed block is done (each column's
 * two additions either way). Whoever gathered a column, its sums are the same bits, and the same as one thread
 * gathering every block (gather without a ticket), which is what the one-thread what-if does.
 * Claims work as in SharedRowSweep: a compare-and-swap on one word holding the ticket and the next
 * block, so a helper late for its gather can never claim a block of the next one.
 * The columns are gathered in WebAssembly (column-gather.wat: the same additions in the same order,
 * so the same bits, at about half the CPU of V8's code for the loop; docs/performance.md), each
 * thread with its own instance over the one shared memory that holds every array here; where no
 * such memory or module can be had, gatherColumnChanges gathers them.
 */
export class SharedColumnGather {
  readonly start: Uint32Array;
  readonly rowIds: Uint32Array;
  readonly values: Float64Array;
  /** The owner's scratch for the per-row factors: zero outside a gather (the owner clears it). */
  readonly rowChange: Float64Array;
  readonly blocks: number;
  private readonly blockStart: Uint32Array;
  private readonly mask: Uint8Array;
  private readonly out: Float64Array;
  private readonly control: Int32Array;
  /** This thread's instance of the WebAssembly gather over `buffers.memory` (null: JavaScript; undefined: not yet made). */
  private wasm: ColumnGatherExports | null | undefined;
  /** The places for sums handed out so far (claimSums). */
  private sumsClaimed = 0;

  private constructor(readonly buffers: SharedColumnGatherBuffers) {
    const { rows, cols, nnz, blocks, buffer } = buffers;
    const at = gatherLayout(rows, cols, nnz, blocks);
    this.start = new Uint32Array(buffer, at.start, cols + 1);
    this.rowIds = new Uint32Array(buffer, at.rowIds, nnz);
    this.values = new Float64Array(buffer, at.values, nnz);
    this.blockStart = new Uint32Array(buffer, at.blockStart, blocks + 1);
    this.rowChange = new Float64Array(buffer, at.rowChange, 2 * rows);
    this.mask = new Uint8Array(buffer, at.mask, cols);
    this.out = new Float64Array(buffer, at.out, 2 * cols);
    this.control = new Int32Array(buffers.control);
    this.blocks = blocks;
  }

  /**
   * Shared memory for the column postings of a rows × cols matrix with `nnz` non-zeros; the
   * caller fills `start`, `rowIds` and `values`, then calls `divide`. With `webAssembly` (and the
   * module at hand, and the arrays within a WebAssembly memory's 4 GiB) the columns are gathered
   * in WebAssembly, else in JavaScript: the same bits.
   */
  static create(rows: number, cols: number, nnz: number, webAssembly = true): SharedColumnGather {
    const blocks = Math.max(1, Math.min(GATHER_BLOCKS, cols));
    const layout = gatherLayout(rows, cols, nnz, blocks);
    const { memory, buffer } = sharedMemoryFor(layout.bytes, webAssembly && columnGatherModule() !== null);
    return new SharedColumnGather({ rows, cols, nnz, blocks, memory, buffer, control: new SharedArrayBuffer(4 * CONTROL_SLOTS) });
  }

  /** The same shared memory seen from another thread. */
  static from(buffers: SharedColumnGatherBuffers): SharedColumnGather {
    return new SharedColumnGather(buffers);
  }

  /** Whether this thread gathers in WebAssembly (for the tests and the benchmark). */
  get inWebAssembly(): boolean {
    return this.exports() !== null;
  }

  /**
   * The next of the memory's places for a state's S1 and S2 (zeros), or null when both are taken:
   * sums kept there are added to by the gather itself, column by column (see gather).
   */
  claimSums(): { s1: Float64Array; s2: Float64Array } | null {
    if (this.sumsClaimed >= SUMS_PLACES) return null;
    const { rows, cols, nnz, blocks, buffer } = this.buffers;
    const at = gatherLayout(rows, cols, nnz, blocks).sums + 8 * 2 * cols * this.sumsClaimed++;
    return { s1: new Float64Array(buffer, at, cols), s2: new Float64Array(buffer, at + 8 * cols, cols) };
  }

  /** Sets the blocks' column bounds from the filled `start`: about equal numbers of entries. */
  divide(): void {
    const { start, blockStart, blocks } = this;
    const cols = start.length - 1;
    const nnz = start[cols]!;
    let u = 0;
    for (let b = 0; b < blocks; b++) {
      blockStart[b] = u;
      const until = Math.floor((nnz * (b + 1)) / blocks);
      while (u < cols && start[u + 1]! <= until) u++;
    }
    blockStart[blocks] = cols;
  }

  /** The ticket of the latest gather opened or passed over. */
  get opened(): number {
    return Atomics.load(this.control, OPENED);
  }

  /** Blocks a helper has gathered so far, over every gather. */
  get helped(): number {
    return Atomics.load(this.control, HELPED);
  }

  /**
   * Adds to s1 and s2 each kept column's (mask[u] = 0, u ≠ t) change from the factors in
   * `rowChange`, summed down its postings in row order. With a `ticket` (above every earlier one)
   * the blocks are shared with a helper (help); without one this thread gathers them all. The
   * sums are the same bits either way. `interrupt` is called before each block claimed here; when
   * it throws, no block is claimed any more and the throw goes on once the helper's block is done.
   * Where s1 and s2 are one of the memory's places (claimSums), each column's change is added to
   * them as the column ends, by whichever thread gathered it (no pass over `out` after the gather:
   * ~0.5 ms of a 100k click, docs/performance.md); a helper's block that failed then throws
   * GatherFailed, as those sums cannot be gathered again. Else the changes go to `out` and are
   * added here once every block is done, in column order: the same two additions a column.
   */
  gather(t: number, mask: Uint8Array, s1: Float64Array, s2: Float64Array, ticket?: number, interrupt?: () => void): void {
    const { control, blocks } = this;
    this.mask.set(mask.subarray(0, this.mask.length));
    const direct = this.holds(s1) && this.holds(s2);
    const s1At = direct ? s1.byteOffset : 0;
    const s2At = direct ? s2.byteOffset : 0;
    if (ticket === undefined) {
      for (let b = 0; b < blocks; b++) {
        interrupt?.();
        this.block(b, t, s1At, s2At);
      }
    } else {
      Atomics.store(control, DONE, 0);
      Atomics.store(control, FAILED, 0);
      Atomics.store(control, TERM, t);
      Atomics.store(control, S1, s1At);
      Atomics.store(control, S2, s2At);
      Atomics.store(control, CLAIM, claimWord(ticket, 0));
      Atomics.store(control, OPENED, ticket);
      Atomics.notify(control, OPENED);
      try {
        for (;;) {
          interrupt?.();
          const b = this.claim(ticket);
          if (b < 0) break;
          this.block(b, t, s1At, s2At);
          Atomics.add(control, DONE, 1);
        }
      } finally {
        const claimed = this.close(ticket);
        for (let done = Atomics.load(control, DONE); done < claimed; done = Atomics.load(control, DONE)) Atomics.wait(control, DONE, done, 1000);
      }
      if (Atomics.load(control, FAILED) !== 0) {
        if (direct) throw new GatherFailed();
        for (let b = 0; b < blocks; b++) this.block(b, t, 0, 0);
      }
    }
    if (!direct) addColumnChanges(this.out, this.mask, t, s1, s2);
  }

  /** Whether `a` is an array of this gather's memory (then one of its places for sums, claimSums). */
  private holds(a: Float64Array): boolean {
    return a.buffer === this.buffers.buffer && a.length === this.buffers.cols;
  }

  /**
   * The owner's word that gather `ticket` will not be opened (the click did not gather): a helper
   * waiting for it stops waiting. Does nothing if it was opened.
   */
  pass(ticket: number): void {
    const { control, blocks } = this;
    if (Atomics.load(control, OPENED) >= ticket) return;
    Atomics.store(control, CLAIM, claimWord(ticket, blocks));
    Atomics.store(control, OPENED, ticket);
    Atomics.notify(control, OPENED);
  }

  /**
   * The helper's part of gather `ticket`: waits (blocking this thread, at most `waitMs`) until
   * the owner opens it or passes it over, then gathers blocks until none is left. Returns how
   * many it gathered.
   */
  help(ticket: number, waitMs: number): number {
    const { control } = this;
    const until = Date.now() + waitMs;
    for (let opened = this.opened; opened < ticket; opened = this.opened) {
      const left = until - Date.now();
      if (left <= 0) return 0;
      Atomics.wait(control, OPENED, opened, left);
    }
    if (this.opened !== ticket) return 0;
    let gathered = 0;
    for (let b = this.claim(ticket); b >= 0; b = this.claim(ticket)) {
      try {
        // Read only once a block is claimed: until then the owner may still be writing it.
        this.block(b, Atomics.load(control, TERM), Atomics.load(control, S1), Atomics.load(control, S2));
        gathered++;
      } catch {
        Atomics.store(control, FAILED, 1);
      } finally {
        Atomics.add(control, DONE, 1);
        Atomics.notify(control, DONE);
      }
    }
    Atomics.add(control, HELPED, gathered);
    return gathered;
  }

  /** Block b's columns of the click on t; s1At and s2At as in the control slots (0: into `out`). */
  private block(b: number, t: number, s1At: number, s2At: number): void {
    const wasm = this.exports();
    if (wasm !== null) wasm.gather(t, this.blockStart[b]!, this.blockStart[b + 1]!, s1At, s2At);
    else {
      const { buffer, cols } = this.buffers;
      const sums = s1At === 0 ? null : { s1: new Float64Array(buffer, s1At, cols), s2: new Float64Array(buffer, s2At, cols) };
      gatherColumnChanges(this.start, this.rowIds, this.values, this.rowChange, this.mask, t, this.out, this.blockStart[b]!, this.blockStart[b + 1]!, sums);
    }
  }

  /** This thread's WebAssembly gather over the shared memory, made at its first use; null where there is none. */
  private exports(): ColumnGatherExports | null {
    if (this.wasm === undefined) {
      const { memory, rows, cols, nnz, blocks } = this.buffers;
      const module = memory !== null ? columnGatherModule() : null;
      if (module === null || memory === null) this.wasm = null;
      else {
        const wasm = new WebAssembly.Instance(module, { env: { memory } }).exports as unknown as ColumnGatherExports;
        const at = gatherLayout(rows, cols, nnz, blocks);
        wasm.layout(at.start, at.rowIds, at.values, at.rowChange, at.mask, at.out);
        this.wasm = wasm;
      }
    }
    return this.wasm;
  }

  /** The next block of gather `ticket`, claimed; −1 when none is left or another gather is open. */
  private claim(ticket: number): number {
    return claimBlock(this.control, CLAIM, ticket, this.blocks);
  }

  /** Stops the claims of gather `ticket`; returns how many blocks were claimed. */
  private close(ticket: number): number {
    return closeClaims(this.control, CLAIM, ticket, this.blocks);
  }
}

/**
 * For the kept columns u ≠ t in [from, to): Σ w·Δinv and Σ w²·Δ(1/norm²) down the column, rows
 * ascending, into out[2u] and out[2u + 1], or with `sums` added to sums.s1[u] and sums.s2[u].
 * column-gather.wat does the same, operation for operation: a change here is made there too
 * (test/what-if-column-gather-wasm.test.ts).
 */
function gatherColumnChanges(start: Uint32Array, rows: Uint32Array, values: Float64Array, rowChange: Float64Array, mask: Uint8Array, t: number, out: Float64Array, from: number, to: number, sums: { s1: Float64Array; s2: Float64Array } | null = null): void {
  for (let u = from; u < to; u++) {
    if (mask[u] !== 0 || u === t) continue;
    let a = 0;
    let b = 0;
    for (let q = start[u]!, qEnd = start[u + 1]!; q < qEnd; q++) {
      const c = 2 * rows[q]!;
      const w = values[q]!;
      a += w * rowChange[c]!;
      b += w * w * rowChange[c + 1]!;
    }
    if (sums !== null) {
      sums.s1[u] += a;
      sums.s2[u] += b;
    } else {
      out[2 * u] = a;
      out[2 * u + 1] = b;
    }
  }
}

/** The gathered changes added to the sums of the kept columns other than t, in column order. */
function addColumnChanges(out: Float64Array, mask: Uint8Array, t: number, s1: Float64Array, s2: Float64Array): void {
  for (let u = 0, cols = s1.length; u < cols; u++) {
    if (mask[u] === 0 && u !== t) {
      s1[u] += out[2 * u]!;
      s2[u] += out[2 * u + 1]!;
    }
  }
}
