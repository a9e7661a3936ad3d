#!/usr/bin/env node
// `npm run bench:shards`: one corpus in 16 shards reviewed by one process and by `--dask local`
// (a LocalCluster with 2 workers), side by side: wall time, peak memory, per-shard step costs, and
// whether the two Reports agree. Printed, never asserted (speed is not a unit test).
//   node cluster/bench-shards.mjs [--docs 1000000] [--shards 16] [--workers 2] [--keep]
// The corpus is generated (seeded): a Zipf vocabulary shared by all documents plus topic words.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, mkdirSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import { tsImport } from 'tsx/esm/api';

const root = path.join(path.dirname(fileURLToPath(import.meta.url)), '..');
const arg = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
};
const DOCS = arg('docs', 1_000_000);
const SHARDS = arg('shards', 16);
const WORKERS = arg('workers', 2);

// The engine's own seeded generator (one mulberry32 in the project), loaded through tsx.
const { mulberry32 } = await tsImport('../extension/src/engine/random/seeded-random.ts', import.meta.url);

function generate(dir) {
  const random = mulberry32(2026);
  const vocabulary = Array.from({ length: 50_000 }, (_, i) => `w${i.toString(36)}`);
  const topics = 40;
  const outs = Array.from({ length: SHARDS }, () => []);
  for (let d = 0; d < DOCS; d++) {
    const topic = Math.floor(random() * topics);
    const length = 20 + Math.floor(random() * 100);
    const words = [];
    for (let i = 0; i < length; i++) {
      // Zipf-like background (rank ~ 1/u) and a topic's own band of the vocabulary.
      if (random() < 0.7) words.push(vocabulary[Math.min(vocabulary.length - 1, Math.floor(1 / (random() + 1e-5)) - 1)]);
      else words.push(vocabulary[1000 + topic * 500 + Math.floor(500 * random() ** 2)]);
    }
    outs[d % SHARDS].push(JSON.stringify({ text: words.join(' '), label: `t${topic}` }));
  }
  mkdirSync(dir, { recursive: true });
  outs.forEach((lines, s) => writeFileSync(path.join(dir, `part-${String(s).padStart(3, '0')}.jsonl`), lines.join('\n') + '\n'));
}

/** Runs the CLI under /usr/bin/time: wall seconds and peak RSS (MB) of the CLI process itself. */
function timed(args) {
  const r = spawnSync('/usr/bin/time', ['-f', 'TIME %e %M', process.execPath, path.join(root, 'bin', 'loudword.js'), ...args], {
    encoding: 'utf8',
    maxBuffer: 1 << 28,
    env: { ...process.env, LOUDWORD_DASK_WORKERS: String(WORKERS) },
  });
  const m = /TIME ([\d.]+) (\d+)/.exec(r.stderr);
  if (r.status !== 0 || m === null) throw new Error(`loudword ${args.join(' ')} failed:\n${r.stderr}`);
  return { wall: Number(m[1]), peakMB: Number(m[2]) / 1024 };
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

const work = mkdtempSync(path.join(os.tmpdir(), 'loudword-bench-shards-'));
try {
  const corpus = path.join(work, 'corpus');
  console.log(`generating ${DOCS} documents in ${SHARDS} shards…`);
  generate(corpus);
  const common = [corpus, '--label', 'label', '--no-config', '--format', 'json', '-q'];
  console.log('one process…');
  const one = timed(['review', ...common, '--out', path.join(work, 'one.json')]);
  console.log(`--dask local (${WORKERS} workers)…`);
  const dask = timed(['review', ...common, '--dask', 'local', '--workdir', path.join(work, 'run'), '--out', path.join(work, 'dask.json')]);
  const stats = JSON.parse(readFileSync(path.join(work, 'run', 'stats.json'), 'utf8'));
  const a = JSON.parse(readFileSync(path.join(work, 'one.json'), 'utf8'));
  const b = JSON.parse(readFileSync(path.join(work, 'dask.json'), 'utf8'));
  const median = (xs) => xs[Math.floor(xs.length / 2)];
  console.log(`\n${DOCS} documents, ${a.vocabulary.terms} terms, ${a.vocabulary.nonzeros} non-zeros, ${SHARDS} shards, ${os.availableParallelism()} cores, load ${os.loadavg()[0].toFixed(1)}`);
  console.log('| | wall | peak memory |');
  console.log('|---|---|---|');
  console.log(`| one process | ${one.wall.toFixed(1)} s | ${one.peakMB.toFixed(0)} MB |`);
  console.log(`| --dask local, ${WORKERS} workers | ${dask.wall.toFixed(1)} s | ${stats.peakStepMB.toFixed(0)} MB per shard step; merge/finish ${stats.peakLocalMB.toFixed(0)} MB |`);
  for (const r of stats.rounds) console.log(`  ${r.round}: ${r.wallSeconds.toFixed(1)} s, per shard median ${median(r.stepSeconds).toFixed(1)} s (max ${r.stepSeconds.at(-1).toFixed(1)} s)`);
  for (const l of stats.local) console.log(`  ${l.step} (here): ${l.seconds.toFixed(1)} s`);
  console.log(`same suggestions: ${JSON.stringify(a.suggestions) === JSON.stringify(b.suggestions)}; largest relative difference ${largestDifference(a, b).toExponential(1)}`);
  const perDocStep = stats.rounds.reduce((s, r) => s + r.stepSeconds.reduce((x, y) => x + y, 0), 0) / DOCS;
  console.log(`shard-step CPU per document (all rounds): ${(perDocStep * 1e6).toFixed(0)} µs`);
} finally {
  if (!process.argv.includes('--keep')) rmSync(work, { recursive: true, force: true });
}
