import type { Csr } from '../matrix/csr';
import { addKeptRow, type MaskedTermSums } from '../measures/masked-term-sums';
import { GatherFailed, SharedColumnGather, type SharedColumnGatherBuffers } from './shared-column-gather';

/**
 * The exact term sums of a what-if (S1, S2, df over every document, each row renormalised after
 * its removed columns are dropped — docs/methods.md §3), kept up to date across toggles instead of being
 * recomputed. Stopping or restoring term t changes only the rows that hold t: each such row's
 * kept norm is recomputed from scratch and its old contribution to the sums swapped for its new
 * one in the same pass. The rows holding t come from a column-major copy of the row ids and,
 * up to COLUMN_WEIGHTS_UP_TO non-zeros, the weights (postings, 12 bytes per non-zero: 91 MB at
 * 100k documents; 4 above the bound: ~0.3 GB at 1M; in the editor only, where the what-if runs),
 * built before the first incremental step; a click on a term in most rows reads the kept columns
 * from it (updateOne). With the weights the copy lives in shared memory, so that the what-if's
 * sample thread can take part in that read (SharedColumnGather).
 *
 * Rounding: a row's norm is never updated by subtraction, so it is exact; the sums S1 and S2
 * are, and drift by ~1e-16 relative per update. A term whose df drops to 0 is reset to exact 0,
 * and once updates have touched `SETTLE_AFTER`×nnz entries `settle()` recomputes the sums from
 * scratch at the current mask, in idle time after an answer; a call that finds that still due
 * does it first, so the answers never depend on whether idle time came (as IncrementalGram).
 *
 * The arrays returned by `at` are the live state: valid until the next call, never to be kept.
 */
export class IncrementalTermSums {
  /** S1 and S2: arrays of their own, moved into the gather's memory once it is made (sumsInto). */
  private s1: Float64Array;
  private s2: Float64Array;
  private readonly df: Uint32Array;
  /** Always zeros: no what-if measure reads the spread (the term table takes it from its own pass); kept for the TermSums shape. */
  private readonly sxlogx: Float64Array;
  /** Σ of kept w² per row under `mask` (the weights are unit rows, so 1 when nothing is removed). */
  private readonly rowNorm2: Float64Array;
  private readonly mask: Uint8Array;
  private readonly rowStamp: Uint32Array;
  private stamp = 0;
  private rowsWithWeight = 0;
  private ready = false;
  private postings: ColumnPostings | null = null;
  private delta: Float64Array | null = null;
  /** Entries visited by incremental updates since the last full pass. */
  private updatedEntries = 0;
  /**
   * The entries of the columns `mask` keeps (Σ of their postings), kept by updateOne as it flips
   * one column; −1 when unknown (any other change of the mask), then counted afresh. Only
   * updateOne's choice between gather and scatter reads it: it changes the time, never the bits.
   */
  private keptEntries = -1;
  /**
   * States of full passes (the review's baseline and the latest Report figure), restored bit for
   * bit whenever that mask is asked for again.
   */
  private checkpoints: Array<{ mask: Uint8Array; s1: Float64Array; s2: Float64Array; df: Uint32Array; rowNorm2: Float64Array; rowsWithWeight: number }> = [];
  /** Whether the state is what a full pass gives (not reached by updates). */
  private exact = false;
  /** A full pass at the current mask is due (see settle). */
  private settleDue = false;
  /** Statistics of the last call, for the benchmark and the tests. */
  lastStep: { kind: 'full' | 'incremental' | 'unchanged' | 'restored'; entries: number; gathered?: boolean } = { kind: 'unchanged', entries: 0 };

  constructor(
    readonly weights: Csr,
    /** updateOne gathers term by term below this ratio of entries (GATHER_BELOW; the tests set it to take either way). */
    private readonly gatherBelow = GATHER_BELOW,
    /** The column copy holds the weights only up to this many non-zeros (COLUMN_WEIGHTS_UP_TO; the tests set it). */
    private readonly columnWeightsUpTo = COLUMN_WEIGHTS_UP_TO,
    /** Whether the gather may run in WebAssembly (SharedColumnGather.create; false: the TypeScript, for the tests and the benchmark). */
    private readonly webAssembly = true,
  ) {
    const cols = weights.cols;
    this.s1 = new Float64Array(cols);
    this.s2 = new Float64Array(cols);
    this.df = new Uint32Array(cols);
    this.sxlogx = new Float64Array(cols);
    this.rowNorm2 = new Float64Array(weights.rows);
    this.rowStamp = new Uint32Array(weights.rows);
    this.mask = new Uint8Array(cols);
  }

