// Labels that no list can move — a label field that names each document (an identifier) or gives
// all documents one value — make label precision 0 (or 1) with and without the list. The verdict
// then judges by neighbour standout, as without labels, and says why
// (engine/terms/judge-suggestions.ts blindLabels), instead of "no clear change, a larger sample
// would tell". Per-query precisions are made up in the unit checks; the review of the bundled
// sample corpus (our own invented tickets) checks the same through the whole review.
import { strict as assert } from 'node:assert';
import * as path from 'node:path';
import { blindLabels, judgeSuggestions } from '../extension/src/engine/terms/judge-suggestions';
import type { CorpusPrecision } from '../extension/src/engine/terms/corpus-precision';
import { startReview } from '../extension/src/engine/review/start-review';
import { twoLabs } from './support/two-labs';

describe('labels that cannot judge the list: the verdict is by standout, and says why', function () {
  this.timeout(120_000);

  it('blindLabels: only all-0 or all-1 precision with and without the list, NaN left out', () => {
    const f = (...v: number[]) => Float64Array.from(v);
    const ids = Int32Array.from([0, 1, 2, -1]);
    assert.match(blindLabels(f(0, 0, Number.NaN), f(0, Number.NaN, 0), ids) ?? '', /no sampled document has a neighbour with its label, with or without it \(3 values among 3 sampled documents\); .*identifier/);
    assert.match(blindLabels(f(1, 1), f(1, 1), Int32Array.from([4, 4])) ?? '', /every sampled document's neighbours carry its label, with or without it \(1 value among 2 sampled documents\)/);
    assert.equal(blindLabels(f(0, 0.1), f(0, 0), ids), null, 'one neighbour with its label is evidence');
    assert.equal(blindLabels(f(0, 0), f(1, 1), ids), null, 'a list that moves precision from 0 to 1 is judged by the labels');
    assert.equal(blindLabels(f(Number.NaN), f(Number.NaN), ids), null, 'no figure at all is left to the caller');
  });

  it('a verdict over a corpus search with precision 0 everywhere is by standout', () => {
    const { lab, baseline, opening } = twoLabs(3);
    const suggested = lab.measure(opening, baseline.neighbors);
    const m = lab.sampleRows.rows;
    const corpus: CorpusPrecision = { before: new Float64Array(m), after: new Float64Array(m), among: 6000, documents: 6000, queries: m };
    const v = judgeSuggestions({ lab, suggestions: ['t0', 't3'], baseline, suggested, opinion: { share: 0, opinionText: false }, agreedStopped: 0, light: {}, corpus, documents: 6000 });
    assert.equal(v.estimate?.measure, 'neighbour standout');
    assert.equal(v.estimate?.neighborsAmong, undefined);
    assert.match(v.headline, /The labels cannot judge the list/);
    assert.doesNotMatch(v.headline, /larger sample|pass --label/);
  });

  it('the bundled sample reviewed with its ticket id as the label: standout, with the reason; with its topic: precision', async () => {
    const file = path.join(__dirname, '..', 'samples', 'support-tickets.csv');
    const review = async (label: string) => (await startReview({ file, configPath: null, overrides: { label, stopList: null } }, { reportOnly: true })).report.verdict;
    const byId = await review('id');
    assert.equal(byId.estimate?.measure, 'neighbour standout');
    assert.match(byId.headline, /no sampled document has a neighbour with its label, with or without it \(2,000 values among 2,000 sampled documents\)/);
    const byTopic = await review('topic');
    assert.equal(byTopic.estimate?.measure, 'label precision@10');
    assert.doesNotMatch(byTopic.headline, /cannot judge/);
  });
});
