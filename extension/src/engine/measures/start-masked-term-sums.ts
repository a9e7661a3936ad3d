import type { LastingLink } from '../threads/lasting-thread';
import { matrixPassThreads, PASS_THREAD_WAIT_MS, sameMatrix } from '../threads/matrix-pass-threads';
import { startOneShots, type PendingResult } from '../threads/one-shot-thread';
import { threadScript } from '../threads/thread-script';
import type { Csr } from '../matrix/csr';
import { maskedTermSums, type MaskedTermSums } from './masked-term-sums';

/** Where the thread writes one pass's answer (SharedArrayBuffers). */
export interface MaskedTermSumsOut {
  s1: Float64Array;
  s2: Float64Array;
  df: Uint32Array;
  sxlogx: Float64Array;
  /** Each row's kept Σw², when the pass was asked for them (rowNorms), else null. */
  rowNorm2: Float64Array | null;
  /** rowsWithWeight[0]. */
  rowsWithWeight: Int32Array;
}

/** Passes to make in order, and where to say each is done. */
export interface MaskedTermSumsWork {
  passes: Array<{ removed: Uint8Array; withSpread: boolean; out: MaskedTermSumsOut }>;
  /** status[i]: PENDING, DONE or FAILED for pass i (engine/threads/one-shot-thread.ts). */
  status: Int32Array;
}

/**
 * What the thread is started with: the matrix (indices and data shared), its first passes, and
 * the link on which it waits for more passes over the same matrix once they are done.
 */
export interface MaskedTermSumsThreadData extends MaskedTermSumsWork {
  rows: number;
  cols: number;
  indptr: Uint32Array;
  indices: Uint32Array;
  data: Float64Array;
  link: LastingLink;
}



/** maskedTermSums, begun now and read by `take()` (which waits for it when it runs elsewhere). */
export type PendingTermSums = PendingResult<MaskedTermSums>;

/** One pass of startMaskedTermSumsInSeries. */
export interface MaskedTermSumsAsk {
  removed: Uint8Array;
  withSpread: boolean;
  /** Also each row's kept Σw² (maskedTermSums's `rowNorm2`): what a what-if state adopting the pass needs. */
  rowNorms?: boolean;
}

const defaultScript = (): string | null => threadScript(__dirname, 'masked-term-sums-thread.js', 'masked-term-sums-thread.ts');

/**
 * maskedTermSums(X, removed, withSpread) on a thread of its own, while the caller goes on with
 * other work: the review's last stage is otherwise one thread with the second core idle, and this
 * pass (the spread's logarithms included) is ~0.3 s of it at 100k documents. Only when X's indices
 * and data are on SharedArrayBuffers (the threads that assembled the matrix put them there), so
 * the thread reads the matrix without a copy, and the thread's script is there; otherwise — and
 * if the thread fails — `take()` computes the same sums in this thread. Either way the answer is
 * maskedTermSums's, to the bit: the same function over the same arrays.
 */
export function startMaskedTermSums(X: Csr, removed: Uint8Array, withSpread: boolean, script: string | null = defaultScript(), rowNorms = false): PendingTermSums {
  return startMaskedTermSumsInSeries(X, [{ removed, withSpread, rowNorms }], script)[0]!;
}

/**
 * Several maskedTermSums passes on one thread, one after the other, each read by its own
 * `take()` as soon as it is done (a one-shot thread with a result per pass,
 * engine/threads/one-shot-thread.ts): passes begun beside other work leave this thread a core of
 * its own (two passes on two threads would each take a share of it), and the first is ready after
 * one pass. The masks are copied now. Without a shared matrix or a script, or where the thread
 * fails, each `take()` computes its pass here; every answer is maskedTermSums's, to the bit. A
 * pass the caller will not read is dropped (`drop()`). Once every pass is taken the thread waits
 * PASS_THREAD_WAIT_MS for more passes over the same matrix, which a later call hands it instead of
 * starting a thread; a pass dropped before it was made stops it.
 */
export function startMaskedTermSumsInSeries(X: Csr, asks: readonly MaskedTermSumsAsk[], script: string | null = defaultScript()): PendingTermSums[] {
  const shared = X.indices.buffer instanceof SharedArrayBuffer && X.data.buffer instanceof SharedArrayBuffer;
  const copies = asks.map((a) => ({ removed: a.removed.slice(), withSpread: a.withSpread, rowNorms: a.rowNorms === true }));
  const here = (i: number): MaskedTermSums => {
    const c = copies[i]!;
    return maskedTermSums(X, c.removed, c.withSpread, c.rowNorms ? new Float64Array(X.rows) : null);
  };
  const cols = X.cols;
  const sharedF64 = (n: number): Float64Array => new Float64Array(new SharedArrayBuffer(8 * n));
  const thread = shared && script !== null && copies.length > 0;
  const passes = thread
    ? copies.map((c) => ({
        removed: c.removed,
        withSpread: c.withSpread,
        out: {
          s1: sharedF64(cols),
          s2: sharedF64(cols),
          df: new Uint32Array(new SharedArrayBuffer(4 * cols)),
          sxlogx: sharedF64(cols),
          rowNorm2: c.rowNorms ? sharedF64(X.rows) : null,
          rowsWithWeight: new Int32Array(new SharedArrayBuffer(4)),
        },
      }))
    : [];
  const status = new Int32Array(new SharedArrayBuffer(4 * copies.length));
  const work: MaskedTermSumsWork = { passes, status };
  // A thread waiting with the same matrix takes the passes (one that wrote its rows, or made
  // earlier passes: a review's passes come in two rounds, the baseline's spread and the rule's
  // passes together, then a moment later the suggestions' measure's); else one is started with
  // them. A fresh thread cost ~65 ms of CPU to start and ran its pass unoptimised at first.
  const matrix = { indptr: X.indptr, indices: X.indices, data: X.data };
  const lasting = thread
    ? (matrixPassThreads.claim(X.indices.buffer, (t) => sameMatrix(t, matrix), work) ??
      matrixPassThreads.start(script, X.indices.buffer, matrix, PASS_THREAD_WAIT_MS, (link): MaskedTermSumsThreadData => ({ rows: X.rows, cols, ...matrix, ...work, link })))
    : null;
  return startOneShots<MaskedTermSums>({
    script: null,
    ...(lasting !== null ? { thread: lasting } : {}),
    workerData: null,
    status,
    // A generous bound for a thread that died before it could set a status: ~40 times a pass's
    // time on an idle core, and at least a minute, for each pass up to this one. Past it the
    // sums are computed here.
    patienceMs: Math.max(60_000, X.indices.length * 2e-3),
    here,
    read: (i) => {
      const { out } = passes[i]!;
      const answer: MaskedTermSums = { sums: { s1: out.s1, s2: out.s2, df: out.df, sxlogx: out.sxlogx }, rowsWithWeight: out.rowsWithWeight[0]! };
      if (out.rowNorm2 !== null) answer.rowNorm2 = out.rowNorm2;
      return answer;
    },
  });
}