  /**
   * The sums with `removed` stopped (1 = removed). With `incremental` (the panel's toggles) they
   * are reached from the previous call's state; without it (the Report's figures) they are
   * computed by a full pass — bit for bit what a fresh review with that stop list computes — and
   * kept as a checkpoint (the first and the latest), restored exactly when that mask returns.
   * `interrupt` (a prefetch's, computed in a twin) is called every few rows of an update and
   * throws to abandon it: the state is then unusable until the next copyFrom. With a `ticket`
   * (above every earlier one) a click's gather is opened to a helping thread under it
   * (SharedColumnGather); the sums are the same bits with or without.
   */
  at(removed: Uint8Array, incremental = true, interrupt?: () => void, ticket?: number): MaskedTermSums {
    const X = this.weights;
    if (removed.length < X.cols) throw new RangeError(`removed has ${removed.length} entries for ${X.cols} columns`);
    const nnz = X.indptr[X.rows]!;
    const checkpoint = this.ready ? this.checkpoints.find((c) => sameMask(removed, c.mask)) : undefined;
    // What idle time would have done, unless this call replaces the whole state anyway.
    if (checkpoint === undefined && incremental) this.settle();
    if (this.ready && sameMask(removed, this.mask) && (incremental || this.exact)) {
      this.lastStep = { kind: 'unchanged', entries: 0 };
    } else if (checkpoint !== undefined) {
      this.s1.set(checkpoint.s1);
      this.s2.set(checkpoint.s2);
      this.df.set(checkpoint.df);
      this.rowNorm2.set(checkpoint.rowNorm2);
      this.rowsWithWeight = checkpoint.rowsWithWeight;
      this.mask.set(checkpoint.mask);
      this.keptEntries = -1;
      this.updatedEntries = 0;
      this.settleDue = false;
      this.exact = true;
      this.lastStep = { kind: 'restored', entries: 0 };
    } else if (!this.ready || !incremental) {
      this.full(removed);
      this.checkpoint();
    } else {
      const changed = changedColumns(removed, this.mask);
      if (changed.length === 0) {
        this.lastStep = { kind: 'unchanged', entries: 0 };
      } else {
        const postings = this.columnPostings();
        // Rows holding t ≈ df(t), each read once more than a full pass reads it. When that comes
        // near one pass over everything, the plain pass is as cheap and resets rounding drift.
        let rowsTouched = 0;
        for (const t of changed) rowsTouched += postings.start[t + 1]! - postings.start[t]!;
        const estimate = rowsTouched * (nnz / Math.max(1, X.rows));
        if (estimate >= nnz || this.updatedEntries + estimate > REBUILD_AFTER * nnz) this.full(removed);
        else if (changed.length === 1) this.updateOne(changed[0]!, removed, interrupt, ticket);
        else this.update(changed, removed, interrupt);
      }
    }
    return this.answer();
  }

  /**
   * Whether `at(removed, false)` would make a full pass (rather than find the state unchanged
   * or restore a checkpoint): then the pass can be made elsewhere, on another thread, by
   * maskedTermSums with its row norms, and adopted.
   */
  needsFullPass(removed: Uint8Array): boolean {
    if (!this.ready) return true;
    if (this.checkpoints.some((c) => sameMask(removed, c.mask))) return false;
    return !(sameMask(removed, this.mask) && this.exact);
  }

