import { startOneShot, type PendingResult } from '../threads/one-shot-thread';
import { threadScript } from '../threads/thread-script';
import type { Csr } from '../matrix/csr';
import { maskedTermSums, type MaskedTermSums } from './masked-term-sums';

/** What the thread is given: the matrix (indices and data shared), the mask and where to write. */
export interface MaskedTermSumsJob {
  rows: number;
  cols: number;
  indptr: Uint32Array;
  indices: Uint32Array;
  data: Float64Array;
  removed: Uint8Array;
  withSpread: boolean;
  /** On SharedArrayBuffers; status[0] is PENDING, DONE or FAILED (engine/threads/one-shot-thread.ts), status[1] rowsWithWeight. */
  out: { s1: Float64Array; s2: Float64Array; df: Uint32Array; sxlogx: Float64Array; status: Int32Array };
}

/** maskedTermSums, begun now and read by `take()` (which waits for it when it runs elsewhere). */
export type PendingTermSums = PendingResult<MaskedTermSums>;

/**
 * maskedTermSums(X, removed, withSpread) on a thread of its own, while the caller goes on with
 * other work: the review's last stage is otherwise one thread with the second core idle, and this
 * pass (the spread's logarithms included) is ~0.3 s of it at 100k documents. Only when X's indices
 * and data are on SharedArrayBuffers (the threads that assembled the matrix put them there), so
 * the thread reads the matrix without a copy, and the thread's script is there; otherwise — and
 * if the thread fails — `take()` computes the same sums in this thread. Either way the answer is
 * maskedTermSums's, to the bit: the same function over the same arrays.
 */
export function startMaskedTermSums(X: Csr, removed: Uint8Array, withSpread: boolean, script: string | null = threadScript(__dirname, 'masked-term-sums-thread.js', 'masked-term-sums-thread.ts')): PendingTermSums {
  const shared = X.indices.buffer instanceof SharedArrayBuffer && X.data.buffer instanceof SharedArrayBuffer;
  const mask = removed.slice();
  const here = (): MaskedTermSums => maskedTermSums(X, mask, withSpread);
  if (!shared || script === null) return { take: here, fromThread: false };
  const cols = X.cols;
  const sharedF64 = (n: number): Float64Array => new Float64Array(new SharedArrayBuffer(8 * n));
  const out = { s1: sharedF64(cols), s2: sharedF64(cols), df: new Uint32Array(new SharedArrayBuffer(4 * cols)), sxlogx: sharedF64(cols), status: new Int32Array(new SharedArrayBuffer(8)) };
  const job: MaskedTermSumsJob = { rows: X.rows, cols, indptr: X.indptr, indices: X.indices, data: X.data, removed: mask, withSpread, out };
  // A generous bound for a thread that died before it could set the status: ~40 times the pass's
  // time on an idle core, and at least a minute. Past it the sums are computed here.
  const patienceMs = Math.max(60_000, X.indices.length * 2e-3);
  const read = (): MaskedTermSums => ({ sums: { s1: out.s1, s2: out.s2, df: out.df, sxlogx: out.sxlogx }, rowsWithWeight: out.status[1]! });
  return startOneShot({ script, workerData: job, status: out.status, patienceMs, here, read });
}
