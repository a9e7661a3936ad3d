// worker_threads entry (bundled to dist/opinion-thread.js): the opinion check's share
// (opinion-check.ts) of the texts it is given, written into shared memory, then a flag set and
// notified (start-opinion-share.ts waits on it with Atomics.wait, so the term review stays
// synchronous). Its own wink instance, loaded here rather than on the review's thread.
import { workerData } from 'node:worker_threads';
import { opinionShare } from './opinion-check';
import { DONE, FAILED } from '../threads/one-shot-thread';
import type { OpinionJob } from './start-opinion-share';

const job = workerData as OpinionJob | null;
if (job === null || job === undefined) throw new Error('opinion-thread must run as a worker thread');
try {
  job.share[0] = opinionShare(job.texts);
  Atomics.store(job.status, 0, DONE);
} catch {
  Atomics.store(job.status, 0, FAILED);
}
Atomics.notify(job.status, 0);