  /**
   * `at(removed, false)` with its full pass made elsewhere: `pass` is maskedTermSums(weights,
   * removed, false) with each row's norm (`rowNorm2`), which adds the same numbers in the same
   * order as the pass here (addKeptRow), so the state left — sums, norms, mask, checkpoint — is
   * the one `at` leaves, to the bit (test/what-if-adopt-full-pass.test.ts). When `at` would make
   * no pass (see needsFullPass), `pass` is not read and `at` answers.
   */
  adopt(removed: Uint8Array, pass: MaskedTermSums): MaskedTermSums {
    if (!this.needsFullPass(removed)) return this.at(removed, false);
    const X = this.weights;
    if (removed.length < X.cols) throw new RangeError(`removed has ${removed.length} entries for ${X.cols} columns`);
    const { rowNorm2 } = pass;
    if (rowNorm2 === undefined || rowNorm2.length !== X.rows || pass.sums.s1.length !== X.cols) throw new Error('adopt: a pass over other weights, or without its row norms');
    this.s1.set(pass.sums.s1);
    this.s2.set(pass.sums.s2);
    this.df.set(pass.sums.df);
    this.rowNorm2.set(rowNorm2);
    this.rowsWithWeight = pass.rowsWithWeight;
    this.markFullPass(removed);
    this.checkpoint();
    return this.answer();
  }

  /** Keeps the state of a full pass just made as a checkpoint: the first, and the latest. */
  private checkpoint(): void {
    const saved = {
      mask: this.mask.slice(),
      s1: this.s1.slice(),
      s2: this.s2.slice(),
      df: this.df.slice(),
      rowNorm2: this.rowNorm2.slice(),
      rowsWithWeight: this.rowsWithWeight,
    };
    if (this.checkpoints.length < 2) this.checkpoints.push(saved);
    else this.checkpoints[1] = saved;
  }

  /**
   * A second state over the same weights, sharing the column postings and the checkpoints: the
   * what-if's speculative answers are computed in it (copyFrom, then at) so that the state the
   * clicks walk is left as it was, and adopted by swapping the two (DistanceLab.whatIfExact).
   */
  twin(): IncrementalTermSums {
    const twin = new IncrementalTermSums(this.weights, this.gatherBelow, this.columnWeightsUpTo, this.webAssembly);
    twin.postings = this.columnPostings();
    if (twin.postings.gather !== null) twin.sumsInto(twin.postings.gather);
    twin.checkpoints = this.checkpoints;
    return twin;
  }

  /**
   * Makes this state `other`'s, to the bit: the sums, norms and mask, and the counters that
   * decide the next full pass (so the next call takes the branch `other`'s would). The row
   * stamps stay this instance's: they only tell rows apart within one call.
   */
  copyFrom(other: IncrementalTermSums): void {
    if (other.weights !== this.weights) throw new Error('copyFrom: a state over other weights');
    this.s1.set(other.s1);
    this.s2.set(other.s2);
    this.df.set(other.df);
    this.sxlogx.set(other.sxlogx);
    this.rowNorm2.set(other.rowNorm2);
    this.mask.set(other.mask);
    this.keptEntries = other.keptEntries;
    this.rowsWithWeight = other.rowsWithWeight;
    this.ready = other.ready;
    this.updatedEntries = other.updatedEntries;
    this.exact = other.exact;
    this.settleDue = other.settleDue;
    this.lastStep = { ...other.lastStep };
  }

  /**
   * Recomputes the sums at the current mask if enough updates have piled up (idle time, after
   * an answer); returns whether it did. Only the rounding changes: to a full pass's.
   */
  settle(): boolean {
    if (!this.settleDue) return false;
    this.full(this.mask);
    return true;
  }

  private full(removed: Uint8Array): void {
    const { indptr, indices, data, rows } = this.weights;
    this.s1.fill(0);
    this.s2.fill(0);
    this.df.fill(0);
    let nonEmpty = 0;
    for (let r = 0; r < rows; r++) {
      const start = indptr[r]!;
      const end = indptr[r + 1]!;
      const norm2 = keptNorm2(indices, data, start, end, removed);
      this.rowNorm2[r] = norm2;
      if (!(norm2 > 0)) continue;
      nonEmpty++;
      this.addRow(start, end, removed, 1 / Math.sqrt(norm2));
    }
    this.rowsWithWeight = nonEmpty;
    this.markFullPass(removed);
  }

