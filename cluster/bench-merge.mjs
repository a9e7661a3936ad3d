#!/usr/bin/env node
// The merge (`loudword shard plan`) must stay O(vocabulary): its memory must not grow with the
// number of documents. Printed, never asserted (speed is not a unit test).
//   node cluster/bench-merge.mjs [--docs 20000] [--shards 8] [--times 1,4,16,64]
// Counts a generated corpus's shards once (generate-shards.mjs), then merges the same round-1
// partials copied `times` over as other shards (new shard keys, sample keys shifted so the copies
// compete for the sample): documents grow `times`-fold, the vocabulary stays the same. Each merge
// runs as its own process under /usr/bin/time (wall seconds, peak RSS).
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import { generateShards } from './generate-shards.mjs';

const root = path.join(path.dirname(fileURLToPath(import.meta.url)), '..');
const option = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : fallback;
};
const DOCS = Number(option('docs', '20000'));
const SHARDS = Number(option('shards', '8'));
const TIMES = option('times', '1,4,16,64').split(',').map(Number);
const loudword = path.join(root, 'bin', 'loudword.js');

function run(args) {
  const r = spawnSync('/usr/bin/time', ['-f', 'TIME %e %M', process.execPath, loudword, ...args], { encoding: 'utf8', maxBuffer: 1 << 26 });
  const m = /TIME ([\d.]+) (\d+)/.exec(r.stderr);
  if (r.status !== 0 || m === null) throw new Error(`loudword ${args.slice(0, 2).join(' ')} failed:\n${r.stderr}`);
  return { wall: Number(m[1]), peakMB: Number(m[2]) / 1024 };
}

const work = mkdtempSync(path.join(os.tmpdir(), 'loudword-bench-merge-'));
try {
  const corpus = path.join(work, 'corpus');
  await generateShards(corpus, DOCS, SHARDS);
  const settings = path.join(work, 'settings.json');
  run(['shard', 'settings', corpus, '--label', 'label', '--no-config', '--out', settings]);
  const counted = [];
  for (let s = 0; s < SHARDS; s++) {
    const name = `part-${String(s).padStart(3, '0')}.jsonl`;
    const out = path.join(work, `count-${s}.json`);
    run(['shard', 'count', path.join(corpus, name), '--key', name, '--settings', settings, '--out', out]);
    counted.push(readFileSync(out, 'utf8'));
  }
  console.log(`merge of round-1 partials copied k times: ${DOCS} documents in ${SHARDS} shards × k, ${os.availableParallelism()} cores, load ${os.loadavg()[0].toFixed(1)}`);
  console.log('| k | documents | shards | terms after the merge | merge wall | merge peak memory |');
  console.log('|---|---|---|---|---|---|');
  for (const k of TIMES) {
    const dir = path.join(work, `k${k}`);
    mkdirSync(dir);
    const files = [];
    for (let copy = 0; copy < k; copy++) {
      for (let s = 0; s < SHARDS; s++) {
        const p = JSON.parse(counted[s]);
        p.shard = { key: `copy-${copy}/${p.shard.key}`, file: `copy-${copy}/${p.shard.file}` };
        for (const c of p.candidates) c.key = (c.key + copy * 0.6180339887498949) % 1;
        p.candidates.sort((a, b) => a.key - b.key);
        const file = path.join(dir, `count-${copy}-${s}.json`);
        writeFileSync(file, JSON.stringify(p));
        files.push(file);
      }
    }
    const plan = path.join(dir, 'plan.json');
    const { wall, peakMB } = run(['shard', 'plan', ...files, '--settings', settings, '--out', plan]);
    const terms = JSON.parse(readFileSync(plan, 'utf8')).terms.length;
    console.log(`| ${k} | ${(k * DOCS).toLocaleString('en')} | ${k * SHARDS} | ${terms.toLocaleString('en')} | ${wall.toFixed(1)} s | ${peakMB.toFixed(0)} MB |`);
    rmSync(dir, { recursive: true, force: true });
  }
} finally {
  rmSync(work, { recursive: true, force: true });
}
