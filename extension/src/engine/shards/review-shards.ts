import type { EffectiveSettings, Report, SettingsProvenance } from '../../protocol';
import { listCorpusFiles } from '../read/corpus-files';
import { countShard, type ShardRef } from './count-shard';
import { finishReview } from './finish-review';
import { planReview } from './plan-review';
import { sumShard } from './sum-shard';
import { SumsTotals } from './sums-totals';

/** Rounds of sums a review may ask for before giving up (the current method needs two). */
export const MAX_SUMS_ROUNDS = 6;

export interface ShardedReviewOptions {
  corpus: string;
  settings: EffectiveSettings;
  configDir: string | null;
  /** Where the settings came from (Report.provenance), as the caller resolved them. */
  provenance?: SettingsProvenance;
  onStep?(step: string, done: number, total: number): void;
}

/**
 * Every shard step in this process, one shard after another: round 1, merge, sums rounds until
 * the review needs no more, finish. What a cluster does with many processes, for a laptop, for
 * tests that compare the two, and for the editor.
 */
export async function reviewShards(options: ShardedReviewOptions): Promise<Report> {
  const { settings } = options;
  const shards: ShardRef[] = (await listCorpusFiles(options.corpus)).map((f) => ({ file: f.path, key: f.key }));
  const counted = [];
  for (const shard of shards) {
    counted.push({ partial: await countShard(shard, settings), file: shard.file });
    options.onStep?.('count', counted.length, shards.length);
  }
  let plan = await planReview({ corpus: options.corpus, settings, configDir: options.configDir, partials: counted });
  const totals = new SumsTotals(plan, settings);
  for (let round = 1; round <= MAX_SUMS_ROUNDS; round++) {
    for (let i = 0; i < shards.length; i++) {
      totals.add(await sumShard(shards[i]!, plan, settings), shards[i]!.file);
      options.onStep?.(`sums ${round}`, i + 1, shards.length);
    }
    const result = finishReview(plan, settings, totals);
    if (result.done) {
      if (options.provenance !== undefined) result.report.provenance = options.provenance;
      return result.report;
    }
    plan = { ...plan, masks: result.masks, full: false };
  }
  throw new Error(`the review still needed more sums after ${MAX_SUMS_ROUNDS} rounds`);
}
