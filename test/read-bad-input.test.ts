import assert from 'node:assert/strict';
import { mkdtempSync, mkdirSync, rmSync, writeFileSync, createWriteStream } from 'node:fs';
import { execFileSync, spawnSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import * as path from 'node:path';
import type { CorpusRow, CorpusSource, ReadOptions } from '../extension/src/engine/read/corpus-source';
import { openCorpus, openCorpusFromText } from '../extension/src/engine/read/open-corpus';
import { UserError } from '../extension/src/engine/user-error';
import { valueAt } from '../extension/src/engine/read/jsonl-value';
import { readAllRows } from './support/read-all-rows';

// Robustness: each case asserts a defined result, or a UserError that names the file and line.

let cases = 0;
let dir: string;

async function fileRows(name: string, content: string | Uint8Array, options: ReadOptions = {}): Promise<{ source: CorpusSource; rows: CorpusRow[] }> {
  const file = path.join(dir, name);
  writeFileSync(file, content);
  const source = await openCorpus(file, options);
  return { source, rows: await readAllRows(source) };
}

/** Runs `fn` and checks it fails with a UserError naming `file`, the line (when given) and the words. */
async function rejectsUserError(fn: () => Promise<unknown>, file: string, line: number | null, words: RegExp): Promise<UserError> {
  try {
    await fn();
  } catch (e) {
    assert.ok(e instanceof UserError, `expected a UserError, got ${String(e)}`);
    assert.equal(path.basename(e.file ?? ''), path.basename(file));
    assert.equal(e.line, line);
    assert.match(e.message, words);
    return e;
  }
  assert.fail('expected a UserError');
}

describe('reader bad input', () => {
  before(() => {
    dir = mkdtempSync(path.join(tmpdir(), 'loudword-bad-'));
  });
  after(() => {
    rmSync(dir, { recursive: true, force: true });
    console.log(`      reader bad-input cases run: ${cases}`);
  });
  afterEach(() => cases++);

  it('openCorpus: an unclosed quote is a UserError on the line where the quote opened', async () => {
    // Source: RFC 4180 §2 rule 6/7 — a quoted field runs to its closing quote.
    const file = path.join(dir, 'unclosed.csv');
    writeFileSync(file, 'id,text\n1,fine\n2,"never closed\n3,more\n4,rows\n');
    await rejectsUserError(async () => readAllRows(await openCorpus(file, {})), file, 3, /unclosed quote.*line 3/);
  });

  it('openCorpus: an unclosed quote found only after many chunks still names its line', async () => {
    const file = path.join(dir, 'unclosed-late.csv');
    const good = Array.from({ length: 2000 }, (_, i) => `${i},document number ${i}`).join('\n');
    writeFileSync(file, `id,text\n${good}\n2000,"open\n2001,x\n`);
    await rejectsUserError(async () => readAllRows(await openCorpus(file, { chunkBytes: 4096 })), file, 2002, /unclosed quote/);
  });

  it('openCorpus: a quote closed only by text, never by a delimiter or line end, at the end of the file is unclosed', async () => {
    const file = path.join(dir, 'badquote-end.csv');
    writeFileSync(file, 'id,text\n1,ok one\n2,"abc"def\n');
    await rejectsUserError(async () => readAllRows(await openCorpus(file, {})), file, 3, /unclosed quote/);
  });

  it('openCorpus: a malformed quote (text after the closing quote) skips that record with its line', async () => {
    // papaparse keeps looking for a proper closing quote, so the bad record runs to line 4.
    const { rows, source } = await fileRows('badquote.csv', 'id,text\n1,ok one\n2,"abc"def\n3,"x"\n4,ok four\n');
    assert.deepEqual(rows.map((r) => r.line), [2, 5]);
    assert.equal(source.skipped.count, 1);
    assert.equal(source.skipped.examples[0]?.line, 3);
    assert.match(source.skipped.examples[0]?.reason ?? '', /malformed quote/);
  });

  it('openCorpus: ragged rows (too few, too many fields) are skipped with line and reason, and counted', async () => {
    const { rows, source } = await fileRows('ragged.csv', 'id,text,label\n1,good row,a\n2,short\n3,long,b,extra\n4,also good,b\n');
    assert.deepEqual(rows.map((r) => [r.line, r.text]), [[2, 'good row'], [5, 'also good']]);
    assert.equal(source.skipped.count, 2);
    assert.deepEqual(source.skipped.examples, [
      { line: 3, reason: '2 fields where the header has 3' },
      { line: 4, reason: '4 fields where the header has 3' },
    ]);
  });

  it('openCorpus: a .csv written with semicolons is read with the sniffed delimiter', async () => {
    const { rows, source } = await fileRows('semi.csv', 'id;text;label\n1;"a, b and c";x\n2;d e;y\n', { labelField: 'label' });
    assert.equal(source.delimiter, ';');
    assert.deepEqual(rows.map((r) => r.text), ['a, b and c', 'd e']);
  });

  it('openCorpus: mixed delimiters (comma header, semicolon rows) give "no documents" naming the first bad line', async () => {
    const file = path.join(dir, 'mixed.csv');
    writeFileSync(file, 'id,text,label\n1;hello;a\n2;bye;b\n');
    await rejectsUserError(async () => readAllRows(await openCorpus(file, {})), file, 2, /no documents.*1 field where the header has 3/);
  });

  it('openCorpus: format tsv forced on a comma file reads one column, whole lines as text', async () => {
    const { rows, source } = await fileRows('forced.tsv', 'id,text\n1,hello there\n', { format: 'tsv' });
    assert.deepEqual(source.fields, ['id,text']);
    assert.deepEqual(rows, [{ text: '1,hello there', label: null, line: 2 }]);
  });

  it('openCorpus: mixed CRLF/LF/CR line endings keep editor line numbers', async () => {
    const { rows } = await fileRows('endings.csv', 'id,text\r\n1,one\n2,"two\r\nlines"\r3,three\r\n');
    assert.deepEqual(rows.map((r) => [r.line, r.text]), [[2, 'one'], [3, 'two\nlines'], [5, 'three']]);
  });

  it('openCorpus: a UTF-8 BOM is not part of the first header name', async () => {
    // Source: Unicode standard — the UTF-8 encoding of U+FEFF is EF BB BF.
    const bytes = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('id,text\n1,héllo\n', 'utf8')]);
    const { rows, source } = await fileRows('bom.csv', bytes);
    assert.deepEqual(source.fields, ['id', 'text']);
    assert.equal(rows[0]?.text, 'héllo');
  });

  it('openCorpus: UTF-16 LE with BOM FF FE is decoded', async () => {
    // Source: Unicode standard — byte-order mark FF FE = UTF-16 little-endian.
    const bytes = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('id,text\n1,naïve 日本\n', 'utf16le')]);
    const { rows } = await fileRows('le.csv', bytes, { chunkBytes: 3 });
    assert.deepEqual(rows, [{ text: 'naïve 日本', label: null, line: 2 }]);
  });

  it('openCorpus: UTF-16 BE with BOM FE FF is decoded', async () => {
    // Source: Unicode standard — byte-order mark FE FF = UTF-16 big-endian.
    const le = Buffer.from('\uFEFFid,text\n1,naïve 😀\n', 'utf16le');
    const be = Buffer.from(le).swap16();
    const { rows } = await fileRows('be.csv', be, { chunkBytes: 5 });
    assert.deepEqual(rows, [{ text: 'naïve 😀', label: null, line: 2 }]);
  });

  it('openCorpus: Latin-1 (windows-1252) bytes are decoded as windows-1252 with a note', async () => {
    // Source: Python's cp1252 codec — b'\x93caf\xe9\x94 \x80'.decode('cp1252') == '“café” €'
    // (checked with /usr/bin/python3).
    const bytes = Buffer.from([...Buffer.from('id,text\n1,'), 0x93, 0x63, 0x61, 0x66, 0xe9, 0x94, 0x20, 0x80, 0x0a]);
    const { rows, source } = await fileRows('latin1.csv', bytes);
    assert.equal(rows[0]?.text, '\u201ccaf\u00e9\u201d \u20ac');
    assert.match((source.notes ?? []).join(' '), /not valid UTF-8.*windows-1252/);
  });

  it('openCorpus: Latin-1 bytes after the head (past 1 MiB of ASCII) switch decoding mid-stream with a note', async () => {
    const ascii = 'id,text\n1,short\n' + 'x,' + 'a'.repeat(1100 * 1024) + '\n';
    const bytes = Buffer.concat([Buffer.from(ascii), Buffer.from([0x32, 0x2c, 0x63, 0x61, 0x66, 0xe9, 0x0a])]);
    const { rows, source } = await fileRows('latin1-late.csv', bytes);
    assert.equal(rows[2]?.text, 'café');
    assert.match((source.notes ?? []).join(' '), /from byte offset \d+.*windows-1252/);
  });

  it('openCorpus: a NUL byte without a UTF-16 BOM is "looks like a binary file"', async () => {
    const file = path.join(dir, 'binary.csv');
    writeFileSync(file, Buffer.from([0x07, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x08, 0x00]));
    await rejectsUserError(() => openCorpus(file, {}), file, null, /looks like a binary file/);
  });

  it('openCorpus: a stray NUL in a field of a text export is read, with a note; NULs as frequent as in binary data are not', async () => {
    // A database export with one NUL in a message: Python's csv module writes it as it is.
    const file = path.join(dir, 'stray-nul.csv');
    const script = 'import csv, sys\nw = csv.writer(open(sys.argv[1], "w", newline="", encoding="utf-8"))\nw.writerow(["id", "text"])\nfor i in range(200):\n    w.writerow([i, f"message number {i} with some words" + ("\\x00 after a NUL" if i == 7 else "")])';
    execFileSync('/usr/bin/python3', ['-c', script, file]);
    const source = await openCorpus(file, {});
    const rows = await readAllRows(source);
    assert.equal(rows.length, 200);
    assert.equal(rows[7]!.text, 'message number 7 with some words\0 after a NUL');
    assert.match((source.notes ?? []).join(' '), /a NUL byte at offset \d+ among text that is otherwise UTF-8: read as text/);
    // One NUL in every 100 bytes of the same text: binary, as before.
    const dense = path.join(dir, 'dense-nul.csv');
    writeFileSync(dense, 'id,text\n' + Array.from({ length: 200 }, (_, i) => `${i},${'w'.repeat(90)}\0`).join('\n'));
    await rejectsUserError(() => openCorpus(dense, {}), dense, null, /looks like a binary file/);
  });

  it('openCorpus: an empty file, and a BOM-only file, are UserErrors', async () => {
    const empty = path.join(dir, 'empty.csv');
    writeFileSync(empty, '');
    await rejectsUserError(() => openCorpus(empty, {}), empty, null, /empty/);
    const bomOnly = path.join(dir, 'bom-only.txt');
    writeFileSync(bomOnly, Buffer.from([0xef, 0xbb, 0xbf]));
    await rejectsUserError(() => openCorpus(bomOnly, {}), bomOnly, null, /empty/);
  });

  it('openCorpus: a file of blank lines has no documents', async () => {
    const file = path.join(dir, 'blank.txt');
    writeFileSync(file, '\n  \r\n\t\n');
    await rejectsUserError(() => openCorpus(file, {}), file, null, /no documents/);
  });

  it('openCorpus: a header-only CSV is "no documents" on the header line', async () => {
    const file = path.join(dir, 'header.csv');
    writeFileSync(file, 'id,text,label\n');
    await rejectsUserError(() => openCorpus(file, {}), file, 1, /no documents/);
  });

  it('openCorpus: a single document is read', async () => {
    const { rows } = await fileRows('one.csv', 'text\nonly one\n');
    assert.deepEqual(rows, [{ text: 'only one', label: null, line: 2 }]);
  });

  it('openCorpus: a missing file and a folder are UserErrors', async () => {
    const missing = path.join(dir, 'nope.csv');
    await rejectsUserError(() => openCorpus(missing, {}), missing, null, /the corpus does not exist/);
    const folder = path.join(dir, 'folder.csv');
    mkdirSync(folder);
    await rejectsUserError(() => openCorpus(folder, {}), folder, null, /is a directory; Loudword reads regular files only/);
  });

  it('openCorpus: an unknown text field lists the available fields', async () => {
    const file = path.join(dir, 'fields.csv');
    writeFileSync(file, 'id,Body\n1,x\n');
    const e = await rejectsUserError(() => openCorpus(file, { textField: 'body' }), file, 1, /no text field "body"/);
    assert.match(e.message, /did you mean "Body".*"id", "Body"/);
    // A number is taken for a position (cut -f counts from 1) and named; past the last column it is a name like any other.
    const byNumber = await rejectsUserError(() => openCorpus(file, { textField: '2' }), file, 1, /no text field "2"/);
    assert.match(byNumber.message, /columns are named, not numbered: column 2 is "Body"/);
    const past = await rejectsUserError(() => openCorpus(file, { textField: '3' }), file, 1, /no text field "3"/);
    assert.doesNotMatch(past.message, /column 3 is/);
  });

  it('openCorpus: JSON Lines with a few broken lines skips them with line and reason', async () => {
    // Source: jsonlines.org — each line is a valid JSON value.
    const { rows, source } = await fileRows('some-broken.jsonl', '{"text":"one"}\n{"text": "two"\n{"text":"three"}\n[1,2]\n{"text":"four"}\n');
    assert.deepEqual(rows.map((r) => r.line), [1, 3, 5]);
    assert.equal(source.skipped.count, 2);
    assert.equal(source.skipped.examples[0]?.line, 2);
    assert.match(source.skipped.examples[0]?.reason ?? '', /not valid JSON/);
    assert.match(source.skipped.examples[1]?.reason ?? '', /array, not an object/);
  });

  it('openCorpus: JSON Lines where most lines are broken is a UserError naming the first bad line', async () => {
    const file = path.join(dir, 'mostly-broken.jsonl');
    writeFileSync(file, '{"text":"ok"}\nnot json\nstill not\n{"text":\n');
    await rejectsUserError(() => openCorpus(file, {}), file, 2, /3 of the first 4 lines.*first bad line 2/);
  });

  it('openCorpus: JSON Lines with an object where the text should be skips it, saying how to name a key inside', async () => {
    const { rows, source } = await fileRows('nested.jsonl', '{"text":{"en":"hi"}}\n{"text":"plain"}\n{"text":42}\n', { textField: 'text' });
    assert.deepEqual(rows.map((r) => r.text), ['plain', '42']);
    assert.match(source.skipped.examples[0]?.reason ?? '', /"text" is an object, not text: name one of its keys with a dot \("field\.key"\)/);
  });

  it('openCorpus: a label that is a list of tags leaves the document without a label, and a note says why', async () => {
    const { rows, source } = await fileRows('tags.jsonl', '{"text":"one","tags":["a","b"]}\n{"text":"two","tags":"a"}\n{"text":"three","tags":[]}\n', { textField: 'text', labelField: 'tags' });
    assert.deepEqual(rows.map((r) => [r.text, r.label]), [['one', null], ['two', 'a'], ['three', null]]);
    assert.equal(source.skipped.count, 0);
    assert.ok((source.notes ?? []).includes('2 documents hold a list in "tags" (the first on line 1), not one label: label precision needs one class per document, so they were reviewed without a label; to measure precision, write each document\'s class in a field of its own'), JSON.stringify(source.notes));
  });

  it('openCorpus: dotted keys reach into nested objects (JSON Lines and a JSON array), own keys only, a literal dotted key first', async () => {
    const lines = [
      { id: 1, doc: { body: 'first text here', lang: 'en' }, meta: { topic: 'a' } },
      { id: 2, doc: { body: 'second text here' }, meta: { topic: 'b' } },
      { id: 3, doc: { body: 'third text' }, meta: {} },
      { id: 4, doc: 'not an object', meta: { topic: 'c' } },
    ];
    for (const [name, content] of [['nested.jsonl', lines.map((l) => JSON.stringify(l)).join('\n') + '\n'], ['nested.json', JSON.stringify(lines, null, 2)]] as const) {
      const { rows, source } = await fileRows(name, content, { labelField: 'meta.topic' });
      assert.equal(source.textField, 'doc.body', 'found by itself among the nested keys');
      assert.deepEqual(rows.map((r) => [r.text, r.label]), [['first text here', 'a'], ['second text here', 'b'], ['third text', null]]);
      assert.match(source.skipped.examples[0]?.reason ?? '', /"doc\.body" is missing/);
    }
    await rejectsUserError(() => fileRows('typo.jsonl', JSON.stringify(lines[0]) + '\n', { labelField: 'meta.topc' }), 'typo.jsonl', null, /no label field "meta\.topc" \(did you mean "meta\.topic"\?\)/);
    // A key that holds a dot is read as it is; a path never reads what the object inherits.
    const { rows } = await fileRows('dotted.jsonl', '{"a.b":"literal words","a":{"b":"nested words"}}\n', { textField: 'a.b' });
    assert.deepEqual(rows.map((r) => r.text), ['literal words']);
    assert.equal(valueAt({ x: {} }, 'x.constructor'), undefined);
    assert.equal(valueAt({ x: { y: 'z' } }, 'x.y.length'), undefined);
    assert.equal(valueAt({ x: { y: 'z' } }, 'x.y'), 'z');
  });

  it('openCorpus: maxBytes on a file cuts it at a record boundary and reports truncated', async () => {
    const { rows, source } = await fileRows('cut.txt', 'first doc\nsecond doc\nthird doc\n', { maxBytes: 15 });
    assert.deepEqual(rows.map((r) => r.text), ['first doc']);
    assert.deepEqual(source.truncated, { bytesRead: 15, limitBytes: 15 });
  });

  it('openCorpus: a 50 MB single line is one document (text) and finishes', async function () {
    this.timeout(120000);
    const file = path.join(dir, 'long.txt');
    await writeLongLine(file, 'word ', 50 * 1024 * 1024, '');
    const source = await openCorpus(file, {});
    let count = 0;
    let length = 0;
    for await (const batch of source.batches()) for (const row of batch) {
      count++;
      length = row.text.length;
    }
    assert.equal(count, 1);
    assert.equal(length, 50 * 1024 * 1024);
    rmSync(file);
  });

  it('openCorpus: a 12 MB CSV line without a line break is a header and "no documents"', async function () {
    this.timeout(120000);
    // 12 MB: past four doublings of the 1 MiB head (open-corpus.ts), with 3 million header fields.
    // At 50 MB (12 million fields) this one check took ~9 s of npm test; the 50 MB text line above
    // still covers a huge record.
    const file = path.join(dir, 'long.csv');
    await writeLongLine(file, 'a,b,', 12 * 1024 * 1024, '');
    await rejectsUserError(async () => readAllRows(await openCorpus(file, {})), file, 1, /no documents/);
    rmSync(file);
  });

  it('openCorpus: a spreadsheet, document, PDF, gzip or Parquet file is named as what it is, with what to do instead', async () => {
    // Signatures: PKWARE ZIP APPNOTE §4.3.7 (local file header 50 4B 03 04; an .xlsx is a ZIP
    // package), ISO 32000-1 §7.5.2 ("%PDF-"), RFC 1952 §2.3.1 (gzip 1F 8B), Microsoft
    // [MS-CFB] §2.2 (D0 CF 11 E0 A1 B1 1A E1: .xls), Apache Parquet ("PAR1").
    const cases: Array<[string, number[], RegExp]> = [
      ['book.xlsx', [0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00], /a ZIP archive \(an \.xlsx.*save a spreadsheet as CSV \(UTF-8\)/],
      ['paper.pdf', [...Buffer.from('%PDF-1.7\n%\xe2\xe3\n1 0 obj << >> endobj\n', 'latin1')], /a PDF, not text: extract its text first/],
      ['corpus.csv', [0x1f, 0x8b, 0x08, 0x00, 0x00, 0x00, 0x00, 0x00], /gzip-compressed, not text: name it with \.gz at the end/],
      ['old.xls', [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0x00], /pre-2007 kind \(\.xls, \.doc\)/],
      ['data.bin', [0x50, 0x41, 0x52, 0x31, 0x15, 0x00], /a Parquet file, not text: name it with \.parquet/],
    ];
    for (const [name, bytes, words] of cases) {
      const file = path.join(dir, name);
      // The PDF case holds no NUL at all: its signature alone marks it.
      writeFileSync(file, Uint8Array.from(bytes));
      await rejectsUserError(() => openCorpus(file, {}), file, null, words);
    }
  });

  it('openCorpus: a corpus compressed by xz, bzip2 or zstd is named, with what to do (Node reads gzip only)', async () => {
    // Files written by the compressors themselves: Debian xz-utils and bzip2 (scripts/ensure-system-packages.sh), zstd where present.
    const text = 'id,text\n1,some words\n2,more words\n';
    const cases: Array<[string, string[], RegExp]> = [
      ['xz', ['-c'], /xz-compressed, not text: decompress it \(xz -dk FILE\), or compress it with gzip instead/],
      ['bzip2', ['-c'], /bzip2-compressed, not text: decompress it \(bunzip2 -k FILE\)/],
      ['zstd', ['-c', '-q'], /Zstandard-compressed, not text: decompress it \(zstd -d FILE\)/],
    ];
    let ran = 0;
    for (const [tool, args, words] of cases) {
      const made = spawnSync(tool, args, { input: text });
      if (made.error !== undefined || made.status !== 0) continue;
      ran++;
      const file = path.join(dir, `corpus-${tool}.csv`);
      writeFileSync(file, made.stdout);
      await rejectsUserError(() => openCorpus(file, {}), file, null, words);
    }
    assert.ok(ran >= 2, 'xz and bzip2 are installed before the tests run');
  });

  it('openCorpusFromText: a NUL character is refused as binary', () => {
    assert.throws(() => openCorpusFromText('buf.txt', 'abc\0def', {}), (e: unknown) => e instanceof UserError && /binary/.test(e.message) && e.file === 'buf.txt');
  });
});

async function writeLongLine(file: string, unit: string, bytes: number, end: string): Promise<void> {
  const out = createWriteStream(file);
  const block = unit.repeat(Math.floor((1024 * 1024) / unit.length));
  let left = bytes;
  while (left > 0) {
    const piece = left >= block.length ? block : block.slice(0, left);
    left -= piece.length;
    if (!out.write(piece)) await new Promise<void>((r) => out.once('drain', () => r()));
  }
  out.end(end);
  await new Promise<void>((r) => out.once('finish', () => r()));
}
