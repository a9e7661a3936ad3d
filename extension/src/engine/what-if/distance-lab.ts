import type { Csr } from '../matrix/csr';
import { maskTerms, type CsrBuffers } from '../matrix/mask-terms';
import { selectRows } from '../matrix/select-rows';
import { maskedTermSums, type MaskedTermSums } from '../measures/masked-term-sums';
import { startMaskedTermSums, type PendingTermSums } from '../measures/start-masked-term-sums';
import { exactMeasures, joinMeasures, measureDistances, sampledMeasures, type ExactMeasures } from '../measures/measure-distances';
import type { Measures } from '../../protocol';
import { rowsWithWeight } from '../matrix/rows-with-weight';
import { SharedRowSweep } from '../measures/shared-row-sweep';
import { sweepRowsModule } from '../measures/sweep-rows-wasm';
import { termSums } from '../measures/term-sums';
import { IncrementalGram } from './incremental-gram';
import { IncrementalTermSums, sameMask } from './incremental-term-sums';
import type { SharedColumnGatherBuffers } from './shared-column-gather';
import { WHAT_IF_BLOCK_ROWS } from './sample-side';

export type DistanceResult = ReturnType<typeof measureDistances>;

/**
 * A full pass of the exact sums begun elsewhere (maskedTermSums with its row norms, the spread
 * optional: it changes no other sum) at the mask `removed`, for `measure` to adopt.
 */
export interface BegunPass {
  removed: Uint8Array;
  pending: PendingTermSums;
}

/**
 * Holds the full weight matrix (no stop list applied) and measures it under any set of removed
 * columns — the what-if behind the suggestions and the panel's toggles; nothing is re-tokenised.
 * The exact part (term sums over all rows) and the sample's cosines are kept from one call to
 * the next and updated from the postings of the terms whose state changed (IncrementalTermSums,
 * IncrementalGram), so a panel toggle costs the rows that hold the term rather than a pass over
 * the corpus; the rest of the sampled measures are recomputed from the cosines. The n-row masked
 * matrix is never written.
 */
export class DistanceLab {
  /** The sampled rows, unmasked, in sample order. */
  readonly sampleRows: Csr;
  /** 0..m−1: sample positions, for functions that take (rows, sample) pairs. */
  readonly positions: Uint32Array;
  private readonly buffers: CsrBuffers;
  private exact: IncrementalTermSums;
  private readonly gram: IncrementalGram;
  /**
   * The memory the sample's dot products are built in, swept there in WebAssembly in one block of
   * all m rows (the Report's sums: measureSampleRows' bits); null where no module or memory can
   * be had (the products then live in arrays of their own and the TypeScript sweeps them).
   */
  private readonly sweep: SharedRowSweep | null;
  private sweeps = 0;
  /** The second state speculative answers are computed in (IncrementalTermSums.twin), once needed. */
  private spareExact: IncrementalTermSums | null = null;
  /**
   * The latest speculative answer and its mask, computed from the current state: every call that
   * moves the exact sums drops it (settle does not: it changes no answer, see IncrementalTermSums).
   */
  private speculation: { mask: Uint8Array; measures: ExactMeasures } | null = null;
  /** The measures of the exact sums the latest whatIfExactSums reached, until read (readUnread). */
  private unread: (() => ExactMeasures) | null = null;

  constructor(
    /** l2-normalised weights of every kept term; removing a column and renormalising equals
     *  weighting without that term, because idf depends only on the term's own df. */
    readonly weights: Csr,
    /** Document index of each sample position. */
    readonly sample: Uint32Array,
    readonly k: number,
    readonly seed: number,
    /** Label id per sample position, −1 where the document has none; null without labels. */
    readonly sampleLabels: Int32Array | null,
    /** Whether the sample's state serves what-ifs after its full builds (IncrementalGram); off for a review asked no what-if. */
    options: { whatIf?: boolean } = {},
  ) {
    this.sampleRows = selectRows(weights, sample);
    this.positions = new Uint32Array(sample.length).map((_, i) => i);
    const nnz = this.sampleRows.indptr[this.sampleRows.rows]!;
    this.buffers = { indptr: new Uint32Array(sample.length + 1), indices: new Uint32Array(nnz), data: new Float64Array(nnz) };
    this.exact = new IncrementalTermSums(weights);
    // Only a review asked no what-if builds its products in the sweep memory: a lab that answers
    // what-ifs on this thread (the editor's fallback when its thread is not there) swept its
    // clicks' products 1.5x slower from that memory (docs/performance.md, nineteenth session).
    this.sweep = options.whatIf === false ? reportSweep(sample.length, k) : null;
    this.gram = new IncrementalGram(this.sampleRows, this.sweep?.state(0), options.whatIf ?? true);
  }