  /** The state's flags after a full pass at `removed`, made here (full) or elsewhere (adopt). */
  private markFullPass(removed: Uint8Array): void {
    this.mask.set(removed.subarray(0, this.mask.length));
    this.keptEntries = -1;
    this.ready = true;
    this.exact = true;
    this.updatedEntries = 0;
    this.settleDue = false;
    this.lastStep = { kind: 'full', entries: this.weights.indptr[this.weights.rows]! };
  }

  /** The live state as at() and adopt() return it. */
  private answer(): MaskedTermSums {
    return { sums: { s1: this.s1, s2: this.s2, df: this.df, sxlogx: this.sxlogx }, rowsWithWeight: this.rowsWithWeight };
  }

  private update(changed: number[], removed: Uint8Array, interrupt?: () => void): void {
    const { indptr, indices, data } = this.weights;
    const { mask } = this;
    const postings = this.columnPostings();
    if (++this.stamp === 0xffffffff) {
      this.rowStamp.fill(0);
      this.stamp = 1;
    }
    const stamp = this.stamp;
    let entries = 0;
    for (const t of changed) {
      for (let q = postings.start[t]!, qEnd = postings.start[t + 1]!; q < qEnd; q++) {
        if (interrupt !== undefined && ((q - postings.start[t]!) & 63) === 0) this.interrupted(interrupt);
        const r = postings.rows[q]!;
        if (this.rowStamp[r] === stamp) continue;
        this.rowStamp[r] = stamp;
        const start = indptr[r]!;
        const end = indptr[r + 1]!;
        entries += end - start;
        const oldNorm2 = this.rowNorm2[r]!;
        const norm2 = keptNorm2(indices, data, start, end, removed);
        this.rowNorm2[r] = norm2;
        const wasKept = oldNorm2 > 0;
        const isKept = norm2 > 0;
        this.rowsWithWeight += (isKept ? 1 : 0) - (wasKept ? 1 : 0);
        const invOld = wasKept ? 1 / Math.sqrt(oldNorm2) : 0;
        const invNew = isKept ? 1 / Math.sqrt(norm2) : 0;
        // One pass swaps the row's old scaled weights for its new ones (the row is in cache
        // from the norm pass): kept terms move by the difference, toggled ones come or go.
        for (let p = start; p < end; p++) {
          const w = data[p]!;
          if (w === 0) continue;
          const u = indices[p]!;
          this.move(u, w, wasKept && mask[u] === 0, isKept && removed[u] === 0, invOld, invNew);
        }
      }
    }
    mask.set(removed.subarray(0, mask.length));
    this.keptEntries = -1;
    this.updatedEntries += entries;
    this.settleDue = this.updatedEntries > SETTLE_AFTER * this.weights.indptr[this.weights.rows]!;
    this.exact = false;
    this.lastStep = { kind: 'incremental', entries };
  }

