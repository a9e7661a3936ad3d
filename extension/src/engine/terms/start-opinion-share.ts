import { startOneShot, type PendingResult } from '../threads/one-shot-thread';
import { threadScript } from '../threads/thread-script';
import { opinionShare } from './opinion-check';

/** What the thread is given: the texts, and where to write (SharedArrayBuffers). */
export interface OpinionJob {
  texts: string[];
  share: Float64Array;
  /** status[0]: PENDING, DONE or FAILED (engine/threads/one-shot-thread.ts). */
  status: Int32Array;
}

/** opinionShare, begun now and read by `take()` (which waits for it when it runs elsewhere). */
export type PendingOpinionShare = PendingResult<number>;

/**
 * opinionShare(texts) on a thread of its own, begun as soon as the documents' previews are known
 * so that it runs while the review's thread measures the baseline: on that thread it cost ~0.12 s
 * at 100k documents (loading wink's sentiment pipe, then 400 short documents), and the second
 * core was idle. With `script` null, or if the thread fails, `take()` computes it in this thread.
 * Either way the share is opinionShare's on a fresh wink instance: a count of texts over a
 * threshold, the same on any thread.
 */
export function startOpinionShare(texts: readonly string[], script: string | null = threadScript(__dirname, 'opinion-thread.js', 'opinion-thread.ts')): PendingOpinionShare {
  const copy = [...texts];
  const here = (): number => opinionShare(copy);
  if (copy.length === 0) return { take: here, drop: () => undefined, fromThread: false };
  const job: OpinionJob = { texts: copy, share: new Float64Array(new SharedArrayBuffer(8)), status: new Int32Array(new SharedArrayBuffer(4)) };
  // The patience is a bound for a thread that died before it could set the status (it needs
  // well under a second on an idle core); past it the share is computed here.
  return startOneShot({ script, workerData: job, status: job.status, patienceMs: 60_000, here, read: () => job.share[0]! });
}
