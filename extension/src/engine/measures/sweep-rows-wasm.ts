import { assembledModule } from '../wasm/assembled-module';
import { lineAllocator, sharedWasmMemory } from '../wasm/shared-memory';
import { RANK_BUCKETS, type SweepOutputs } from './measure-sample-rows';
import { SIMILARITY_BINS } from './similarity-histograms';

/**
 * The sampled measures' row sweep in WebAssembly (sweep-rows.wat: SweepRows.block, .row and .noRow
 * with the same IEEE double operations in the same order, so the same bits; the TypeScript stays
 * the reference and the fallback). It reads and writes one memory that the threads sweeping
 * blocks of the same sweep share (SharedRowSweep), laid out by sweepLayout: the outputs, the rows'
 * validity, each thread's scratch, and the states' dot products and row scales.
 *
 * Why: the row is the largest part of a what-if's CPU, and V8's code for it in JavaScript (typed
 * array bounds, the k-NN offers and the histogram's index checks inside a 2,000-step loop) costs
 * more than the same operations in WebAssembly; docs/performance.md has the figures.
 */

/** Defined by scripts/build.mjs in the Node bundles: the module's bytes, base64. */
declare const LOUDWORD_SWEEP_ROWS_WASM: string | undefined;

/** The compiled module, or null where it cannot be had (the sweep then runs in JavaScript). */
export function sweepRowsModule(): WebAssembly.Module | null {
  return assembledModule('measures/sweep-rows.wat', typeof LOUDWORD_SWEEP_ROWS_WASM !== 'undefined' ? LOUDWORD_SWEEP_ROWS_WASM : undefined);
}

/** Byte offsets of one thread's scratch (SweepRows' per-row arrays). */
interface ScratchAt {
  norms: number;
  best: number;
  bestPos: number;
  tie: number;
  near: number;
  rankScratch: number;
  probe: number;
  buckets: number;
  counts: number;
  /** A pair's second row's scores, nearby distances and pair terms (sweep-rows.wat's rowPair). */
  rankScratch2: number;
  near2: number;
  pairTail: number;
}

/** Where everything of a sweep lies in its memory (byte offsets), and the memory's size. */
export interface SweepLayout {
  m: number;
  k: number;
  blocks: number;
  bytes: number;
  outputs: Record<keyof Omit<SweepOutputs, 'knn'> | 'neighbors' | 'sims', number>;
  valid: number;
  scratch: ScratchAt[];
  /** Per state: its dot products and row scales, and with `gram` its shared-term counts (else −1). */
  states: Array<{ dots: number; scale: number; counts: number }>;
  /** With `gram`, the sample's postings the what-if's updates read (IncrementalGram), else −1. */
  postPos: number;
  postVal: number;
}

/**
 * Room a what-if's states need beside their dot products, so that their update can run in
 * WebAssembly on the same memory (IncrementalGram.storageNeeds): bytes per shared-term count (2 or
 * 4) and the sample's postings.
 */
export interface GramRoom {
  countBytes: 2 | 4;
  postings: number;
}

/**
 * The layout of a sweep over m rows and k neighbours in `blocks` blocks, with scratch for
 * `threads` threads and room for `states` states (with `gram`, room for their updates too). Each
 * array starts on a 64-byte line, so the threads' scratch never shares a cache line.
 */
