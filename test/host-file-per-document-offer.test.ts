// The editor offers to read a folder one document per file when it holds no table or line files
// (host/pure/file-per-document-offer.ts). Checked on the reader's real error for such a folder.
import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { listCorpusFiles } from '../extension/src/engine/read/corpus-files';
import { offersFilePerDocument } from '../extension/src/host/pure/file-per-document-offer';

describe('the editor\'s offer of format "files" for a folder', () => {
  it('comes for a folder of .md and .rst files, once, and not for other errors', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-offer-'));
    try {
      writeFileSync(path.join(dir, 'intro.md'), '# Intro\n');
      writeFileSync(path.join(dir, 'usage.rst'), 'Usage\n=====\n');
      const message = await listCorpusFiles(dir).then(
        () => assert.fail('a folder without corpus files was listed'),
        (e: Error) => e.message,
      );
      assert.equal(offersFilePerDocument(message, []), true);
      assert.equal(offersFilePerDocument(message, ['format']), false, 'format was already chosen for this review');
      assert.equal(offersFilePerDocument('no label field "topic"', []), false);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
