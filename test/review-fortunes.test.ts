// The whole review on an open labelled corpus, judged by an outside reference.
// Corpus source: Debian package `fortunes` (12 categories, one label per file). Fortunes is a
// CHECK corpus of the development set (test/corpora/README.md): no constant of the suggestion
// rule was chosen on it, and the review below runs WITHOUT the labels, as most users would.
// Reference: scikit-learn (Debian python3-sklearn) leave-one-out k-NN precision@10 with its own
// TfidfVectorizer defaults, run on the same texts with (a) no stop list, (b) its built-in English
// list, (c) max_df = 0.5, (d) our suggestions — the comparison a practitioner would make.
import { strict as assert } from 'node:assert';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { startReview } from '../extension/src/engine/review/start-review';
import { suggestionLines } from '../extension/src/engine/terms/stop-list-spelling';
import type { ReviewSession } from '../extension/src/engine/review/review-api';
import { readFortunes, type Fortune } from './corpora/fortunes';

describe('startReview on Debian fortunes (labels kept from the review)', function () {
  this.timeout(300_000);
  let dir: string;
  let fortunes: Fortune[];
  let session: ReviewSession;
  let file: string;

  before(async () => {
    fortunes = readFortunes();
    dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-fortunes-'));
    file = path.join(dir, 'fortunes.jsonl');
    writeFileSync(file, fortunes.map((f) => JSON.stringify(f)).join('\n') + '\n');
    session = await startReview({ file, configPath: null, overrides: { text: 'text', label: null, stopList: null } });
  });
  after(() => rmSync(dir, { recursive: true, force: true }));

  it('reads every entry, without labels, and leads with a verdict on neighbour standout', () => {
    const r = session.report;
    assert.equal(r.input.documents, fortunes.length);
    assert.equal(r.input.labelField, null);
    assert.equal(r.baseline.labelPrecisionAtK, null);
    assert.ok(r.suggestions.length > 0);
    assert.ok(r.verdict !== undefined);
    assert.equal(r.verdict.estimate?.measure, 'neighbour standout');
    assert.ok(r.verdict.estimate!.low <= r.verdict.estimate!.change && r.verdict.estimate!.change <= r.verdict.estimate!.high);
    // Counts are written for a reader, thousands grouped, as everywhere else (number-format.ts).
    assert.match(r.verdict.headline, /over \d{1,3}(,\d{3})* sampled documents/);
    assert.doesNotMatch(r.verdict.headline, /\d{4}/);
    console.log(`      fortunes: ${r.suggestions.length} suggestions; verdict: ${r.verdict.headline}`);
  });

  it('suggested measures are what the what-if of the suggestions gives', async () => {
    const again = await session.whatIf(session.report.suggestions);
    assert.equal(again.backgroundSimilarity, session.report.suggested.backgroundSimilarity);
    assert.equal(again.neighborStandout, session.report.suggested.neighborStandout);
    assert.ok(session.report.suggested.backgroundSimilarity < session.report.baseline.backgroundSimilarity);
  });

  it('topic quotations do not read as opinion text, and a negation is explained as a negation', () => {
    assert.doesNotMatch(session.report.verdict.headline, /opinion text/);
    const not = session.report.terms.find((t) => t.term === 'not');
    assert.ok(not !== undefined);
    assert.match(not.why, /negation/);
    assert.doesNotMatch(not.why, /function word/);
  });

  it('the suggestions do not depend on the sample seed (exact statistics), so another seed gives the same list', async () => {
    const other = await startReview({ file, configPath: null, overrides: { text: 'text', label: null, stopList: null, sample: { seed: 7 } } });
    assert.deepEqual([...other.report.suggestions].sort(), [...session.report.suggestions].sort());
  });

  it('scikit-learn leave-one-out precision@10: ours beats no list and is within 0.002 of the better of the English list and max_df 0.5', () => {
    const job = {
      texts: fortunes.map((f) => f.text),
      labels: fortunes.map((f) => f.category),
      k: 10,
      stop_lists: { none: null, english: 'english', maxDf: { max_df: 0.5 }, ours: suggestionLines(session.report) },
    };
    const out = execFileSync('/usr/bin/python3', [path.join(__dirname, 'quality', 'precision_at_k.py')], {
      input: JSON.stringify(job),
      maxBuffer: 1 << 24,
    });
    const p = JSON.parse(out.toString()) as { none: number; english: number; maxDf: number; ours: number };
    console.log(`      scikit-learn LOO precision@10: none ${p.none.toFixed(4)}, English list ${p.english.toFixed(4)}, max_df 0.5 ${p.maxDf.toFixed(4)}, ours ${p.ours.toFixed(4)}`);
    assert.ok(p.ours > p.none, 'ours > no list');
    assert.ok(p.ours >= Math.max(p.english, p.maxDf) - 0.002, 'ours ≥ max(English list, max_df 0.5) − 0.002');
  });
});