  /** Exact term sums of the whole corpus with `removed` stopped. */
  sums(removed: Uint8Array, withSpread = false): MaskedTermSums {
    return maskedTermSums(this.weights, removed, withSpread);
  }

  /**
   * Exact term sums of the whole corpus with nothing stopped, as weighted (no renormalising), and
   * its rows with any weight. A method, so that a review spread over shards can answer it from
   * summed partials (engine/shards/).
   */
  fullSums(): MaskedTermSums {
    return { sums: termSums(this.weights), rowsWithWeight: rowsWithWeight(this.weights) };
  }

  /**
   * The exact sums `measure` uses; a review in shards answers them from summed partials. With a
   * `ticket`, a click's gather is opened to a helping thread under it (IncrementalTermSums.at).
   */
  protected exactSums(removed: Uint8Array, incremental: boolean, ticket?: number): MaskedTermSums {
    return this.exact.at(removed, incremental, undefined, ticket);
  }

  /**
   * The shared memory a thread needs to help with the clicks' gather of the exact sums
   * (SharedColumnGather), with the column postings built; null when this lab's exact sums are
   * not its own (a ShardedLab) or the column copy holds no weights (a large corpus).
   */
  exactGather(): SharedColumnGatherBuffers | null {
    if (this.exactSums !== DistanceLab.prototype.exactSums) return null;
    return this.exact.gatherBuffers();
  }

  /** The sampled rows with `removed` stopped, renormalised (reused buffers: valid until the next call). */
  maskedSample(removed: Uint8Array): Csr {
    return maskTerms(this.sampleRows, removed, 'l2', this.buffers);
  }

  /**
   * Every measure with `removed` stopped, computed in full: the figures a fresh review with that
   * stop list gives, to the last bit (the Report's baseline and suggested come from here).
   */
  measure(removed: Uint8Array, baselineNeighbors: Uint32Array | null, pass: BegunPass | null = null): DistanceResult {
    return this.measureFrom(removed, baselineNeighbors, false, pass);
  }

  /**
   * The same measures reached from the previous call's state: only the terms whose state
   * differs are applied (see the class comment). Equal to `measure` to ~1e-12; for the panel.
   */
  measureIncrementally(removed: Uint8Array, baselineNeighbors: Uint32Array | null): DistanceResult {
    return this.measureFrom(removed, baselineNeighbors, true);
  }

  /**
   * The panel's toggle: the Measures alone (no per-term k-NN mass, no hub list), reached from
   * the previous call's state like measureIncrementally and equal to `measure(removed).measures`
   * to ~1e-12. The masked sample is never written: the kept cosines are all it needs.
   */
  whatIf(removed: Uint8Array, baselineNeighbors: Uint32Array | null): Measures {
    const exact = this.whatIfExact(removed);
    const { dots, scale } = this.gram.scaled(removed, true);
    const sampled = sampledMeasures({ k: this.k, seed: this.seed, labels: this.sampleLabels, baselineNeighbors, gram: dots, rowScale: scale, blockRows: WHAT_IF_BLOCK_ROWS });
    return joinMeasures(sampled.measures, exact);
  }

  /**
   * whatIf's exact half alone: the pair mass from the exact sums, reached from the previous
   * call's state. ParallelWhatIf runs it here while the sample's half runs on its own thread,
   * which helps with a click's gather under `ticket` once its half is done (exactSums).
   */
  whatIfExact(removed: Uint8Array, ticket?: number): ExactMeasures {
    return this.whatIfExactSums(removed, ticket)();
  }

  /**
   * whatIfExact in two steps: the exact sums now, the measures read off them when the function
   * returned is called, before the next call moves the sums (they are the live state).
   * ParallelWhatIf calls it once its share of the sample's sweep is done, while the thread reads
   * the sampled measures off the sweep: the review's thread would otherwise wait for those.
   * Whatever moves the exact state first (another call, the idle-time settle, a Report measure)
   * reads them before it does (readUnread), so the function always answers for these sums.
   */
  whatIfExactSums(removed: Uint8Array, ticket?: number): () => ExactMeasures {
    this.readUnread();
    const held = this.speculation;
    this.speculation = null;
    if (held !== null && this.spareExact !== null && held.mask.length === removed.length && sameMask(removed, held.mask)) {
      // The speculation went from this very state to `removed` the way this call would: adopt it.
      [this.exact, this.spareExact] = [this.spareExact, this.exact];
      return () => held.measures;
    }
    const { sums, rowsWithWeight } = this.exactSums(removed, true, ticket);
    let measures: ExactMeasures | undefined;
    const read = () => (measures ??= exactMeasures(sums, rowsWithWeight));
    this.unread = read;
    return read;
  }