  /**
   * One toggled term, the panel's usual click: a row holding t gets its new kept norm from the
   * old one ± w_t² (w_t read from t's column in the column-major copy) instead of a pass
   * over the row, and its other kept terms then move to the new scale. Where stopping t removes
   * more than half of a row's kept norm the subtraction would lose digits, so that row's norm is
   * summed afresh, as is one that empties (its norm must be exactly 0).
   *
   * A rescaled row changes the sums of its kept terms u ≠ t by x_new − x_old = w·(inv_new −
   * inv_old) and x_new² − x_old² = w²·(1/norm²_new − 1/norm²_old). Those changes are summed per
   * term, over the rows in ascending order, then added to S1 and S2 at the end, one of two ways
   * with the same additions in the same order (so the same bits): row by row, scattering each
   * entry's change into a per-term scratch (`delta`), or, when the kept columns hold fewer
   * entries than t's rows (t in most rows, as a function word is), term by term down the
   * column-major copy, gathering each row's
   * two factors (`rowChange`, 0 for the rows not rescaled, whose +0 leaves a sum as it is; the
   * columns in blocks another thread may share, SharedColumnGather, each column alone, its two
   * sums added to S1 and S2 as it ends, which live in the gather's memory for that). The
   * scatter lands each entry at a random place in a 16-bytes-per-term array; the gather reads the
   * weights in order and only the per-row factors at random, and it skips the stopped columns.
   */
  private updateOne(t: number, removed: Uint8Array, interrupt?: () => void, ticket?: number): void {
    // The postings first: making them moves S1 and S2 into the gather's memory.
    const postings = this.columnPostings();
    const { s1, s2, mask } = this;
    const stopping = removed[t] !== 0;
    const from = postings.start[t]!;
    const to = postings.start[t + 1]!;
    // The entries of t's rows, and those of the kept columns other than t, without a pass over
    // either (each was ~0.15–0.45 ms of a click's CPU at 100k: docs/performance.md).
    const entries = postings.rowEntries[t]!;
    if (this.keptEntries < 0) this.keptEntries = keptColumnEntries(postings.start, mask, -1);
    const keptOthers = this.keptEntries - (mask[t] === 0 ? to - from : 0);
    const gatherer = postings.gather;
    const gather = gatherer !== null && keptOthers < this.gatherBelow * entries;
    const delta = gather ? null : this.deltaScratch();
    const rowChange = gather ? gatherer!.rowChange : null;
    // The loops live in small functions called many times per click (a block of rows, a block
    // of columns): V8 then optimises each as a whole function with the feedback of many calls,
    // where one long loop here was compiled part way through a call (on-stack replacement) and
    // thrown away again whenever a path it had not yet seen came (a stop after restores, the
    // scatter after gathers): the first clicks after the Report took 250–670 ms at 100k against
    // ~100 ms once settled.
    for (let q = from; q < to; q += RESCALE_BLOCK) {
      if (interrupt !== undefined) this.interrupted(interrupt);
      this.rescaleRows(t, stopping, removed, q, Math.min(to, q + RESCALE_BLOCK), delta, rowChange);
    }
    if (rowChange !== null) {
      const check = interrupt === undefined ? undefined : () => this.interrupted(interrupt);
      try {
        gatherer!.gather(t, mask, s1, s2, ticket, check);
      } catch (e) {
        if (!(e instanceof GatherFailed)) throw e;
        // A helper's block failed part way through sums it adds to as it goes: they cannot be
        // gathered again, so the state is made afresh at `removed` (a full pass's bits).
        clearRowChange(rowChange, postings.rows, from, to);
        this.full(removed);
        return;
      }
      clearRowChange(rowChange, postings.rows, from, to);
    } else {
      addDelta(delta!, mask, t, s1, s2);
      delta!.fill(0);
    }
    // t's state changed (at() calls this for a changed column): its entries leave or join the kept ones.
    this.keptEntries += stopping ? from - to : to - from;
    mask[t] = stopping ? 1 : 0;
    this.updatedEntries += entries;
    this.settleDue = this.updatedEntries > SETTLE_AFTER * this.weights.indptr[this.weights.rows]!;
    this.exact = false;
    this.lastStep = { kind: 'incremental', entries, gathered: gather };
  }

  /**
   * updateOne for the rows of t's postings from..to: each row's new kept norm and scale; t's own
   * sums; the row's change to its other kept terms, scattered into `delta` or, for the gather,
   * its two factors written to `rowChange`; a row that empties or was empty moves entry by entry.
   */
  private rescaleRows(t: number, stopping: boolean, removed: Uint8Array, from: number, to: number, delta: Float64Array | null, rowChange: Float64Array | null): void {
    const { indptr, indices, data } = this.weights;
    const { mask, rowNorm2 } = this;
    // t's weight in each of its rows comes from the column-major copy, in order, so a row's
    // own entries are read only where its other terms move one by one or its norm is summed.
    const { rows, values } = this.columnPostings();
    // A row's bounds are read only where its own entries are (the gather's rows need none).
    for (let q = from; q < to; q++) {
      const r = rows[q]!;
      const wt = values !== null ? values[q]! : data[columnIn(indices, indptr[r]!, indptr[r + 1]!, t)]!;
      if (wt === 0) continue;
      const oldNorm2 = rowNorm2[r]!;
      let norm2 = stopping ? oldNorm2 - wt * wt : oldNorm2 + wt * wt;
      if (stopping && !(norm2 > 0.5 * oldNorm2)) norm2 = keptNorm2(indices, data, indptr[r]!, indptr[r + 1]!, removed);
      rowNorm2[r] = norm2;
      const wasKept = oldNorm2 > 0;
      const isKept = norm2 > 0;
      this.rowsWithWeight += (isKept ? 1 : 0) - (wasKept ? 1 : 0);
      const invOld = wasKept ? 1 / Math.sqrt(oldNorm2) : 0;
      const invNew = isKept ? 1 / Math.sqrt(norm2) : 0;
      // t itself comes or goes; every other kept term of the row moves to the new scale.
      this.move(t, wt, stopping, !stopping && isKept, invOld, invNew);
      if (wasKept && isKept) {
        const d1 = invNew - invOld;
        const d2 = 1 / norm2 - 1 / oldNorm2;
        if (rowChange !== null) {
          rowChange[2 * r] = d1;
          rowChange[2 * r + 1] = d2;
        } else {
          scatterRow(indices, data, indptr[r]!, indptr[r + 1]!, d1, d2, delta!);
        }
      } else {
        for (let p = indptr[r]!, end = indptr[r + 1]!; p < end; p++) {
          const u = indices[p]!;
          const w = data[p]!;
          if (u !== t && w !== 0 && mask[u] === 0) this.move(u, w, wasKept, isKept, invOld, invNew);
        }
      }
    }
  }

