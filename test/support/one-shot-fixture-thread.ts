// A one-shot thread for test/threads-one-shot-thread.test.ts: result i is i² + 1, written after
// `delayMs` of busy waiting, so a test can stop the thread between results. Skips results marked
// DROPPED (when told to) and writes FAILED from `failAt` on, as the engine's one-shot threads do.
import { workerData } from 'node:worker_threads';
import { DONE, DROPPED, FAILED } from '../../extension/src/engine/threads/one-shot-thread';

export interface FixtureJob {
  values: Float64Array;
  status: Int32Array;
  delayMs: number;
  failAt: number;
  /** Whether it skips a result marked DROPPED (false: only stopping the thread stops it). */
  skipsDropped: boolean;
}

const job = workerData as FixtureJob;
for (let i = 0; i < job.status.length; i++) {
  if (job.skipsDropped && Atomics.load(job.status, i) === DROPPED) continue;
  const until = Date.now() + job.delayMs;
  while (Date.now() < until);
  if (i >= job.failAt) {
    Atomics.store(job.status, i, FAILED);
  } else {
    job.values[i] = i * i + 1;
    Atomics.store(job.status, i, DONE);
  }
  Atomics.notify(job.status, i);
}
