// Issue 13, "Clear errors instead of internal errors": an --out that cannot be written (a full
// disk), stdout closed early (`| head`), an unreadable corpus each gave an internal error with a
// stack. Each is now one line `loudword: file: what is wrong`, exit 1. Sources: /dev/full returns
// ENOSPC on every write (Linux null(4) man page, from memory); a closed pipe gives EPIPE (POSIX
// write(2)); permission bits per POSIX (root bypasses them, so the test runs the CLI as nobody).
import { strict as assert } from 'node:assert';
import { spawn } from 'node:child_process';
import { chmodSync, existsSync, readdirSync, rmSync } from 'node:fs';
import * as path from 'node:path';
import { assertOneLineFailure, buildOnce, projectWithCorpus, root, runCli } from './cli-support';

describe('bad input: output and read failures are one line, exit 1, no stack', function () {
  this.timeout(120_000);
  let dir: string;
  before(buildOnce);
  beforeEach(() => (dir = projectWithCorpus()));
  afterEach(() => rmSync(dir, { recursive: true, force: true }));
  const args = ['review', 'corpus.csv', '--sample', '30', '--k', '3', '--no-config'];

  it('--out on a full disk (/dev/full)', function () {
    if (!existsSync('/dev/full')) this.skip();
    assertOneLineFailure(runCli([...args, '--out', '/dev/full'], dir), 1, /^loudword: \/dev\/full: cannot write the report: the disk is full$/);
  });

  it('--out to a device that is fine (/dev/null) still works', () => {
    const r = runCli([...args, '--out', '/dev/null'], dir);
    assert.equal(r.code, 0, r.stderr);
  });

  it('a failed --out write leaves no temporary file behind', () => {
    chmodSync(dir, 0o555);
    try {
      const asNobody = process.getuid?.() === 0 ? { uid: 65534, gid: 65534 } : {};
      const r = runCli([...args, '--out', 'report.txt'], dir, asNobody);
      assertOneLineFailure(r, 1, /report\.txt: cannot write the report: permission denied; no file was created/);
    } finally {
      chmodSync(dir, 0o755);
    }
    assert.deepEqual(readdirSync(dir).filter((n) => n !== 'corpus.csv'), []);
  });

  it('stdout closed before the report is written', async () => {
    const child = spawn(process.execPath, [path.join(root, 'bin', 'loudword.js'), ...args, '--format', 'json'], { cwd: dir, stdio: ['ignore', 'pipe', 'pipe'] });
    child.stdout.destroy(); // the reader went away, as `| head -c 0` does
    let stderr = '';
    child.stderr.on('data', (d: Buffer) => (stderr += String(d)));
    const code = await new Promise<number | null>((r) => child.on('close', (c) => r(c)));
    assertOneLineFailure({ code, stdout: '', stderr }, 1, /\(standard output\): the reader closed the pipe before all output was written/);
  });

  it('an unreadable corpus (no read permission)', () => {
    chmodSync(dir, 0o755); // the folder can be entered, the file cannot be read
    chmodSync(path.join(dir, 'corpus.csv'), 0o000);
    const asNobody = process.getuid?.() === 0 ? { uid: 65534, gid: 65534 } : {};
    const r = runCli(args, dir, asNobody);
    assertOneLineFailure(r, 1, /^loudword: corpus\.csv: the corpus cannot be read: permission denied$/);
  });
});
