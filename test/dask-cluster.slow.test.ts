// `loudword review <glob> --dask ADDR` on a real Dask cluster: a scheduler and two workers on
// 127.0.0.1 (Debian's python3-distributed), issue 11 points 3–5. The reference is the one-process
// review of the same files (same sample, same suggestions, figures equal to 1e-12); the fault
// test kills a worker process in round 1 and another in round 2 and expects Dask (the scheduler
// reruns a dead worker's tasks) to give the same Report. Corpora: Debian's `fortunes` package and
// generated documents (seeded; no outside source).
import { strict as assert } from 'node:assert';
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import type { Report } from '../extension/src/protocol';
import { DaskCluster } from './support/dask-cluster';
import { reportDifferences } from './support/report-diff';
import { fortuneDocs, generatedDocs, writeShards } from './support/shard-corpora';

const root = path.join(__dirname, '..');
const CLI = path.join(root, 'bin', 'loudword.js');
const COMMON = ['--label', 'label', '--no-config', '--sample', '300', '--format', 'json', '-q'];

function oneProcess(corpus: string, out: string): Report {
  const r = spawnSync(process.execPath, [CLI, 'review', corpus, ...COMMON, '--out', out], { encoding: 'utf8', timeout: 300_000 });
  assert.equal(r.status, 0, r.stderr);
  return JSON.parse(readFileSync(out, 'utf8')) as Report;
}

/** Runs the review on the cluster; `onProgress` sees each progress line as it comes. */
function onDask(corpus: string, address: string, out: string, onProgress: (line: string) => void = () => {}): Promise<{ status: number | null; stderr: string }> {
  return new Promise((resolve) => {
    const args = [CLI, 'review', corpus, ...COMMON.filter((a) => a !== '-q'), '--dask', address, '--out', out];
    const child = spawn(process.execPath, args, { stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    const timer = setTimeout(() => child.kill('SIGKILL'), 400_000);
    child.stderr.on('data', (d: Buffer) => {
      const text = d.toString('utf8');
      stderr += text;
      for (const line of text.split('\n')) if (line !== '') onProgress(line);
    });
    child.on('close', (status) => {
      clearTimeout(timer);
      resolve({ status, stderr });
    });
  });
}

function assertSame(one: Report, dask: Report, name: string): void {
  const { differences, largest } = reportDifferences(one, dask);
  console.log(`      ${name}: ${one.input.documents} documents, ${one.suggestions.length} suggestions, largest relative difference ${largest.toExponential(1)}`);
  assert.deepEqual(differences, []);
  assert.deepEqual(dask.suggestions, one.suggestions);
}

describe('review --dask on a real scheduler and two workers', function () {
  this.timeout(900_000);
  let dir: string;
  let cluster: DaskCluster;

  before(async () => {
    if (!existsSync(path.join(root, 'dist', 'cli.js'))) {
      assert.equal(spawnSync(process.execPath, [path.join(root, 'scripts', 'build.mjs')], { cwd: root }).status, 0, 'build');
    }
    dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-dask-'));
    cluster = await DaskCluster.start(2);
  });
  after(() => {
    cluster?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('Debian fortunes in 8 shards: the Report of one process, with progress as tasks finish', async () => {
    const shards = path.join(dir, 'fortunes');
    mkdirSync(shards);
    writeShards(shards, fortuneDocs(100), 8);
    const one = oneProcess(`${shards}/*.jsonl`, path.join(dir, 'one.json'));
    const run = await onDask(`${shards}/*.jsonl`, cluster.address, path.join(dir, 'dask.json'));
    assert.equal(run.status, 0, run.stderr);
    assert.match(run.stderr, /round 1 \(count\): 8\/8 shards/);
    assert.match(run.stderr, /round 2 \(sums\): 8\/8 shards/);
    assertSame(one, JSON.parse(readFileSync(path.join(dir, 'dask.json'), 'utf8')) as Report, 'fortunes on Dask');
  });

  it('a worker killed in round 1 and another in round 2: Dask reruns their tasks and the Report is unchanged', async () => {
    const shards = path.join(dir, 'generated');
    mkdirSync(shards);
    writeShards(shards, generatedDocs(1600, 21), 8);
    const one = oneProcess(shards, path.join(dir, 'one-gen.json'));
    const killed: number[] = [];
    const failures: string[] = [];
    const killOne = (): void => {
      try {
        const pid = cluster.workerPids().find((p) => !killed.includes(p));
        if (pid === undefined) throw new Error('no live worker to kill');
        process.kill(pid, 'SIGKILL');
        killed.push(pid);
      } catch (e) {
        failures.push((e as Error).message);
      }
    };
    let round2 = false;
    const run = await onDask(shards, cluster.address, path.join(dir, 'dask-gen.json'), (line) => {
      // After the first task of a round finishes, the others of that round are running or queued.
      if (killed.length === 0 && /round 1 \(count\): 1\/8/.test(line)) killOne();
      if (!round2 && /round 2 \(sums\): 1\/8/.test(line)) {
        round2 = true;
        killOne();
      }
    });
    assert.deepEqual(failures, []);
    assert.equal(run.status, 0, run.stderr);
    assert.equal(killed.length, 2, 'a worker was killed in each round');
    assertSame(one, JSON.parse(readFileSync(path.join(dir, 'dask-gen.json'), 'utf8')) as Report, 'with two workers killed');
  });

  it('an unparsable shard fails the review naming the shard and the line, and writes no Report', async () => {
    const shards = path.join(dir, 'broken');
    mkdirSync(shards);
    writeShards(shards, generatedDocs(200, 4), 3);
    writeFileSync(path.join(shards, 'part-3.csv'), 'text,label\nfine words,a\nmore words,b\n"a quote that never closes,c\n');
    const out = path.join(dir, 'broken.json');
    const run = await onDask(shards, cluster.address, out);
    assert.equal(run.status, 1, run.stderr);
    assert.match(run.stderr, new RegExp(`${path.join(shards, 'part-3.csv').replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}:4: unclosed quote`));
    assert.ok(!existsSync(out), 'no Report was written');
  });
});
