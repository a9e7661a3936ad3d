// A table exported without its header row lost its first document as column names, and the text
// column was named by that document's text, without a word. The first record is now read as a
// document when the vote of CPython's csv.Sniffer.has_header (Lib/csv.py) finds evidence of it
// (engine/read/header-votes.ts), with a note. Checked against Debian's python3: complex() on
// strings of every kind the vote meets, has_header on tables written by its csv module, and the
// rows its csv reader reads from the bundled sample (our own invented tickets) without a header.
import { strict as assert } from 'node:assert';
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { headerVotes, readsAsComplex } from '../extension/src/engine/read/header-votes';
import type { ReadOptions } from '../extension/src/engine/read/corpus-source';
import { openCorpus } from '../extension/src/engine/read/open-corpus';
import { isUserError } from '../extension/src/engine/user-error';
import { scratchFolder } from './support/scratch-folder';
import { readAllRows } from './support/read-all-rows';

const SAMPLE = path.join(__dirname, '..', 'samples', 'support-tickets.csv');

function python(script: string, ...args: string[]): string {
  return execFileSync('/usr/bin/python3', ['-c', script, ...args], { encoding: 'utf8', maxBuffer: 64 << 20 });
}

/** The records of a CSV file as Python's csv module reads them. */
function pythonRecords(file: string): string[][] {
  return JSON.parse(python('import csv, json, sys\nprint(json.dumps(list(csv.reader(open(sys.argv[1], newline="", encoding="utf-8")))))', file)) as string[][];
}

describe('a table without its header row', function () {
  this.timeout(60_000);
  const dir = scratchFolder('loudword-headerless-');

  it('readsAsComplex agrees with Python complex() on numbers, blanks, underscores, other scripts and text', () => {
    const values = ['1', '-1', '+1.5', ' 2 ', '1e5', '1E-5', '1_000', '1__0', '_1', '1_', '1.', '.5', '.', 'e5', 'inf', '-Inf', 'infinity', 'nan', 'nanj', 'j', '+j', '2j', '1+2j', '1-2J', '1 + 2j', '(1+2j)', '( 1+2j )', '(1+2j', '()', '1j2', '0x10', '1,000', '12%', 'T100000', '2026-04-25', '', '  ', 'abc', '1e', '١٢', '１２', '1+j', '+.5j', '3.14.15', '007', '\t5\n', '5 j', '((5))', '\u00a05\u2003', '\u200b5', '\x1c5'];
    const expected = JSON.parse(python('import json, sys\nout = []\nfor s in json.loads(sys.argv[1]):\n    try:\n        complex(s); out.append(True)\n    except (ValueError, OverflowError):\n        out.append(False)\nprint(json.dumps(out))', JSON.stringify(values))) as boolean[];
    values.forEach((v, i) => assert.equal(readsAsComplex(v), expected[i], `complex(${JSON.stringify(v)})`));
  });

  it('headerVotes > 0 exactly where csv.Sniffer().has_header says there is a header', () => {
    const records = pythonRecords(SAMPLE);
    const tables: Record<string, string[][]> = {
      'the sample': records.slice(0, 60),
      'the sample without its header': records.slice(1, 60),
      'topic and message only': records.slice(0, 60).map((r) => [r[2]!, r[3]!]),
      'ids and topics, no header': records.slice(1, 60).map((r) => [r[0]!, r[2]!]),
      'a header of numbers over numbers': [['1', '2'], ['3', '4.5'], ['5', '6']],
      'names the length of their values': [['ab', 'xyz'], ['cd', 'uvw'], ['ef', 'rst']],
      'ragged rows left out': [['id', 'text'], ['1', 'a b'], ['2'], ['3', 'c d e']],
    };
    for (const [name, table] of Object.entries(tables)) {
      const file = path.join(dir(), `${name}.csv`);
      python('import csv, json, sys\ncsv.writer(open(sys.argv[1], "w", newline="")).writerows(json.loads(sys.argv[2]))', file, JSON.stringify(table));
      // has_header's vote over the records as written (its own dialect guess is another question, and fails on some of these).
      const sniffer = python('import csv, sys\nclass Known(csv.Sniffer):\n    def sniff(self, sample, delimiters=None):\n        return csv.excel\nprint(Known().has_header(open(sys.argv[1], newline="").read()))', file).trim();
      assert.equal(headerVotes(table[0]!, table.slice(1)) > 0, sniffer === 'True', name);
    }
  });

  it('the sample without its header: every row a document, as Python reads them, with a note; a header is kept where no column can tell', async () => {
    const records = pythonRecords(SAMPLE);
    const file = path.join(dir(), 'no-header.csv');
    python('import csv, json, sys\nrows = list(csv.reader(open(sys.argv[1], newline="", encoding="utf-8")))[1:]\ncsv.writer(open(sys.argv[2], "w", newline="", encoding="utf-8")).writerows(rows)', SAMPLE, file);
    const source = await openCorpus(file, {});
    assert.deepEqual(source.fields, ['column 1', 'column 2', 'column 3', 'column 4']);
    assert.equal(source.textField, 'column 4');
    assert.match((source.notes ?? [])[0] ?? '', /^line 1 reads as a document, not a header: .*"column 1" to "column 4"/);
    const read = await readAllRows(source);
    assert.deepEqual(read.map((r) => r.text), records.slice(1).map((r) => r[3]!.replace(/\r\n?/g, '\n')));
    const labelled = await readAllRows(await openCorpus(file, { labelField: 'column 3' }));
    assert.deepEqual(labelled.map((r) => r.label), records.slice(1).map((r) => r[2]!));
    await assert.rejects(openCorpus(file, { labelField: 'topic' }), (e: unknown) => isUserError(e) && /no label field "topic".*line 1 reads as a document/.test((e as Error).message));

    // Text and label columns alone: no column has one type or length, so the first line stays the header.
    const twoColumns = path.join(dir(), 'topic-message.csv');
    python('import csv, sys\nrows = list(csv.reader(open(sys.argv[1], newline="", encoding="utf-8")))\ncsv.writer(open(sys.argv[2], "w", newline="", encoding="utf-8")).writerows([[r[2], r[3]] for r in rows])', SAMPLE, twoColumns);
    const kept = await openCorpus(twoColumns, {});
    assert.deepEqual(kept.fields, ['topic', 'message']);
    assert.deepEqual(kept.notes ?? [], []);
  });

  it('a first line the text or label setting names is the header, whatever the vote', async () => {
    // "id" is as long as the ids below it: the vote alone would call line 1 a document.
    const file = path.join(dir(), 'short-ids.csv');
    writeFileSync(file, 'id,text\nab,first words here\ncd,more words\nef,the last words\n');
    const opened = async (options: ReadOptions) => openCorpus(file, options);
    assert.deepEqual((await opened({})).fields, ['column 1', 'column 2']);
    for (const options of [{ textField: 'text' }, { labelField: 'id' }] as ReadOptions[]) {
      const source = await opened(options);
      assert.deepEqual(source.fields, ['id', 'text']);
      assert.equal((await readAllRows(source)).length, 3);
    }
  });
});