  /**
   * Swaps one entry's old contribution (weight w at scale invOld, if `before` it counted) for its
   * new one (at invNew, if `after`): kept terms move by the difference, toggled ones come or go.
   */
  private move(u: number, w: number, before: boolean, after: boolean, invOld: number, invNew: number): void {
    const { s1, s2, df } = this;
    if (before && after) {
      const xo = w * invOld;
      const xn = w * invNew;
      s1[u] += xn - xo;
      s2[u] += xn * xn - xo * xo;
    } else if (before) {
      if (--df[u] === 0) {
        s1[u] = 0;
        s2[u] = 0;
      } else {
        const xo = w * invOld;
        s1[u] -= xo;
        s2[u] -= xo * xo;
      }
    } else if (after) {
      const xn = w * invNew;
      df[u]++;
      s1[u] += xn;
      s2[u] += xn * xn;
    }
  }

  /**
   * Calls a prefetch's `interrupt`; when it throws, the half-done state is marked unusable (a
   * full pass comes first if anything but copyFrom uses it) and the scratch zeroed for the next
   * update, then the throw goes on.
   */
  private interrupted(interrupt: () => void): void {
    try {
      interrupt();
    } catch (e) {
      this.ready = false;
      this.delta?.fill(0);
      this.postings?.gather?.rowChange.fill(0);
      throw e;
    }
  }

  /** Adds one row's kept weights, scaled, to the sums. */
  private addRow(start: number, end: number, removed: Uint8Array, scale: number): void {
    addKeptRow({ s1: this.s1, s2: this.s2, df: this.df }, this.weights, start, end, removed, scale);
  }

  /** Zeroed scratch of 2 entries per column for updateOne, kept from call to call. */
  private deltaScratch(): Float64Array {
    if (this.delta === null) this.delta = new Float64Array(2 * this.weights.cols);
    return this.delta;
  }

  /** Builds the column postings ahead of the first incremental step. */
  prepare(): void {
    this.columnPostings();
  }

  /**
   * The shared memory of the clicks' gather (the column postings with their weights), for a
   * thread that helps (SharedColumnGather.help); null when the column copy holds no weights.
   */
  gatherBuffers(): SharedColumnGatherBuffers | null {
    return this.columnPostings().gather?.buffers ?? null;
  }

