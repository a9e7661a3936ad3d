// A folder read one document per file (format "files", engine/read/file-per-document-corpus.ts).
// Outside reference: scikit-learn's load_files (Debian python3-sklearn), which reads a folder with
// a subfolder per class, on Debian fortunes written one saying per file (source: Debian package
// "fortunes"). The encodings, skipped files and errors are checked on small files made here.
import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { openCorpusInput } from '../extension/src/engine/read/many-files-corpus';
import type { CorpusRow } from '../extension/src/engine/read/corpus-source';
import { startReview } from '../extension/src/engine/review/start-review';
import { isShardsInput } from '../extension/src/engine/shards/review-in-threads';
import { isUserError } from '../extension/src/engine/user-error';
import { formatText } from '../extension/src/cli/format-text';
import { readFortunes } from './corpora/fortunes';
import { reportDifferences } from './support/report-diff';
import { PYTHON, requireSklearn } from './reference/run-sklearn';
import { scratchFolder } from './support/scratch-folder';

async function allRows(folder: string, options: Parameters<typeof openCorpusInput>[1]) {
  const source = await openCorpusInput(folder, options);
  const rows: CorpusRow[] = [];
  for await (const batch of source.batches(7)) rows.push(...batch);
  return { source, rows };
}

describe('a folder read one document per file (format "files")', function () {
  this.timeout(120_000);
  const dir = scratchFolder('loudword-files-');

  it('gives the documents and labels scikit-learn\'s load_files gives, in the same order (Debian fortunes)', async () => {
    requireSklearn();
    const folder = path.join(dir(), 'fortunes');
    const fortunes = readFortunes(['food', 'law', 'science'], 30);
    fortunes.forEach((f, i) => {
      mkdirSync(path.join(folder, f.category), { recursive: true });
      writeFileSync(path.join(folder, f.category, `saying-${String(i).padStart(3, '0')}.txt`), `${f.text}\n`);
    });
    const { source, rows } = await allRows(folder, { format: 'files', labelField: 'folder' });
    const script = [
      'import json, sys',
      'from sklearn.datasets import load_files',
      'b = load_files(sys.argv[1], shuffle=False, encoding="utf-8")',
      'print(json.dumps({"texts": b.data, "labels": [b.target_names[t] for t in b.target]}))',
    ].join('\n');
    const r = spawnSync(PYTHON, ['-c', script, folder], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
    assert.equal(r.status, 0, r.stderr);
    const theirs = JSON.parse(r.stdout) as { texts: string[]; labels: string[] };
    assert.equal(rows.length, fortunes.length);
    assert.deepEqual(rows.map((row) => row.text), theirs.texts);
    assert.deepEqual(rows.map((row) => row.label), theirs.labels);
    assert.deepEqual(source.places.documents, rows.map(() => 1));
    assert.ok(rows.every((row) => row.line === 1));
    assert.deepEqual(source.notes, [`${fortunes.length} files read as one document each`]);
  });

  it('decodes each file like a corpus file, skips binary and empty ones with their reason, and leaves hidden ones out', async () => {
    const folder = path.join(dir(), 'mixed');
    for (const sub of ['a', 'b', 'c', '.git']) mkdirSync(path.join(folder, sub), { recursive: true });
    writeFileSync(path.join(folder, 'a', 'plain.text'), 'plain UTF-8 text, déjà vu\n');
    writeFileSync(path.join(folder, 'a', 'latin.txt'), Buffer.from([0x63, 0x61, 0x66, 0xe9, 0x20, 0x6e, 0x6f, 0x69, 0x72])); // "café noir" in windows-1252
    writeFileSync(path.join(folder, 'b', 'wide.rst'), Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('UTF-16 with a mark', 'utf16le')]));
    writeFileSync(path.join(folder, 'b', 'empty.txt'), '  \n');
    writeFileSync(path.join(folder, 'c', 'image.png'), Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x00, 0x01]));
    writeFileSync(path.join(folder, '.git', 'HEAD'), 'ref: refs/heads/main\n');
    writeFileSync(path.join(folder, '.hidden.txt'), 'never read\n');
    writeFileSync(path.join(folder, 'top.txt'), 'a document at the top has no folder\n');
    const { source, rows } = await allRows(folder, { format: 'files', labelField: 'folder' });
    assert.deepEqual(
      rows.map((r) => [r.label, r.text.trim()]),
      [
        ['a', 'café noir'],
        ['a', 'plain UTF-8 text, déjà vu'],
        ['b', 'UTF-16 with a mark'],
        [null, 'a document at the top has no folder'],
      ],
    );
    assert.equal(source.skipped.count, 2);
    assert.deepEqual(source.skipped.examples.map((e) => e.reason), ['b/empty.txt: an empty file', 'c/image.png: a binary file (a NUL byte), not text']);
    assert.ok(source.notes?.some((n) => n.startsWith('a/latin.txt: not valid UTF-8')), JSON.stringify(source.notes));
    assert.deepEqual(source.places.keys, ['a/latin.txt', 'a/plain.text', 'b/empty.txt', 'b/wide.rst', 'c/image.png', 'top.txt']);
    assert.deepEqual(source.places.documents, [1, 1, 0, 1, 0, 1]);
    const unlabelled = await allRows(folder, { format: 'files' });
    assert.ok(unlabelled.rows.every((r) => r.label === null), 'no label unless the label field is "folder"');
  });

  it('refuses what it cannot read, naming the file, and leaves column settings aside with a note', async () => {
    const folder = path.join(dir(), 'refuse');
    mkdirSync(path.join(folder, 'x'), { recursive: true });
    writeFileSync(path.join(folder, 'x', 'one.txt'), 'one\n');
    const refusal = async (input: string, options: Parameters<typeof openCorpusInput>[1]): Promise<{ message: string; file: string | null }> => {
      try {
        await allRows(input, options);
      } catch (e) {
        assert.ok(isUserError(e), String(e));
        return { message: e.message, file: e.file };
      }
      assert.fail('no error');
    };
    // A text or label setting that names a column (a loudword.json written for the project's
    // tables) is left aside with a note, as plain text does.
    const aside = await allRows(folder, { format: 'files', textField: 'body', labelField: 'topic' });
    assert.deepEqual(aside.rows.map((r) => [r.text, r.label]), [['one\n', null]]);
    assert.match(aside.source.notes?.join('\n') ?? '', /the settings text "body" and label "topic" were ignored \(its label can be "folder"/);
    const single = await refusal(path.join(folder, 'x', 'one.txt'), { format: 'files' });
    assert.match(single.message, /format "files" reads a folder/);
    assert.equal(single.file, path.join(folder, 'x', 'one.txt'));
    assert.match((await refusal(path.join(dir(), 'no-such-folder'), { format: 'files' })).message, /cannot list the folder \(ENOENT\)/);
  });

  it('is reviewed as one corpus, with the Report of the same documents as JSON Lines', async () => {
    const folder = path.join(dir(), 'review');
    const fortunes = readFortunes(['computers', 'food', 'law', 'love'], 60);
    const lines: string[] = [];
    fortunes.forEach((f, i) => {
      mkdirSync(path.join(folder, f.category), { recursive: true });
      writeFileSync(path.join(folder, f.category, `${String(i).padStart(4, '0')}.txt`), f.text);
      lines.push(JSON.stringify({ text: f.text, label: f.category }));
    });
    // A file that is not text: skipped, and said so as a file, not as a row.
    writeFileSync(path.join(folder, 'food', 'photo.jpg'), Buffer.from([0xff, 0xd8, 0xff, 0x00, 0x10]));
    const jsonl = path.join(dir(), 'review.jsonl');
    writeFileSync(jsonl, `${lines.join('\n')}\n`);
    // The sample is drawn by place (file, line), which differs between the two layouts: with a
    // sample larger than the corpus both measure every document.
    const settings = { stopList: null, sample: { documents: 300 } };
    const input = { file: folder, configPath: null, overrides: { ...settings, format: 'files' as const, label: 'folder' } };
    assert.equal(await isShardsInput(input), false, 'a folder of documents is not a folder of shards');
    assert.equal(await isShardsInput({ ...input, overrides: settings }), true);
    const fromFolder = (await startReview(input)).report;
    const fromLines = (await startReview({ file: jsonl, configPath: null, overrides: { ...settings, label: 'label' } })).report;
    const { differences } = reportDifferences({ ...fromLines, input: null, settings: null, provenance: null, hubs: null }, { ...fromFolder, input: null, settings: null, provenance: null, hubs: null });
    assert.deepEqual(differences, []);
    assert.equal(fromFolder.input.documents, fortunes.length);
    assert.equal(fromFolder.input.format, 'files');
    assert.ok(fromFolder.baseline.labelPrecisionAtK !== null, 'the folders are the labels');
    // A hub's place is its file, line 1.
    assert.ok(fromFolder.hubs.every((h) => h.line === 1));
    const text = formatText(fromFolder);
    assert.match(text, /; 1 file skipped\n/);
    assert.match(text, /\nSkipped food\/photo\.jpg: a binary file \(a NUL byte\), not text\n/);
  });

  it('inflates gzip-compressed files (written by Python\'s gzip module), whatever their name, and says how many', async () => {
    // Outside reference: Python's gzip module writes the files (RFC 1952), with and without a
    // .gz name, one of them windows-1252 inside; a truncated one and a compressed binary are skipped.
    const folder = path.join(dir(), 'gzipped');
    mkdirSync(path.join(folder, 'docs'), { recursive: true });
    writeFileSync(path.join(folder, 'docs', 'plain.txt'), 'a plain file beside them\n');
    const script = [
      'import gzip, sys, os',
      'd = os.path.join(sys.argv[1], "docs")',
      'open(os.path.join(d, "changelog.gz"), "wb").write(gzip.compress("version 2: déjà vu\\n".encode("utf-8")))',
      'open(os.path.join(d, "README"), "wb").write(gzip.compress("café noir, no .gz name".encode("cp1252")))',
      'open(os.path.join(d, "binary.gz"), "wb").write(gzip.compress(bytes([0x89, 0x50, 0x00, 0x01])))',
      'open(os.path.join(d, "cut.gz"), "wb").write(gzip.compress(b"a file cut short " * 100)[:30])',
    ].join('\n');
    const r = spawnSync(PYTHON, ['-c', script, folder], { encoding: 'utf8' });
    assert.equal(r.status, 0, r.stderr);
    const { source, rows } = await allRows(folder, { format: 'files' });
    assert.deepEqual(source.places.keys, ['docs/README', 'docs/binary.gz', 'docs/changelog.gz', 'docs/cut.gz', 'docs/plain.txt']);
    assert.deepEqual(rows.map((row) => row.text), ['café noir, no .gz name', 'version 2: déjà vu\n', 'a plain file beside them\n']);
    assert.deepEqual(source.places.documents, [1, 0, 1, 0, 1]);
    const reasons = source.skipped.examples.map((e) => e.reason);
    assert.equal(reasons[0], 'docs/binary.gz: inflated from gzip: a binary file (a NUL byte), not text');
    assert.match(reasons[1] ?? '', /^docs\/cut\.gz: gzip-compressed, but it cannot be inflated \(/);
    assert.equal(source.notes?.[0], '3 files read as one document each (2 of them inflated from gzip); 2 files skipped (the reasons below)');
    assert.ok(source.notes?.some((n) => n.startsWith('docs/README: not valid UTF-8')), JSON.stringify(source.notes));
  });

  it('names the first five files with a decoding note and counts the rest in one note', async () => {
    const folder = path.join(dir(), 'latin');
    mkdirSync(folder, { recursive: true });
    // "café n" in windows-1252: not UTF-8 (common practice, no source: 0xE9 is é in windows-1252).
    for (let i = 0; i < 8; i++) writeFileSync(path.join(folder, `f${i}.txt`), Buffer.from([0x63, 0x61, 0x66, 0xe9, 0x20, 0x30 + i]));
    const { source, rows } = await allRows(folder, { format: 'files' });
    assert.deepEqual(rows.map((row) => row.text), [0, 1, 2, 3, 4, 5, 6, 7].map((i) => `café ${i}`));
    const notes = source.notes ?? [];
    assert.equal(notes.length, 7, JSON.stringify(notes));
    assert.deepEqual(notes.slice(1, 6).map((n) => n.slice(0, n.indexOf(':'))), ['f0.txt', 'f1.txt', 'f2.txt', 'f3.txt', 'f4.txt']);
    assert.equal(notes[6], '3 more files had a note like those above (not valid UTF-8: read as windows-1252, or bytes read as U+FFFD): f5.txt, f6.txt, f7.txt');
  });
});
