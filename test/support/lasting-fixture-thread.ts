// A lasting thread for test/threads-lasting-thread.test.ts: each job asks for `value`, which the
// thread writes back times `factor` (its start-up data) together with its threadId, then sets
// status[0] DONE; between jobs it waits on its link (engine/threads/lasting-thread.ts) as the
// engine's pass threads do. The rule is the fixture's own (common practice, no source).
import { threadId, workerData } from 'node:worker_threads';
import { nextJob, type LastingLink } from '../../extension/src/engine/threads/lasting-thread';
import { DONE } from '../../extension/src/engine/threads/one-shot-thread';

export interface LastingFixtureJob {
  value: number;
  /** [answer, threadId], on a SharedArrayBuffer. */
  out: Float64Array;
  status: Int32Array;
  /** Busy time before answering, so that a test can drop the job while it is being made. */
  delayMs: number;
}

export interface LastingFixtureData extends LastingFixtureJob {
  factor: number;
  link: LastingLink;
}

const start = workerData as LastingFixtureData;
let job: LastingFixtureJob | null = start;
while (job !== null) {
  const until = Date.now() + job.delayMs;
  while (Date.now() < until);
  job.out[0] = job.value * start.factor;
  job.out[1] = threadId;
  Atomics.store(job.status, 0, DONE);
  Atomics.notify(job.status, 0);
  job = nextJob<LastingFixtureJob>(start.link);
}
