import type { EffectiveSettings, Measures, Report, SettingsProvenance } from '../../protocol';
import { listCorpusFiles } from '../read/corpus-files';
import { countShardKeeping, type ShardRef } from './count-shard';
import { finishReview, type FinishedLab } from './finish-review';
import type { CountPartial, PlanPartial, SumsPartial } from './partials';
import { planReview } from './plan-review';
import type { ShardCounts } from './shard-counts';
import { sumShard } from './sum-shard';
import { SumsTotals } from './sums-totals';
import { DistanceLab } from '../what-if/distance-lab';

/** Rounds of sums a review may ask for before giving up (the current method needs two). */
export const MAX_SUMS_ROUNDS = 6;

/**
 * Who runs the shard steps: this thread (inProcessRunner) or a pool of worker threads
 * (shard-thread-pool.ts). Each keeps round 1's counts of every shard for the sums rounds.
 */
export interface ShardRunner {
  /** Steps run at once. */
  readonly parallelism: number;
  count(shard: ShardRef): Promise<CountPartial>;
  sums(shard: ShardRef, plan: PlanPartial): Promise<SumsPartial>;
  /** Lets go of the kept counts and of any threads. */
  close(): Promise<void>;
}

/** Every step in this thread, one after another; the counts are kept in memory. */
export function inProcessRunner(settings: EffectiveSettings): ShardRunner {
  const kept = new Map<string, ShardCounts>();
  return {
    parallelism: 1,
    async count(shard) {
      const { partial, kept: counts } = await countShardKeeping(shard, settings);
      kept.set(shard.key, counts);
      return partial;
    },
    sums: (shard, plan) => sumShard(shard, plan, settings, kept.get(shard.key) ?? null),
    close: async () => kept.clear(),
  };
}

export interface ShardedReviewOptions {
  corpus: string;
  settings: EffectiveSettings;
  configDir: string | null;
  /** Where the settings came from (Report.provenance), as the caller resolved them. */
  provenance?: SettingsProvenance;
  onStep?(step: string, done: number, total: number): void;
  /** Default: inProcessRunner (closed at the end). A runner passed in is left open for what-ifs. */
  runner?: ShardRunner;
  signal?: AbortSignal;
  /** The stop list's text instead of its file (the editor's unsaved buffer). */
  stopListText?: string;
}

/** A finished review in shards, which answers what-ifs with one more sums round for a new stop list. */
export interface ShardedSession {
  readonly report: Report;
  /** Exact, like one process's what-if; the first time a stop list is asked for, it costs a sums round over every shard. */
  whatIf(removed: readonly string[]): Promise<Measures>;
  close(): Promise<void>;
}

/**
 * Every shard step, run by `runner`: round 1, merge, sums rounds until the review needs no
 * more, finish. What a cluster does with many processes, for a laptop, for tests that compare
 * the two, and for the editor (with worker threads).
 */
export async function reviewShards(options: ShardedReviewOptions): Promise<Report> {
  const own = options.runner === undefined;
  const session = await startShardedReview({ ...options, runner: options.runner ?? inProcessRunner(options.settings) });
  if (own) await session.close();
  return session.report;
}

export async function startShardedReview(options: ShardedReviewOptions & { runner: ShardRunner }): Promise<ShardedSession> {
  const { settings, runner, signal } = options;
  const shards: ShardRef[] = (await listCorpusFiles(options.corpus)).map((f) => ({ file: f.path, key: f.key }));
  try {
    const counted = await inOrder(shards, runner.parallelism, signal, (shard) => runner.count(shard), (partial, i, done) => {
      options.onStep?.('count', done, shards.length);
      return { partial, file: shards[i]!.file };
    });
    let plan = await planReview({
      corpus: options.corpus,
      settings,
      configDir: options.configDir,
      partials: counted,
      ...(options.stopListText !== undefined ? { stopListText: options.stopListText } : {}),
    });
    const totals = new SumsTotals(plan, settings);
    let finished: { report: Report; finished: FinishedLab } | null = null;
    for (let round = 1; round <= MAX_SUMS_ROUNDS && finished === null; round++) {
      const roundPlan = plan;
      await inOrder(shards, runner.parallelism, signal, (shard) => runner.sums(shard, roundPlan), (partial, i, done) => {
        totals.add(partial, shards[i]!.file);
        options.onStep?.(`sums ${round}`, done, shards.length);
      });
      const result = finishReview(plan, settings, totals);
      if (result.done) finished = result;
      else plan = { ...plan, masks: result.masks, neighbors: result.neighbors, full: false };
    }
    if (finished === null) throw new Error(`the review still needed more sums after ${MAX_SUMS_ROUNDS} rounds`);
    const { report } = finished;
    if (options.provenance !== undefined) report.provenance = options.provenance;
    const { lab, index, baseMask, baselineNeighbors } = finished.finished;
    let asked: Promise<unknown> = Promise.resolve();
    return {
      report,
      whatIf(removed) {
        // One at a time: a what-if's sums round must not interleave with another's.
        const answer = asked.then(async () => {
          const mask = DistanceLab.union(baseMask, index.columnsOf(removed));
          const missing = lab.unknown(mask);
          if (missing !== null) {
            const roundPlan: PlanPartial = { ...plan, masks: [missing], neighbors: [], full: false };
            await inOrder(shards, runner.parallelism, undefined, (shard) => runner.sums(shard, roundPlan), (partial, i) => totals.add(partial, shards[i]!.file));
            lab.learn(missing.id, totals.maskSums().get(missing.id)!);
          }
          return lab.measure(mask, baselineNeighbors).measures;
        });
        asked = answer.catch(() => undefined);
        return answer;
      },
      close: () => runner.close(),
    };
  } catch (e) {
    await runner.close();
    throw e;
  }
}

/**
 * Runs `step` on every item, `parallelism` at a time, and hands the results to `take` in item
 * order (so sums are added in shard order whatever finishes first, as one process adds them);
 * a result waits only for those before it.
 */
async function inOrder<T, R, O>(
  items: readonly T[],
  parallelism: number,
  signal: AbortSignal | undefined,
  step: (item: T) => Promise<R>,
  take: (result: R, index: number, done: number) => O,
): Promise<O[]> {
  const out: O[] = [];
  const pending = new Map<number, Promise<R>>();
  let next = 0;
  const start = (): void => {
    if (next < items.length) {
      const p = step(items[next]!);
      p.catch(() => undefined); // awaited below in order; this only silences an early rejection
      pending.set(next++, p);
    }
  };
  for (let i = 0; i < Math.max(1, parallelism); i++) start();
  for (let i = 0; i < items.length; i++) {
    signal?.throwIfAborted();
    const result = await pending.get(i)!;
    pending.delete(i);
    start();
    out.push(take(result, i, i + 1));
  }
  signal?.throwIfAborted();
  return out;
}
