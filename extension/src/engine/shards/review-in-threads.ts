import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import type { Measures, Report } from '../../protocol';
import { isManyFilesInput, listCorpusFiles } from '../read/corpus-files';
import type { ReviewHooks, ReviewInput } from '../review/review-api';
import { loadReviewSettings, provenanceOf } from '../review/review-settings';
import { inProcessRunner, startShardedReview } from './review-shards';
import { shardThreadPool } from './shard-thread-pool';

/** At most this many shard threads: each holds one shard's counts and a tokeniser (~300 MB at 60k documents). */
const MAX_THREADS = 4;

export interface ThreadedShardsSession {
  readonly report: Report;
  whatIf(removed: readonly string[]): Promise<Measures>;
  close(): Promise<void>;
}

/**
 * Whether the input is reviewed in shards: a folder or a glob of shard files, unless the settings
 * read a folder as one document per file (format "files"), which is reviewed as one corpus.
 */
export async function isShardsInput(input: ReviewInput): Promise<boolean> {
  if (input.text !== undefined || !(await isManyFilesInput(input.file))) return false;
  return (await loadReviewSettings(input)).settings.format !== 'files';
}

/**
 * A folder or glob of shards reviewed on this machine the way a cluster reviews it (the editor's
 * review of a shards folder): round 1 and the sums rounds on worker threads (dist/shard-thread.js,
 * one shard per thread at a time, counts kept in a temporary folder), the merge and the finish
 * here. The Report equals one process's over the same files (tests: shards-threads.test.ts);
 * memory holds a shard per thread, the vocabulary and the sample, not the corpus. A what-if asks
 * the threads for one more sums round the first time a stop list is asked for.
 */
export async function reviewShardsInThreads(input: ReviewInput, hooks: ReviewHooks = {}, threadScript = join(__dirname, 'shard-thread.js')): Promise<ThreadedShardsSession> {
  hooks.onStage?.('reading', 0);
  const loaded = await loadReviewSettings(input);
  const { settings } = loaded;
  const shards = await listCorpusFiles(input.file);
  const threads = Math.max(1, Math.min(shards.length, availableParallelism(), MAX_THREADS));
  const runner = (await shardThreadPool(settings, threads, threadScript)) ?? inProcessRunner(settings);
  const timings: Record<string, number> = {};
  let stage: string | null = null;
  let since = performance.now();
  const enter = (name: 'tokenizing' | 'weighting' | 'measuring', fraction: number): void => {
    if (stage !== name) {
      const now = performance.now();
      if (stage !== null) timings[stage] = Math.round(now - since);
      stage = name;
      since = now;
    }
    hooks.onStage?.(name, fraction);
  };
  enter('tokenizing', 0);
  const session = await startShardedReview({
    corpus: input.file,
    settings,
    configDir: loaded.configDir,
    provenance: provenanceOf(input, loaded.sources),
    runner,
    ...(hooks.signal !== undefined ? { signal: hooks.signal } : {}),
    ...(input.stopListText !== undefined ? { stopListText: input.stopListText } : {}),
    onStep(step, done, total) {
      // Round 1 reads and tokenises; the sums rounds weigh; after the last one the finish measures.
      if (step === 'count') enter(done === total ? 'weighting' : 'tokenizing', done / total);
      else enter(done === total ? 'measuring' : 'weighting', done / total);
    },
  });
  if (stage !== null) timings[stage] = Math.round(performance.now() - since);
  session.report.timings = timings;
  return session;
}
