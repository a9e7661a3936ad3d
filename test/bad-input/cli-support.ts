// Shared by the bad-input CLI cases: the bundled CLI as a user runs it, on a small corpus in a
// fresh temporary project folder. Not a test file itself (no .test.ts suffix).
import { strict as assert } from 'node:assert';
import { spawnSync, type SpawnSyncOptions } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';

export const root = path.join(__dirname, '..', '..');
const cli = path.join(root, 'bin', 'loudword.js');
let built = false;

/**
 * Builds dist/ when it is missing or older than a source file (the CLI runs from the bundle, as
 * users get it). Never when it is current: `npm test` builds before mocha, and its test files run
 * in two processes, so a rebuild in one would rewrite dist/cli.js under a CLI the other is
 * starting (a half-written bundle fails to load).
 */
export function buildOnce(): void {
  if (built) return;
  const bundle = path.join(root, 'dist', 'cli.js');
  if (!existsSync(bundle) || newestSource(path.join(root, 'extension', 'src'), path.join(root, 'webview', 'src')) > statSync(bundle).mtimeMs) {
    const r = spawnSync(process.execPath, [path.join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`build failed: ${r.stderr}`);
  }
  built = true;
}

/** The latest modification time (ms) of any file under the folders. */
function newestSource(...folders: string[]): number {
  let newest = 0;
  for (const folder of folders) {
    for (const entry of readdirSync(folder, { recursive: true, withFileTypes: true })) {
      if (entry.isFile()) newest = Math.max(newest, statSync(path.join(entry.parentPath ?? entry.path, entry.name)).mtimeMs);
    }
  }
  return newest;
}

export interface CliRun {
  code: number | null;
  stdout: string;
  stderr: string;
}

export function runCli(args: readonly string[], cwd: string, extra: SpawnSyncOptions = {}): CliRun {
  const r = spawnSync(process.execPath, [cli, ...args], { cwd, encoding: 'utf8', maxBuffer: 1 << 26, ...extra });
  return { code: r.status, stdout: String(r.stdout ?? ''), stderr: String(r.stderr ?? '') };
}

/**
 * A corpus of 60 short documents on three topics, each with the same greeting, so a review is
 * quick (well under a second of work).
 */
export function smallCorpusCsv(): string {
  const topics = [
    ['printer', 'paper', 'jam', 'toner', 'tray'],
    ['password', 'login', 'reset', 'account', 'locked'],
    ['invoice', 'payment', 'refund', 'charge', 'billing'],
  ];
  const lines = ['id,text,topic'];
  for (let i = 0; i < 60; i++) {
    const t = topics[i % 3]!;
    const words = [t[i % 5], t[(i + 1) % 5], t[(i + 2) % 5], t[(i * 7) % 5]];
    lines.push(`${i},"hello team thanks ${words.join(' ')} regards",${['print', 'auth', 'bill'][i % 3]}`);
  }
  return lines.join('\n') + '\n';
}

/** A fresh project folder holding corpus.csv; returns its path. */
export function projectWithCorpus(prefix = 'loudword-bad-'): string {
  const dir = mkdtempSync(path.join(os.tmpdir(), prefix));
  writeFileSync(path.join(dir, 'corpus.csv'), smallCorpusCsv());
  return dir;
}

/** The CLI failed the way the README promises: exit `code`, one line on stderr, no stack. */
export function assertOneLineFailure(r: CliRun, code: number, words: RegExp): void {
  assert.equal(r.code, code, `exit code (stderr: ${r.stderr})`);
  const lines = r.stderr.trimEnd().split('\n');
  assert.equal(lines.length, 1, `one line on stderr, got:\n${r.stderr}`);
  assert.doesNotMatch(r.stderr, /\n\s+at /, 'no stack trace');
  assert.match(lines[0]!, /^loudword: /);
  assert.match(lines[0]!, words);
}
