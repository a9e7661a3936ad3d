import { promises as fs } from 'node:fs';
import * as path from 'node:path';
import { createInterface } from 'node:readline';
import { parseArgs as parseNodeArgs } from 'node:util';
import type { EffectiveSettings, SettingsProvenance } from '../protocol';
import { loadReviewSettings, provenanceOf } from '../engine/review/review-settings';
import { listCorpusFiles } from '../engine/read/corpus-files';
import { LOUDWORD_VERSION } from '../engine/review/version';
import { countShard, countShardKeeping } from '../engine/shards/count-shard';
import { finishReview } from '../engine/shards/finish-review';
import { parsePartial, settingsKey, type CountPartial, type PlanPartial, type SumsPartial } from '../engine/shards/partials';
import { readShardCounts, shardCountsOrigin, writeShardCounts } from '../engine/shards/shard-counts';
import { planReview } from '../engine/shards/plan-review';
import { sumShard } from '../engine/shards/sum-shard';
import { SumsTotals } from '../engine/shards/sums-totals';
import { isUserError, UserError } from '../engine/user-error';
import { parseArgs, UsageError } from './parse-args';
import { reviewInputOf } from './review-input-of';
import { writeAtomically } from './write-atomically';

/** Exit status of `shard finish` when the review needs another sums round (the next plan is written). */
export const NEEDS_SUMS = 10;

/** What every shard step reads: the settings resolved once, so all steps use the same. */
export interface ShardSettingsFile {
  loudword: 'shard-settings';
  toolVersion: string;
  corpus: string;
  configDir: string | null;
  settings: EffectiveSettings;
  /** Where the settings came from, for the finished Report (as one process would say it). */
  provenance: SettingsProvenance;
}

const STEPS = ['settings', 'list', 'count', 'plan', 'sums', 'finish', 'serve'] as const;
type Step = (typeof STEPS)[number];

/** `loudword shard --help` (and `shard <step> --help`): the steps, in the order a driver runs them. */
export const SHARD_USAGE = `loudword shard <step> — one step of a review in shards, each a process of its own that a
scheduler can run anywhere (Dask, a Slurm array, Spark); README "The shard steps by hand".

Steps, in the order they run:
  settings <corpus> [review options] --out S
      resolve the settings once; every later step reads S
  list <corpus>
      the shards: one JSON line {"key", "file"} each
  count <shard file> --key K --settings S --out P [--counts C]
      round 1, once per shard (--counts C: keep the shard's token counts for the sums rounds)
  plan P... --settings S --out PLAN
      merge the round-1 partials into the plan
  sums <shard file> --key K --settings S --plan PLAN --out P [--counts C]
      round 2, once per shard (--counts C: read the kept counts instead of tokenising again)
  finish SUMS... --settings S --plan PLAN --out REPORT [--next-plan NEXT]
      the Report; exits ${NEEDS_SUMS} after writing NEXT when more sums are needed: run sums
      with --plan NEXT on every shard, then finish again
  serve
      run steps asked on standard input, one JSON line {"args": ["count", …]} each (for drivers)

Every output is written atomically. Exit status: 0 done, ${NEEDS_SUMS} another sums round is needed
(finish), 1 the input is wrong (the message names the file), 2 the command line is wrong,
4 an internal error (please report it).
`;

const OPTIONS = {
  settings: { type: 'string' },
  key: { type: 'string' },
  plan: { type: 'string' },
  out: { type: 'string' },
  'next-plan': { type: 'string' },
  counts: { type: 'string' },
} as const;

