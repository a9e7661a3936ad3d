import { startThread } from './thread-script';

/** Values of a one-shot job's status word (status[0]), set by the thread when it is done. */
export const PENDING = 0;
export const DONE = 1;
export const FAILED = 2;

/** A computation begun now and read by `take()`, which waits for it when it runs on a thread. */
export interface PendingResult<T> {
  take(): T;
  /** After take(): whether the thread's answer was used (for the tests). */
  readonly fromThread: boolean;
}

export interface OneShotJob<T> {
  /** The thread's entry, or null to compute in this thread. */
  script: string | null;
  /** What the thread is given; its results go to SharedArrayBuffers inside it. */
  workerData: unknown;
  /** On a SharedArrayBuffer, inside workerData: status[0] goes from PENDING to DONE or FAILED. */
  status: Int32Array;
  /** How long take() waits for a thread that may have died before it set the status. */
  patienceMs: number;
  /** The same answer computed in this thread: without a thread, or when it failed. */
  here: () => T;
  /** The answer from the shared buffers once status[0] is DONE. */
  read: () => T;
}

/**
 * Runs a job on a thread of its own while the caller goes on with other work, for the review's
 * steps that would otherwise leave the second core idle. take() waits with Atomics.wait, so a
 * synchronous caller can use it: the thread signals through shared memory, not a message,
 * because this thread's event loop does not run meanwhile. The thread never keeps the process
 * alive, its errors are read from the status word, and any failure (no script, a thread that
 * cannot start, dies or gives up) falls back to `here()`, which must give the same answer.
 */
export function startOneShot<T>(job: OneShotJob<T>): PendingResult<T> {
  if (job.script === null) return { take: job.here, fromThread: false };
  let worker: ReturnType<typeof startThread>;
  try {
    worker = startThread(job.script, { workerData: job.workerData });
  } catch {
    return { take: job.here, fromThread: false };
  }
  worker.on('error', () => undefined);
  worker.unref();
  let fromThread = false;
  return {
    get fromThread() {
      return fromThread;
    },
    take() {
      Atomics.wait(job.status, 0, PENDING, job.patienceMs);
      const state = Atomics.load(job.status, 0);
      void worker.terminate();
      if (state !== DONE) return job.here();
      fromThread = true;
      return job.read();
    },
  };
}
