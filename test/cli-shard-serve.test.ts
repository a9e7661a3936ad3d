// `loudword shard serve` (what each Dask worker keeps, cluster/loudword_dask.py): one JSON line per
// step in, one answer per step out, errors answered rather than ending the process. Corpus:
// generated documents (seeded; common practice, no source).
import { strict as assert } from 'node:assert';
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { generatedDocs, writeShards } from './support/shard-corpora';
import { scratchFolder } from './support/scratch-folder';

const BIN = path.resolve(__dirname, '..', 'bin', 'loudword.js');

function serve(lines: string[]): Promise<{ answers: Array<{ status: number; message?: string; peakMB: number }>; code: number | null }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [BIN, 'shard', 'serve'], { stdio: ['pipe', 'pipe', 'ignore'] });
    let out = '';
    child.stdout.on('data', (d: Buffer) => (out += d.toString('utf8')));
    child.on('error', reject);
    child.on('close', (code) => resolve({ answers: out.trim().split('\n').map((l) => JSON.parse(l) as { status: number; message?: string; peakMB: number }), code }));
    child.stdin.end(lines.map((l) => `${l}\n`).join(''));
  });
}

describe('loudword shard serve', function () {
  this.timeout(120_000);
  const dir = scratchFolder('loudword-serve-');

  it('runs steps one after another, answers each with its status, and ends at the end of its input', async () => {
    mkdirSync(path.join(dir(), 'corpus'));
    const [a, b] = writeShards(path.join(dir(), 'corpus'), generatedDocs(200, 4), 2);
    const settings = path.join(dir(), 'settings.json');
    const step = (...args: string[]): string => JSON.stringify({ args });
    const { answers, code } = await serve([
      step('settings', path.join(dir(), 'corpus'), '--label', 'label', '--no-config', '--out', settings),
      step('count', a!, '--key', 'part-0.jsonl', '--settings', settings, '--out', path.join(dir(), 'count-0.json'), '--counts', path.join(dir(), 'counts-0.bin')),
      step('count', path.join(dir(), 'missing.jsonl'), '--settings', settings, '--out', path.join(dir(), 'count-x.json')),
      'not json',
      step('list', path.join(dir(), 'corpus')),
      step('count', b!, '--key', 'part-1.jsonl', '--settings', settings, '--out', path.join(dir(), 'count-1.json')),
    ]);
    assert.equal(code, 0);
    assert.deepEqual(answers.map((x) => x.status), [0, 0, 1, 2, 2, 0]);
    assert.match(answers[2]!.message ?? '', /missing\.jsonl: the corpus does not exist/);
    assert.ok(answers.every((x) => x.peakMB > 0));
    assert.equal(JSON.parse(readFileSync(path.join(dir(), 'count-1.json'), 'utf8')).shard.key, 'part-1.jsonl');
    assert.ok(existsSync(path.join(dir(), 'counts-0.bin')), 'round 1 kept the counts it was asked to');
    assert.equal(existsSync(path.join(dir(), 'count-x.json')), false, 'a failed step writes nothing');
  });
});
