// The column picker's previews and which review errors offer it (issue 10 part 2; the CSV
// reading is papaparse's, RFC 4180 quoting; common practice, no source).
import { strict as assert } from 'node:assert';
import { columnPreviews, missingFieldRole } from '../extension/src/host/pure/column-previews';
import { noTermsLeftMessage } from '../extension/src/engine/matrix/prune-terms';

describe('columnPreviews', () => {
  it('columnPreviews lists CSV columns with their first values, quotes and line breaks handled', () => {
    const csv = 'id,topic,body\n1,billing,"The invoice, twice"\n2,login,"Password\nreset"\n3,,x\n';
    assert.deepEqual(columnPreviews(csv, 'csv'), [
      { name: 'id', samples: ['1', '2', '3'] },
      { name: 'topic', samples: ['billing', 'login'] },
      { name: 'body', samples: ['The invoice, twice', 'Password reset', 'x'] },
    ]);
  });

  it('columnPreviews reads TSV and JSON Lines keys, shortening long values', () => {
    assert.deepEqual(columnPreviews('a\tb\n1\t2\n', 'tsv'), [
      { name: 'a', samples: ['1'] },
      { name: 'b', samples: ['2'] },
    ]);
    const long = 'w'.repeat(100);
    const got = columnPreviews(`{"text":"${long}","n":3}\nnot json\n{"text":"b"}\n`, 'jsonl');
    assert.equal(got[0]!.name, 'text');
    assert.equal(got[0]!.samples[0]!.length, 60);
    assert.ok(got[0]!.samples[0]!.endsWith('…'));
    assert.deepEqual(got[1], { name: 'n', samples: ['3'] });
  });

  it('columnPreviews reads the keys of a JSON array cut anywhere, indented or not', () => {
    const records = [
      { id: 1, body: 'first [text]', meta: { a: 1 } },
      { id: 2, body: 'second "text"' },
      { id: 3, body: 'third' },
    ];
    for (const indent of [undefined, 2]) {
      const text = JSON.stringify(records, null, indent);
      const cut = text.slice(0, text.indexOf('third') + 2);
      assert.deepEqual(columnPreviews(cut, 'json'), [
        { name: 'id', samples: ['1', '2'] },
        { name: 'body', samples: ['first [text]', 'second "text"'] },
        { name: 'meta', samples: ['{"a":1}'] },
        { name: 'meta.a', samples: ['1'] },
      ]);
    }
  });

  it('missingFieldRole tells the missing-field errors from the others', () => {
    assert.equal(missingFieldRole('no label field "topic"; available: "id", "text"'), 'label');
    assert.equal(missingFieldRole('no text column "body"; available: "a"'), 'text');
    assert.equal(missingFieldRole('found no column with text; name one with the text setting (columns: a)'), 'text');
    assert.equal(missingFieldRole('unclosed quote'), null);
    // The same errors once blameSetting says where the setting came from (a parent loudword.json, a flag, an editor setting).
    assert.equal(missingFieldRole('label "topic": no such field in /w/sub/tickets.csv; available: "ref", "category", "body"'), 'label');
    assert.equal(missingFieldRole('text "message": no such field in /w/sub/tickets.csv; available: "ref"'), 'text');
    assert.equal(missingFieldRole('--text "body" (command-line flag): no such field in c.csv; available: "a"'), 'text');
    assert.equal(missingFieldRole('loudword.labelField "topic" (editor setting): no such field in c.csv; available: "a"'), 'label');
    assert.equal(missingFieldRole('sample.k 5: must be a whole number'), null);
    // A text field that gave no terms, with other fields to choose (the engine's own message).
    assert.equal(missingFieldRole(noTermsLeftMessage('url', ['url', 'title'], 0)), 'text');
    assert.equal(missingFieldRole(noTermsLeftMessage('body', ['body'], 12)), null, 'no other field to offer');
  });
});
