// Paired percentile bootstrap behind the verdict's interval. Source: Efron & Tibshirani (1993),
// "An Introduction to the Bootstrap", ch. 13 (percentile interval); the cases below are exact by
// construction, so no outside figure is needed.
import { strict as assert } from 'node:assert';
import { pairedBootstrap } from '../extension/src/engine/terms/paired-bootstrap';

describe('pairedBootstrap', () => {
  it('pairedBootstrap: a constant shift of every query gives that change with a zero-width interval (mean and median)', () => {
    const before = Float64Array.from([0.1, 0.5, 0.3, 0.9, 0.7]);
    const after = before.map((x) => x + 0.25);
    for (const stat of ['mean', 'median'] as const) {
      const r = pairedBootstrap(before, after, stat, 200, 7)!;
      assert.ok(Math.abs(r.change - 0.25) < 1e-12 && Math.abs(r.low - 0.25) < 1e-12 && Math.abs(r.high - 0.25) < 1e-12, JSON.stringify(r));
    }
  });

  it('pairedBootstrap: NaN queries are left out; fewer than two paired values give no answer', () => {
    const r = pairedBootstrap(Float64Array.from([1, Number.NaN, 3]), Float64Array.from([2, 5, Number.NaN]), 'mean', 50, 1);
    assert.equal(r, null);
    const s = pairedBootstrap(Float64Array.from([1, Number.NaN, 3, 5]), Float64Array.from([2, 5, Number.NaN, 6]), 'mean', 50, 1)!;
    assert.equal(s.queries, 2);
    assert.equal(s.change, 1);
  });

  it('pairedBootstrap: the interval holds the observed change and is the same for the same seed', () => {
    const before = Float64Array.from({ length: 50 }, (_, i) => (i * 37) % 11);
    const after = before.map((x, i) => x + ((i * 13) % 5) - 1);
    const a = pairedBootstrap(before, after, 'mean', 300, 3)!;
    const b = pairedBootstrap(before, after, 'mean', 300, 3)!;
    assert.deepEqual(a, b);
    assert.ok(a.low <= a.change && a.change <= a.high);
  });
});
