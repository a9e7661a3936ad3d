// The self-consistency requirements for suggestions, on the demo corpus (samples/, made
// by scripts/make-sample.mjs): the same list for every sample seed (Jaccard ≥ 0.9 asked; exact
// statistics give 1), adding one suggested term by hand changes ≤ 5% of the rest (0 here), and a
// second review after applying suggests ≤ 5% more and raises no stop-list warning on the terms
// just added. Source of the thresholds: the project's issue 9 ("Done when"); no outside figure.
import { strict as assert } from 'node:assert';
import * as path from 'node:path';
import { startReview } from '../extension/src/engine/review/start-review';
import type { Report } from '../extension/src/protocol';
import { stopListFindings } from '../extension/src/host/pure/stop-list-findings';
import { suggestionLines } from '../extension/src/engine/terms/stop-list-spelling';

const CORPUS = path.join(__dirname, '..', 'samples', 'support-tickets.csv');

async function review(stopListText: string, seed = 1): Promise<Report> {
  const session = await startReview({
    file: CORPUS,
    configPath: null,
    stopListText,
    overrides: { text: 'message', label: 'topic', sample: { documents: 400, seed } },
  });
  return session.report;
}

describe('suggestions are self-consistent (demo corpus)', function () {
  this.timeout(240_000);
  let first: Report;
  before(async () => {
    first = await review('');
  });

  it('startReview: another sample seed gives the same suggestions', async () => {
    const other = await review('', 5);
    assert.ok(first.suggestions.length > 0);
    assert.deepEqual([...other.suggestions].sort(), [...first.suggestions].sort());
  });

  it('startReview: stopping one suggested term by hand leaves every other suggestion as it was', async () => {
    const byHand = first.suggestions[Math.floor(first.suggestions.length / 2)]!;
    const after = await review(`${byHand}\n`);
    assert.deepEqual([...after.suggestions].sort(), first.suggestions.filter((t) => t !== byHand).sort());
  });

  it('startReview: after applying, the second review suggests nothing new and no added term is flagged', async () => {
    // What `loudword apply` writes: the terms, then the pieces of contractions ("isn" for "is" + "not").
    const list = suggestionLines(first).join('\n') + '\n';
    assert.ok(Object.keys(first.suggestionPieces ?? {}).length > 0);
    const second = await review(list);
    assert.deepEqual(second.suggestions, []);
    assert.deepEqual(second.stopList.unused, [], 'a piece of a contraction is not an entry that never occurs');
    assert.deepEqual(second.suggestionPieces, {});
    assert.equal(second.verdict?.outcome, 'nothing suggested');
    assert.match(second.verdict.headline, new RegExp(`^Nothing more to suggest: the ${first.suggestions.length} terms the rule would pick are already on the stop list`));
    const findings = stopListFindings(list, second).filter((f) => f.kind === 'neighborSignal');
    assert.deepEqual(findings.map((f) => f.term), []);
    for (const t of second.terms.filter((row) => row.status === 'stopped')) assert.equal(t.ruleWouldSuggest, true, t.term);
  });

  it('startReview: the verdict leads with label precision when labels are given, with an interval around its change', () => {
    const v = first.verdict!;
    assert.equal(v.estimate?.measure, 'label precision@10');
    assert.ok(v.estimate!.low <= v.estimate!.change && v.estimate!.change <= v.estimate!.high);
    assert.match(v.headline, /held out/);
  });
});
