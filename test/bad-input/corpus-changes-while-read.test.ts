// Issue 13: "a file that grows while it is read is accepted (the snapshot check misses growth)".
// A review must be of one version of the file or of none. Source: common practice, no source
// (rsync and tar warn "file changed as we read it" from the same size/mtime/ctime comparison).
import { strict as assert } from 'node:assert';
import { appendFileSync, mkdtempSync, rmSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { openCorpus } from '../../extension/src/engine/read/open-corpus';
import { FileSnapshot } from '../../extension/src/engine/review/file-snapshot';
import { UserError } from '../../extension/src/engine/user-error';

function corpusText(lines: number): string {
  let s = '';
  for (let i = 0; i < lines; i++) s += `document ${i} about printers and paper jams\n`;
  return s;
}

describe('bad input: a corpus that changes while it is read is refused', () => {
  let dir: string;
  beforeEach(() => (dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-grow-'))));
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  async function readWhile(file: string, change: () => void): Promise<void> {
    const snapshot = await FileSnapshot.take(file);
    const source = await openCorpus(file, { format: 'text', chunkBytes: 4096 });
    let first = true;
    for await (const _batch of source.batches(100)) {
      if (first) change();
      first = false;
    }
    await snapshot!.assertUnchanged();
  }

  it('growth in the middle of the read', async () => {
    const file = path.join(dir, 'c.txt');
    writeFileSync(file, corpusText(5000));
    await assert.rejects(readWhile(file, () => appendFileSync(file, 'one more line\n')), (e: unknown) => e instanceof UserError && e.file === file && /grew from/.test(e.message));
  });

  it('a same-size rewrite that puts the modification time back', async () => {
    const file = path.join(dir, 'c.txt');
    writeFileSync(file, corpusText(5000));
    const before = statSync(file);
    await new Promise((r) => setTimeout(r, 20));
    await assert.rejects(
      readWhile(file, () => {
        writeFileSync(file, corpusText(5000).replace('printers', 'PRINTERS'));
        utimesSync(file, before.atime, before.mtime);
      }),
      /was rewritten/,
    );
  });

  it('an unchanged file passes (the check is not always failing)', async () => {
    const file = path.join(dir, 'c.txt');
    writeFileSync(file, corpusText(5000));
    await readWhile(file, () => undefined);
  });
});
