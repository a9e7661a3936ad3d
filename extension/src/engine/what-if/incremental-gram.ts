import type { Csr } from '../matrix/csr';
import type { SweepState } from '../measures/shared-row-sweep';
import type { GramRoom } from '../measures/sweep-rows-wasm';
import { assembledModule } from '../wasm/assembled-module';
import { changedColumns, sameMask } from './incremental-term-sums';

/** Defined by scripts/build.mjs in the Node bundles: gram-update.wat's bytes, base64. */
declare const LOUDWORD_GRAM_UPDATE_WASM: string | undefined;

/** The compiled dot-product update, or null where it cannot be had (the update then runs in JavaScript). */
export function gramUpdateModule(): WebAssembly.Module | null {
  return assembledModule('what-if/gram-update.wat', typeof LOUDWORD_GRAM_UPDATE_WASM !== 'undefined' ? LOUDWORD_GRAM_UPDATE_WASM : undefined);
}

/**
 * Where a state's arrays live when not in arrays of its own: a SharedRowSweep's state (the dot
 * products and row scales another thread sweeps, and, for the update to run in WebAssembly, the
 * shared-term counts and the sample's postings in the same WebAssembly memory).
 */
export type GramStorage = SweepState;

/**
 * Bytes of one shared-term count: a pair of rows shares at most as many terms as the longer row
 * holds, so 16 bits do unless a row holds 65,535 terms or more.
 */
function sharedCountBytes(rows: Csr): 2 | 4 {
  let longest = 0;
  for (let i = 0; i < rows.rows; i++) longest = Math.max(longest, rows.indptr[i + 1]! - rows.indptr[i]!);
  return longest < 0xffff ? 2 : 4;
}

interface GramUpdateExports {
  update(dots: number, counts: number, wide: number, pos: number, val: number, m: number, from: number, to: number, aFrom: number, aTo: number, sign: number): void;
}

/**
 * The sample's m×m cosine matrix under a what-if, kept up to date across toggles instead of
 * being recomputed. It holds the raw dot products D_ij = Σ_{t kept} w_it·w_jt of the unmasked
 * (unit) sample rows; the cosine under the mask is D_ij/√(D_ii·D_jj), because renormalising a
 * masked row only rescales it (see maskTerms). Stopping or restoring term t changes D only on
 * the pairs of sample rows that both hold t: |P_s(t)|² updates from the term's sample postings
 * (a column-major copy of the sampled rows, built once), then one O(m²) scaling pass.
 *
 * Rounding: D_ii is recomputed from the row, never updated by subtraction. Off the diagonal a
 * count of shared kept terms is kept beside D (Uint16 when no sampled row has 65,536 terms,
 * else Uint32); when it reaches 0, D_ij is set to exact 0, so pairs left with nothing in common
 * stay exactly orthogonal as in a full recompute (kNN ties at 0 depend on it). Other entries
 * drift by ~1e-16 relative per update; once `SETTLE_AFTER`·m² pair updates have piled up, D is
 * rebuilt at the current mask by `settle()`, which the what-if calls in idle time after its
 * answer has gone (a rebuild costs several clicks' worth of updates). A call that finds the
 * rebuild still due does it first, so the answers never depend on whether idle time came.
 * Full builds (the Report's figures) are kept and restored exactly when asked for again.
 */
