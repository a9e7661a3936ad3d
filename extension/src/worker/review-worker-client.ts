// The host's handle on one review worker. Plain Node (no 'vscode'), so the round trip is
// unit-tested against the bundled dist/review-worker.js.
import { Worker } from 'node:worker_threads';
import type { Measures, Report, WhatIfHops } from '../protocol';
import type { ReviewInput, ReviewStage } from '../engine/review/review-api';
import { PendingReplies } from '../engine/threads/pending-replies';
import { UserError } from '../engine/user-error';
import { isWorkerToHost, type HostToWorker, type WorkerErrorMessage, type WorkerToHost } from './worker-protocol';

/**
 * The review worker itself failed: a bug in the engine (the stack is the worker's) or a thread
 * that died. A mistake in the user's files or settings is a UserError instead, and a cancelled
 * review an AbortError, so the host handles every failure by its type, wherever it came from.
 */
export class WorkerFailure extends Error {
  constructor(message: string, workerStack?: string) {
    super(message);
    this.name = 'WorkerFailure';
    if (workerStack !== undefined) this.stack = workerStack;
  }
}

/** A cancelled review or what-if (the name AbortSignal uses, so one check covers both). */
export function reviewCancelled(message = 'Review cancelled.'): Error {
  return Object.assign(new Error(message), { name: 'AbortError' });
}

export function isCancelled(e: unknown): boolean {
  return e instanceof Error && e.name === 'AbortError';
}

/** The error a failure of `kind` becomes on the host side. */
function failureOf(kind: WorkerErrorMessage['kind'], message: string, file: string | null = null, line: number | null = null, stack?: string): Error {
  if (kind === 'user') return new UserError(message, file, line);
  if (kind === 'cancelled') return reviewCancelled(message);
  return new WorkerFailure(message, stack);
}

/**
 * A what-if's measures, the engine's time for them (ms, measured in the worker) and when it
 * passed each hop between host and worker (the e2e latency split).
 */
export interface WhatIfAnswer { measures: Measures; engineMs: number; hops: WhatIfHops }
type StageCallback = (stage: ReviewStage, fraction: number) => void;

export class ReviewWorkerClient {
  private worker: Worker | null = null;
  /** One numbering for runs and what-ifs across workers, so a late reply of a stopped worker matches nothing. */
  private nextId = 1;
  // The requests waiting for the current worker's replies; each new worker starts with none.
  private runs = new PendingReplies<Report>();
  /** What-ifs awaiting the worker; a prefetch's resolves with null when the worker drops it. */
  private whatIfs = new PendingReplies<WhatIfAnswer | null>();
  private readonly stageCallbacks = new Map<number, StageCallback>();
  /**
   * In memory the worker shares: a prefetch it is computing stops when this moves. It moves on
   * each click, and on each prefetch while another is in flight, except for a request for the
   * selection of the prefetch in flight (see askWhatIf).
   */
  private readonly clicks = new Int32Array(new SharedArrayBuffer(4));
  /**
   * The latest prefetch sent and not answered yet, by its selection: a click for that selection
   * does not stop it (the click then adopts it in the worker, ReviewSession.speculate).
   */
  private speculating: { requestId: number; key: string } | null = null;
  /** True while the worker holds a finished session that can answer what-ifs. */
  private sessionReady = false;

  constructor(private readonly workerFile: string) {}

  get hasSession(): boolean {
    return this.worker !== null && this.sessionReady;
  }

  /**
   * Runs a review. Aborting `signal` terminates the worker at once: the engine may be inside
   * a long synchronous step, and a stuck thread must not outlive the user's cancel.
   */
  review(input: ReviewInput, onStage?: StageCallback, signal?: AbortSignal): Promise<Report> {
    if (signal?.aborted) return Promise.reject(reviewCancelled());
    const worker = this.ensureWorker();
    const runId = this.nextId++;
    const onAbort = (): void => {
      void this.terminate('Review cancelled.', 'cancelled');
    };
    signal?.addEventListener('abort', onAbort, { once: true });
    if (onStage !== undefined) this.stageCallbacks.set(runId, onStage);
    const report = this.runs.request(() => this.send(worker, { type: 'review', runId, input }), runId);
    this.updateRef();
    return report.finally(() => {
      signal?.removeEventListener('abort', onAbort);
      this.stageCallbacks.delete(runId);
    });
  }

  whatIf(removed: readonly string[]): Promise<Measures> {
    return this.timedWhatIf(removed).then((r) => r.measures);
  }

  /** The what-if with the engine's time for it (ms, measured in the worker). */
  timedWhatIf(removed: readonly string[]): Promise<WhatIfAnswer> {
    return this.askWhatIf(removed, false).then((answer) => {
      if (answer === null) throw new WorkerFailure('The review worker dropped a what-if it had to answer.');
      return answer;
    });
  }

