import { strict as assert } from 'node:assert';
import { neighborStandout } from '../extension/src/engine/measures/neighbor-standout';

describe('measures/neighbor-standout', () => {
  it('neighborStandout is the median z-score of the nearest similarity (hand-checked)', () => {
    // Row 0's similarities to others: 0.9, 0.1, 0.2 → mean 0.4, population sd √(0.38/3);
    // z = 0.5/sd. Row 1: 0.9, 0.5, 0.1 → mean 0.5, sd √(0.32/3), z = 0.4/sd.
    // Rows 2 and 3 have equal similarities → no z-score. Median of two = their mean.
    // (Only each row's own similarities are read, so the matrix need not be symmetric here.)
    const s = [
      [1, 0.9, 0.1, 0.2],
      [0.9, 1, 0.5, 0.1],
      [0.3, 0.3, 1, 0.3],
      [0.2, 0.2, 0.2, 1],
    ];
    const sims = Float64Array.from(s.flat());
    const nearest = Float64Array.from([0.9, 0.9, 0.3, 0.2]);
    const z0 = 0.5 / Math.sqrt(0.38 / 3);
    const z1 = 0.4 / Math.sqrt(0.32 / 3);
    const value = neighborStandout(sims, 4, new Uint8Array(4).fill(1), nearest)!;
    assert.ok(Math.abs(value - (z0 + z1) / 2) < 1e-9, `${value}`);
  });

  it('neighborStandout is null when no query has spread', () => {
    const sims = Float64Array.from([1, 0.5, 0.5, 0.5, 1, 0.5, 0.5, 0.5, 1]);
    assert.equal(neighborStandout(sims, 3, new Uint8Array(3).fill(1), Float64Array.from([0.5, 0.5, 0.5])), null);
  });
});