  /** Row ids and weights per column, rows ascending: the column-major copy the toggles walk. */
  private columnPostings(): ColumnPostings {
    if (this.postings !== null) return this.postings;
    const { indptr, indices, data, rows, cols } = this.weights;
    const nnz = indptr[rows]!;
    const start = new Uint32Array(cols + 1);
    for (let p = 0; p < nnz; p++) start[indices[p]! + 1]++;
    for (let t = 0; t < cols; t++) start[t + 1] += start[t]!;
    const fill = start.slice(0, cols);
    // With the weights, the copy lives in shared memory, where another thread can gather from it.
    const gather = nnz <= this.columnWeightsUpTo ? SharedColumnGather.create(rows, cols, nnz, this.webAssembly) : null;
    gather?.start.set(start);
    const rowIds = gather?.rowIds ?? new Uint32Array(nnz);
    const values = gather?.values ?? null;
    // Per column, the entries of the rows that hold it (at most nnz, so within 32 bits).
    const rowEntries = new Uint32Array(cols);
    for (let r = 0; r < rows; r++) {
      const end = indptr[r + 1]!;
      const length = end - indptr[r]!;
      for (let p = indptr[r]!; p < end; p++) {
        const u = indices[p]!;
        const slot = fill[u]!++;
        rowIds[slot] = r;
        if (values !== null) values[slot] = data[p]!;
        rowEntries[u] += length;
      }
    }
    gather?.divide();
    this.postings = { start: gather?.start ?? start, rows: rowIds, values, gather, rowEntries };
    if (gather !== null) this.sumsInto(gather);
    return this.postings;
  }

  /**
   * Moves S1 and S2 into one of the gather's places for sums (their values copied), so that a
   * click's gather adds each column's change to them as the column ends instead of in a pass of
   * its own after it (SharedColumnGather.gather); where both places are taken they stay where
   * they are (the gather then adds them after it, the same bits).
   */
  private sumsInto(gather: SharedColumnGather): void {
    const place = gather.claimSums();
    if (place === null) return;
    place.s1.set(this.s1);
    place.s2.set(this.s2);
    this.s1 = place.s1;
    this.s2 = place.s2;
  }
}

/** The column-major copy of the weights: column t's entries are start[t]..start[t+1]), rows ascending. */
interface ColumnPostings {
  start: Uint32Array;
  rows: Uint32Array;
  /** The weights, in the same order; null above COLUMN_WEIGHTS_UP_TO non-zeros (no gather then). */
  values: Float64Array | null;
  /** The gather over these arrays (they live in its shared memory), with its per-row scratch; null without weights. */
  gather: SharedColumnGather | null;
  /** Per column, the entries of the rows that hold it (Σ of their lengths): what a click on it visits. */
  rowEntries: Uint32Array;
}

/**
 * Up to this many non-zeros the column copy also holds the weights (8 more bytes each), which the
 * gather needs and which spare a binary search per row of the toggled term. Above it the memory
 * weighs more than the time: at 1M documents (~76M non-zeros) the weights would add ~0.6 GB to an
 * editor worker that already holds ~2 GB, so large corpora scatter (the same bits, slower clicks).
 * 16M is twice the bench's 100k corpus (128 MB). A choice of ours, no source.
 */
const COLUMN_WEIGHTS_UP_TO = 16_000_000;

/**
 * updateOne gathers term by term when the kept columns hold fewer entries than the rows holding
 * the toggled term, times this; the choice changes the time, never the bits. Measured on the
 * bench's 100k corpus (its clicks replayed in one process, each way in turn, 2026-12-03, load
 * 5–7): the gather read the 4.9M kept entries in ~70 ms whatever the term (~14 ns an entry, in
 * order), the scatter ~30–40 ns an entry of the term's rows (each lands at a random place), so
 * they broke even at ~1.8–2.3M entries, where the kept columns hold 2.1–2.7× as many; at 1 the
 * terms in 2.4–4.9M entries' worth of rows scattered, 1.5–2.5× slower.
 */
const GATHER_BELOW = 2;

/** Incremental updates visiting this many times nnz entries make settle() reset drift by a full pass. */
const SETTLE_AFTER = 12;
/** The same bound inside a call (a full pass on a click's path): only reached by one big update. */
const REBUILD_AFTER = 16;

/** Rows of the toggled term per rescaleRows call (and between interrupt checks). */
const RESCALE_BLOCK = 64;

/** Entries of the columns kept by `mask`, t excepted (−1: none excepted). */
function keptColumnEntries(start: Uint32Array, mask: Uint8Array, t: number): number {
  let entries = 0;
  for (let u = 0, cols = mask.length; u < cols; u++) if (mask[u] === 0 && u !== t) entries += start[u + 1]! - start[u]!;
  return entries;
}

