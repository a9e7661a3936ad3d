// The worker_threads entry (dist/review-worker.js): runs the engine off the extension-host
// thread, so tokenising a large corpus never freezes the editor. It keeps the last finished
// session so the panel's what-if toggles are answered without re-reading the corpus.
import { parentPort } from 'node:worker_threads';
import { startReview } from '../engine/review/start-review';
import type { ReviewSession, ReviewStage } from '../engine/review/review-api';
import { isManyFilesInput } from '../engine/read/corpus-files';
import { reviewShardsInThreads, type ThreadedShardsSession } from '../engine/shards/review-in-threads';
import { isUserError } from '../engine/user-error';
import { isHostToWorker, type HostToWorker, type WorkerErrorMessage, type WorkerToHost } from './worker-protocol';

interface Running { runId: number; controller: AbortController }

let session: ReviewSession | ThreadedShardsSession | null = null;
let running: Running | null = null;

function post(message: WorkerToHost): void {
  parentPort?.postMessage(message);
}

function errorMessage(e: unknown, controller: AbortController | null): Omit<WorkerErrorMessage, 'runId' | 'requestId'> {
  if (isUserError(e)) return { type: 'error', kind: 'user', message: e.message, file: e.file, line: e.line };
  if (controller?.signal.aborted || (e instanceof Error && e.name === 'AbortError')) {
    return { type: 'error', kind: 'cancelled', message: 'Review cancelled.', file: null, line: null };
  }
  const err = e instanceof Error ? e : new Error(String(e));
  return { type: 'error', kind: 'internal', message: err.message, file: null, line: null, ...(err.stack ? { stack: err.stack } : {}) };
}

async function review(runId: number, input: HostToWorker & { type: 'review' }): Promise<void> {
  running?.controller.abort();
  const controller = new AbortController();
  running = { runId, controller };
  try {
    const hooks = { signal: controller.signal, onStage: (stage: ReviewStage, fraction: number) => post({ type: 'stage', runId, stage, fraction }) };
    // A folder or glob of shards is reviewed in shards on worker threads (engine/shards/review-in-threads.ts; dask's hook).
    const shards = input.input.text === undefined && (await isManyFilesInput(input.input.file));
    const next = shards ? await reviewShardsInThreads(input.input, hooks) : await startReview(input.input, hooks);
    controller.signal.throwIfAborted();
    if (session !== null) void session.close?.();
    session = next;
    post({ type: 'report', runId, report: next.report });
    // While the reader looks at the Report, build what the first toggle would otherwise pay for
    // and warm the toggle's code up. A failure here shows again on the first toggle, which
    // then answers in this thread.
    setImmediate(() => {
      if (session === next && 'prepareWhatIf' in next) next.prepareWhatIf?.().catch(() => undefined);
    });
  } catch (e) {
    post({ ...errorMessage(e, controller), runId });
  } finally {
    if (running?.controller === controller) running = null;
  }
}

async function whatIf(requestId: number, removed: string[]): Promise<void> {
  if (session === null) {
    post({ type: 'error', kind: 'user', message: 'No finished review to ask a what-if of; run "Review distances" first.', file: null, line: null, requestId });
    return;
  }
  try {
    const started = performance.now();
    const measures = await session.whatIf(removed);
    post({ type: 'whatIfResult', requestId, removed, measures, engineMs: performance.now() - started });
  } catch (e) {
    post({ ...errorMessage(e, null), requestId });
  }
}

parentPort?.on('message', (message: unknown) => {
  if (!isHostToWorker(message)) {
    post({ type: 'error', kind: 'internal', message: 'The review worker received a message it does not know.', file: null, line: null });
    return;
  }
  switch (message.type) {
    case 'review':
      void review(message.runId, message);
      return;
    case 'whatIf':
      void whatIf(message.requestId, message.removed);
      return;
  }
});