export class IncrementalGram {
  readonly m: number;
  private readonly dots: Float64Array;
  private readonly shared: Uint16Array | Uint32Array;
  private readonly inv: Float64Array;
  private readonly mask: Uint8Array;
  private readonly start: Uint32Array;
  private readonly postPos: Uint32Array;
  private readonly postVal: Float64Array;
  /** Σ_t |P_s(t)|²/2: the multiply-adds of a full build, to choose between update and rebuild. */
  private readonly fullCost: number;
  /** The update's pair loop in WebAssembly over the storage's memory, or null (JavaScript). */
  private readonly wasm: GramUpdateExports | null;
  private ready = false;
  private updatedPairs = 0;
  /** D of full builds (the review's baseline and the latest Report figure), restored bit for bit. */
  private checkpoints: Checkpoint[] = [];
  /** Whether D is what a full build gives (not reached by updates). */
  private exact = false;
  /** Whether `shared` holds the state's counts (a build without `forWhatIf` leaves them to countShared). */
  private sharedValid = false;
  /** A rebuild at the current mask is due (see settle). */
  private settleDue = false;
  /** While scaledPending runs: the most toggled terms whose pair loops it leaves to the caller (0: none). */
  private deferUpTo = 0;
  /** What scaledPending leaves to the caller: the terms' postings and signs (see there), or null. */
  private pending: Int32Array | null = null;
  /** Whether the pair loops scaledPending left are still to run (the state is not ready until then). */
  private rowsPending = false;
  lastStep: { kind: 'full' | 'incremental' | 'unchanged' | 'restored'; pairs: number } = { kind: 'unchanged', pairs: 0 };

  constructor(
    readonly rows: Csr,
    /**
     * Where D and the row scales live (m×m and m entries; shared memory for SampleSide), else new
     * arrays; with the counts and postings there too (storageNeeds), in a WebAssembly memory, the
     * update's pair loop runs in WebAssembly (gram-update.wat: the same bits).
     */
    private readonly storage?: GramStorage,
    /**
     * Whether the state serves what-ifs after its full builds: keeps them for restoring, and
     * counts the shared terms that updates need as it builds. Without (a review nobody will ask
     * a what-if, the CLI), a mask met again is built again, and the counts are made only when an
     * update first needs them: the same bits, without a second m×m copy, and a build ~35% cheaper
     * (the counts are a second m×m array written in both halves).
     */
    private readonly forWhatIf = true,
    /** Whether the update may run in WebAssembly (false: the TypeScript, for the tests and the benchmark). */
    private readonly webAssembly = true,
  ) {
    const m = rows.rows;
    this.m = m;
    if (storage !== undefined && (storage.dots.length !== m * m || storage.scale.length !== m)) throw new RangeError(`IncrementalGram: storage is not for ${m} rows`);
    this.dots = storage?.dots ?? new Float64Array(m * m);
    const countBytes = sharedCountBytes(rows);
    const counts = storage?.counts;
    if (counts !== undefined && (counts.length !== m * m || counts.BYTES_PER_ELEMENT !== countBytes)) throw new RangeError(`IncrementalGram: the storage's counts are not ${countBytes}-byte counts for ${m} rows`);
    this.shared = counts ?? (countBytes === 2 ? new Uint16Array(m * m) : new Uint32Array(m * m));
    this.inv = storage?.scale ?? new Float64Array(m);
    this.mask = new Uint8Array(rows.cols);

    const cols = rows.cols;
    const nnz = rows.indptr[m]!;
    const start = new Uint32Array(cols + 1);
    for (let p = 0; p < nnz; p++) if (rows.data[p] !== 0) start[rows.indices[p]! + 1]++;
    let cost = 0;
    for (let t = 0; t < cols; t++) {
      cost += (start[t + 1]! * start[t + 1]!) / 2;
      start[t + 1] += start[t]!;
    }
    const fill = start.slice(0, cols);
    const postings = start[cols]!;
    if ((storage?.postPos !== undefined && storage.postPos.length !== postings) || (storage?.postVal !== undefined && storage.postVal.length !== postings)) throw new RangeError(`IncrementalGram: the storage's postings are not ${postings}`);
    // A twin over the same storage writes the same postings again: harmless, and it is made once.
    this.postPos = storage?.postPos ?? new Uint32Array(postings);
    this.postVal = storage?.postVal ?? new Float64Array(postings);
    for (let i = 0; i < m; i++) {
      for (let p = rows.indptr[i]!, end = rows.indptr[i + 1]!; p < end; p++) {
        const x = rows.data[p]!;
        if (x === 0) continue;
        const slot = fill[rows.indices[p]!]!++;
        this.postPos[slot] = i;
        this.postVal[slot] = x;
      }
    }
    this.start = start;
    this.fullCost = cost;
    this.wasm = this.updateInWebAssembly();
  }

