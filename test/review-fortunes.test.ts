// The whole review on an open labelled corpus, judged by an outside reference.
// Corpus source: Debian package `fortunes` (12 categories, one label per file).
// Reference: scikit-learn (Debian python3-sklearn) leave-one-out k-NN precision@10 with its own
// TfidfVectorizer defaults, run on the same texts with (a) no stop list, (b) its built-in English
// list, (c) our suggestions — the comparison a practitioner would make in a notebook.
import { strict as assert } from 'node:assert';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { startReview } from '../extension/src/engine/review/start-review';
import type { ReviewSession } from '../extension/src/engine/review/review-api';
import { readFortunes, type Fortune } from './corpora/fortunes';

describe('startReview on Debian fortunes (labelled by category)', function () {
  this.timeout(240_000);
  let dir: string;
  let fortunes: Fortune[];
  let session: ReviewSession;

  before(async () => {
    fortunes = readFortunes();
    dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-fortunes-'));
    const file = path.join(dir, 'fortunes.jsonl');
    writeFileSync(file, fortunes.map((f) => JSON.stringify(f)).join('\n') + '\n');
    session = await startReview({ file, configPath: null, overrides: { text: 'text', label: 'category', stopList: null } });
  });
  after(() => rmSync(dir, { recursive: true, force: true }));

  it('reads every entry and reports precision@10 for both settings', () => {
    const r = session.report;
    assert.equal(r.input.documents, fortunes.length);
    assert.equal(r.input.labelField, 'category');
    assert.equal(typeof r.baseline.labelPrecisionAtK, 'number');
    assert.equal(typeof r.suggested.labelPrecisionAtK, 'number');
    console.log(`      fortunes: precision@10 ${r.baseline.labelPrecisionAtK!.toFixed(4)} → ${r.suggested.labelPrecisionAtK!.toFixed(4)} with ${r.suggestions.length} suggestions`);
  });

  it('suggested list: precision@10 on the sample is not below that with no list', () => {
    assert.ok(session.report.suggestions.length > 0);
    assert.ok(session.report.suggested.labelPrecisionAtK! >= session.report.baseline.labelPrecisionAtK!);
  });

  it('suggested measures show the gain they claim: what-if of the suggestions equals `suggested`', () => {
    const again = session.whatIf(session.report.suggestions);
    assert.equal(again.backgroundSimilarity, session.report.suggested.backgroundSimilarity);
    assert.equal(again.neighborStandout, session.report.suggested.neighborStandout);
    assert.ok(session.report.suggested.backgroundSimilarity < session.report.baseline.backgroundSimilarity);
  });

  it('negations stay out of the suggestions (protected by default)', () => {
    for (const negation of ['not', 'no', 'never']) assert.ok(!session.report.suggestions.includes(negation), negation);
  });

  it('scikit-learn leave-one-out precision@10: ours beats no list and is at least its English list', () => {
    const job = {
      texts: fortunes.map((f) => f.text),
      labels: fortunes.map((f) => f.category),
      k: 10,
      stop_lists: { none: null, english: 'english', ours: session.report.suggestions },
    };
    const out = execFileSync('/usr/bin/python3', [path.join(__dirname, 'quality', 'precision_at_k.py')], {
      input: JSON.stringify(job),
      maxBuffer: 1 << 24,
    });
    const p = JSON.parse(out.toString()) as { none: number; english: number; ours: number };
    console.log(`      scikit-learn LOO precision@10: none ${p.none.toFixed(4)}, English list ${p.english.toFixed(4)}, ours ${p.ours.toFixed(4)}`);
    assert.ok(p.ours > p.none, 'ours > no list');
    assert.ok(p.ours >= p.english, 'ours ≥ English list');
  });
});
