// A practitioner's corpus is often a pandas data frame saved by one of its writers (or put in an
// SQLite database by to_sql). The bundled
// sample (our own invented tickets) is written by pandas (Debian's python3-pandas) in each layout:
// the text ones are read as pandas wrote them, document for document; the others get a message
// that names the layout and how to write it so that it can be read, instead of "not records" or
// "looks like a binary file".
import { strict as assert } from 'node:assert';
import { execFileSync } from 'node:child_process';
import * as path from 'node:path';
import { openCorpus } from '../extension/src/engine/read/open-corpus';
import { isUserError } from '../extension/src/engine/user-error';
import { readAllRows } from './support/read-all-rows';
import { scratchFolder } from './support/scratch-folder';

const SAMPLE = path.join(__dirname, '..', 'samples', 'support-tickets.csv');

describe("pandas' ways of saving a data frame", function () {
  this.timeout(120_000);
  const dir = scratchFolder('loudword-pandas-');
  let messages: string[] = [];

  before(() => {
    const script = [
      'import json, sys, pandas as pd',
      'df = pd.read_csv(sys.argv[1])',
      'out = sys.argv[2]',
      'df.to_csv(out + "/index.csv")',
      'df.to_csv(out + "/tabs.tsv", sep="\\t", index=False)',
      'df.to_json(out + "/records.json", orient="records")',
      'df.to_json(out + "/lines.jsonl", orient="records", lines=True)',
      'df.to_json(out + "/values.json", orient="values")',
      'df.to_json(out + "/table.json", orient="table")',
      'df.to_json(out + "/columns.json")',
      'df["message"].to_json(out + "/series.json")',
      'df.to_pickle(out + "/frame.pkl")',
      'import sqlite3',
      'db = sqlite3.connect(out + "/tickets.db")',
      'df.to_sql("tickets", db, index=False)',
      'db.close()',
      'print(json.dumps([m for m in df["message"]]))',
    ].join('\n');
    messages = JSON.parse(execFileSync('/usr/bin/python3', ['-c', script, SAMPLE, dir()], { encoding: 'utf8', maxBuffer: 64 << 20 })) as string[];
  });

  it('to_csv (with its index column), to_csv with tabs (quoting messages of several lines) and to_json as records: every message as pandas holds it', async () => {
    for (const name of ['index.csv', 'tabs.tsv', 'records.json', 'lines.jsonl']) {
      const source = await openCorpus(path.join(dir(), name), {});
      assert.equal(source.textField, 'message', name);
      const rows = await readAllRows(source);
      assert.deepEqual(rows.map((r) => r.text), messages, name);
      assert.equal(source.skipped.count, 0, name);
    }
  });

  it('the other layouts are named, with how to write records instead', async () => {
    const cases: Array<[string, RegExp]> = [
      ['values.json', /a JSON array of arrays \(rows without field names, as pandas' DataFrame\.to_json\(orient="values"\) writes\).*orient="records"/],
      ['table.json', /pandas' DataFrame\.to_json\(orient="table"\), whose records are under "data".*jq -c '\.data\[\]' table\.json > table\.jsonl/],
      ['columns.json', /pandas' DataFrame\.to_json\(\) without orient="records": write it with orient="records"/],
      ['series.json', /maps (3000 )?keys to strings, as json\.dump of a dict or pandas' Series\.to_json\(\) writes/],
      ['frame.pkl', /a Python pickle \(pandas' to_pickle\), not text: write the data frame as text: df\.to_csv/],
      ['tickets.db', /an SQLite database, not text: export the table that holds the texts as CSV/],
    ];
    for (const [name, words] of cases) {
      await assert.rejects(openCorpus(path.join(dir(), name), {}), (e: unknown) => isUserError(e) && words.test((e as Error).message), name);
    }
  });
});
