import type { Worker } from 'node:worker_threads';
import { startThread } from './thread-script';

/** Values of a one-shot job's status words (status[i] for result i), set by the thread. */
export const PENDING = 0;
export const DONE = 1;
export const FAILED = 2;
/** Set by the caller on a result it dropped before the thread began it: a thread of several results skips it. */
export const DROPPED = 3;

/** A computation begun now and read by `take()`, which waits for it when it runs on a thread. */
export interface PendingResult<T> {
  /** The answer; a later call gives the same one without computing it again. */
  take(): T;
  /**
   * The caller will not take this result: once every result of its thread is taken or dropped,
   * the thread is stopped, so work nobody reads does not hold a core. No effect after take();
   * a take() after it does not wait (the answer is computed here unless it was already done).
   */
  drop(): void;
  /** After take(): whether the thread's answer was used (for the tests). */
  readonly fromThread: boolean;
}

export interface OneShotJob<T> {
  /** The thread's entry, or null to compute in this thread. */
  script: string | null;
  /** What the thread is given; its results go to SharedArrayBuffers inside it. */
  workerData: unknown;
  /**
   * On a SharedArrayBuffer, inside workerData: one word per result, which the thread moves from
   * PENDING to DONE or FAILED (then Atomics.notify on that word) when result i is written; a
   * thread that makes its results in turn skips one the caller has marked DROPPED.
   */
  status: Int32Array;
  /**
   * How long take() of the first result waits for a thread that may have died before it set
   * the status; result i waits (i + 1) times as long, the thread making them in order.
   */
  patienceMs: number;
  /** Result i computed in this thread: without a thread, or when it failed. */
  here: (i: number) => T;
  /** Result i from the shared buffers once status[i] is DONE. */
  read: (i: number) => T;
  /**
   * A thread the caller has already started, or handed this job, used instead of starting one
   * from `script`: once every result is taken or dropped it is given back through `release`
   * instead of being stopped (`unfinishedDropped`: a result was dropped before the thread had
   * made it, and it may be making it now). The caller listens for its errors.
   */
  thread?: { worker: Worker; release(unfinishedDropped: boolean): void };
}

/**
 * Runs a job on a thread of its own while the caller goes on with other work, for the review's
 * steps that would otherwise leave the second core idle; the thread makes status.length results,
 * each read by its own take() as soon as it is done. take() waits with Atomics.wait, so a
 * synchronous caller can use it: the thread signals through shared memory, not a message,
 * because this thread's event loop does not run meanwhile. The thread never keeps the process
 * alive, its errors are read from the status words, and any failure (no script, a thread that
 * cannot start, dies or gives up) falls back to `here(i)`, which must give the same answer.
 * The thread is stopped once every result has been taken or dropped (or given back: `thread`).
 */
export function startOneShots<T>(job: OneShotJob<T>): PendingResult<T>[] {
  const count = job.status.length;
  const inThisThread = (): PendingResult<T>[] =>
    Array.from({ length: count }, (_, i) => {
      let answer: { value: T } | null = null;
      return { take: () => (answer ??= { value: job.here(i) }).value, drop: () => undefined, fromThread: false };
    });
  if (count === 0) return inThisThread();
  let worker: Worker;
  if (job.thread !== undefined) {
    worker = job.thread.worker;
  } else {
    if (job.script === null) return inThisThread();
    try {
      worker = startThread(job.script, { workerData: job.workerData });
    } catch {
      return inThisThread();
    }
    worker.on('error', () => undefined);
    worker.unref();
  }
  let open = count;
  let unfinishedDropped = false;
  const close = (): void => {
    if (--open > 0) return;
    if (job.thread !== undefined) job.thread.release(unfinishedDropped);
    else void worker.terminate();
  };
  return Array.from({ length: count }, (_, i) => {
    let fromThread = false;
    let closed = false;
    let answer: { value: T } | null = null;
    return {
      get fromThread() {
        return fromThread;
      },
      take() {
        if (answer !== null) return answer.value;
        // A dropped result's thread may be stopped: read what is there, never wait for it.
        if (!closed) Atomics.wait(job.status, i, PENDING, job.patienceMs * (i + 1));
        const state = Atomics.load(job.status, i);
        if (!closed) {
          closed = true;
          close();
        }
        fromThread = state === DONE;
        answer = { value: fromThread ? job.read(i) : job.here(i) };
        return answer.value;
      },
      drop() {
        if (closed) return;
        closed = true;
        if (Atomics.compareExchange(job.status, i, PENDING, DROPPED) === PENDING) unfinishedDropped = true;
        close();
      },
    };
  });
}

/** startOneShots with one result (status[0]). */
export function startOneShot<T>(job: Omit<OneShotJob<T>, 'here' | 'read'> & { here: () => T; read: () => T }): PendingResult<T> {
  return startOneShots<T>({ ...job, status: job.status.subarray(0, 1), here: () => job.here(), read: () => job.read() })[0]!;
}
