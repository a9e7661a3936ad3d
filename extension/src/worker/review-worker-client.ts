// The host's handle on one review worker. Plain Node (no 'vscode'), so the round trip is
// unit-tested against the bundled dist/review-worker.js.
import { Worker } from 'node:worker_threads';
import type { Measures, Report } from '../protocol';
import type { ReviewInput, ReviewStage } from '../engine/review/review-api';
import { isWorkerToHost, type HostToWorker, type WorkerErrorMessage, type WorkerToHost } from './worker-protocol';

/** A review or what-if that failed; `kind` and `file`/`line` come from the worker. */
export class WorkerFailure extends Error {
  constructor(
    message: string,
    readonly kind: WorkerErrorMessage['kind'],
    readonly file: string | null = null,
    readonly line: number | null = null,
  ) {
    super(message);
    this.name = 'WorkerFailure';
  }
}

interface Pending<T> { resolve(value: T): void; reject(error: Error): void }
interface PendingRun extends Pending<Report> { onStage: ((stage: ReviewStage, fraction: number) => void) | undefined }

export class ReviewWorkerClient {
  private worker: Worker | null = null;
  private nextId = 1;
  private readonly runs = new Map<number, PendingRun>();
  private readonly whatIfs = new Map<number, Pending<Measures>>();
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
    if (signal?.aborted) return Promise.reject(new WorkerFailure('Review cancelled.', 'cancelled'));
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
    if (!this.hasSession) return Promise.reject(new WorkerFailure('The review behind this panel is no longer loaded; run "Review distances" again.', 'user'));
    const worker = this.ensureWorker();
    const requestId = this.nextId++;
    return new Promise<Measures>((resolve, reject) => {
      this.whatIfs.set(requestId, { resolve, reject });
      this.updateRef();
      this.send(worker, { type: 'whatIf', requestId, removed: [...removed] });
    });
  }

  /** Stops the worker; everything pending is rejected with `kind`. */
  async terminate(message = 'The review worker was stopped.', kind: WorkerErrorMessage['kind'] = 'cancelled'): Promise<void> {
    const worker = this.worker;
    this.worker = null;
    this.sessionReady = false;
    this.rejectAll(new WorkerFailure(message, kind));
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
      this.rejectAll(new WorkerFailure(`The review worker failed: ${e.message}`, 'internal'));
    });
    worker.on('exit', (code) => {
      if (this.worker !== worker) return;
      this.worker = null;
      this.sessionReady = false;
      this.rejectAll(new WorkerFailure(`The review worker stopped unexpectedly (exit code ${code}).`, 'internal'));
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
        pending?.resolve(m.measures);
        return;
      }
      case 'error': {
        const failure = new WorkerFailure(m.message, m.kind, m.file, m.line);
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