  /**
   * What a state over `rows` needs beside its dot products for its update to run in WebAssembly
   * in the same memory (SharedRowSweep.create's room): the bytes of a shared-term count and the
   * number of sample postings (non-zero entries).
   */
  static storageNeeds(rows: Csr): GramRoom {
    let postings = 0;
    for (let p = 0, nnz = rows.indptr[rows.rows]!; p < nnz; p++) if (rows.data[p] !== 0) postings++;
    return { countBytes: sharedCountBytes(rows), postings };
  }

  /** The WebAssembly update, when the storage holds every array it reads in one WebAssembly memory. */
  private updateInWebAssembly(): GramUpdateExports | null {
    const memory = this.storage?.memory;
    if (!this.webAssembly || memory === undefined || this.storage?.counts !== this.shared || this.storage.postPos !== this.postPos || this.storage.postVal !== this.postVal) return null;
    if ([this.dots, this.shared, this.postPos, this.postVal].some((a) => a.buffer !== memory.buffer)) return null;
    const module = gramUpdateModule();
    if (module === null) return null;
    try {
      return new WebAssembly.Instance(module, { env: { memory } }).exports as unknown as GramUpdateExports;
    } catch {
      return null;
    }
  }

  /** Whether this state's updates run in WebAssembly (for the tests and the benchmark). */
  get inWebAssembly(): boolean {
    return this.wasm !== null;
  }

  /**
   * The sampled rows with `removed` stopped, without writing their m×m cosines: the kept dot
   * products D (row-major) and each row's 1/√D_ii (0 for an emptied row), so cosine_ij =
   * dots_ij·scale_i·scale_j — what measuresFromGram reads with `rowScale`, one pass over D.
   * Both arrays are the live state: valid until the next call, never to be written.
   * `incremental` as in IncrementalTermSums.at: false = a full build, kept as a checkpoint.
   * `interrupt` as there: called every few rows of an update, throws to abandon it.
   */
  scaled(removed: Uint8Array, incremental = true, interrupt?: () => void): { dots: Float64Array; scale: Float64Array } {
    this.advance(removed, incremental, interrupt);
    const { m, dots, inv } = this;
    for (let i = 0; i < m; i++) {
      const d = dots[i * m + i]!;
      inv[i] = d > 0 ? 1 / Math.sqrt(d) : 0;
    }
    return { dots, scale: inv };
  }

  /**
   * scaled(removed, incremental, interrupt), except that when the step is an update in
   * WebAssembly of at most `maxTerms` toggled terms, its pair loops are left to the caller, to run
   * row by row just before each row is read (GramRowsUpdate, as the sweep reaches the row): each
   * row's pairs write only that row's dot products and counts, and no pair writes a diagonal
   * entry. The diagonal and the row scales returned are final; `pending` lists, in the update's
   * order, each toggled term's sample postings [from, to) and its sign (+1 restored, −1 stopped),
   * three i32 per term, or is null when nothing is left (a build, a restore, no change, or an
   * update run here). Until rowsUpdated() the state is not ready: a call that comes first (the
   * rows left part way: an interrupted sweep) builds it afresh.
   */
  scaledPending(removed: Uint8Array, incremental: boolean, maxTerms: number, interrupt?: () => void): { dots: Float64Array; scale: Float64Array; pending: Int32Array | null } {
    this.deferUpTo = this.wasm === null ? 0 : maxTerms;
    try {
      const { dots, scale } = this.scaled(removed, incremental, interrupt);
      return { dots, scale, pending: this.pending };
    } finally {
      this.deferUpTo = 0;
      this.pending = null;
    }
  }

  /** Every row has run the pair loops scaledPending left: the state is ready again. */
  rowsUpdated(): void {
    if (!this.rowsPending) return;
    this.rowsPending = false;
    this.ready = true;
  }

