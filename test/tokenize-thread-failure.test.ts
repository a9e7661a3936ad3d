// A tokenising thread that dies must fail the review with its reason, never leave a batch
// waiting forever: the batch sent to it is rejected with the exit, and so is every later batch,
// whichever thread it would go to (engine/tokenize/batch-encoder.ts, engine/threads/pending-replies.ts).
import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startTokenizingThreads } from '../extension/src/engine/tokenize/batch-encoder';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';

describe('tokenising threads that die', function () {
  this.timeout(30000);
  let dir: string;
  before(() => (dir = mkdtempSync(join(tmpdir(), 'loudword-tokenize-'))));
  after(() => rmSync(dir, { recursive: true, force: true }));

  it('a thread that exits on its first batch rejects that batch and every later one with the exit code', async () => {
    // Stands in for the tokenising thread: takes the settings, exits with code 3 on a batch.
    const script = join(dir, 'dies.js');
    writeFileSync(script, "require('node:worker_threads').parentPort.on('message', (m) => { if (m.type === 'texts') process.exit(3); });\n");
    const threads = startTokenizingThreads(2, script);
    assert.ok(threads !== null);
    const encoder = threads.encoder(DEFAULT_SETTINGS.tokens);
    try {
      await assert.rejects(encoder.encode(['a first batch']), /tokenize worker exited with code 3/);
      await assert.rejects(encoder.encode(['a later batch']), /tokenize worker exited with code 3/);
    } finally {
      await encoder.close();
    }
  });
});
