// What the panel's toggle costs: one full review through the engine API, then several
// what-if calls that each stop or restore one term, timed one by one: first as the editor runs
// them (the sample's half on a thread of its own), then the same clicks in one thread. Prints
// one JSON object. As in the editor, the clicks start after the idle preparation, warm-up
// toggles included; the cold figures (no warm-up: the first clicks run unoptimised code) come
// from a second process with --cold, run first and printed as `cold`.
//
// Each run of clicks also prints a hash of its answers (every number's bits, NaN and −0 included),
// so that an A/B of the what-if shows its answers stayed the same bits; the two-thread and the
// one-thread clicks answer alike, so their hashes are equal too.
//
// usage: node --import tsx test/bench/what-if-latency.ts FILE.csv [--text text] [--label topic] [--toggles 9]
//                                                         [--cold | --no-cold] [--pause 300]
import { spawnSync } from 'node:child_process';
import { createHash, type Hash } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { resolve } from 'node:path';
import type { ReviewInput, ReviewHooks, ReviewSession } from '../../extension/src/engine/review/review-api';

type StartReview = (input: ReviewInput, hooks: ReviewHooks) => Promise<ReviewSession>;

function option(args: string[], name: string, fallback: string): string {
  const i = args.indexOf(name);
  return i >= 0 && i + 1 < args.length ? (args[i + 1] as string) : fallback;
}

