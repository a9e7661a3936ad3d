// Issue 13, "Silent wrong results": two CSV columns of the same name read the first without a
// note; a 70 MB first record made text-field detection pick `id`; JSON Lines keys named
// `constructor` or `toString` were read from Object.prototype; a TSV field starting with an inch
// mark ("Best" pizza) failed the whole file as an unclosed quote. Sources: RFC 4180 (CSV
// quoting), IANA text/tab-separated-values (no quoting in TSV), ECMA-262 (Object.prototype's
// constructor/toString are inherited by every object JSON.parse makes).
import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { detectLayout, tsvUsesQuotes } from '../../extension/src/engine/read/corpus-layout';
import type { CorpusRow, CorpusSource, ReadOptions } from '../../extension/src/engine/read/corpus-source';
import { openCorpus } from '../../extension/src/engine/read/open-corpus';

describe('bad input: fields and columns are read as written', () => {
  let dir: string;
  beforeEach(() => (dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-fields-'))));
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  async function read(name: string, text: string, options: ReadOptions = {}): Promise<{ rows: CorpusRow[]; source: CorpusSource }> {
    const file = path.join(dir, name);
    writeFileSync(file, text);
    const source = await openCorpus(file, options);
    const rows: CorpusRow[] = [];
    for await (const b of source.batches()) rows.push(...b);
    return { rows, source };
  }

  it('two columns of the same name: a note names both columns', async () => {
    const { source } = await read('dup.csv', 'id,text,text\n1,first words here,second words\n2,more first words,more second\n', { textField: 'text' });
    assert.match((source.notes ?? []).join(' | '), /columns 2 and 3 are both named "text" \(the text field\); only column 2 is read/);
  });

  it('a first record longer than the head: the field the head ends inside is the text field, not the first column', () => {
    const head = 'id,text,topic\n1,"' + 'word '.repeat(2000); // the head stops inside the text field
    const layout = detectLayout('big.csv', head, false, {});
    assert.equal(layout.textField, 'text');
    assert.equal(layout.sampled, 0);
  });

  it('…and when the head ends inside the label column, the user is asked to name the text field', () => {
    const head = 'id,topic\n1,' + 'x'.repeat(5000);
    assert.throws(() => detectLayout('big.csv', head, false, { labelField: 'topic' }), /first record is too long to sample.*text setting/);
  });

  it('JSON Lines keys named constructor, toString and __proto__ are plain fields', async () => {
    const lines = [
      { constructor: 'printer jams again', toString: 'hw', __proto__x: 1 },
      { constructor: 'password reset fails', toString: 'auth' },
      { other: 'no constructor key here' },
      { constructor: 'refund not received' },
    ].map((o) => JSON.stringify(o));
    lines.push('{"__proto__": "a proto text", "constructor": "and a constructor text", "toString": "x"}');
    const { rows, source } = await read('keys.jsonl', lines.join('\n') + '\n', { textField: 'constructor', labelField: 'toString' });
    assert.deepEqual(rows.map((r) => [r.text, r.label]), [
      ['printer jams again', 'hw'],
      ['password reset fails', 'auth'],
      ['refund not received', null],
      ['and a constructor text', 'x'],
    ]);
    assert.equal(source.skipped.count, 1);
    assert.match(source.skipped.examples[0]!.reason, /"constructor" is missing/);
    const proto = await read('proto.jsonl', '{"__proto__": "text under proto", "id": 1}\n{"__proto__": "more text", "id": 2}\n', { textField: '__proto__' });
    assert.deepEqual(proto.rows.map((r) => r.text), ['text under proto', 'more text']);
  });

  it('TSV: a field starting with an inch mark is text, and the rows after it are read', async () => {
    const { rows, source } = await read('menu.tsv', 'id\ttext\n1\t"Best" pizza in town\n2\ta 12" pizza\n3\tplain text\n');
    assert.deepEqual(rows.map((r) => r.text), ['"Best" pizza in town', 'a 12" pizza', 'plain text']);
    assert.match((source.notes ?? []).join(' '), /TSV read without quoting/);
  });

  it('TSV that does quote its fields (a spreadsheet export with a tab and a line break inside) is still read quoted', async () => {
    const { rows } = await read('quoted.tsv', 'id\ttext\n1\t"has\ta tab"\n2\t"two\nlines"\n3\t"say ""hi"""\n');
    assert.deepEqual(rows.map((r) => r.text), ['has\ta tab', 'two\nlines', 'say "hi"']);
    assert.equal(tsvUsesQuotes('a\t"Best" pizza\n'), false);
    assert.equal(tsvUsesQuotes('a\t"x"\n'), true);
  });

  it('TSV whose only quoted fields span lines (messages of several lines in a spreadsheet export) is read quoted; a lone quote in plain TSV is not quoting', async () => {
    const { rows, source } = await read('messages.tsv', 'id\ttext\n1\t"Good morning,\nmy order is late.\nThanks"\n2\tone line\n3\t"Hello,\n""where"" is it?"\n');
    assert.deepEqual(rows.map((r) => r.text), ['Good morning,\nmy order is late.\nThanks', 'one line', 'Hello,\n"where" is it?']);
    assert.equal(source.skipped.count, 0);
    // A lone quote opening a field, closed only by a quote lines later: read with quoting, the
    // records in between would lose their field count, so it stays unquoted.
    const lone = 'id\ttext\n1\t"a lone quote\n2\tplain\n3\tplain\n4\tplain\n5\tends here"\n6\tlast\n';
    assert.equal(tsvUsesQuotes(lone), false);
  });

  it('a first line "sep=;" (a spreadsheet\'s delimiter line) sets the delimiter and is no record, with or without a .csv name', async () => {
    for (const name of ['excel.csv', 'excel-export']) {
      const { rows, source } = await read(name, 'sep=;\r\nid;topic;text\r\n1;a;first, with a comma\r\n2;b;second\r\n');
      assert.deepEqual(rows, [
        { text: 'first, with a comma', label: null, line: 3 },
        { text: 'second', label: null, line: 4 },
      ]);
      assert.deepEqual(source.fields, ['id', 'topic', 'text']);
      assert.match((source.notes ?? [])[0] ?? '', /^line 1, "sep=;" \(a spreadsheet's delimiter line\), set the delimiter/);
    }
  });
});
