#!/usr/bin/env node
// `npm run bench:shards`: one corpus in 16 shards reviewed by one process and by `--dask local`
// (a LocalCluster with 2 workers), side by side: wall time, peak memory (of the one process; of
// each worker's Node process), per-round and per-shard step costs, and whether the two Reports
// agree. Printed, never asserted (speed is not a unit test).
//   node cluster/bench-shards.mjs [--docs 1000000] [--shards 16] [--workers 2]
//                                 [--dir DIR] [--only one|dask]
// --dir keeps the generated corpus, the Reports and the Dask run's files in DIR (reused when
// there), so the two sides can be run one at a time (--only) and compared by a last run.
// The corpus is generated (seeded, generate-shards.mjs).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import { generateShards } from './generate-shards.mjs';

const root = path.join(path.dirname(fileURLToPath(import.meta.url)), '..');
const option = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : fallback;
};
const DOCS = Number(option('docs', '1000000'));
const SHARDS = Number(option('shards', '16'));
const WORKERS = Number(option('workers', '2'));
const ONLY = option('only', null);
const KEEP = option('dir', null);

/** Runs the CLI under /usr/bin/time: wall seconds and peak RSS (MB) of the CLI process itself. */
function timed(args) {
  const r = spawnSync('/usr/bin/time', ['-f', 'TIME %e %M', process.execPath, path.join(root, 'bin', 'loudword.js'), ...args], {
    encoding: 'utf8',
    maxBuffer: 1 << 28,
    env: { ...process.env, LOUDWORD_DASK_WORKERS: String(WORKERS) },
  });
  const m = /TIME ([\d.]+) (\d+)/.exec(r.stderr);
  if (r.status !== 0 || m === null) throw new Error(`loudword ${args.join(' ')} failed:\n${r.stderr}`);
  return { wall: Number(m[1]), peakMB: Number(m[2]) / 1024, load: os.loadavg()[0] };
}

function largestDifference(a, b) {
  let largest = 0;
  const walk = (x, y, at) => {
    if (at === '.timings') return;
    if (typeof x === 'number' && typeof y === 'number') largest = Math.max(largest, Math.abs(x - y) / Math.max(1, Math.abs(x)));
    else if (x && y && typeof x === 'object') for (const k of Object.keys(x)) walk(x[k], y[k], `${at}.${k}`);
  };
  walk(a, b, '');
  return largest;
}

const work = KEEP ?? mkdtempSync(path.join(os.tmpdir(), 'loudword-bench-shards-'));
try {
  mkdirSync(work, { recursive: true });
  const corpus = path.join(work, 'corpus');
  if (!existsSync(path.join(corpus, 'done'))) {
    console.log(`generating ${DOCS} documents in ${SHARDS} shards…`);
    await generateShards(corpus, DOCS, SHARDS);
    writeFileSync(path.join(corpus, 'done'), `${DOCS} ${SHARDS}\n`);
  }
  const common = [path.join(corpus, '*.jsonl'), '--label', 'label', '--no-config', '--format', 'json', '-q'];
  const result = (side) => path.join(work, `${side}.timing.json`);
  if (ONLY !== 'dask') {
    console.log('one process…');
    writeFileSync(result('one'), JSON.stringify(timed(['review', ...common, '--out', path.join(work, 'one.json')])));
  }
  if (ONLY !== 'one') {
    console.log(`--dask local (${WORKERS} workers)…`);
    rmSync(path.join(work, 'run'), { recursive: true, force: true });
    writeFileSync(result('dask'), JSON.stringify(timed(['review', ...common, '--dask', 'local', '--workdir', path.join(work, 'run'), '--out', path.join(work, 'dask.json')])));
  }
  const median = (xs) => xs[Math.floor(xs.length / 2)];
  const have = (side) => existsSync(result(side));
  const any = JSON.parse(readFileSync(path.join(work, have('one') ? 'one.json' : 'dask.json'), 'utf8'));
  console.log(`\n${any.input.documents} documents, ${any.vocabulary.terms} terms, ${any.vocabulary.nonzeros} non-zeros, ${SHARDS} shards, ${os.availableParallelism()} cores`);
  console.log('| | wall | peak memory | load average at the end |');
  console.log('|---|---|---|---|');
  if (have('one')) {
    const one = JSON.parse(readFileSync(result('one'), 'utf8'));
    console.log(`| one process | ${one.wall.toFixed(1)} s | ${one.peakMB.toFixed(0)} MB | ${one.load.toFixed(1)} |`);
  }
  if (have('dask')) {
    const dask = JSON.parse(readFileSync(result('dask'), 'utf8'));
    const stats = JSON.parse(readFileSync(path.join(work, 'run', 'stats.json'), 'utf8'));
    const workers = Object.values(stats.workerPeakMB ?? {}).map((mb) => `${mb.toFixed(0)} MB`).join(', ');
    console.log(`| --dask local, ${WORKERS} workers | ${dask.wall.toFixed(1)} s | per worker's Node process: ${workers}; merge and finish ${stats.peakLocalMB.toFixed(0)} MB | ${dask.load.toFixed(1)} |`);
    for (const r of stats.rounds) console.log(`  ${r.round}: ${r.wallSeconds.toFixed(1)} s, per shard median ${median(r.stepSeconds).toFixed(1)} s (max ${r.stepSeconds.at(-1).toFixed(1)} s)`);
    for (const l of stats.local) console.log(`  ${l.step} (here): ${l.seconds.toFixed(1)} s`);
    const perDocStep = stats.rounds.reduce((s, r) => s + r.stepSeconds.reduce((x, y) => x + y, 0), 0) / DOCS;
    console.log(`shard-step wall per document (all rounds, summed over workers): ${(perDocStep * 1e6).toFixed(0)} µs`);
  }
  if (have('one') && have('dask')) {
    const a = JSON.parse(readFileSync(path.join(work, 'one.json'), 'utf8'));
    const b = JSON.parse(readFileSync(path.join(work, 'dask.json'), 'utf8'));
    console.log(`same suggestions: ${JSON.stringify(a.suggestions) === JSON.stringify(b.suggestions)}; largest relative difference ${largestDifference(a, b).toExponential(1)}`);
  }
} finally {
  if (KEEP === null) rmSync(work, { recursive: true, force: true });
}
