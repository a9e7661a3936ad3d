// A corpus as a JSON array of records (`.json`): the documents, labels and start lines, checked
// against Python's own json module, and the clear messages for what is not such an array.
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import type { ReadOptions } from '../extension/src/engine/read/corpus-source';
import { JsonArraySplitter } from '../extension/src/engine/read/json-array-splitter';
import { openCorpus, openCorpusFromText } from '../extension/src/engine/read/open-corpus';
import { UserError } from '../extension/src/engine/user-error';
import { scratchFolder } from './support/scratch-folder';
import { readAllRows } from './support/read-all-rows';

async function rejects(fn: () => Promise<unknown> | unknown, line: number | null, words: RegExp): Promise<void> {
  try {
    await fn();
  } catch (e) {
    assert.ok(e instanceof UserError, `expected a UserError, got ${String(e)}`);
    assert.equal(e.line, line, e.message);
    assert.match(e.message, words);
    return;
  }
  assert.fail('expected a UserError');
}

/** Python's reading of a JSON file (Debian python3, its json module): [body, topic] per record. */
function pythonRecords(file: string): Array<[string, string | null]> {
  const script = 'import json,sys\nrecords=json.load(open(sys.argv[1],encoding="utf-8"))\njson.dump([[r["body"], r.get("topic")] for r in records], sys.stdout)';
  return JSON.parse(execFileSync('/usr/bin/python3', ['-c', script, file], { encoding: 'utf8' })) as Array<[string, string | null]>;
}

/** Text that tests the splitter: brackets, braces, commas, quotes, backslashes, escapes, emoji. */
const trickyText = fc
  .array(fc.constantFrom('word', ' ', '[', ']', '{', '}', ',', '"', '\\', '\\"', 'é', '😀', '\t', '\n', '\u2028', 'a b', '"]}'), { minLength: 1, maxLength: 12 })
  .map((parts) => `x ${parts.join('')}`);

const record = fc.record({
  id: fc.integer(),
  body: trickyText,
  topic: fc.option(fc.constantFrom('a', 'b', 'c'), { nil: null }),
  extra: fc.oneof(fc.constant(null), fc.array(fc.integer(), { maxLength: 3 }), fc.record({ nested: fc.constantFrom('[', '{', '"') })),
});