  /**
   * A second state over the same rows (in `storage` if given), sharing the checkpoints: the what-if's speculative
   * answers are computed in it (copyFrom, then scaled) so that the state the clicks walk is left
   * as it was, and adopted by swapping the two (SampleSide).
   */
  twin(storage?: GramStorage): IncrementalGram {
    const twin = new IncrementalGram(this.rows, storage, this.forWhatIf, this.webAssembly);
    twin.checkpoints = this.checkpoints;
    return twin;
  }

  /**
   * Makes this state `other`'s, to the bit: D, the shared-term counts, the mask and the counters
   * that decide the next rebuild (so the next call takes the branch `other`'s would).
   */
  copyFrom(other: IncrementalGram): void {
    if (other.rows !== this.rows) throw new Error('copyFrom: a state over other rows');
    this.keepCheckpoint();
    this.dots.set(other.dots);
    if (other.sharedValid) this.shared.set(other.shared);
    this.sharedValid = other.sharedValid;
    this.inv.set(other.inv);
    this.mask.set(other.mask);
    this.ready = other.ready;
    this.rowsPending = false;
    this.updatedPairs = other.updatedPairs;
    this.exact = other.exact;
    this.settleDue = other.settleDue;
    this.lastStep = { ...other.lastStep };
  }

  /**
   * Rebuilds D at the current mask if enough updates have piled up (idle time, after an
   * answer); returns whether it did. Only the rounding changes: to a full build's.
   */
  settle(): boolean {
    if (!this.settleDue) return false;
    this.build(this.mask);
    return true;
  }

  private advance(removed: Uint8Array, incremental: boolean, interrupt?: () => void): void {
    if (removed.length < this.mask.length) throw new RangeError(`removed has ${removed.length} entries for ${this.mask.length} columns`);
    const checkpoint = this.ready ? this.checkpoints.find((c) => sameMask(removed, c.mask)) : undefined;
    // What idle time would have done, unless this call replaces the whole state anyway.
    if (checkpoint === undefined && incremental) this.settle();
    if (this.ready && sameMask(removed, this.mask) && (incremental || this.exact)) {
      this.lastStep = { kind: 'unchanged', pairs: 0 };
    } else if (checkpoint !== undefined) {
      // Not this state's own unsaved checkpoint: that one's mask is this state's, caught above.
      const owner = checkpoint.owner;
      const dots = owner !== null ? owner.dots : checkpoint.dots!;
      const shared = owner !== null ? owner.shared : checkpoint.shared!;
      this.keepCheckpoint();
      this.dots.set(dots);
      this.shared.set(shared);
      this.mask.set(checkpoint.mask);
      this.updatedPairs = 0;
      this.settleDue = false;
      this.exact = true;
      this.lastStep = { kind: 'restored', pairs: 0 };
    } else if (!this.ready || !incremental) {
      // The latest checkpoint is about to be replaced: no need to copy it out first.
      if (this.checkpoints.length === 2 && this.checkpoints[1]!.owner === this) this.checkpoints.pop();
      this.build(removed);
      if (!this.forWhatIf) return;
      const saved: Checkpoint = { mask: this.mask.slice(), dots: null, shared: null, owner: this };
      if (this.checkpoints.length < 2) this.checkpoints.push(saved);
      else this.checkpoints[1] = saved;
    } else {
      const changed = changedColumns(removed, this.mask);
      let cost = 0;
      for (const t of changed) {
        const len = this.start[t + 1]! - this.start[t]!;
        cost += len * len;
      }
      if (changed.length === 0) this.lastStep = { kind: 'unchanged', pairs: 0 };
      else if (cost >= this.fullCost || this.updatedPairs + cost > REBUILD_AFTER * this.m * this.m) this.build(removed);
      else this.update(changed, removed, cost, interrupt);
    }
  }

