// JSON Lines whose text is a list of strings — a document kept as its sentences or its tokens, as
// many NLP data sets hold it — had every document skipped ('"sentences" is an array, not text').
// Such a list is now the document: its strings joined by line breaks, with a note. Checked on the
// bundled sample (our own invented tickets) written by Debian's python3: the texts read are
// Python's "\n".join of each list, and a review of the sentences or the tokens (str.split) finds
// the same tokens and terms as a review of the messages themselves.
import { strict as assert } from 'node:assert';
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { openCorpus } from '../extension/src/engine/read/open-corpus';
import { startReview } from '../extension/src/engine/review/start-review';
import { scratchFolder } from './support/scratch-folder';
import { readAllRows } from './support/read-all-rows';

const SAMPLE = path.join(__dirname, '..', 'samples', 'support-tickets.csv');

describe('a text field that holds a list of strings', function () {
  this.timeout(120_000);
  const dir = scratchFolder('loudword-text-lists-');

  /** Writes the sample as JSON Lines with the message as `key`, a list made by `split` (Python); returns each document's "\n".join. */
  function write(file: string, key: string, split: string): string[] {
    const script = [
      'import csv, json, re, sys',
      'rows = list(csv.DictReader(open(sys.argv[1], newline="", encoding="utf-8")))',
      'split = eval("lambda text: " + sys.argv[4])',
      'joined = []',
      'with open(sys.argv[2], "w", encoding="utf-8") as out:',
      '    for r in rows:',
      '        parts = split(r["message"])',
      '        out.write(json.dumps({"id": r["id"], "topic": r["topic"], sys.argv[3]: parts}) + "\\n")',
      '        joined.append("\\n".join(parts))',
      'print(json.dumps(joined))',
    ].join('\n');
    return JSON.parse(execFileSync('/usr/bin/python3', ['-c', script, SAMPLE, file, key, split], { encoding: 'utf8', maxBuffer: 64 << 20 })) as string[];
  }

  it('each document is its strings joined by line breaks, the field found by itself, with a note', async () => {
    const file = path.join(dir(), 'sentences.jsonl');
    const joined = write(file, 'sentences', '[s for s in re.split(r"(?<=[.?!])\\s+", text) if s]');
    const source = await openCorpus(file, {});
    assert.equal(source.textField, 'sentences');
    assert.match((source.notes ?? [])[0] ?? '', /^"sentences" holds lists of strings .* joined by line breaks/);
    assert.deepEqual((await readAllRows(source)).map((r) => r.text), joined);
  });

  it('a review of the sentences or of the tokens counts what a review of the messages counts', async () => {
    const review = async (file: string) => (await startReview({ file, configPath: null, overrides: { label: 'topic', stopList: null } }, { reportOnly: true })).report;
    const whole = await review(SAMPLE);
    for (const [key, split] of [['sentences', '[s for s in re.split(r"(?<=[.?!])\\s+", text) if s]'], ['tokens', 'text.split()']] as const) {
      const file = path.join(dir(), `${key}-review.jsonl`);
      write(file, key, split);
      const listed = await review(file);
      assert.equal(listed.input.documents, whole.input.documents, key);
      assert.deepEqual([listed.vocabulary.terms, listed.vocabulary.tokens, listed.vocabulary.nonzeros], [whole.vocabulary.terms, whole.vocabulary.tokens, whole.vocabulary.nonzeros], key);
    }
  });

  it('a list with more than strings in it, or none, is skipped with its reason', async () => {
    const file = path.join(dir(), 'mixed.jsonl');
    writeFileSync(file, '{"text": ["a first", "document"]}\n{"text": ["a", 2]}\n{"text": []}\n{"text": "plain text"}\n');
    const source = await openCorpus(file, { textField: 'text' });
    assert.deepEqual((await readAllRows(source)).map((r) => r.text), ['a first\ndocument', 'plain text']);
    assert.equal(source.skipped.count, 2);
    assert.match(source.skipped.examples[0]?.reason ?? '', /"text" is a list that holds more than strings, not text/);
    assert.match(source.skipped.examples[1]?.reason ?? '', /"text" is an empty list/);
  });
});
