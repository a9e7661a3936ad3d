// The host's handle on one review worker. Plain Node (no 'vscode'), so the round trip is
// unit-tested against the bundled dist/review-worker.js.
import { Worker } from 'node:worker_threads';
import type { Measures, Report } from '../protocol';
import type { ReviewInput, ReviewStage } from '../engine/review/review-api';
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

interface Pending<T> { resolve(value: T): void; reject(error: Error): void }
/** A what-if's measures and the engine's time for them (ms, measured in the worker). */
export interface WhatIfAnswer { measures: Measures; engineMs: number }
interface PendingRun extends Pending<Report> { onStage: ((stage: ReviewStage, fraction: number) => void) | undefined }

export class ReviewWorkerClient {
  private worker: Worker | null = null;
  private nextId = 1;
  private readonly runs = new Map<number, PendingRun>();
  /** What-ifs awaiting the worker; a prefetch's resolves with null when the worker drops it. */
  private readonly whatIfs = new Map<number, Pending<WhatIfAnswer | null>>();
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
  review(input: ReviewInput, onStage?: (stage: ReviewStage, fraction: number) => void, signal?: AbortSignal): Promise<Report> {
    if (signal?.aborted) return Promise.reject(reviewCancelled());
    const worker = this.ensureWorker();
    const runId = this.nextId++;
    return new Promise<Report>((resolve, reject) => {
      const onAbort = (): void => {
        void this.terminate('Review cancelled.', 'cancelled');
      };
      signal?.addEventListener('abort', onAbort, { once: true });
      const settle = <A extends unknown[]>(f: (...a: A) => void) => (...a: A): void => {
        signal?.removeEventListener('abort', onAbort);
        f(...a);
      };
      this.runs.set(runId, { resolve: settle(resolve), reject: settle(reject), onStage });
      this.updateRef();
      this.send(worker, { type: 'review', runId, input });
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
    const requestId = this.nextId++;
    return new Promise<WhatIfAnswer | null>((resolve, reject) => {
      this.whatIfs.set(requestId, { resolve, reject });
      this.updateRef();
      this.send(worker, speculative ? { type: 'whatIf', requestId, removed: [...removed], speculative } : { type: 'whatIf', requestId, removed: [...removed] });
    });
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
    const worker = new Worker(this.workerFile);
    worker.on('message', (m: unknown) => this.receive(m));
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
    switch (m.type) {
      case 'stage':
        this.runs.get(m.runId)?.onStage?.(m.stage, m.fraction);
        return;
      case 'report': {
        const run = this.runs.get(m.runId);
        this.runs.delete(m.runId);
        this.sessionReady = true;
        run?.resolve(m.report);
        return;
      }
      case 'whatIfResult': {
        const pending = this.whatIfs.get(m.requestId);
        this.whatIfs.delete(m.requestId);
        pending?.resolve({ measures: m.measures, engineMs: m.engineMs });
        return;
      }
      case 'whatIfDropped': {
        const pending = this.whatIfs.get(m.requestId);
        this.whatIfs.delete(m.requestId);
        pending?.resolve(null);
        return;
      }
      case 'error': {
        const failure = failureOf(m.kind, m.message, m.file, m.line, m.stack);
        if (m.runId !== undefined) {
          const run = this.runs.get(m.runId);
          this.runs.delete(m.runId);
          run?.reject(failure);
        } else if (m.requestId !== undefined) {
          const pending = this.whatIfs.get(m.requestId);
          this.whatIfs.delete(m.requestId);
          pending?.reject(failure);
        }
        return;
      }
    }
  }

  private rejectAll(error: Error): void {
    const pending: Pending<unknown>[] = [...this.runs.values(), ...this.whatIfs.values()];
    this.runs.clear();
    this.whatIfs.clear();
    for (const p of pending) p.reject(error);
  }
}
