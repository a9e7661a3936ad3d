// Paired percentile bootstrap behind the verdict's interval. Source: Efron & Tibshirani (1993),
// "An Introduction to the Bootstrap", ch. 13 (percentile interval); the cases below are exact by
// construction, so no outside figure is needed.
import { strict as assert } from 'node:assert';
import { pairedBootstrap } from '../extension/src/engine/terms/paired-bootstrap';
import { mulberry32, randomBelow } from '../extension/src/engine/random/seeded-random';

/** The median interval by its definition: draw each resample, sort it, take the middle (or the mean of the two middle values). */
function medianIntervalBySorting(before: Float64Array, after: Float64Array, draws: number, seed: number): { change: number; low: number; high: number } {
  const keep = [...before.keys()].filter((i) => !Number.isNaN(before[i]!) && !Number.isNaN(after[i]!));
  const a = keep.map((i) => before[i]!);
  const b = keep.map((i) => after[i]!);
  const median = (x: number[]): number => {
    const s = [...x].sort((p, q) => p - q);
    const h = s.length >> 1;
    return s.length % 2 === 1 ? s[h]! : (s[h - 1]! + s[h]!) / 2;
  };
  const random = mulberry32(seed);
  const changes: number[] = [];
  for (let d = 0; d < draws; d++) {
    const picks = a.map(() => randomBelow(random, a.length));
    changes.push(median(picks.map((j) => b[j]!)) - median(picks.map((j) => a[j]!)));
  }
  changes.sort((p, q) => p - q);
  const at = (q: number): number => changes[Math.min(draws - 1, Math.max(0, Math.round(q * (draws - 1))))]!;
  return { change: median(b) - median(a), low: at(0.025), high: at(0.975) };
}

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

  it('pairedBootstrap: the median interval equals sorting every resample, to the bit (ties, NaN, odd and even sizes)', () => {
    for (let t = 0; t < 60; t++) {
      const random = mulberry32(1000 + t);
      const n = 2 + Math.floor(random() * 40) + (t % 10 === 0 ? 500 : 0);
      // Coarse values, so that ties are common.
      const before = Float64Array.from({ length: n }, () => Math.round(random() * 8) / 4);
      const after = Float64Array.from({ length: n }, () => (random() < 0.05 ? Number.NaN : Math.round(random() * 8) / 3));
      const fast = pairedBootstrap(before, after, 'median', 40, t);
      const reference = medianIntervalBySorting(before, after, 40, t);
      if (fast === null) continue;
      assert.deepEqual({ change: fast.change, low: fast.low, high: fast.high }, reference, `case ${t}`);
    }
  });
});
