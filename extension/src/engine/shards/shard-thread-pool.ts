import { existsSync, promises as fs } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { Worker } from 'node:worker_threads';
import type { EffectiveSettings } from '../../protocol';
import { PendingReplies } from '../threads/pending-replies';
import { UserError } from '../user-error';
import type { ShardRef } from './count-shard';
import type { CountPartial, PlanPartial, SumsPartial } from './partials';
import type { ShardRunner } from './review-shards';

type TaskBody = { shard: ShardRef; countsFile: string } & ({ step: 'count' } | { step: 'sums'; plan: PlanPartial });

/**
 * A task as posted: a sums step names its plan by number when the thread already holds it (the
 * plan carries the merged vocabulary, ~10 MB to copy for each of a round's shards: a folder of 983
 * small files spent ~5 s of its weighting posting it). A number, not the plan's planId: the
 * rounds of one review share a planId and differ in their masks.
 */
type PostedBody = { shard: ShardRef; countsFile: string } & ({ step: 'count' } | { step: 'sums'; plan: PlanPartial | null; planNumber: number });
const PREFIX = 'loudword-shards-';

/**
 * Folders of kept counts whose process has ended (an editor closed while a review's threads
 * lived: a terminated thread runs no cleanup) are removed when the next pool starts.
 */
async function removeOrphans(): Promise<void> {
  const names = await fs.readdir(os.tmpdir()).catch(() => [] as string[]);
  for (const name of names) {
    const pid = /^loudword-shards-(\d+)-/.exec(name)?.[1];
    if (pid === undefined || Number(pid) === process.pid) continue;
    try {
      process.kill(Number(pid), 0);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'ESRCH') await fs.rm(path.join(os.tmpdir(), name), { recursive: true, force: true }).catch(() => undefined);
    }
  }
}

export type ShardTask = PostedBody & { id: number };
export type ShardTaskReply =
  | { id: number; partial: CountPartial | SumsPartial }
  | { id: number; error: { user: boolean; message: string; file: string | null; line: number | null; stack?: string } };

/** A step's failure as this thread throws it: the user's mistake stays a UserError. */
function taskError(error: Extract<ShardTaskReply, { error: unknown }>['error']): Error {
  if (error.user) return new UserError(error.message, error.file, error.line);
  return Object.assign(new Error(`shard thread: ${error.message}`), { stack: error.stack });
}

/**
 * Shard steps on worker threads (dist/shard-thread.js): round 1 and the sums rounds of a review
 * in shards, `threads` at a time, for the editor, where a folder of shards is reviewed on this
 * machine. Round 1 keeps each shard's counts in a file of a temporary folder (removed by close),
 * so memory holds one shard per thread, not the corpus. Null when the thread script is missing
 * (sources run without a build); the caller then runs the steps in its own thread.
 */
export async function shardThreadPool(settings: EffectiveSettings, threads: number, script: string): Promise<ShardRunner | null> {
  if (threads < 1 || !existsSync(script)) return null;
  await removeOrphans();
  const folder = await fs.mkdtemp(path.join(os.tmpdir(), `${PREFIX}${process.pid}-`));
  const idle: Worker[] = [];
  const waiting: Array<(w: Worker) => void> = [];
  const pending = new PendingReplies<CountPartial | SumsPartial>();
  const all: Worker[] = [];
  for (let t = 0; t < threads; t++) {
    const worker = new Worker(script, { workerData: { settings } });
    worker.on('message', (reply: ShardTaskReply) => {
      const answered = 'partial' in reply ? pending.resolve(reply.id, reply.partial) : pending.reject(reply.id, taskError(reply.error));
      // A reply that no request waits for (the pool has failed) frees no thread.
      if (answered) release(worker);
    });
    worker.on('error', (e) => pending.fail(e));
    worker.on('exit', (code) => {
      if (code !== 0) pending.fail(new Error(`shard thread exited with code ${code}`));
    });
    all.push(worker);
    idle.push(worker);
  }
  function release(worker: Worker): void {
    const next = waiting.shift();
    if (next !== undefined) next(worker);
    else idle.push(worker);
  }
  const acquire = (): Promise<Worker> => {
    const w = idle.pop();
    return w !== undefined ? Promise.resolve(w) : new Promise((resolve) => waiting.push(resolve));
  };
  const countsFiles = new Map<string, string>();
  const countsFileOf = (shard: ShardRef): string => {
    let file = countsFiles.get(shard.key);
    if (file === undefined) countsFiles.set(shard.key, (file = path.join(folder, `counts-${countsFiles.size}.bin`)));
    return file;
  };
  // Each plan's number, and the plan each thread was last sent (shard-thread.ts keeps it).
  const planNumbers = new WeakMap<PlanPartial, number>();
  const planHeld = new Map<Worker, number>();
  let nextPlanNumber = 1;
  const planOnce = (worker: Worker, task: TaskBody & { step: 'sums' }): PostedBody => {
    let planNumber = planNumbers.get(task.plan);
    if (planNumber === undefined) planNumbers.set(task.plan, (planNumber = nextPlanNumber++));
    const held = planHeld.get(worker) === planNumber;
    planHeld.set(worker, planNumber);
    return held ? { ...task, plan: null, planNumber } : { ...task, planNumber };
  };
  async function run<T extends CountPartial | SumsPartial>(task: TaskBody): Promise<T> {
    if (pending.failure !== null) throw pending.failure;
    const worker = await acquire();
    const posted: PostedBody = task.step === 'count' ? task : planOnce(worker, task);
    return pending.request((id) => worker.postMessage({ ...posted, id })) as Promise<T>;
  }
  return {
    parallelism: threads,
    count: (shard) => run<CountPartial>({ step: 'count', shard, countsFile: countsFileOf(shard) }),
    sums: (shard, plan) => run<SumsPartial>({ step: 'sums', shard, plan, countsFile: countsFileOf(shard) }),
    async close() {
      pending.fail(new Error('the shard threads were closed'));
      await Promise.all(all.map((w) => w.terminate()));
      await fs.rm(folder, { recursive: true, force: true });
    },
  };
}
