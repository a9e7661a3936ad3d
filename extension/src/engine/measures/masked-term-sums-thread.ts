// worker_threads entry (bundled to dist/masked-term-sums-thread.js): maskedTermSums passes over a
// matrix whose indices and data are on SharedArrayBuffers (make-passes.ts; the caller waits with
// Atomics.wait, so it stays synchronous). The matrix is read in place, never copied. Once its
// passes are done the thread waits a while for more passes over the same matrix
// (engine/threads/lasting-thread.ts).
import { workerData } from 'node:worker_threads';
import { nextJob } from '../threads/lasting-thread';
import { makePasses } from './make-passes';
import type { MaskedTermSumsThreadData, MaskedTermSumsWork } from './start-masked-term-sums';

const job = workerData as MaskedTermSumsThreadData | null;
if (job === null || job === undefined) throw new Error('masked-term-sums-thread must run as a worker thread');
const { rows, cols, indptr, indices, data } = job;
let work: MaskedTermSumsWork | null = job;
while (work !== null) {
  makePasses({ rows, cols, indptr, indices, data }, work);
  work = nextJob<MaskedTermSumsWork>(job.link);
}
