// worker_threads entry (bundled to dist/masked-term-sums-thread.js): maskedTermSums passes over a
// matrix whose indices and data are on SharedArrayBuffers, one after the other, each written into
// its shared result arrays, then its status word set and notified (a one-shot thread,
// engine/threads/one-shot-thread.ts: the caller waits with Atomics.wait, so it stays
// synchronous). The matrix is read in place, never copied. Once its passes are done the thread
// waits a while for more passes over the same matrix (engine/threads/lasting-thread.ts).
import { workerData } from 'node:worker_threads';
import { maskedTermSums } from './masked-term-sums';
import { nextJob } from '../threads/lasting-thread';
import { DONE, DROPPED, FAILED } from '../threads/one-shot-thread';
import type { MaskedTermSumsThreadData, MaskedTermSumsWork } from './start-masked-term-sums';

const job = workerData as MaskedTermSumsThreadData | null;
if (job === null || job === undefined) throw new Error('masked-term-sums-thread must run as a worker thread');
const { rows, cols, indptr, indices, data } = job;
let work: MaskedTermSumsWork | null = job;
while (work !== null) {
  makePasses(work);
  work = nextJob<MaskedTermSumsWork>(job.link);
}

function makePasses({ passes, status }: MaskedTermSumsWork): void {
  for (let i = 0; i < passes.length; i++) {
    // A pass nobody will read (the caller dropped it) is not made.
    if (Atomics.load(status, i) === DROPPED) continue;
    const { removed, withSpread, out } = passes[i]!;
    try {
      const { sums, rowsWithWeight } = maskedTermSums({ rows, cols, indptr, indices, data }, removed, withSpread, out.rowNorm2);
      out.s1.set(sums.s1);
      out.s2.set(sums.s2);
      out.df.set(sums.df);
      out.sxlogx.set(sums.sxlogx);
      out.rowsWithWeight[0] = rowsWithWeight;
      Atomics.store(status, i, DONE);
      Atomics.notify(status, i);
    } catch {
      // This pass and every later one are computed by the caller.
      for (let j = i; j < passes.length; j++) {
        Atomics.store(status, j, FAILED);
        Atomics.notify(status, j);
      }
      return;
    }
  }
}
