// The worker_threads entry (dist/review-worker.js): runs the engine off the extension-host
// thread, so tokenising a large corpus never freezes the editor. It keeps the last finished
// session so the panel's what-if toggles are answered without re-reading the corpus.
import { parentPort, workerData } from 'node:worker_threads';
import { startReview } from '../engine/review/start-review';
import type { ReviewSession, ReviewStage } from '../engine/review/review-api';
import { isShardsInput, reviewShardsInThreads, type ThreadedShardsSession } from '../engine/shards/review-in-threads';
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
    const shards = await isShardsInput(input.input);
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

interface Asked { requestId: number; removed: string[]; speculative: boolean; /** Date.now() when read (WhatIfHops.workerReceived). */ received: number }

/**
 * The host's count of requests that go before a computing prefetch (ReviewWorkerClient, shared
 * memory: clicks, and prefetches for another selection): a prefetch that is computing when it
 * moves stops part way, as the newer request's message cannot be read until then.
 */
const clickCount: Int32Array | undefined = (workerData as { clicks?: Int32Array } | null)?.clicks;

/** Clicks' what-ifs not answered yet, in the order they came. */
const clicks: Asked[] = [];
/** The latest prefetch not started yet: it waits for every click, and a newer one replaces it. */
let hover: Asked | null = null;
let answering = false;

/**
 * One what-if at a time, clicks first: a prefetch (speculative) runs only when no click waits,
 * and a click or a newer prefetch drops one that has not started. A started one stops part way
 * when the host's count moves (`clickCount`: the engine's steps are synchronous, so the newer
 * message cannot be read until then); a click for its selection leaves the count alone, waits
 * for it and adopts its state (ReviewSession.speculate).
 */
function ask(asked: Asked): void {
  if (hover !== null) post({ type: 'whatIfDropped', requestId: hover.requestId });
  hover = null;
  if (asked.speculative) hover = asked;
  else clicks.push(asked);
  void answerAll();
}

async function answerAll(): Promise<void> {
  if (answering) return;
  answering = true;
  try {
    for (;;) {
      const click = clicks.shift();
      if (click !== undefined) {
        await whatIf(click);
        continue;
      }
      if (hover === null) return;
      // A click already in this thread's message queue goes first (it drops the prefetch).
      await new Promise<void>((resolve) => setImmediate(resolve));
      const prefetch = hover;
      if (clicks.length > 0 || prefetch === null) continue;
      hover = null;
      await whatIf(prefetch);
    }
  } finally {
    answering = false;
  }
}

async function whatIf({ requestId, removed, speculative, received }: Asked): Promise<void> {
  if (session === null) {
    if (speculative) post({ type: 'whatIfDropped', requestId });
    else post({ type: 'error', kind: 'user', message: 'No finished review to ask a what-if of; run "Review distances" first.', file: null, line: null, requestId });
    return;
  }
  try {
    const engineStarted = Date.now();
    const started = performance.now();
    const measures = !speculative ? await session.whatIf(removed) : 'speculate' in session && session.speculate !== undefined ? await session.speculate(removed, clickCount) : null;
    const engineMs = performance.now() - started;
    if (measures === null) post({ type: 'whatIfDropped', requestId });
    else post({ type: 'whatIfResult', requestId, removed, measures, engineMs, hops: { workerReceived: received, engineStarted, engineEnded: Date.now() } });
  } catch (e) {
    // A failed prefetch says nothing: the click that may follow asks again and reports it.
    if (speculative) post({ type: 'whatIfDropped', requestId });
    else post({ ...errorMessage(e, null), requestId });
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
      ask({ requestId: message.requestId, removed: message.removed, speculative: message.speculative === true, received: Date.now() });
      return;
  }
});
