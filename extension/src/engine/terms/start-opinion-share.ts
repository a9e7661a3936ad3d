import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { opinionShare } from './opinion-check';

/** What the thread is given: the texts, and where to write (SharedArrayBuffers). */
export interface OpinionJob {
  texts: string[];
  share: Float64Array;
  /** status[0]: PENDING, DONE or FAILED. */
  status: Int32Array;
}

export const PENDING = 0;
export const DONE = 1;
export const FAILED = 2;

/** opinionShare, begun now and read by `take()` (which waits for it when it runs elsewhere). */
export interface PendingOpinionShare {
  take(): number;
  /** After take(): whether the thread's answer was used (for the tests). */
  readonly fromThread: boolean;
}

/**
 * opinionShare(texts) on a thread of its own, begun as soon as the documents' previews are known
 * so that it runs while the review's thread measures the baseline: on that thread it cost ~0.12 s
 * at 100k documents (loading wink's sentiment pipe, then 400 short documents), and the second
 * core was idle. With `script` null, or if the thread fails, `take()` computes it in this thread.
 * Either way the share is opinionShare's on a fresh wink instance: a count of texts over a
 * threshold, the same on any thread.
 *
 * `take()` waits with Atomics.wait, so a synchronous caller can use it.
 */
export function startOpinionShare(texts: readonly string[], script: string | null = threadScript()): PendingOpinionShare {
  const copy = [...texts];
  const here = (): number => opinionShare(copy);
  if (script === null || copy.length === 0) return { take: here, fromThread: false };
  const job: OpinionJob = { texts: copy, share: new Float64Array(new SharedArrayBuffer(8)), status: new Int32Array(new SharedArrayBuffer(4)) };
  let worker: Worker;
  try {
    // Under tsx (tests) the entry is TypeScript: the thread loads it through tsx too.
    worker = new Worker(script, { workerData: job, ...(script.endsWith('.ts') ? { execArgv: ['--require', 'tsx/cjs'] } : {}) });
  } catch {
    return { take: here, fromThread: false };
  }
  // Errors are read from the status word; the thread never keeps the process alive.
  worker.on('error', () => undefined);
  worker.unref();
  let fromThread = false;
  return {
    get fromThread() {
      return fromThread;
    },
    take() {
      // A bound for a thread that died before it could set the status (it needs well under a
      // second on an idle core); past it the share is computed here.
      Atomics.wait(job.status, 0, PENDING, PATIENCE_MS);
      const state = Atomics.load(job.status, 0);
      void worker.terminate();
      if (state !== DONE) return here();
      fromThread = true;
      return job.share[0]!;
    },
  };
}

const PATIENCE_MS = 60_000;

/** The bundled dist/opinion-thread.js beside this bundle, or under tsx the source entry. */
function threadScript(): string | null {
  const bundled = join(__dirname, 'opinion-thread.js');
  if (existsSync(bundled)) return bundled;
  const source = join(__dirname, 'opinion-thread.ts');
  return existsSync(source) ? source : null;
}
