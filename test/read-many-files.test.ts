// Reading a corpus of many files: globs and folders, gzip and Parquet.
// Sources: the glob rules are POSIX shell pattern matching (IEEE Std 1003.1, 2.13) plus the common
// "**" extension (common practice, no source); gzip is RFC 1952 as written by node:zlib; the
// Parquet files are written by hyparquet-writer (a second, independent writer of the format, from
// npm) and must read back as the rows written.
import { strict as assert } from 'node:assert';
import { mkdirSync, writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { parquetWriteBuffer } from 'hyparquet-writer';
import { globToRegExp, listCorpusFiles, splitGlob } from '../extension/src/engine/read/corpus-files';
import type { CorpusRow, CorpusSource } from '../extension/src/engine/read/corpus-source';
import { openCorpusFile } from '../extension/src/engine/read/open-corpus-file';
import { openCorpusInput } from '../extension/src/engine/read/many-files-corpus';
import { isUserError, type UserError } from '../extension/src/engine/user-error';
import { writeGzipJsonl, type Doc } from './support/shard-corpora';
import { scratchFolder } from './support/scratch-folder';

async function rowsOf(source: CorpusSource): Promise<CorpusRow[]> {
  const out: CorpusRow[] = [];
  for await (const batch of source.batches(7)) out.push(...batch);
  return out;
}

const DOCS: Doc[] = Array.from({ length: 40 }, (_, i) => ({ text: `document ${i} says ünïcödé things ${'x'.repeat(i % 5)}`, label: `l${i % 3}` }));

describe('reading many files', () => {
  const dir = scratchFolder('loudword-many-');

  it('globToRegExp: *, ?, [..] stay in one path segment, ** crosses them', () => {
    assert.ok(globToRegExp('*.jsonl').test('a.jsonl'));
    assert.ok(!globToRegExp('*.jsonl').test('sub/a.jsonl'));
    assert.ok(globToRegExp('**/*.jsonl').test('sub/deeper/a.jsonl'));
    assert.ok(globToRegExp('**/*.jsonl').test('a.jsonl'));
    assert.ok(globToRegExp('part-?.csv').test('part-3.csv') && !globToRegExp('part-?.csv').test('part-13.csv'));
    assert.ok(globToRegExp('part-[0-4].csv').test('part-3.csv') && !globToRegExp('part-[0-4].csv').test('part-7.csv'));
    assert.ok(globToRegExp('part-[!0-4].csv').test('part-7.csv'));
    assert.deepEqual(splitGlob('data/shards/*.jsonl'), { root: 'data/shards', pattern: '*.jsonl' });
    assert.deepEqual(splitGlob('/abs/**/x.gz'), { root: '/abs', pattern: '**/x.gz' });
  });

  it('listCorpusFiles: a glob or a folder gives the files in code point order of their keys; hidden and non-corpus files are left out', async () => {
    const root = path.join(dir(), 'tree');
    mkdirSync(path.join(root, 'b'), { recursive: true });
    mkdirSync(path.join(root, '.hidden'), { recursive: true });
    for (const f of ['b/z.jsonl', 'a10.jsonl', 'a2.jsonl', 'B.jsonl', 'README.md', '.hidden/x.jsonl', 'c.csv.gz']) writeFileSync(path.join(root, f), 'x\n');
    const folder = await listCorpusFiles(root);
    assert.deepEqual(folder.map((f) => f.key), ['B.jsonl', 'a10.jsonl', 'a2.jsonl', 'b/z.jsonl', 'c.csv.gz']);
    const glob = await listCorpusFiles(`${root}/*.jsonl`);
    assert.deepEqual(glob.map((f) => f.key), ['B.jsonl', 'a10.jsonl', 'a2.jsonl']);
    assert.equal(glob[0]!.path, path.join(root, 'B.jsonl'));
    await assert.rejects(listCorpusFiles(`${root}/*.parquet`), (e: unknown) => isUserError(e) && /no file matches/.test(e.message));
  });

  it('openCorpusFile on .jsonl.gz: the same rows (text, label, line) as the plain file', async () => {
    const plain = path.join(dir(), 'docs.jsonl');
    writeFileSync(plain, DOCS.map((d) => JSON.stringify(d)).join('\n') + '\n');
    writeGzipJsonl(path.join(dir(), 'docs.jsonl.gz'), DOCS);
    const a = await openCorpusFile(plain, { labelField: 'label' });
    const b = await openCorpusFile(path.join(dir(), 'docs.jsonl.gz'), { labelField: 'label' });
    assert.equal(b.format, 'jsonl');
    assert.equal(b.textField, 'text');
    assert.deepEqual(await rowsOf(b), await rowsOf(a));
    assert.deepEqual(await rowsOf(b), await rowsOf(a), 'a second pass reads the same');
  });

  it('openCorpusFile on a broken .gz fails naming the file', async () => {
    const bad = path.join(dir(), 'broken.jsonl.gz');
    writeFileSync(bad, Buffer.from('not gzip at all'));
    await assert.rejects(openCorpusFile(bad), (e: unknown) => isUserError(e) && (e as UserError).file === bad && /gzip/.test(e.message));
  });

  it('openCorpusFile on Parquet (written by hyparquet-writer, 3 row groups): the rows written, line = row number; columns by name', async () => {
    const file = path.join(dir(), 'docs.parquet');
    const buffer = parquetWriteBuffer({
      columnData: [
        { name: 'id', data: DOCS.map((_, i) => i), type: 'INT32' },
        { name: 'body', data: DOCS.map((d) => d.text), type: 'STRING' },
        { name: 'topic', data: DOCS.map((d) => d.label), type: 'STRING' },
      ],
      rowGroupSize: 16,
    });
    writeFileSync(file, Buffer.from(buffer));
    const detected = await openCorpusFile(file, { labelField: 'topic' });
    assert.equal(detected.format, 'parquet');
    assert.equal(detected.textField, 'body', 'the longest string column');
    const rows = await rowsOf(detected);
    assert.deepEqual(rows, DOCS.map((d, i) => ({ text: d.text, label: d.label, line: i + 1 })));
    await assert.rejects(openCorpusFile(file, { textField: 'Body' }), (e: unknown) => isUserError(e) && /no text column "Body" \(did you mean "body"\?\)/.test(e.message));
  });

  it('openCorpusInput on a folder: one corpus, file after file, places per file, skipped rows named by file', async () => {
    const shards = path.join(dir(), 'shards');
    mkdirSync(shards);
    writeFileSync(path.join(shards, 'p0.jsonl'), DOCS.slice(0, 10).map((d) => JSON.stringify(d)).join('\n') + '\n{"label":"x"}\n');
    writeGzipJsonl(path.join(shards, 'p1.jsonl.gz'), DOCS.slice(10, 25));
    const source = await openCorpusInput(shards, { labelField: 'label' });
    const rows = await rowsOf(source);
    assert.equal(rows.length, 25);
    assert.deepEqual(source.places, { keys: ['p0.jsonl', 'p1.jsonl.gz'], documents: [10, 15] });
    assert.equal(rows[10]!.line, 1, 'lines restart in each file');
    assert.equal(source.skipped.count, 1);
    assert.match(source.skipped.examples[0]!.reason, /^p0\.jsonl: /);
  });

  it('openCorpusInput: a file whose text field differs from the first file\'s fails naming that file', async () => {
    const shards = path.join(dir(), 'mixed');
    mkdirSync(shards);
    writeFileSync(path.join(shards, 'a.jsonl'), DOCS.slice(0, 5).map((d) => JSON.stringify(d)).join('\n') + '\n');
    writeFileSync(path.join(shards, 'b.jsonl'), DOCS.slice(0, 5).map((d) => JSON.stringify({ body: d.text })).join('\n') + '\n');
    const source = await openCorpusInput(shards);
    await assert.rejects(rowsOf(source), (e: unknown) => isUserError(e) && (e as UserError).file === path.join(shards, 'b.jsonl'));
  });
});
