// A .txt file whose lines are tab-separated columns — a spreadsheet saved as "Unicode text" is
// one: UTF-16 with a byte-order mark, tab-separated, a header row — was read one document a
// line, header and all, with the id and topic columns in every document's text, and nothing
// said. Now it stays plain text (its name says so) with a note on how to read it as a table,
// and is read as TSV when the text or label setting names one of its first line's columns. The
// file is the bundled sample (our own invented tickets) written by Python's csv module with its
// "excel-tab" dialect in UTF-16 (Debian's python3), which also counts the records.
import { strict as assert } from 'node:assert';
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import * as path from 'node:path';
import type { ReadOptions } from '../extension/src/engine/read/corpus-source';
import { openCorpus } from '../extension/src/engine/read/open-corpus';
import { scratchFolder } from './support/scratch-folder';
import { readAllRows } from './support/read-all-rows';

const SAMPLE = path.join(__dirname, '..', 'samples', 'support-tickets.csv');

describe('a .txt file of tab-separated columns', function () {
  this.timeout(60_000);
  const dir = scratchFolder('loudword-tab-text-');
  let file = '';
  let records = 0;

  before(() => {
    file = path.join(dir(), 'tickets export.txt');
    const script = [
      'import csv, sys',
      'rows = list(csv.reader(open(sys.argv[1], newline="", encoding="utf-8")))',
      'w = csv.writer(open(sys.argv[2], "w", newline="", encoding="utf-16"), dialect="excel-tab")',
      'w.writerows(rows)',
      'print(len(rows) - 1)',
    ].join('\n');
    records = Number(execFileSync('/usr/bin/python3', ['-c', script, SAMPLE, file], { encoding: 'utf8' }).trim());
  });

  const open = (options: ReadOptions) => openCorpus(file, options);

  it('read as lines, as its name says, with a note naming the columns and how to read it as a table', async () => {
    const source = await open({});
    assert.equal(source.format, 'text');
    const notes = source.notes ?? [];
    assert.equal(notes.length, 1, JSON.stringify(notes));
    assert.match(notes[0]!, /^every line holds 4 tab-separated fields \(the first line: "id", "received", "topic", "message"\).*--input-format tsv/);
  });

  it('read as TSV when the label or text setting names one of its columns, every record as Python wrote it', async () => {
    for (const options of [{ labelField: 'topic' }, { textField: 'message' }] as ReadOptions[]) {
      const source = await open(options);
      assert.equal(source.format, 'tsv');
      assert.equal(source.textField, 'message');
      assert.match((source.notes ?? [])[0] ?? '', /tab-separated with a header row \("id", "received", "topic", "message"\).*read as TSV/);
      const read = await readAllRows(source);
      assert.equal(read.length + source.skipped.count, records);
      assert.equal(source.skipped.count, 0);
    }
  });

  it('no note when the user chose plain text, or when the lines are prose with a stray tab', async () => {
    assert.deepEqual((await open({ format: 'text' })).notes ?? [], []);
    const prose = path.join(dir(), 'prose.txt');
    writeFileSync(prose, 'A line of prose.\nAnother\twith a tab in it.\nA third line.\nAnd a fourth.\n');
    assert.deepEqual((await openCorpus(prose, {})).notes ?? [], []);
  });
});