  /**
   * Copies out a checkpoint still held by this state's own arrays, before they change. A full
   * build's D is kept by reference at first and copied only when the state moves on: the copy is
   * 40 MB at the default 2,000 sampled documents (D and the shared counts), and a review without
   * a panel never moves on from its last build, so it never pays for that one (each fresh page
   * of the copy is a page fault, which costs this machine's kernel 10-20 µs).
   */
  private keepCheckpoint(): void {
    for (const c of this.checkpoints) {
      if (c.owner !== this) continue;
      c.dots = this.dots.slice();
      c.shared = this.shared.slice();
      c.owner = null;
    }
  }

  /**
   * D from scratch, through an inverted index of the rows seen, and for a state that serves
   * what-ifs the shared-term counts its updates need, in a second pass of the same shape (one
   * m×m array written per pass; the counts alone are ~35% of a build, so a review nobody asks a
   * what-if skips them and countShared makes them when an update first needs them).
   */
  private build(removed: Uint8Array): void {
    this.keepCheckpoint();
    this.buildDots(removed);
    if (this.forWhatIf) this.countShared();
  }

  /** What every full build leaves besides D. */
  private built(removed: Uint8Array): void {
    this.mask.set(removed.subarray(0, this.mask.length));
    this.ready = true;
    this.exact = true;
    this.updatedPairs = 0;
    this.settleDue = false;
    this.lastStep = { kind: 'full', pairs: this.fullCost };
  }

  /** D alone: each pair's kept products summed in row order; the shared counts are countShared's. */
  private buildDots(removed: Uint8Array): void {
    const { m, dots } = this;
    const { indptr, indices, data, cols } = this.rows;
    const start = new Uint32Array(cols + 1);
    start.set(this.start);
    const fill = start.slice(0, cols);
    const pos = new Uint32Array(this.postPos.length);
    const val = new Float64Array(this.postPos.length);
    const acc = new Float64Array(m);
    for (let i = 0; i < m; i++) {
      let self = 0;
      for (let p = indptr[i]!, end = indptr[i + 1]!; p < end; p++) {
        const x = data[p]!;
        const t = indices[p]!;
        if (x === 0 || removed[t] !== 0) continue;
        self += x * x;
        const stop = fill[t]!;
        for (let q = start[t]!; q < stop; q++) acc[pos[q]!] += x * val[q]!;
        pos[stop] = i;
        val[stop] = x;
        fill[t] = stop + 1;
      }
      const base = i * m;
      for (let j = 0; j < i; j++) {
        dots[base + j] = acc[j]!;
        dots[j * m + i] = acc[j]!;
        acc[j] = 0;
      }
      dots[base + i] = self;
    }
    this.sharedValid = false;
    this.built(removed);
  }

  /** The shared kept terms of every pair at the state's mask, as build counts them (before an update needs them). */
  private countShared(): void {
    const { m, shared, mask } = this;
    const { indptr, indices, data, cols } = this.rows;
    const start = new Uint32Array(cols + 1);
    start.set(this.start);
    const fill = start.slice(0, cols);
    const pos = new Uint32Array(this.postPos.length);
    const cnt = new Uint32Array(m);
    for (let i = 0; i < m; i++) {
      let selfCount = 0;
      for (let p = indptr[i]!, end = indptr[i + 1]!; p < end; p++) {
        const t = indices[p]!;
        if (data[p] === 0 || mask[t] !== 0) continue;
        selfCount++;
        const stop = fill[t]!;
        for (let q = start[t]!; q < stop; q++) cnt[pos[q]!]++;
        pos[stop] = i;
        fill[t] = stop + 1;
      }
      const base = i * m;
      for (let j = 0; j < i; j++) {
        shared[base + j] = cnt[j]!;
        shared[j * m + i] = cnt[j]!;
        cnt[j] = 0;
      }
      shared[base + i] = selfCount;
    }
    this.sharedValid = true;
  }