  /** The measures a whatIfExactSums left unread, read now: the exact state is about to move. */
  private readUnread(): void {
    const read = this.unread;
    this.unread = null;
    read?.();
  }

  /**
   * whatIfExact's answer for `removed`, computed in a copy of the state (a hover's prefetch, the
   * panel's speculative what-if): the state the clicks walk does not move, and a whatIfExact of
   * the same mask that comes next adopts the copy instead of computing, so its answer and the
   * state it leaves are those of a plain call, bit for bit (test/what-if-speculative.test.ts).
   * Only for the lab whose exact sums are its own (not a ShardedLab's summed partials).
   * `interrupt` is called every few rows and throws to abandon the speculation (a click came).
   */
  speculateExact(removed: Uint8Array, interrupt?: () => void): ExactMeasures {
    if (this.exactSums !== DistanceLab.prototype.exactSums) throw new Error('speculateExact: this lab answers its exact sums from elsewhere');
    this.speculation = null;
    const spare = (this.spareExact ??= this.exact.twin());
    spare.copyFrom(this.exact);
    const { sums, rowsWithWeight } = spare.at(removed, true, interrupt);
    const measures = exactMeasures(sums, rowsWithWeight);
    this.speculation = { mask: removed.slice(), measures };
    return measures;
  }

  private measureFrom(removed: Uint8Array, baselineNeighbors: Uint32Array | null, incremental: boolean, begun: BegunPass | null = null): DistanceResult {
    this.readUnread();
    this.speculation = null;
    // A full pass over every non-zero (the Report's figures) runs on another thread beside the
    // sample's dot products, which need nothing from it, and the exact state adopts it: the
    // same bits as the pass here (IncrementalTermSums.adopt). The caller may have begun it
    // already (the term review's spread pass at the same mask, with row norms); where the matrix
    // is not shared the pending pass is computed here when taken.
    let pass: PendingTermSums | null = null;
    if (!incremental && this.exactSums === DistanceLab.prototype.exactSums && this.exact.needsFullPass(removed)) {
      if (begun !== null && !sameMask(removed, begun.removed)) throw new Error('measure: the pass begun is for another mask');
      pass = begun?.pending ?? startMaskedTermSums(this.weights, removed, false, undefined, true);
    }
    const { dots, scale } = this.gram.scaled(removed, incremental);
    const sample = this.maskedSample(removed);
    // The pass begun elsewhere is taken only after the sampled measures (they need nothing from
    // it), so that they run while it does instead of after waiting for it.
    const now = pass === null ? this.exactSums(removed, incremental) : null;
    return measureDistances(sample, {
      sample: this.positions,
      k: this.k,
      seed: this.seed,
      labels: this.sampleLabels,
      baselineNeighbors,
      ...(now !== null ? { sums: now.sums, rowsWithWeight: now.rowsWithWeight } : { exact: () => this.exact.adopt(removed, pass!.take()) }),
      gram: dots,
      rowScale: scale,
      ...(this.sweep !== null ? { shared: { sweep: this.sweep, ticket: ++this.sweeps } } : {}),
    });
  }

  /**
   * Idle time after a what-if answer: the drift resets (a full pass of the exact sums, a rebuild
   * of the sample's dot products) that have come due, so no click pays for them. The next call
   * would do them first anyway, so the answers are the same whether this runs or not.
   */
  settle(): void {
    this.readUnread();
    this.exact.settle();
    this.gram.settle();
  }

  /** Builds the column postings toggles walk, so the first toggle does not pay for them. */
  prepareToggles(): void {
    this.exact.prepare();
  }

  /** Column mask with `base` plus `extra` columns set. */
  static union(base: Uint8Array, extra: Iterable<number>): Uint8Array {
    const mask = base.slice();
    for (const col of extra) mask[col] = 1;
    return mask;
  }
}

/**
 * The sweep memory of a lab's full measures: one state (the products IncrementalGram builds in
 * it) swept in one block of all m rows. Written into where they are swept, the products need no
 * copy into the module's memory, whose fresh pages (32 MB at m = 2,000) had cost what the
 * WebAssembly rows save (docs/performance.md). Null without the module or such a memory.
 */
function reportSweep(m: number, k: number): SharedRowSweep | null {
  if (m < 1 || sweepRowsModule() === null) return null;
  try {
    const sweep = SharedRowSweep.create(m, k, m, 1);
    return sweep.buffers.memory !== null ? sweep : null;
  } catch {
    return null;
  }
}