/** Σ of the kept w² of one row (entries start..end). */
function keptNorm2(indices: Uint32Array, data: Float64Array, start: number, end: number, removed: Uint8Array): number {
  let norm2 = 0;
  for (let p = start; p < end; p++) if (removed[indices[p]!] === 0) norm2 += data[p]! * data[p]!;
  return norm2;
}

/** One rescaled row's changes into `delta` (S1's and S2's of a term side by side): w·d1 and w²·d2 per entry. */
function scatterRow(indices: Uint32Array, data: Float64Array, start: number, end: number, d1: number, d2: number, delta: Float64Array): void {
  for (let p = start; p < end; p++) {
    const u2 = 2 * indices[p]!;
    const w = data[p]!;
    delta[u2] += w * d1;
    delta[u2 + 1] += w * w * d2;
  }
}

/** The scattered changes added to the sums of the kept terms other than t. */
function addDelta(delta: Float64Array, mask: Uint8Array, t: number, s1: Float64Array, s2: Float64Array): void {
  for (let u = 0, cols = s1.length; u < cols; u++) {
    if (mask[u] === 0 && u !== t) {
      s1[u] += delta[2 * u]!;
      s2[u] += delta[2 * u + 1]!;
    }
  }
}

/** Zeroes the factors the gather read (the rows of t's postings from..to). */
function clearRowChange(rowChange: Float64Array, rows: Uint32Array, from: number, to: number): void {
  for (let q = from; q < to; q++) {
    const c = 2 * rows[q]!;
    rowChange[c] = 0;
    rowChange[c + 1] = 0;
  }
}

/**
 * Whether two column masks stop the same columns (the first `b.length` of `a`; any non-zero byte
 * stops its column). Four columns at a time while the two masks' bytes are equal (equal bytes stop
 * the same columns), byte by byte in a word that differs: a click's masks differ in a column or two
 * of ~115,000 at 100k, and each thread compares a click's mask with its state's and checkpoints'
 * (~0.1 ms a comparison byte by byte).
 */
export function sameMask(a: Uint8Array, b: Uint8Array): boolean {
  const n = b.length;
  let t = 0;
  const words = maskWords(a, b);
  if (words !== null) {
    const [wa, wb] = words;
    for (let w = 0; w < wa.length; w++) {
      if (wa[w] === wb[w]) continue;
      for (let u = 4 * w; u < 4 * w + 4; u++) if ((a[u] !== 0) !== (b[u] !== 0)) return false;
    }
    t = 4 * wa.length;
  }
  for (; t < n; t++) if ((a[t] !== 0) !== (b[t] !== 0)) return false;
  return true;
}

/** The columns below `b.length` that one of the masks stops and the other does not, ascending (as sameMask reads them). */
export function changedColumns(a: Uint8Array, b: Uint8Array): number[] {
  const changed: number[] = [];
  const n = b.length;
  let t = 0;
  const words = maskWords(a, b);
  if (words !== null) {
    const [wa, wb] = words;
    for (let w = 0; w < wa.length; w++) {
      if (wa[w] === wb[w]) continue;
      for (let u = 4 * w; u < 4 * w + 4; u++) if ((a[u] !== 0) !== (b[u] !== 0)) changed.push(u);
    }
    t = 4 * wa.length;
  }
  for (; t < n; t++) if ((a[t] !== 0) !== (b[t] !== 0)) changed.push(t);
  return changed;
}

/** The first ⌊b.length/4⌋ words of both masks as 32-bit views, or null when either is not 4-byte aligned or `a` is shorter. */
function maskWords(a: Uint8Array, b: Uint8Array): [Uint32Array, Uint32Array] | null {
  const words = b.length >>> 2;
  if (a.length < b.length || ((a.byteOffset | b.byteOffset) & 3) !== 0) return null;
  return [new Uint32Array(a.buffer, a.byteOffset, words), new Uint32Array(b.buffer, b.byteOffset, words)];
}

/** Position of column t in a row's ascending columns indices[start..end) (t must be there). */
function columnIn(indices: Uint32Array, start: number, end: number, t: number): number {
  let lo = start;
  let hi = end - 1;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (indices[mid]! < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
