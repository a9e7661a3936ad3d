#!/usr/bin/env node
'use strict';
// Thin launcher: the CLI is bundled into dist/cli.js by `npm run build`.
const path = require('path');
const fs = require('fs');
const bundle = path.join(__dirname, '..', 'dist', 'cli.js');
if (!fs.existsSync(bundle)) {
  process.stderr.write('loudword: dist/cli.js is missing; run `npm run build` first.\n');
  process.exit(2);
}
startTokenizingEarly();
require(bundle);

/**
 * A review of one large corpus file tokenises in two threads, which the review starts once the
 * CLI's bundle is loaded (~0.1 s of this thread, the second core idle). Started here instead,
 * they load their own bundle meanwhile; the review takes them (engine/tokenize/early-threads.ts),
 * or stops them when it tokenises otherwise. What is guessed here only decides whether they start
 * early: the first two plain words of the command line as the command and the corpus (an option's
 * value read as the corpus at worst starts them for nothing). The figures are the review's:
 * IN_THREAD_BYTES (review/prepare-weights.ts), min(2, cores) threads and their young generation
 * (tokenize/batch-encoder.ts, TOKENIZING_HEAP); the review checks the last two before it takes them.
 */
function startTokenizingEarly() {
  const args = process.argv.slice(2);
  const [command, file] = args.filter((a) => !a.startsWith('-'));
  if ((command !== 'review' && command !== 'apply') || file === undefined || args.includes('--dask')) return;
  try {
    const s = fs.statSync(file);
    if (!s.isFile() || s.size < 4 * 1024 * 1024) return;
  } catch {
    return;
  }
  const script = path.join(__dirname, '..', 'dist', 'tokenize-worker.js');
  if (!fs.existsSync(script)) return;
  const { Worker } = require('worker_threads');
  const youngGenerationMb = 12;
  const early = { script: path.resolve(script), workers: [], youngGenerationMb, failed: false };
  for (let w = 0; w < Math.min(2, require('os').availableParallelism()); w++) {
    const worker = new Worker(script, { resourceLimits: { maxYoungGenerationSizeMb: youngGenerationMb } });
    worker.on('error', () => (early.failed = true));
    worker.on('exit', () => (early.failed = true));
    worker.unref();
    early.workers.push(worker);
  }
  globalThis[Symbol.for('loudword.earlyTokenizingThreads')] = early;
}
