import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { Worker, type WorkerOptions } from 'node:worker_threads';

/**
 * A thread's entry script: `bundled` (a dist/*.js file built beside the running bundle) when it
 * is there, else — running from source under tsx (tests, benchmarks) — `source` beside the
 * calling module; null when neither exists (the caller then works in its own thread).
 */
export function threadScript(dir: string, bundled: string, source: string): string | null {
  const built = join(dir, bundled);
  if (existsSync(built)) return built;
  const fromSource = join(dir, source);
  return existsSync(fromSource) ? fromSource : null;
}

/** A Worker on `script`; a TypeScript entry (under tsx) is loaded through tsx in the thread too. */
export function startThread(script: string, options: WorkerOptions = {}): Worker {
  return new Worker(script, script.endsWith('.ts') ? { ...options, execArgv: ['--require', 'tsx/cjs'] } : options);
}