/** Adds `value` to `hash` with every number as its 8 bytes (JSON would lose NaN and −0). */
function hashValue(hash: Hash, value: unknown): void {
  const bits = new Float64Array(1);
  const walk = (v: unknown): void => {
    if (typeof v === 'number') {
      bits[0] = v;
      hash.update(new Uint8Array(bits.buffer));
    } else if (Array.isArray(v)) {
      hash.update(`[${v.length}`);
      for (const x of v) walk(x);
    } else if (v !== null && typeof v === 'object') {
      for (const [k, x] of Object.entries(v)) {
        hash.update(`{${k}`);
        walk(x);
      }
    } else hash.update(`${String(v)};`);
  };
  walk(value);
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const file = args[0];
  if (!file) throw new Error('usage: what-if-latency.ts FILE.csv [--text text] [--label topic] [--toggles 9]');
  const text = option(args, '--text', 'text');
  const label = option(args, '--label', 'topic');
  const toggles = Number(option(args, '--toggles', '9'));
  const cold = args.includes('--cold');
  // A reader looks at the strip before the next click: the engine's idle-time work (rounding
  // resets that have come due) runs then, as in the editor. 0 clicks back to back.
  const pause = Number(option(args, '--pause', '300'));
  const idle = () => new Promise<void>((done) => setTimeout(done, pause));
  // The cold run first, in a process of its own, before this one loads the machine.
  const coldRun = cold || args.includes('--no-cold') ? null : coldFigures(file, text, label, pause);

  // Loaded by path at run time so this script still parses while the engine is being written.
  const modulePath = resolve(__dirname, '../../extension/src/engine/review/start-review.ts');
  const engine = (await import(modulePath)) as { startReview?: StartReview };
  if (typeof engine.startReview !== 'function') throw new Error(`${modulePath} does not export startReview`);

  const started = performance.now();
  const session = await engine.startReview({ file: resolve(file), configPath: null, overrides: { text, label } }, {});
  const reviewMs = performance.now() - started;

  // Toggle the terms a user would try first: the suggestions, then the loudest rows.
  const candidates = [...session.report.suggestions];
  for (const row of session.report.terms) if (!candidates.includes(row.term)) candidates.push(row.term);
  if (candidates.length === 0) throw new Error('the review ranked no terms to toggle');

  // CPU time of the same calls: on a shared machine the wall time stretches with the load, the
  // CPU time much less. It counts every thread of the process (both halves of a two-thread toggle).
  const cpuMs = (since: NodeJS.CpuUsage) => {
    const d = process.cpuUsage(since);
    return (d.user + d.system) / 1000;
  };
  // The panel opens with the suggestions ticked and a click ticks or unticks one term, so each
  // call differs from the one before by one term: every other click is kept, the others undone.
  const flip = (terms: string[], term: string) => (terms.includes(term) ? terms.filter((t) => t !== term) : [...terms, term]);
  async function clicks(): Promise<{ on: number[]; off: number[]; onCpu: number[]; hash: string }> {
    const on: number[] = [];
    const off: number[] = [];
    const onCpu: number[] = [];
    const answers = createHash('sha256');
    let selection = [...session.report.suggestions];
    for (let i = 0; i < toggles; i++) {
      const term = candidates[i % candidates.length] as string;
      const next = flip(selection, term);
      await idle();
      let t = performance.now();
      const cpu = process.cpuUsage();
      const answer = await session.whatIf(next);
      on.push(performance.now() - t);
      onCpu.push(cpuMs(cpu));
      hashValue(answers, answer);
      if (i % 2 === 0) {
        selection = next;
      } else {
        await idle();
        t = performance.now();
        const back = await session.whatIf(selection);
        off.push(performance.now() - t);
        hashValue(answers, back);
      }
    }
    // Back to the opening state, so the next run of clicks starts where the panel does.
    await session.whatIf(session.report.suggestions);
    return { on, off, onCpu, hash: answers.digest('hex').slice(0, 16) };
  }
  // As the editor's review worker does: the idle-time preparation after the Report (the column
  // postings, the sample's what-if thread with its opening build, the warm-up), then the clicks. Once
  // the thread is closed the session answers in this thread alone: the same clicks again.
  await session.prepareWhatIf?.({ warmUp: !cold });
  const two = await clicks();
  // The same clicks when the panel asked ahead (the pointer rested on the term, ReviewSession.
  // speculate): the prefetch's time, then the click's, which adopts the prefetch.
  const prefetchMs: number[] = [];
  const adoptMs: number[] = [];
  if (session.speculate !== undefined) {
    let selection = [...session.report.suggestions];
    for (let i = 0; i < toggles; i++) {
      const next = flip(selection, candidates[i % candidates.length] as string);
      await idle();
      let t = performance.now();
      if ((await session.speculate(next)) === null) break;
      prefetchMs.push(performance.now() - t);
      t = performance.now();
      await session.whatIf(next);
      adoptMs.push(performance.now() - t);
      selection = next;
    }
    await session.whatIf(session.report.suggestions);
  }
  await session.close?.();
  const one = await clicks();
  console.log(
    JSON.stringify({
      documents: session.report.input.documents,
      reviewMs,
      toggles,
      pauseMs: pause,
      medianMs: median(two.on),
      medianBackMs: median(two.off),
      medianCpuMs: median(two.onCpu),
      hash: two.hash,
      firstMs: two.on[0],
      onMs: two.on,
      offMs: two.off,
      ...(adoptMs.length > 0 ? { prefetched: { medianPrefetchMs: median(prefetchMs), medianClickMs: median(adoptMs), prefetchMs, clickMs: adoptMs } } : {}),
      oneThread: { medianMs: median(one.on), medianBackMs: median(one.off), medianCpuMs: median(one.onCpu), hash: one.hash, onMs: one.on },
      warmUp: !cold,
      ...(coldRun === null ? {} : { cold: coldRun }),
    }),
  );
}

/** The first clicks without the warm-up, from this script with `--cold` in a child process. */
function coldFigures(file: string, text: string, label: string, pause: number): { firstMs: number; onMs: number[] } | { error: string } {
  const run = spawnSync(process.execPath, [...process.execArgv, __filename, file, '--text', text, '--label', label, '--toggles', '4', '--pause', String(pause), '--cold'], {
    encoding: 'utf8',
    maxBuffer: 16 * 1024 * 1024,
  });
  const line = run.stdout.trim().split('\n').pop() ?? '';
  try {
    const parsed = JSON.parse(line) as { firstMs: number; onMs: number[] };
    return { firstMs: parsed.firstMs, onMs: parsed.onMs };
  } catch {
    return { error: `cold run failed (exit ${run.status}): ${run.stderr.trim().split('\n').pop() ?? ''}` };
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.stack ?? error.message : String(error));
  process.exit(1);
});
