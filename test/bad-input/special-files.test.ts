// Issue 13, "Hangs and runaway memory": a stop list that is /dev/zero grew to 13 GB; a FIFO as
// config or stop list blocked forever. Rule: regular files only, size checked before reading.
// Source: common practice, no source (the kinds of file are POSIX's; mkfifo from coreutils).
import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { loadSettings, MAX_CONFIG_BYTES } from '../../extension/src/engine/config/load-settings';
import { openCorpus } from '../../extension/src/engine/read/open-corpus';
import { MAX_STOP_LIST_BYTES, readStopList } from '../../extension/src/engine/stoplist/stop-list-file';
import { UserError } from '../../extension/src/engine/user-error';
import { assertOneLineFailure, buildOnce, projectWithCorpus, runCli } from './cli-support';

function refusedWith(words: RegExp, file: string) {
  return (e: unknown) => e instanceof UserError && e.file === file && words.test(e.message);
}

describe('bad input: regular files only, size checked before reading', function () {
  this.timeout(120_000);
  let dir: string;
  let fifo: string;
  before(buildOnce);
  beforeEach(() => {
    dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-special-'));
    fifo = path.join(dir, 'pipe');
    assert.equal(spawnSync('mkfifo', [fifo]).status, 0, 'mkfifo');
  });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  it('a FIFO as stop list, config or corpus is refused at once (no writer ever opens it)', async () => {
    await assert.rejects(readStopList(fifo), refusedWith(/named pipe \(FIFO\); Loudword reads regular files only/, fifo));
    await assert.rejects(loadSettings(fifo), refusedWith(/the config file is a named pipe/, fifo));
    await assert.rejects(openCorpus(fifo), refusedWith(/the corpus is a named pipe \(FIFO\); Loudword reads regular files only \(save the stream to a file first/, fifo));
  });

  it('/dev/zero as stop list or config is refused before reading', async () => {
    await assert.rejects(readStopList('/dev/zero'), refusedWith(/character device/, '/dev/zero'));
    await assert.rejects(loadSettings('/dev/zero'), refusedWith(/character device/, '/dev/zero'));
  });

  it('a directory as stop list is refused, not read as empty', async () => {
    mkdirSync(path.join(dir, 'lists'));
    await assert.rejects(readStopList(path.join(dir, 'lists')), refusedWith(/is a directory/, path.join(dir, 'lists')));
  });

  it('a stop list or config past its size bound is refused without reading it (sparse files)', async () => {
    const big = path.join(dir, 'big.txt');
    writeFileSync(big, '');
    truncateSync(big, MAX_STOP_LIST_BYTES + 1);
    await assert.rejects(readStopList(big), refusedWith(/more than the 64\.0 MiB a stop list may have/, big));
    const cfg = path.join(dir, 'loudword.json');
    writeFileSync(cfg, '');
    truncateSync(cfg, MAX_CONFIG_BYTES + 1);
    await assert.rejects(loadSettings(cfg), refusedWith(/more than the 1\.0 MiB a config file may have/, cfg));
  });

  it('through the CLI: --stoplist FIFO and --config FIFO end in one line, exit 1, well within the timeout', () => {
    const proj = projectWithCorpus();
    try {
      for (const args of [['--stoplist', fifo], ['--config', fifo]]) {
        const r = runCli(['review', 'corpus.csv', '--sample', '30', '--k', '3', ...args], proj, { timeout: 60_000 });
        assertOneLineFailure(r, 1, /named pipe \(FIFO\)/);
      }
    } finally {
      rmSync(proj, { recursive: true, force: true });
    }
  });
});