/**
 * `loudword shard <step>`: the steps of a review in shards, each a separate process a scheduler
 * can run anywhere (Dask, a Slurm array, Spark's pipe()); the steps and their options are
 * SHARD_USAGE. With --counts, round 1 writes the shard's token counts
 * (engine/shards/shard-counts.ts) before its partial, and every sums round reads them instead of
 * tokenising the shard again; counts that are missing, or from another state of the file or other
 * settings, are ignored (the shard is read again). Every output is written atomically.
 * `serve` is for drivers that run many steps on one machine (cluster/loudword_dask.py keeps one per
 * Dask worker): it reads one JSON line per step, {"args": ["count", …]}, runs it as the command
 * would, and answers one JSON line {"status", "message"?, "seconds", "peakMB"}; status is the
 * command's exit status (1 for a mistake in the input, 3 for an internal error, after which it
 * exits). It saves each step Node's start-up and loading the tokeniser's model. It ends at the
 * end of its input.
 */
export async function runShardCommand(argv: readonly string[]): Promise<number> {
  const beforeEnd = argv.indexOf('--') < 0 ? argv : argv.slice(0, argv.indexOf('--'));
  if (beforeEnd.includes('--help') || beforeEnd.includes('-h')) {
    process.stdout.write(SHARD_USAGE);
    return 0;
  }
  const step = argv[0] as Step | undefined;
  if (step === undefined || !STEPS.includes(step)) throw new UsageError(`shard needs a step: ${STEPS.join(', ')}`);
  if (step === 'settings') return writeSettings(argv.slice(1));
  if (step === 'serve') return serve();
  let parsed;
  try {
    parsed = parseNodeArgs({ args: [...argv.slice(1)], options: OPTIONS, allowPositionals: true, strict: true });
  } catch (e) {
    throw new UsageError(`shard ${step}: ${(e as Error).message}`);
  }
  const v = parsed.values;
  const files = parsed.positionals;
  const need = (name: keyof typeof OPTIONS): string => {
    const value = v[name];
    if (value === undefined || value === '') throw new UsageError(`shard ${step} needs --${name}`);
    return value;
  };
  const one = (what: string): string => {
    if (files.length !== 1) throw new UsageError(`shard ${step} takes one ${what}, got ${files.length}`);
    return files[0]!;
  };
  if (step === 'list') {
    for (const f of await listCorpusFiles(one('corpus'))) process.stdout.write(`${JSON.stringify({ key: f.key, file: f.path })}\n`);
    return 0;
  }
  const shared = await readSettings(need('settings'));
  const { settings } = shared;
  switch (step) {
    case 'count': {
      const file = one('shard file');
      const shard = { file, key: v.key ?? path.basename(file) };
      if (v.counts === undefined) {
        await writeJson(need('out'), await countShard(shard, settings));
        return 0;
      }
      const out = need('out');
      const origin = await shardCountsOrigin(file, shard.key, settingsKey(settings)).catch(() => null);
      const { partial, kept } = await countShardKeeping(shard, settings);
      if (origin !== null) await writeShardCounts(v.counts, kept, origin);
      await writeJson(out, partial);
      return 0;
    }
    case 'plan': {
      if (files.length === 0) throw new UsageError('shard plan needs the round-1 partials');
      // One partial in memory at a time: the merge folds each in and lets it go.
      async function* partials(): AsyncGenerator<{ partial: CountPartial; file: string }> {
        for (const file of files) yield { partial: await readPartial<CountPartial>(file, 'count'), file };
      }
      await writeJson(need('out'), await planReview({ corpus: shared.corpus, settings, configDir: shared.configDir, partials: partials() }));
      return 0;
    }
    case 'sums': {
      const file = one('shard file');
      const shard = { file, key: v.key ?? path.basename(file) };
      const plan = await readPartial<PlanPartial>(need('plan'), 'plan');
      const origin = v.counts === undefined ? null : await shardCountsOrigin(file, shard.key, settingsKey(settings)).catch(() => null);
      const kept = origin === null ? null : await readShardCounts(v.counts!, origin);
      await writeJson(need('out'), await sumShard(shard, plan, settings, kept));
      return 0;
    }
    case 'finish': {
      const plan = await readPartial<PlanPartial>(need('plan'), 'plan');
      // One partial in memory at a time, added into the totals and let go.
      const totals = new SumsTotals(plan, settings);
      for (const file of files) totals.add(await readPartial<SumsPartial>(file, 'sums'), file);
      const result = finishReview(plan, settings, totals);
      if (result.done) {
        result.report.provenance = shared.provenance;
        await writeJson(need('out'), result.report);
        return 0;
      }
      await writeJson(need('next-plan'), { ...plan, masks: result.masks, neighbors: result.neighbors, full: false });
      return NEEDS_SUMS;
    }
  }
}

