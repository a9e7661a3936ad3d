// worker_threads entry (bundled to dist/masked-term-sums-thread.js): maskedTermSums of a matrix
// whose indices and data are on SharedArrayBuffers, written into shared result arrays, then a
// flag set and notified (start-masked-term-sums.ts waits on it with Atomics.wait, so its caller
// stays synchronous). The matrix is read in place, never copied.
import { workerData } from 'node:worker_threads';
import { maskedTermSums } from './masked-term-sums';
import { DONE, FAILED } from '../threads/one-shot-thread';
import type { MaskedTermSumsJob } from './start-masked-term-sums';

const job = workerData as MaskedTermSumsJob | null;
if (job === null || job === undefined) throw new Error('masked-term-sums-thread must run as a worker thread');
const { status } = job.out;
try {
  const { rows, cols, indptr, indices, data, removed, withSpread, out } = job;
  const { sums, rowsWithWeight } = maskedTermSums({ rows, cols, indptr, indices, data }, removed, withSpread);
  out.s1.set(sums.s1);
  out.s2.set(sums.s2);
  out.df.set(sums.df);
  out.sxlogx.set(sums.sxlogx);
  status[1] = rowsWithWeight;
  Atomics.store(status, 0, DONE);
} catch {
  Atomics.store(status, 0, FAILED);
}
Atomics.notify(status, 0);