  private update(changed: number[], removed: Uint8Array, cost: number, interrupt?: () => void): void {
    this.keepCheckpoint();
    if (!this.sharedValid) this.countShared();
    const { m, dots, shared, postPos, postVal, wasm } = this;
    const touched = new Uint8Array(m);
    // Left to the caller (scaledPending): the pair loops, term by term as below.
    const pending = wasm !== null && changed.length <= this.deferUpTo ? new Int32Array(3 * changed.length) : null;
    if (pending !== null) {
      changed.forEach((t, n) => {
        const from = this.start[t]!;
        const to = this.start[t + 1]!;
        pending.set([from, to, removed[t] !== 0 ? -1 : 1], 3 * n);
        for (let x = from; x < to; x++) touched[postPos[x]!] = 1;
      });
    }
    for (const t of pending === null ? changed : []) {
      const sign = removed[t] !== 0 ? -1 : 1;
      const from = this.start[t]!;
      const to = this.start[t + 1]!;
      // The pair loop below and gram-update.wat do the same operations in the same order: a change
      // to one is made to the other (test/what-if-gram-update-wasm.test.ts).
      if (wasm !== null) {
        // The same pairs in the same order, 32 postings (rows) per call, with the interrupt between.
        const wide = shared.BYTES_PER_ELEMENT === 4 ? 1 : 0;
        for (let a = from; a < to; a += 32) {
          if (interrupt !== undefined) this.interrupted(interrupt);
          const aTo = Math.min(to, a + 32);
          for (let x = a; x < aTo; x++) touched[postPos[x]!] = 1;
          wasm.update(dots.byteOffset, shared.byteOffset, wide, postPos.byteOffset, postVal.byteOffset, m, from, to, a, aTo, sign);
        }
        continue;
      }
      for (let a = from; a < to; a++) {
        if (interrupt !== undefined && ((a - from) & 31) === 0) this.interrupted(interrupt);
        const i = postPos[a]!;
        touched[i] = 1;
        const wi = sign * postVal[a]!;
        const base = i * m;
        for (let b = from; b < to; b++) {
          if (b === a) continue;
          const at = base + postPos[b]!;
          const count = shared[at]! + sign;
          shared[at] = count;
          dots[at] = count === 0 ? 0 : dots[at]! + wi * postVal[b]!;
        }
      }
    }
    // The diagonal from the rows themselves: exact, so an emptied row is exactly empty.
    const { indptr, indices, data } = this.rows;
    for (let i = 0; i < m; i++) {
      if (touched[i] === 0) continue;
      let self = 0;
      let selfCount = 0;
      for (let p = indptr[i]!, end = indptr[i + 1]!; p < end; p++) {
        const x = data[p]!;
        if (x === 0 || removed[indices[p]!] !== 0) continue;
        self += x * x;
        selfCount++;
      }
      dots[i * m + i] = self;
      shared[i * m + i] = selfCount;
    }
    this.mask.set(removed.subarray(0, this.mask.length));
    this.updatedPairs += cost;
    this.settleDue = this.updatedPairs > SETTLE_AFTER * m * m;
    this.exact = false;
    this.lastStep = { kind: 'incremental', pairs: cost };
    if (pending !== null) {
      this.pending = pending;
      this.rowsPending = true;
      this.ready = false;
    }
  }

  /** Calls an update's `interrupt`; when it throws, the half-updated state is unusable until the next copyFrom (a full build first otherwise). */
  private interrupted(interrupt: () => void): void {
    try {
      interrupt();
    } catch (e) {
      this.ready = false;
      throw e;
    }
  }
}

/**
 * A full build's D and shared-term counts at `mask`: copied out (`dots`, `shared`), or still the
 * live arrays of `owner`, which copies them out before it changes them (keepCheckpoint).
 */
interface Checkpoint {
  mask: Uint8Array;
  dots: Float64Array | null;
  shared: Uint16Array | Uint32Array | null;
  owner: IncrementalGram | null;
}

/** Incremental pair updates, in multiples of m², after which settle() rebuilds D to reset drift. */
const SETTLE_AFTER = 6;
/** The same bound inside a call (a rebuild on a click's path): only reached by one big update. */
const REBUILD_AFTER = 8;