async function serve(): Promise<number> {
  const lines = createInterface({ input: process.stdin, crlfDelay: Infinity });
  // Standard output carries only the answers: anything else a step prints goes to standard error.
  const stdout = process.stdout.write.bind(process.stdout);
  process.stdout.write = process.stderr.write.bind(process.stderr) as typeof process.stdout.write;
  const answer = (reply: object): void => void stdout(`${JSON.stringify(reply)}\n`);
  for await (const line of lines) {
    if (line.trim() === '') continue;
    const start = performance.now();
    const done = (status: number, message?: string): void =>
      answer({ status, ...(message === undefined ? {} : { message }), seconds: (performance.now() - start) / 1000, peakMB: process.resourceUsage().maxRSS / 1024 });
    let args: unknown;
    try {
      args = (JSON.parse(line) as { args?: unknown }).args;
    } catch {
      args = undefined;
    }
    if (!Array.isArray(args) || !args.every((a) => typeof a === 'string') || ['list', 'serve'].includes(args[0] as string)) {
      done(2, `shard serve: each line must be {"args": ["count" | "plan" | "sums" | "finish" | "settings", …]}`);
      continue;
    }
    try {
      done(await runShardCommand(args as string[]));
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (e instanceof UsageError) done(2, e.message);
      else if (isUserError(e)) done(1, e.describe());
      else if (typeof code === 'string' && /^E[A-Z]+$/.test(code)) done(1, `${(e as NodeJS.ErrnoException).path ?? '(unknown file)'}: ${(e as Error).message}`);
      else {
        done(3, `internal error — please report it with the input that caused it.\n${(e as Error)?.stack ?? String(e)}`);
        return 3;
      }
    }
  }
  return 0;
}

async function writeSettings(argv: readonly string[]): Promise<number> {
  const options = parseArgs(['review', ...argv]);
  if (options.out === null) throw new UsageError('shard settings needs --out');
  const input = reviewInputOf(options);
  const { settings, configDir, sources } = await loadReviewSettings(input);
  const provenance = provenanceOf(input, sources);
  const file: ShardSettingsFile = { loudword: 'shard-settings', toolVersion: LOUDWORD_VERSION, corpus: input.file, configDir, settings, provenance };
  await writeJson(options.out, file);
  return 0;
}

export async function readSettings(file: string): Promise<ShardSettingsFile> {
  const value = JSON.parse(await readText(file)) as Partial<ShardSettingsFile>;
  if (value.loudword !== 'shard-settings' || value.settings === undefined) throw new UserError('not a Loudword shard settings file', file, null);
  if (value.toolVersion !== LOUDWORD_VERSION) {
    throw new UserError(`written by Loudword ${String(value.toolVersion)}; this is ${LOUDWORD_VERSION}: run every shard step with one version`, file, null);
  }
  return value as ShardSettingsFile;
}

async function readPartial<T>(file: string, step: 'count' | 'plan' | 'sums'): Promise<T> {
  return parsePartial(await readText(file), file, step) as T;
}

async function readText(file: string): Promise<string> {
  try {
    return await fs.readFile(file, 'utf8');
  } catch (e) {
    throw new UserError(`cannot read the file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`, file, null);
  }
}

function writeJson(file: string, value: unknown): Promise<void> {
  return writeAtomically(file, JSON.stringify(value));
}
