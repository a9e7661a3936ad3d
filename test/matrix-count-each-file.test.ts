import { strict as assert } from 'node:assert';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import * as path from 'node:path';
import { countEachFile } from '../extension/src/engine/matrix/count-each-file';
import type { BuiltCorpus } from '../extension/src/engine/matrix/build-count-matrix';
import { isFileByFile, openCorpusInput } from '../extension/src/engine/read/many-files-corpus';
import { startFileLanes } from '../extension/src/engine/tokenize/batch-encoder';
import type { TokenSettings } from '../extension/src/engine/tokenize/create-tokenizer';

// count-each-file.ts counts a corpus of many files with a tokeniser fresh for each file, in this
// thread or on tokenising threads ("lanes", each taking the next file when free). Both must give
// the same counts. The files are Debian fortunes (test/corpora/README.md), plus two lines that
// tell a fresh tokeniser from a used one: wink-nlp keeps "xyzzy's" as one token only once a
// chunk such as "xyzzy's." has made it a lexeme of the instance (wink-nlp 2.4, seen here).

const DIST = path.resolve(__dirname, '..', 'dist');
const tokens: TokenSettings = { lowercase: true, minLength: 2, kinds: ['word', 'number', 'hashtag', 'emoji'], stem: false, ngrams: 1 };

function plain(built: BuiltCorpus): unknown {
  const c = built.counts;
  return { terms: c.terms, indptr: [...c.indptr], indices: [...c.indices], data: [...c.data], tokens: [...c.tokensPerDoc], lines: [...built.lines], previews: built.previews, notes: built.notes };
}

describe('matrix/count-each-file: a corpus of many files', function () {
  this.timeout(120_000);
  let dir = '';

  before(function () {
    assert.ok(existsSync(path.join(DIST, 'tokenize-worker.js')), 'dist/tokenize-worker.js is missing: run npm run build first');
    let fortunes: string[];
    try {
      fortunes = readFileSync('/usr/share/games/fortunes/fortunes', 'utf8').split('\n%\n').map((f) => f.replace(/\s+/g, ' ').trim());
    } catch {
      return this.skip(); // the fortunes package is missing (test/corpora/README.md)
    }
    dir = mkdtempSync(path.join(tmpdir(), 'loudword-each-file-'));
    writeFileSync(path.join(dir, 'a.txt'), "the xyzzy's.\n" + fortunes.slice(0, 300).join('\n') + '\n');
    writeFileSync(path.join(dir, 'b.txt'), "the xyzzy's lamp\n" + fortunes.slice(0, 400).reverse().join('\n') + '\n');
    for (let f = 0; f < 5; f++) writeFileSync(path.join(dir, `c${f}.txt`), fortunes.slice(100 + 60 * f, 160 + 60 * f).join('\n') + '\n');
  });

  after(() => {
    if (dir !== '') rmSync(dir, { recursive: true, force: true });
  });

  async function counted(lanes: number): Promise<BuiltCorpus> {
    const source = await openCorpusInput(dir);
    assert.ok(isFileByFile(source));
    const pool = lanes === 0 ? null : startFileLanes(lanes, path.join(DIST, 'tokenize-worker.js'));
    try {
      return await countEachFile(source, tokens, undefined, pool);
    } finally {
      await pool?.close();
    }
  }

  it('gives each file a fresh tokeniser, on one lane as in this thread', async () => {
    const here = await counted(0);
    // b.txt's first line, after a.txt made "xyzzy's" a lexeme of a used tokeniser.
    const b = here.lines.indexOf(1, 1);
    const termsOf = (row: number): string[] => [...here.counts.indices.subarray(here.counts.indptr[row], here.counts.indptr[row + 1])].map((j) => here.counts.terms[j]!);
    assert.deepEqual(termsOf(b).sort(), ["'s", 'lamp', 'the', 'xyzzy'], 'a used tokeniser gives lamp, the, xyzzy\'s');
    assert.deepEqual(plain(await counted(1)), plain(here));
  });

  it('counts the same on two lanes as in this thread, files in order', async () => {
    const here = await counted(0);
    assert.equal(here.counts.rows, 300 + 1 + 400 + 1 + 300);
    assert.deepEqual(plain(await counted(2)), plain(here));
  });
});
