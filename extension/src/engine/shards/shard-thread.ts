// The worker_threads entry (dist/shard-thread.js) of shard-thread-pool.ts: runs round 1 and the
// sums rounds of a review in shards, one step at a time, keeping each shard's counts in a file
// of the pool's folder (shard-counts.ts) between round 1 and the sums rounds.
import { parentPort, workerData } from 'node:worker_threads';
import type { EffectiveSettings } from '../../protocol';
import { isUserError } from '../user-error';
import { countShardKeeping } from './count-shard';
import { settingsKey, type PlanPartial } from './partials';
import { readShardCounts, shardCountsOrigin, writeShardCounts } from './shard-counts';
import { sumShard } from './sum-shard';
import type { ShardTask, ShardTaskReply } from './shard-thread-pool';

const settings = (workerData as { settings: EffectiveSettings }).settings;
const key = settingsKey(settings);
/** The last plan sent: the pool sends a plan once and then only its number (shard-thread-pool.ts). */
let plan: { number: number; partial: PlanPartial } | null = null;

async function run(task: ShardTask): Promise<ShardTaskReply> {
  try {
    const origin = await shardCountsOrigin(task.shard.file, task.shard.key, key).catch(() => null);
    if (task.step === 'count') {
      const { partial, kept } = await countShardKeeping(task.shard, settings);
      if (origin !== null) await writeShardCounts(task.countsFile, kept, origin);
      return { id: task.id, partial };
    }
    if (task.plan !== null) plan = { number: task.planNumber, partial: task.plan };
    if (plan === null || plan.number !== task.planNumber) throw new Error(`shard thread: plan ${task.planNumber} was never sent`);
    const kept = origin === null ? null : await readShardCounts(task.countsFile, origin);
    return { id: task.id, partial: await sumShard(task.shard, plan.partial, settings, kept) };
  } catch (e) {
    const err = e instanceof Error ? e : new Error(String(e));
    return {
      id: task.id,
      error: isUserError(e) ? { user: true, message: e.message, file: e.file, line: e.line } : { user: false, message: err.message, file: null, line: null, stack: err.stack ?? '' },
    };
  }
}

parentPort?.on('message', (task: ShardTask) => {
  void run(task).then((reply) => parentPort?.postMessage(reply));
});
