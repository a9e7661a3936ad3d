import assert from 'node:assert/strict';
import { writeFileSync } from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import Papa from 'papaparse';
import type { CorpusRow, CorpusSource } from '../extension/src/engine/read/corpus-source';
import { openCorpus, openCorpusFromText } from '../extension/src/engine/read/open-corpus';
import { scratchFolder } from './support/scratch-folder';
import { readAllRows } from './support/read-all-rows';

/** Line breaks as an editor counts them (CRLF, CR, LF). */
function lineBreaks(s: string): number {
  return (s.match(/\r\n|\r|\n/g) ?? []).length;
}

let generatedCases = 0;

describe('openCorpusFromText', () => {
  it('openCorpusFromText reads a CSV header, quoted multi-line fields and their start lines', async () => {
    // Source: RFC 4180 §2 — fields with line breaks, commas or quotes are enclosed in double
    // quotes, and a quote inside is written twice.
    const csv = 'id,text,topic\n1,"first line\nsecond line",billing\n2,"say ""hi"", then go",\n3,plain,login\n';
    const source = openCorpusFromText('t.csv', csv, { labelField: 'topic' });
    const rows = await readAllRows(source);
    assert.deepEqual(source.fields, ['id', 'text', 'topic']);
    assert.equal(source.textField, 'text');
    assert.deepEqual(rows, [
      { text: 'first line\nsecond line', label: 'billing', line: 2 },
      { text: 'say "hi", then go', label: null, line: 4 },
      { text: 'plain', label: 'login', line: 5 },
    ]);
  });

  it('openCorpusFromText picks the text column with the longest mean text when none is named', async () => {
    const csv = 'id,body,score\n1,the cat sat on the mat,0.5\n2,a dog barked at the moon,0.25\n';
    const source = openCorpusFromText('t.csv', csv, {});
    assert.equal(source.textField, 'body');
  });

  it('openCorpusFromText passes over a longer column of one-token values (URLs, slugs) for the text, but not text without spaces', async () => {
    // A news export (our own rows): the url is longer than the title, and one token of a kind the tokenizer does not keep.
    const news = 'id,url,title\n1,https://example.org/news/2026/12/05/the-cat-sat-on-the-mat,the cat sat on the mat\n2,https://example.org/news/2026/12/05/a-dog-barked-at-the-moon,a dog barked\n';
    assert.equal(openCorpusFromText('n.csv', news, {}).textField, 'title');
    // Chinese is written without spaces: still text, and the longest.
    const zh = 'id,slug,body\n1,cat-mat,猫坐在垫子上，看着窗外的雨。\n2,dog-moon,狗对着月亮叫了一整夜。\n';
    assert.equal(openCorpusFromText('z.csv', zh, {}).textField, 'body');
    // With nothing but one-token columns, the longest of them.
    const only = 'id,url\n1,https://example.org/a\n2,https://example.org/b\n';
    assert.equal(openCorpusFromText('u.csv', only, {}).textField, 'url');
  });

  it('openCorpusFromText sniffs ; | and TAB delimiters in a .csv', async () => {
    for (const d of [';', '|', '\t']) {
      const csv = ['id', 'text', 'label'].join(d) + '\n' + ['1', 'one, two, three', 'a'].join(d) + '\n' + ['2', 'four, five', 'b'].join(d) + '\n';
      const source = openCorpusFromText('t.csv', csv, { labelField: 'label' });
      assert.equal(source.delimiter, d);
      const rows = await readAllRows(source);
      assert.deepEqual(rows.map((r) => r.text), ['one, two, three', 'four, five']);
    }
  });

  it('openCorpusFromText reads JSON Lines and converts numeric labels', async () => {
    // Source: jsonlines.org — one JSON value per line.
    const jsonl = '{"id":1,"text":"alpha beta","y":3}\n\n{"id":2,"text":"gamma","y":null}\n';
    const rows = await readAllRows(openCorpusFromText('t.jsonl', jsonl, { labelField: 'y' }));
    assert.deepEqual(rows, [
      { text: 'alpha beta', label: '3', line: 1 },
      { text: 'gamma', label: null, line: 3 },
    ]);
  });

  it('openCorpusFromText reads plain text as one document per line, skipping blank lines', async () => {
    const source = openCorpusFromText('notes.txt', 'one doc\r\n\r\n  \ntwo doc\rthree\n', {});
    assert.equal(source.format, 'text');
    const rows = await readAllRows(source);
    assert.deepEqual(rows, [
      { text: 'one doc', label: null, line: 1 },
      { text: 'two doc', label: null, line: 4 },
      { text: 'three', label: null, line: 5 },
    ]);
  });

  it('openCorpusFromText sniffs the format of a file without a known extension', () => {
    assert.equal(openCorpusFromText('data', '{"text":"a b"}\n', {}).format, 'jsonl');
    assert.equal(openCorpusFromText('data', 'a\tb\n1\tx y\n2\tz w\n', {}).format, 'tsv');
    assert.equal(openCorpusFromText('data', 'id,text\n1,x y\n2,z w\n', {}).format, 'csv');
    assert.equal(openCorpusFromText('data', 'Hello, world.\nNo commas here\nAnd, here, three\n', {}).format, 'text');
  });

  it('openCorpusFromText lets format override the extension', () => {
    assert.equal(openCorpusFromText('t.txt', 'id,text\n1,x\n', { format: 'csv' }).format, 'csv');
  });

  it('batches yields batches of the requested size and starts a fresh pass each time', async () => {
    const text = Array.from({ length: 25 }, (_, i) => `document ${i}`).join('\n');
    const source = openCorpusFromText('t.txt', text, {});
    const sizes: number[] = [];
    for await (const b of source.batches(10)) sizes.push(b.length);
    assert.deepEqual(sizes, [10, 10, 5]);
    assert.equal((await readAllRows(source)).length, 25);
  });

  it('maxBytes cuts the input, drops the unfinished record and says so', async () => {
    const text = 'aaaa\nbbbb\ncccc\n';
    const source = openCorpusFromText('t.txt', text, { maxBytes: 12 });
    const rows = await readAllRows(source);
    assert.deepEqual(rows.map((r) => r.text), ['aaaa', 'bbbb']);
    assert.deepEqual(source.truncated, { bytesRead: 12, limitBytes: 12 });
  });
});

