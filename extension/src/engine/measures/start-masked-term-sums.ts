import { DONE, PENDING, type PendingResult } from '../threads/one-shot-thread';
import { startThread, threadScript } from '../threads/thread-script';
import type { Csr } from '../matrix/csr';
import { maskedTermSums, type MaskedTermSums } from './masked-term-sums';

/** Where the thread writes one pass's answer (SharedArrayBuffers). */
export interface MaskedTermSumsOut {
  s1: Float64Array;
  s2: Float64Array;
  df: Uint32Array;
  sxlogx: Float64Array;
  /** status[0] is PENDING, DONE or FAILED (engine/threads/one-shot-thread.ts), status[1] rowsWithWeight. */
  status: Int32Array;
}

/** What the thread is given: the matrix (indices and data shared), and the passes to make in order. */
export interface MaskedTermSumsJob {
  rows: number;
  cols: number;
  indptr: Uint32Array;
  indices: Uint32Array;
  data: Float64Array;
  passes: Array<{ removed: Uint8Array; withSpread: boolean; out: MaskedTermSumsOut }>;
}

/** maskedTermSums, begun now and read by `take()` (which waits for it when it runs elsewhere). */
export type PendingTermSums = PendingResult<MaskedTermSums>;

/** One pass of startMaskedTermSumsInSeries. */
export interface MaskedTermSumsAsk {
  removed: Uint8Array;
  withSpread: boolean;
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
export function startMaskedTermSums(X: Csr, removed: Uint8Array, withSpread: boolean, script: string | null = defaultScript()): PendingTermSums {
  return startMaskedTermSumsInSeries(X, [{ removed, withSpread }], script)[0]!;
}

/**
 * Several maskedTermSums passes on one thread, one after the other, each read by its own
 * `take()` as soon as it is done: passes begun beside other work leave this thread a core of its
 * own (two passes on two threads would each take a share of it), and the first is ready after
 * one pass. The masks are copied now. Without a shared matrix or a script, or where the thread
 * fails, each `take()` computes its pass here; every answer is maskedTermSums's, to the bit.
 */
export function startMaskedTermSumsInSeries(X: Csr, asks: readonly MaskedTermSumsAsk[], script: string | null = defaultScript()): PendingTermSums[] {
  const shared = X.indices.buffer instanceof SharedArrayBuffer && X.data.buffer instanceof SharedArrayBuffer;
  const copies = asks.map((a) => ({ removed: a.removed.slice(), withSpread: a.withSpread }));
  const here = (i: number) => (): MaskedTermSums => maskedTermSums(X, copies[i]!.removed, copies[i]!.withSpread);
  const inThisThread = (): PendingTermSums[] => copies.map((_, i) => ({ take: here(i), fromThread: false }));
  if (!shared || script === null || copies.length === 0) return inThisThread();
  const cols = X.cols;
  const sharedF64 = (n: number): Float64Array => new Float64Array(new SharedArrayBuffer(8 * n));
  const passes = copies.map((c) => ({
    ...c,
    out: { s1: sharedF64(cols), s2: sharedF64(cols), df: new Uint32Array(new SharedArrayBuffer(4 * cols)), sxlogx: sharedF64(cols), status: new Int32Array(new SharedArrayBuffer(8)) },
  }));
  const job: MaskedTermSumsJob = { rows: X.rows, cols, indptr: X.indptr, indices: X.indices, data: X.data, passes };
  let worker: ReturnType<typeof startThread>;
  try {
    worker = startThread(script, { workerData: job });
  } catch {
    return inThisThread();
  }
  worker.on('error', () => undefined);
  worker.unref();
  // A generous bound for a thread that died before it could set a status: ~40 times a pass's
  // time on an idle core, and at least a minute, for each pass up to this one. Past it the sums
  // are computed here.
  const patienceMs = Math.max(60_000, X.indices.length * 2e-3);
  let open = passes.length;
  return passes.map(({ out }, i) => {
    let fromThread = false;
    return {
      get fromThread() {
        return fromThread;
      },
      take() {
        Atomics.wait(out.status, 0, PENDING, patienceMs * (i + 1));
        const state = Atomics.load(out.status, 0);
        if (--open === 0) void worker.terminate();
        if (state !== DONE) return here(i)();
        fromThread = true;
        return { sums: { s1: out.s1, s2: out.s2, df: out.df, sxlogx: out.sxlogx }, rowsWithWeight: out.status[1]! };
      },
    };
  });
}
