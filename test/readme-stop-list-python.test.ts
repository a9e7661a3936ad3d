// The README's Python function that reads a stop list file for scikit-learn must read it as the
// engine does (engine/stoplist/parse-stop-list.ts): the very code block of the README is run with
// Debian's python3 on a file with every kind of line the engine's rule tells apart.
import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { parseStopList } from '../extension/src/engine/stoplist/parse-stop-list';
import { PYTHON, requireSklearn } from './reference/run-sklearn';
import { scratchFolder } from './support/scratch-folder';

describe('the README\'s read_stop_list for scikit-learn', function () {
  this.timeout(60_000);
  const dir = scratchFolder('loudword-readme-py-');

  it('reads the same terms, in the same order, as the engine', () => {
    requireSklearn();
    const readme = readFileSync(path.join(__dirname, '..', 'README.md'), 'utf8');
    const block = /```python\n(import re\n[\s\S]*?def read_stop_list[\s\S]*?)```/.exec(readme);
    assert.ok(block !== null, 'the README holds the python block with read_stop_list');
    const file = path.join(dir(), 'stoplist.txt');
    // A byte-order mark, CRLF, CR and LF breaks, comments of each shape, a hashtag, padding, a repeat.
    const text = '\ufeff# added by Loudword\r\nthe\r\n#ad\r#\n#---\n  of  \n#_tag\n\nthe\n# 2nd\nDon\'t\nnew york\n#ÿes\ncafé';
    writeFileSync(file, text);
    const script = `${block[1]}\nimport json, sys\nprint(json.dumps(read_stop_list(sys.argv[1])))\n`;
    // Run in the file's folder: the block's last line reads "stoplist.txt" into a TfidfVectorizer.
    const r = spawnSync(PYTHON, ['-c', script, file], { encoding: 'utf8', cwd: dir() });
    assert.equal(r.status, 0, r.stderr);
    assert.deepEqual(JSON.parse(r.stdout), parseStopList(text).terms);
    assert.deepEqual(parseStopList(text).terms, ['the', '#ad', 'of', '#_tag', "Don't", 'new york', '#ÿes', 'café']);
  });
});
