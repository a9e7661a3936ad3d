// The verdict's "Also:" sentences (caveatsOf, engine/terms/judge-suggestions.ts) explain measures
// that moved the unhealthy way. A sentence whose two printed figures are the same ("Relative
// contrast fell (0.11 → 0.11)", seen on a corpus of log lines) contradicts the table's
// "unchanged": it is only said where the printed figures differ.
import { strict as assert } from 'node:assert';
import { caveatsOf } from '../extension/src/engine/terms/judge-suggestions';
import type { Measures } from '../extension/src/protocol';
import { distinctMeasures } from './reference/distinct-measures';

function measures(contrast: number, background: number, standout: number, precision: number): Measures {
  return { ...distinctMeasures(), contrast: { median: contrast, p10: 0.01, p90: 0.5 }, backgroundSimilarity: background, neighborStandout: standout, labelPrecisionAtK: precision };
}

const named = (before: Measures, after: Measures): string[] => caveatsOf(before, after).map((c) => c.measure);

describe('verdict caveats: said only where the printed figures moved', () => {
  it('a fall or rise too small to print is not explained', () => {
    assert.deepEqual(named(measures(0.113, 0.06541, 3.801, 0.5), measures(0.112, 0.06542, 3.804, 0.49)), []);
  });

  it('a fall or rise that prints is explained, each with its figures', () => {
    const caveats = caveatsOf(measures(0.113, 0.065, 3.8, 0.5), measures(0.09, 0.07, 3.9, 0.49));
    assert.deepEqual(caveats.map((c) => c.measure), ['relative contrast', 'background similarity', 'neighbour standout']);
    assert.match(caveats[0]!.sentence, /fell \(0\.11 → 0\.09\)/);
    assert.match(caveats[1]!.sentence, /rose \(0\.065 → 0\.070\)/);
  });

  it('a sample too small for its k is said first; 2,000 documents for k = 10 are not', () => {
    const small = (documents: number, k: number): Measures => ({ ...measures(0.1, 0.05, 3, 0.5), sample: { documents, k, seed: 1 } });
    const caveats = caveatsOf(small(12, 10), { ...measures(0.05, 0.05, 3, 0.5), sample: { documents: 12, k: 10, seed: 1 } });
    assert.deepEqual(caveats.map((c) => c.measure), ['sample', 'relative contrast']);
    assert.match(caveats[0]!.sentence, /^Only 12 sampled documents for k = 10: each one's neighbours are 91% of the others/);
    assert.deepEqual(named(small(51, 10), small(51, 10)), []);
    assert.deepEqual(named(small(50, 10), small(50, 10)), ['sample']);
    assert.deepEqual(named(small(2000, 10), small(2000, 10)), []);
  });
});
