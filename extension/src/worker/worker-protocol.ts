// Messages between the extension host and the review worker (dist/review-worker.js).
// Both sides import this file; the engine's own types stay behind `import type`, so the host
// bundle never pulls the engine in. Each message has a literal `type`; comments say which way
// it travels.
import type { Measures, Report, WhatIfHops } from '../protocol';
import type { ReviewInput, ReviewStage } from '../engine/review/review-api';

// ---- host → worker ----
/** Start (or restart) the review; a running one is aborted first. */
export interface ReviewRequest { type: 'review'; runId: number; input: ReviewInput }
/**
 * Measures with the session's baseline stop list plus `removed`. `speculative`: a prefetch (the
 * pointer rests on a term): answered only when no click is waiting, computed without moving the
 * session's state (ReviewSession.speculate), and dropped (WhatIfDropped) when a click or a newer
 * prefetch comes before it starts.
 */
export interface WhatIfRequest { type: 'whatIf'; requestId: number; removed: string[]; speculative?: boolean }
// Cancelling is not a message: the host terminates the worker (review-worker-client.ts), because a
// long synchronous step would not read one, and a stuck thread must not outlive the user's cancel.
export type HostToWorker = ReviewRequest | WhatIfRequest;

// ---- worker → host ----
export interface StageMessage { type: 'stage'; runId: number; stage: ReviewStage; fraction: number }
export interface ReportMessage { type: 'report'; runId: number; report: Report }
/** The worker's answer to a WhatIfRequest (the host passes it on to the panel as protocol.ts's WhatIfResultMessage). */
export interface WorkerWhatIfResult { type: 'whatIfResult'; requestId: number; removed: string[]; measures: Measures; engineMs: number; hops: WorkerHops }
/** The worker's hops of a what-if (Date.now(), see WhatIfHops): the request read, the engine's call started and ended. */
export type WorkerHops = Required<Pick<WhatIfHops, 'workerReceived' | 'engineStarted' | 'engineEnded'>>;
/** A speculative WhatIfRequest that will not be answered (overtaken, or the session cannot speculate). */
export interface WhatIfDropped { type: 'whatIfDropped'; requestId: number }
/**
 * A failure. `kind` says whose fault it is: 'user' (a file or setting, with file and 1-based
 * line where known), 'cancelled' (the host asked), 'internal' (a bug; `stack` for the log).
 * `runId` or `requestId` says which request failed.
 */
export interface WorkerErrorMessage {
  type: 'error';
  kind: 'user' | 'cancelled' | 'internal';
  message: string;
  file: string | null;
  line: number | null;
  runId?: number;
  requestId?: number;
  stack?: string;
}
export type WorkerToHost = StageMessage | ReportMessage | WorkerWhatIfResult | WhatIfDropped | WorkerErrorMessage;

const hostToWorkerTypes: ReadonlySet<string> = new Set(['review', 'whatIf']);
const workerToHostTypes: ReadonlySet<string> = new Set(['stage', 'report', 'whatIfResult', 'whatIfDropped', 'error']);

/** Checks a message the worker received; the worker answers anything else with an error. */
export function isHostToWorker(value: unknown): value is HostToWorker {
  if (!isTyped(value, hostToWorkerTypes)) return false;
  const m = value as unknown as Record<string, unknown>;
  switch (m.type) {
    case 'review':
      return typeof m.runId === 'number' && typeof m.input === 'object' && m.input !== null && typeof (m.input as { file?: unknown }).file === 'string';
    default:
      return typeof m.requestId === 'number' && isStringArray(m.removed) && (m.speculative === undefined || typeof m.speculative === 'boolean');
  }
}

/** Checks a message the host received from the worker. */
export function isWorkerToHost(value: unknown): value is WorkerToHost {
  return isTyped(value, workerToHostTypes);
}

function isTyped(value: unknown, types: ReadonlySet<string>): value is { type: string } {
  return typeof value === 'object' && value !== null && typeof (value as { type?: unknown }).type === 'string' && types.has((value as { type: string }).type);
}

function isStringArray(value: unknown): value is string[] {
  return Array.isArray(value) && value.every((v) => typeof v === 'string');
}
