// The tokenising threads a review starts before it reads its settings (review/prepare-weights.ts,
// prestartTokenizing): when they are started, that they tokenise as this thread does once given
// the settings, that they are closed when the corpus turns out to be tokenised here, and that a
// settings error does not leave them running (the CLI exits). Common practice, no source: the
// answers are compared with the in-thread encoder's.
import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { once } from 'node:events';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { IN_THREAD_BYTES, prestartTokenizing, startTokenizing } from '../extension/src/engine/review/prepare-weights';
import { inProcessEncoder } from '../extension/src/engine/tokenize/batch-encoder';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { buildOnce, root } from './bad-input/cli-support';
import { Worker } from 'node:worker_threads';
import type { EarlyThreads } from '../extension/src/engine/tokenize/early-threads';

const EARLY = Symbol.for('loudword.earlyTokenizingThreads');

/** Threads as the launcher leaves them (bin/loudword.js), and a promise for each one's exit. */
function launcherThreads(script: string, count: number, youngGenerationMb = 12): { early: EarlyThreads; exited: Array<Promise<unknown>> } {
  const workers = Array.from({ length: count }, () => new Worker(script, { resourceLimits: { maxYoungGenerationSizeMb: youngGenerationMb } }));
  for (const worker of workers) worker.unref();
  const early: EarlyThreads = { script: path.resolve(script), workers, youngGenerationMb, failed: false };
  (globalThis as Record<symbol, unknown>)[EARLY] = early;
  return { early, exited: workers.map((w) => once(w, 'exit')) };
}

/** Whether every promise settles within `ms`. */
async function settle(promises: Array<Promise<unknown>>, ms: number): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const late = new Promise<boolean>((resolve) => (timer = setTimeout(() => resolve(false), ms)));
  const done = await Promise.race([Promise.all(promises).then(() => true), late]);
  clearTimeout(timer);
  return done;
}

describe('review/prestart-tokenizing', function () {
  this.timeout(120_000);
  let dir: string;
  let big: string;
  const workerScript = path.join(root, 'dist', 'tokenize-worker.js');

  before(() => {
    buildOnce();
    dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-prestart-'));
    big = path.join(dir, 'big.csv');
    const row = 'Some words, and then some more words; numbers 12 and 3.5 too.\n';
    writeFileSync(big, 'text\n' + row.repeat(Math.ceil(IN_THREAD_BYTES / row.length) + 10));
    writeFileSync(path.join(dir, 'small.csv'), 'text\n' + row.repeat(10));
    mkdirSync(path.join(dir, 'folder'));
  });
  after(() => rmSync(dir, { recursive: true, force: true }));

  it('starts no threads for a small file, a folder, a glob or a missing file', async () => {
    for (const file of ['small.csv', 'folder', '*.csv', 'missing.csv']) assert.equal(await prestartTokenizing(path.join(dir, file), { workerScript }), null, file);
  });

  it('threads started before the settings tokenise a batch as this thread does once given them', async () => {
    const early = await prestartTokenizing(big, { workerScript });
    assert.notEqual(early, null);
    for (const tokenizer of ['wink', 'pattern'] as const) {
      const tokens = { ...DEFAULT_SETTINGS.tokens, tokenizer };
      const threads = tokenizer === 'wink' ? early! : (await prestartTokenizing(big, { workerScript }))!;
      const encoder = threads.encoder(tokens);
      try {
        const texts = ["It's a test: the test of words, WORDS and café's 42 tests.", 'Another one, with more words.'];
        const there = await encoder.encode(texts);
        const here = await inProcessEncoder(tokens).encode(texts);
        assert.deepEqual(there.newTerms, here.newTerms, tokenizer);
        assert.deepEqual([...there.cols], [...here.cols], tokenizer);
        assert.deepEqual([...there.counts], [...here.counts], tokenizer);
      } finally {
        await encoder.close();
      }
    }
  });

  it('startTokenizing closes threads started early when the corpus is tokenised in this thread', async () => {
    const early = (await prestartTokenizing(big, { workerScript }))!;
    assert.equal(startTokenizing(DEFAULT_SETTINGS.tokens, 100, early), null);
    await assert.rejects(early.encoder(DEFAULT_SETTINGS.tokens).encode(['words here']), /closed/);
  });

  it("threads the launcher started are the review's when they are what it would start: they tokenise, and its close stops them", async () => {
    const count = Math.min(2, os.availableParallelism());
    const { early, exited } = launcherThreads(workerScript, count);
    const threads = (await prestartTokenizing(big, { workerScript }))!;
    assert.equal((globalThis as Record<symbol, unknown>)[EARLY], undefined, 'taken once');
    const encoder = threads.encoder({ ...DEFAULT_SETTINGS.tokens, tokenizer: 'pattern' });
    const texts = ['Words, words and more words.', 'café 42 tests'];
    const there = await encoder.encode(texts);
    const here = await inProcessEncoder({ ...DEFAULT_SETTINGS.tokens, tokenizer: 'pattern' }).encode(texts);
    assert.deepEqual([...there.cols], [...here.cols]);
    assert.equal(await settle(exited, 200), false, 'a thread taken was stopped');
    await encoder.close();
    assert.ok(await settle(exited, 10_000), 'the pool did not own the launcher\'s threads');
    assert.equal(early.workers.length, count);
  });

  it("threads the launcher started are stopped when they are not the review's (another count or heap) or when it tokenises here", async () => {
    const count = Math.min(2, os.availableParallelism());
    for (const [threads, young, file] of [[count + 1, 12, big], [count, 16, big], [count, 12, path.join(dir, 'small.csv')]] as const) {
      const { exited } = launcherThreads(workerScript, threads, young);
      const started = await prestartTokenizing(file, { workerScript });
      assert.ok(await settle(exited, 10_000), `${threads} threads, ${young} MB, ${path.basename(file)}: not stopped`);
      assert.equal((globalThis as Record<symbol, unknown>)[EARLY], undefined);
      await started?.close();
    }
  });

  it('the CLI reviews a large file with the threads its launcher started, and exits', () => {
    const row = (i: number) => `Some words and then some more words about topic ${i % 97} and item ${i % 31}\n`;
    writeFileSync(path.join(dir, 'plain.csv'), 'text\n' + Array.from({ length: Math.ceil(IN_THREAD_BYTES / 60) }, (_, i) => row(i)).join(''));
    writeFileSync(path.join(dir, 'loudword.json'), JSON.stringify({ tokens: { tokenizer: 'pattern' } }));
    const r = spawnSync(process.execPath, [path.join(root, 'bin', 'loudword.js'), 'review', 'plain.csv', '--format', 'json', '--out', 'report.json'], { cwd: dir, encoding: 'utf8', timeout: 60_000 });
    assert.equal(r.status, 0, r.stderr);
  });

  it('the CLI exits on a settings error with the threads already started', () => {
    writeFileSync(path.join(dir, 'loudword.json'), JSON.stringify({ tokens: { tokenizer: 'nope' } }));
    const r = spawnSync(process.execPath, [path.join(root, 'bin', 'loudword.js'), 'review', 'big.csv', '--format', 'json'], { cwd: dir, encoding: 'utf8', timeout: 60_000 });
    assert.notEqual(r.status, null, 'the process did not exit (threads left running?)');
    assert.notEqual(r.status, 0);
    assert.match(r.stderr, /tokenizer/);
  });
});