export function sweepLayout(m: number, k: number, blocks: number, states: number, threads: number, gram?: GramRoom): SweepLayout {
  const lines = lineAllocator();
  const take = lines.take;
  const outputs = {
    neighbors: take(4 * m * k),
    sims: take(8 * m * k),
    nnDist: take(8 * m * k),
    zScores: take(8 * m),
    contrast: take(8 * m),
    slack: take(8 * m),
    rowMean: take(8 * m),
    rowMin: take(8 * m),
    nearBin: take(4 * m),
    tieGroup: take(4 * m),
    blockPairs: take(8 * 2 * blocks),
    blockBins: take(8 * SIMILARITY_BINS * blocks),
  };
  const valid = take(m);
  const scratch = Array.from({ length: threads }, () => ({
    norms: take(8 * m),
    best: take(8 * k),
    bestPos: take(4 * k),
    tie: take(8 * m),
    near: take(8 * m),
    rankScratch: take(8 * m),
    probe: take(8 * (Math.ceil(m / 8) + 1)),
    buckets: take(4 * RANK_BUCKETS),
    counts: take(4 * 8 * SIMILARITY_BINS),
    rankScratch2: take(8 * m),
    near2: take(8 * m),
    pairTail: take(8 * m),
  }));
  const stateAt = Array.from({ length: states }, () => ({ dots: take(8 * m * m), scale: take(8 * m), counts: gram === undefined ? -1 : take(gram.countBytes * m * m) }));
  const postPos = gram === undefined ? -1 : take(4 * gram.postings);
  const postVal = gram === undefined ? -1 : take(8 * gram.postings);
  return { m, k, blocks, bytes: lines.bytes, outputs, valid, scratch, states: stateAt, postPos, postVal };
}

/** A shared memory that holds `layout`. */
export function sweepMemory(layout: SweepLayout): WebAssembly.Memory {
  return sharedWasmMemory(layout.bytes);
}

/** The layout's outputs as SweepOutputs (views of `buffer`). */
export function outputsAt(buffer: ArrayBufferLike, layout: SweepLayout): SweepOutputs {
  const { m, k, blocks, outputs: o } = layout;
  const f64 = (at: number, n: number) => new Float64Array(buffer, at, n);
  const i32 = (at: number, n: number) => new Int32Array(buffer, at, n);
  return {
    knn: { neighbors: new Uint32Array(buffer, o.neighbors, m * k), sims: f64(o.sims, m * k) },
    nnDist: f64(o.nnDist, m * k),
    zScores: f64(o.zScores, m),
    contrast: f64(o.contrast, m),
    slack: f64(o.slack, m),
    rowMean: f64(o.rowMean, m),
    rowMin: f64(o.rowMin, m),
    nearBin: i32(o.nearBin, m),
    tieGroup: i32(o.tieGroup, m),
    blockPairs: f64(o.blockPairs, 2 * blocks),
    blockBins: f64(o.blockBins, SIMILARITY_BINS * blocks),
  };
}

interface SweepRowsExports {
  layout(...at: number[]): void;
  state(gram: number, scale: number, shift: number): void;
  block(b: number): void;
}

/**
 * One thread's WebAssembly sweep over `memory` (laid out as `layout`), with scratch `thread`:
 * SweepRows.block's outputs, to the bit, for the state set by `state`.
 */
export class WasmSweepRows {
  private readonly exports: SweepRowsExports;

  constructor(module: WebAssembly.Module, memory: WebAssembly.Memory, layout: SweepLayout, blockRows: number, thread: number) {
    this.exports = new WebAssembly.Instance(module, { env: { memory } }).exports as unknown as SweepRowsExports;
    const { m, k, outputs: o, valid } = layout;
    const s = layout.scratch[thread]!;
    this.exports.layout(m, k, blockRows, o.neighbors, o.sims, o.nnDist, o.zScores, o.contrast, o.slack, o.rowMean, o.rowMin, o.nearBin, o.tieGroup, o.blockPairs, o.blockBins, valid, s.norms, s.best, s.bestPos, s.tie, s.near, s.rankScratch, s.probe, s.buckets, s.counts, s.rankScratch2, s.near2, s.pairTail);
  }

  /** The state the next blocks read: dot products and row scales at these byte offsets; pairShift's value. */
  state(dots: number, scale: number, shift: number): void {
    this.exports.state(dots, scale, shift);
  }

  /** SweepRows.block(b). */
  block(b: number): void {
    this.exports.block(b);
  }
}
