// The verdict's headline and estimate say how the corpus was searched (engine/terms/judge-suggestions.ts):
// all sampled documents among all documents, or a seeded subset of them when the search of the
// whole corpus for all would cost too much (corpus-precision.ts). Per-query precisions are made up
// here (the search itself is checked against scikit-learn in measures-corpus-neighbors.test.ts);
// the rows are generated text-like rows (test/support, common practice, no source).
import { strict as assert } from 'node:assert';
import { judgeSuggestions } from '../extension/src/engine/terms/judge-suggestions';
import type { CorpusPrecision } from '../extension/src/engine/terms/corpus-precision';
import { twoLabs } from './support/two-labs';

describe('the verdict names how the corpus was searched for the sampled documents\' neighbours', () => {
  const { lab, baseline, opening } = twoLabs(3);
  const suggested = lab.measure(opening, baseline.neighbors);
  const m = lab.sampleRows.rows;
  /** Precision 0.5 before and 0.6 after for the searched positions (every `step`-th), NaN for the others. */
  function corpus(step: number): CorpusPrecision {
    const before = new Float64Array(m).fill(Number.NaN);
    const after = new Float64Array(m).fill(Number.NaN);
    let queries = 0;
    for (let q = 0; q < m; q += step, queries++) {
      before[q] = 0.5;
      after[q] = q % 3 === 0 ? 0.7 : 0.6;
    }
    return { before, after, among: 6000, documents: 6000, queries };
  }
  const judge = (c: CorpusPrecision) =>
    judgeSuggestions({ lab, suggestions: ['t0', 't3'], baseline, suggested, opinion: { share: 0, opinionText: false }, agreedStopped: 0, light: {}, corpus: c, documents: 6000 });

  it('all sampled documents: the interval is over them, no word of a subset', () => {
    const v = judge(corpus(1));
    assert.equal(v.estimate?.neighborsFor, m);
    assert.equal(v.estimate?.neighborsAmong, 6000);
    assert.match(v.headline, new RegExp(`over ${m} sampled documents, their neighbours sought among all 6,000 documents`));
    assert.doesNotMatch(v.headline, /drawn at random/);
  });

  it('a subset: the interval is over the subset, and the headline says why it is one', () => {
    const c = corpus(4);
    const v = judge(c);
    assert.equal(v.estimate?.neighborsFor, c.queries);
    assert.ok(c.queries < m);
    assert.match(v.headline, new RegExp(`over ${c.queries} sampled documents, drawn at random from the ${m} \\(a search of the corpus for all of them would cost too much\\), their neighbours sought among all 6,000 documents`));
    assert.equal(v.outcome, 'helps', 'every searched document gains');
    assert.ok(Math.abs(v.estimate!.change - (0.6 + 0.1 / 3 - 0.5)) < 0.02, `change ${v.estimate!.change}`);
  });
});