describe('a corpus as a JSON array of records', () => {
  const dir = scratchFolder('loudword-json-');

  it('reads the same documents and labels as Python’s json module, compact or indented, in chunks of any size', async () => {
    let run = 0;
    await fc.assert(
      fc.asyncProperty(fc.array(record, { minLength: 1, maxLength: 25 }), fc.constantFrom(undefined, 2), fc.integer({ min: 1, max: 64 }), async (records, indent, chunkBytes) => {
        const file = path.join(dir(), `r${run++}.json`);
        writeFileSync(file, JSON.stringify(records, null, indent));
        const expected = pythonRecords(file);
        const rows = await readAllRows(await openCorpus(file, { textField: 'body', labelField: 'topic', chunkBytes }));
        assert.deepEqual(
          rows.map((r) => [r.text, r.label]),
          expected.map(([body, topic]) => [body, topic]),
        );
      }),
      { numRuns: 40, seed: 7 },
    );
  });

  it('gives each record the line its element starts on, so hubs and errors point at it', async () => {
    const records = [{ body: 'one two' }, { body: 'three\nfour', topic: 'x' }, { body: 'five' }];
    const text = JSON.stringify(records, null, 2);
    const rows = await readAllRows(openCorpusFromText('t.json', text, {}));
    const lines = text.split('\n');
    const starts = lines.flatMap((l, i) => (l === '  {' ? [i + 1] : []));
    assert.deepEqual(
      rows.map((r) => r.line),
      starts,
    );
    assert.deepEqual(
      rows.map((r) => r.text),
      ['one two', 'three\nfour', 'five'],
    );
  });

  it('finds the text key by itself, as for JSON Lines', () => {
    const source = openCorpusFromText('t.json', JSON.stringify([{ id: 1, body: 'a long enough text here' }, { id: 2, body: 'another text of words' }]), {});
    assert.equal(source.format, 'json');
    assert.equal(source.textField, 'body');
  });

  it('reads an array of strings (json.dump of a list of texts) as one document per string', async () => {
    const source = openCorpusFromText('t.json', '["first text", "second \\"quoted\\" text", 3, "  "]', {});
    const rows = await readAllRows(source);
    assert.deepEqual(
      rows.map((r) => r.text),
      ['first text', 'second "quoted" text'],
    );
    assert.deepEqual(
      source.skipped.examples.map((s) => s.reason),
      ['a JSON number in an array of strings', 'an empty string'],
    );
  });

  it('reads one JSON object a line under a .json name (pandas to_json lines=True) as JSON Lines, with a note', async () => {
    const source = openCorpusFromText('t.json', '{"body":"one text"}\n{"body":"two texts"}\n', {});
    assert.equal(source.format, 'jsonl');
    assert.match((source.notes ?? []).join(' '), /one JSON object a line: read as JSON Lines/);
    assert.equal((await readAllRows(source)).length, 2);
  });

  it('skips an element that is not an object, with its line, and keeps the rest', async () => {
    const source = openCorpusFromText('t.json', '[\n{"body":"one"},\n[1, 2],\n{"body":"two"},\n{"body":"three"}\n]', {});
    const rows = await readAllRows(source);
    assert.deepEqual(
      rows.map((r) => r.text),
      ['one', 'two', 'three'],
    );
    assert.deepEqual(source.skipped.examples, [{ line: 3, reason: 'a JSON array, not an object' }]);
  });

  it('says where the records are when the file holds one object wrapping them', async () => {
    const file = path.join(dir(), 'wrapped.json');
    writeFileSync(file, JSON.stringify({ data: [{ body: 'x' }], meta: { n: 1 } }, null, 2));
    await rejects(() => openCorpus(file, {}), 1, /a single JSON object, not records.*"data" \(1 items\).*jq -c '\.data\[\]' wrapped\.json > wrapped\.jsonl/);
  });

  it("names pandas' other layouts (to_json's default columns, orient split) and how to write records instead", async () => {
    for (const layout of [{ body: { '0': 'a', '1': 'b' }, topic: { '0': 'x', '1': 'y' } }, { columns: ['body'], index: [0, 1], data: [['a'], ['b']] }]) {
      await rejects(() => openCorpusFromText('frame.json', JSON.stringify(layout), {}), 1, /pandas' DataFrame\.to_json\(\) without orient="records": write it with orient="records"/);
    }
  });

  it('names a mapping of ids to texts (json.dump of a dict, compact or indented) and how to write it one record a line', async () => {
    const script = 'import json, sys\ntexts = {f"doc{i}": f"text number {i}, a few words" for i in range(40)}\njson.dump(texts, open(sys.argv[1], "w"), indent=None if sys.argv[2] == "0" else 2)';
    for (const indent of ['0', '2']) {
      const file = path.join(dir(), `by-id-${indent}.json`);
      execFileSync('/usr/bin/python3', ['-c', script, file, indent]);
      await rejects(() => openCorpus(file, {}), 1, new RegExp(`a single JSON object, not records.*maps 40 keys to strings.*jq -c 'to_entries\\[\\] \\| \\{id: \\.key, text: \\.value\\}' by-id-${indent}\\.json > by-id-${indent}\\.jsonl`));
    }
    // A record of a few string fields on one line stays a record (JSON Lines under a .json name).
    const record = path.join(dir(), 'one-record.json');
    writeFileSync(record, JSON.stringify({ id: 'a', title: 'short', body: 'the text of the one record' }));
    assert.equal((await readAllRows(await openCorpus(record, {}))).length, 1);
  });

  it('names the line of what breaks the array: a missing comma, text after it, a file that ends inside it, an empty array', async () => {
    await rejects(() => readAllRows(openCorpusFromText('t.json', '[\n{"body":"one"}\n{"body":"two"}\n]', {})), 3, /^"\{\\"body\\":\\"two" after the element that starts on line 2, where a comma or the array's "\]" should be/);
    await rejects(() => readAllRows(openCorpusFromText('t.json', '[{"body":"one"}]\n[{"body":"two"}]', {})), 2, /after the JSON array's closing "\]"/);
    await rejects(() => readAllRows(openCorpusFromText('t.json', '[{"body":"one"},\n{"body":"two"', {})), 2, /the file ends inside the element that starts on line 2/);
    await rejects(() => openCorpusFromText('t.json', '[ ]', {}), null, /no documents: the JSON array is empty/);
    await rejects(() => openCorpusFromText('t.json', '"just a string"', {}), 1, /not a JSON array of documents/);
  });

  it('sniffs a JSON array in a file without an extension, but not a log line that opens with a bracket', () => {
    assert.equal(openCorpusFromText('data', '[\n  {"body": "a b"}\n]\n', {}).format, 'json');
    assert.equal(openCorpusFromText('data', '[{"body": "a b"}]', {}).format, 'json');
    assert.equal(openCorpusFromText('data', '[INFO] started\n[WARN] slow disk\n', {}).format, 'text');
  });

  it('skips an element longer than the bound without holding it, and goes on', () => {
    const seen: Array<[string, number]> = [];
    const tooLong: Array<[number, number]> = [];
    const splitter = new JsonArraySplitter('t.json', 20, (line, chars) => tooLong.push([line, chars]));
    const emit = (text: string, line: number): void => void seen.push([text, line]);
    for (const chunk of ['[{"body":"short"},\n{"body":"', 'a much longer text than twenty"},\n', '{"body":"ok"}]']) splitter.push(chunk, emit);
    splitter.end(emit, false);
    assert.deepEqual(seen, [
      ['{"body":"short"}', 1],
      ['{"body":"ok"}', 3],
    ]);
    assert.deepEqual(tooLong, [[2, 41]]);
  });

  it('leaves options it cannot use aside with a note on an array of strings', () => {
    const options: ReadOptions = { textField: 'body' };
    assert.match((openCorpusFromText('t.json', '["a text"]', options).notes ?? []).join(' '), /array of strings has no fields/);
  });
});