describe('openCorpus (files)', () => {
  const dir = scratchFolder('loudword-read-');

  it('openCorpus streams a file in small chunks with the same rows as one read', async () => {
    const body = 'id,text\n' + Array.from({ length: 300 }, (_, i) => `${i},"héllo ${i}\r\nwörld 😀 ${i}"`).join('\r\n') + '\r\n';
    const file = path.join(dir(), 'chunks.csv');
    writeFileSync(file, body, 'utf8');
    const whole = await readAllRows(await openCorpus(file, {}));
    for (const chunkBytes of [1, 2, 3, 7, 64]) {
      const small = await readAllRows(await openCorpus(file, { chunkBytes }));
      assert.deepEqual(small, whole, `chunkBytes ${chunkBytes}`);
    }
    assert.equal(whole.length, 300);
    // Each record spans two lines after the header: record i starts on line 2 + 2i.
    assert.equal(whole[299]?.line, 2 + 2 * 299);
    assert.equal(whole[0]?.text, 'héllo 0\nwörld 😀 0');
  });

  it('property: tables written by Papa.unparse read back with the same texts, labels and start lines', async () => {
    const cell = fc.string({
      unit: fc.oneof(fc.constantFrom('a', 'Z', ' ', ',', ';', '"', '\n', '\r\n', '\r', '\t', 'é', '日', '😀', '#'), fc.string({ unit: 'grapheme', maxLength: 1 })),
      maxLength: 12,
    });
    const table = fc.array(fc.record({ id: fc.nat(999), text: cell, label: cell }), { minLength: 1, maxLength: 12 });
    let fileNo = 0;
    await fc.assert(
      fc.asyncProperty(table, fc.constantFrom('\n', '\r\n'), fc.integer({ min: 1, max: 40 }), fc.boolean(), async (rows, newline, chunkBytes, onDisk) => {
        generatedCases++;
        // Source: RFC 4180 (written by papaparse's unparse, an independent implementation of it).
        // Line breaks inside fields come back as LF: the reader normalises CRLF/CR (by design).
        const csv = Papa.unparse({ fields: ['id', 'text', 'label'], data: rows.map((r) => [String(r.id), r.text, r.label]) }, { newline });
        const expected: CorpusRow[] = [];
        let blankTexts = 0;
        let line = 2;
        for (const r of rows) {
          if (r.text.trim() === '') blankTexts++;
          else {
            expected.push({ text: r.text.replace(/\r\n?/g, '\n'), label: r.label === '' ? null : r.label.replace(/\r\n?/g, '\n'), line });
          }
          line += lineBreaks(r.text) + lineBreaks(r.label) + 1;
        }
        const options = { textField: 'text', labelField: 'label', chunkBytes };
        if (expected.length === 0) return; // all texts blank: covered by the "no documents" case
        let source: CorpusSource;
        if (onDisk) {
          const file = path.join(dir(), `prop-${fileNo++}.csv`);
          writeFileSync(file, csv, 'utf8');
          source = await openCorpus(file, options);
        } else source = openCorpusFromText('prop.csv', csv, options);
        const got = await readAllRows(source, 5);
        assert.deepEqual(got, expected);
        // An empty text is skipped with a reason, never silently dropped.
        assert.equal(source.skipped.count, blankTexts);
      }),
      { numRuns: 300, seed: 42 },
    );
  });

  after(() => console.log(`      read property cases generated: ${generatedCases}`));
});