  /**
   * A prefetch (the pointer rests on a term): the worker answers it only when no click is
   * waiting, without moving the review's what-if state, and a click for the same selection that
   * follows adopts it (worker-protocol.ts WhatIfRequest). Null when the worker dropped it.
   */
  speculativeWhatIf(removed: readonly string[]): Promise<WhatIfAnswer | null> {
    return this.askWhatIf(removed, true);
  }

  private askWhatIf(removed: readonly string[], speculative: boolean): Promise<WhatIfAnswer | null> {
    if (!this.hasSession) return Promise.reject(new UserError('The review behind this panel is no longer loaded; run "Review distances" again.'));
    const worker = this.ensureWorker();
    const key = [...removed].sort().join('\u0000');
    // Read by a prefetch computing in the worker, which then stops (ReviewSession.speculate):
    // a click or a newer prefetch goes first. Not for the prefetch's own selection: stopped,
    // the click would start the same work again from the beginning; let finish, it is the
    // click's answer and state (the click adopts it in the worker).
    const supersedes = speculative ? this.speculating !== null && this.speculating.key !== key : this.speculating?.key !== key;
    if (supersedes) Atomics.add(this.clicks, 0, 1);
    let hostToWorker = 0;
    const answer = this.whatIfs.request((requestId) => {
      if (speculative) this.speculating = { requestId, key };
      hostToWorker = Date.now();
      this.send(worker, speculative ? { type: 'whatIf', requestId, removed: [...removed], speculative } : { type: 'whatIf', requestId, removed: [...removed] });
    }, this.nextId++);
    this.updateRef();
    return answer.then((a) => (a === null ? null : { ...a, hops: { hostToWorker, ...a.hops } }));
  }

  /** Stops the worker; everything pending is rejected with `kind`. */
  async terminate(message = 'The review worker was stopped.', kind: WorkerErrorMessage['kind'] = 'cancelled'): Promise<void> {
    const worker = this.worker;
    this.worker = null;
    this.sessionReady = false;
    this.rejectAll(failureOf(kind, message));
    if (worker !== null) await worker.terminate();
  }

  private ensureWorker(): Worker {
    if (this.worker !== null) return this.worker;
    const worker = new Worker(this.workerFile, { workerData: { clicks: this.clicks } });
    this.runs = new PendingReplies();
    this.whatIfs = new PendingReplies();
    this.speculating = null;
    // A stopped worker may still have a message in flight (a cancelled review's report): it must
    // not mark the new worker's session ready nor settle the new worker's requests.
    worker.on('message', (m: unknown) => {
      if (this.worker === worker) this.receive(m);
    });
    worker.on('error', (e) => {
      if (this.worker !== worker) return;
      this.worker = null;
      this.sessionReady = false;
      this.rejectAll(new WorkerFailure(`The review worker failed: ${e.message}`, e.stack));
    });
    worker.on('exit', (code) => {
      if (this.worker !== worker) return;
      this.worker = null;
      this.sessionReady = false;
      this.rejectAll(new WorkerFailure(`The review worker stopped unexpectedly (exit code ${code}).`));
    });
    this.worker = worker;
    this.updateRef();
    return worker;
  }

  /**
   * Keeps the process alive while an answer is awaited, and lets it exit while the worker only
   * idles with a session in memory.
   */
  private updateRef(): void {
    if (this.worker === null) return;
    if (this.runs.size + this.whatIfs.size > 0) this.worker.ref();
    else this.worker.unref();
  }

  private send(worker: Worker, message: HostToWorker): void {
    worker.postMessage(message);
  }

  private receive(message: unknown): void {
    if (!isWorkerToHost(message)) return;
    try {
      this.dispatch(message);
    } finally {
      this.updateRef();
    }
  }

  private dispatch(m: WorkerToHost): void {
    if ('requestId' in m && m.requestId === this.speculating?.requestId) this.speculating = null;
    switch (m.type) {
      case 'stage':
        this.stageCallbacks.get(m.runId)?.(m.stage, m.fraction);
        return;
      case 'report':
        this.sessionReady = true;
        this.runs.resolve(m.runId, m.report);
        return;
      case 'whatIfResult':
        this.whatIfs.resolve(m.requestId, { measures: m.measures, engineMs: m.engineMs, hops: { ...m.hops, hostAnswered: Date.now() } });
        return;
      case 'whatIfDropped':
        this.whatIfs.resolve(m.requestId, null);
        return;
      case 'error': {
        const failure = failureOf(m.kind, m.message, m.file, m.line, m.stack);
        if (m.runId !== undefined) this.runs.reject(m.runId, failure);
        else if (m.requestId !== undefined) this.whatIfs.reject(m.requestId, failure);
        return;
      }
    }
  }

  private rejectAll(error: Error): void {
    this.runs.fail(error);
    this.whatIfs.fail(error);
  }
}
