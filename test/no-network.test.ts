// Loudword promises no network access anywhere (issue "Robustness and security").
// Two checks: the bundles' own code uses no network API, and a whole review run with every
// network entry point booby-trapped finishes normally. (Common practice, no source.)
import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { buildOnce } from './bad-input/cli-support';

const root = path.join(__dirname, '..');
const NETWORK_API = /\bfetch\(|XMLHttpRequest|WebSocket|EventSource|sendBeacon|require\(["'](node:)?(https?|net|tls|dgram|http2)["']\)|from ["'](node:)?(https?|net|tls|dgram|http2)["']/;

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? sourceFiles(p) : p.endsWith('.ts') ? [p] : [];
  });
}

describe('no network access', function () {
  this.timeout(120_000);
  before(() => {
    buildOnce(); // only when dist/ is missing or older than the sources: npm test has built it, and a rebuild here would race the other test process's CLI runs
  });

  it('our sources (extension and webview) use no network API', () => {
    const offenders = [...sourceFiles(path.join(root, 'extension', 'src')), ...sourceFiles(path.join(root, 'webview', 'src'))].filter((f) =>
      NETWORK_API.test(readFileSync(f, 'utf8')),
    );
    assert.deepEqual(offenders, []);
  });

  it('the webview, tokenizer, row-writing and what-if thread bundles, and wink\'s, contain no network API at all', () => {
    for (const bundle of ['webview.js', 'tokenize-worker.js', 'assemble-worker.js', 'what-if-thread.js', 'masked-term-sums-thread.js', 'opinion-thread.js', 'wink-nlp.js', 'wink-eng-lite-web-model.js', 'wink-core-model.js']) {
      assert.doesNotMatch(readFileSync(path.join(root, 'dist', bundle), 'utf8'), NETWORK_API, bundle);
    }
  });

  // The host reads a few rows with papaparse for the column picker, so it carries the same
  // streamer as the CLI; the check below holds it to papaparse's download code path.
  it('the host, CLI and worker bundles reach XMLHttpRequest only inside papaparse\'s download streamer, which we never enable', () => {
    for (const bundle of ['extension.js', 'cli.js', 'review-worker.js', 'shard-thread.js']) {
      const lines = readFileSync(path.join(root, 'dist', bundle), 'utf8').split('\n');
      const hits = lines.flatMap((l, i) => (NETWORK_API.test(l) ? [i] : []));
      for (const i of hits) assert.match(lines.slice(Math.max(0, i - 30), i).join('\n'), /RemoteChunkSize/, `${bundle}:${i + 1}`);
    }
    const readers = sourceFiles(path.join(root, 'extension', 'src', 'engine', 'read'));
    for (const f of readers) assert.doesNotMatch(readFileSync(f, 'utf8'), /download\s*:/, f);
  });

  it('a whole review runs with every network entry point booby-trapped', () => {
    const r = spawnSync(
      process.execPath,
      ['--require', path.join(__dirname, 'support', 'forbid-network.cjs'), path.join(root, 'bin', 'loudword.js'), 'review', 'samples/support-tickets.csv', '--sample', '300', '--format', 'json', '-q'],
      { cwd: root, encoding: 'utf8', maxBuffer: 1 << 26 },
    );
    assert.equal(r.status, 0, r.stderr);
    assert.doesNotMatch(r.stderr, /NETWORK ATTEMPT/);
    assert.equal(JSON.parse(r.stdout).input.documents, 3000);
  });
});
