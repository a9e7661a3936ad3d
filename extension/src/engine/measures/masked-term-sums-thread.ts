// worker_threads entry (bundled to dist/masked-term-sums-thread.js): maskedTermSums passes over a
// matrix whose indices and data are on SharedArrayBuffers, one after the other, each written into
// its shared result arrays, then its flag set and notified (start-masked-term-sums.ts waits on
// it with Atomics.wait, so its caller stays synchronous). The matrix is read in place, never copied.
import { workerData } from 'node:worker_threads';
import { maskedTermSums } from './masked-term-sums';
import { DONE, FAILED } from '../threads/one-shot-thread';
import type { MaskedTermSumsJob } from './start-masked-term-sums';

const job = workerData as MaskedTermSumsJob | null;
if (job === null || job === undefined) throw new Error('masked-term-sums-thread must run as a worker thread');
const { rows, cols, indptr, indices, data, passes } = job;
for (let i = 0; i < passes.length; i++) {
  const { removed, withSpread, out } = passes[i]!;
  try {
    const { sums, rowsWithWeight } = maskedTermSums({ rows, cols, indptr, indices, data }, removed, withSpread);
    out.s1.set(sums.s1);
    out.s2.set(sums.s2);
    out.df.set(sums.df);
    out.sxlogx.set(sums.sxlogx);
    out.status[1] = rowsWithWeight;
    Atomics.store(out.status, 0, DONE);
    Atomics.notify(out.status, 0);
  } catch {
    // This pass and every later one are computed by the caller.
    for (const rest of passes.slice(i)) {
      Atomics.store(rest.out.status, 0, FAILED);
      Atomics.notify(rest.out.status, 0);
    }
    break;
  }
}
