import * as path from 'node:path';
import type { Worker } from 'node:worker_threads';

/**
 * Tokenising threads the command-line launcher (bin/loudword.js) started before it loaded the
 * CLI's bundle, so that they load theirs on the second core meanwhile instead of ~0.1 s later
 * (the CLI's bundle takes ~0.1 s of the one busy core at the start of a review). The launcher
 * leaves them under this key, unref'd (they keep no process alive), with what it started them
 * with; startTokenizingThreads takes them in place of new ones when they are what it would start.
 * They get their settings in their first message, as threads it starts itself do.
 */
const KEY = Symbol.for('loudword.earlyTokenizingThreads');

export interface EarlyThreads {
  /** The worker script, an absolute path. */
  script: string;
  workers: Worker[];
  /** The young generation's cap each was started with (maxYoungGenerationSizeMb). */
  youngGenerationMb: number;
  /** Set by the launcher when one of them failed or exited before it was taken. */
  failed: boolean;
}

/**
 * The early threads, once, when they run `script` with a young generation of
 * `youngGenerationMb` and there are `count` of them; otherwise (or when one failed) they are
 * stopped and null is returned, so the caller starts its own.
 */
export function takeEarlyThreads(script: string, count: number, youngGenerationMb: number): Worker[] | null {
  const early = (globalThis as Record<symbol, EarlyThreads | undefined>)[KEY];
  if (early === undefined) return null;
  delete (globalThis as Record<symbol, EarlyThreads | undefined>)[KEY];
  if (early.failed || early.script !== path.resolve(script) || early.workers.length !== count || early.youngGenerationMb !== youngGenerationMb) {
    for (const worker of early.workers) void worker.terminate();
    return null;
  }
  for (const worker of early.workers) worker.ref();
  return early.workers;
}

/** Stops early threads nobody will take (the review tokenises in its own thread, or not at all). */
export function closeEarlyThreads(): void {
  const early = (globalThis as Record<symbol, EarlyThreads | undefined>)[KEY];
  if (early === undefined) return;
  delete (globalThis as Record<symbol, EarlyThreads | undefined>)[KEY];
  for (const worker of early.workers) void worker.terminate();
}
