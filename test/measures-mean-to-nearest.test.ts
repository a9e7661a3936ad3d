import { strict as assert } from 'node:assert';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { meanToNearest } from '../extension/src/engine/measures/mean-to-nearest';
import { allValid, euclideanDistances, gaussianPoints } from './measures-fixtures';

describe('measures/mean-to-nearest', () => {
  it('meanToNearest on a hand-checked line', () => {
    // Points 0, 1, 3: D_mean = 2, 1.5, 2.5 (mean 2); D_min = 1, 1, 2 (mean 4/3) → 1.5.
    const x = [0, 1, 3];
    const dist = Float64Array.from(x.flatMap((a) => x.map((b) => Math.abs(a - b))));
    assert.ok(Math.abs(meanToNearest(dist, 3, allValid(3))! - 1.5) < 1e-12);
    // The point at 3 made invalid: pair (0, 1) only → D_mean = D_min → 1.
    assert.equal(meanToNearest(dist, 3, Uint8Array.from([1, 1, 0])), 1);
  });

  it('meanToNearest falls towards 1 as the dimension grows (iid normal, d = 2 vs 100)', () => {
    // Source: He, Kumar & Chang (2012), ICML — C_r = E[D_mean]/E[D_min] decreases with
    // dimensionality (docs/methods.md §4).
    const n = 300;
    const c2 = meanToNearest(euclideanDistances(gaussianPoints(mulberry32(2), n, 2), n, 2), n, allValid(n))!;
    const c100 = meanToNearest(euclideanDistances(gaussianPoints(mulberry32(3), n, 100), n, 100), n, allValid(n))!;
    assert.ok(c2 > c100 && c100 > 1 && c100 < 1.5, `C_r(2) = ${c2}, C_r(100) = ${c100}`);
  });

  it('meanToNearest is null when all points coincide', () => {
    assert.equal(meanToNearest(new Float64Array(9), 3, allValid(3)), null);
  });
});
