// Issue 13 asks that editor edits to the stop list stay WorkspaceEdits (undoable, saved by the
// user) and that the host never rewrites the file itself. A static check on the host's stop-list
// code: no file-system write in it. Source: common practice, no source.
import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';

const host = path.join(__dirname, '..', '..', 'extension', 'src', 'host');
const WRITES = /\b(writeFile|writeFileSync|appendFile|appendFileSync|createWriteStream|rename|renameSync|truncate|\.save\(\))/;

describe('bad input: the editor host never writes the stop list itself', () => {
  it('stop-list-edits.ts and host-context.ts change the stop list only through WorkspaceEdit', () => {
    for (const name of ['stop-list-edits.ts', 'host-context.ts']) {
      const source = readFileSync(path.join(host, name), 'utf8').replace(/\/\/.*$/gm, '');
      assert.doesNotMatch(source, WRITES, name);
    }
    assert.match(readFileSync(path.join(host, 'stop-list-edits.ts'), 'utf8'), /applyEdit\(/);
  });

  it('the check sees a write when there is one', () => {
    assert.match('await vscode.workspace.fs.writeFile(uri, bytes)', WRITES);
    assert.match('await doc.save()', WRITES);
  });
});
