import { strict as assert } from 'node:assert';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { iidEquivalentDimension, pairDistanceCv } from '../extension/src/engine/measures/iid-equivalent-dimension';
import { allValid, euclideanDistances, gaussianPoints } from './measures-fixtures';

describe('measures/iid-equivalent-dimension', () => {
  const n = 400;
  const d = 100;
  const dist = euclideanDistances(gaussianPoints(mulberry32(100), n, d), n, d);

  it('pairDistanceCv of squared distances ≈ √(2/d) = 0.1414 for iid normal points, d = 100', () => {
    // Source: docs/methods.md §4 — ‖x − y‖² = 2·χ²_d, mean 2d, variance 8d, so CV = √(2/d)
    // (chi-square distribution, textbook). Pairs share points, so allow 10%.
    const cv = pairDistanceCv(dist, n, allValid(n), 2)!;
    assert.ok(Math.abs(cv - Math.sqrt(2 / d)) < 0.1 * Math.sqrt(2 / d), `cv = ${cv}`);
  });

  it('iidEquivalentDimension is within 15% of d for iid normal points, d = 100', () => {
    // Source: docs/methods.md §4 — CV of distances ≈ 1/√(2d), so d_eq = 1/(2·CV²) ≈ d.
    const deq = iidEquivalentDimension(dist, n, allValid(n))!;
    assert.ok(Math.abs(deq - d) < 0.15 * d, `d_eq = ${deq}`);
  });

  it('iidEquivalentDimension grows with d (d = 10 well below d = 100)', () => {
    // Source: docs/methods.md §4 (same chi-square argument).
    const dist10 = euclideanDistances(gaussianPoints(mulberry32(10), n, 10), n, 10);
    const deq10 = iidEquivalentDimension(dist10, n, allValid(n))!;
    assert.ok(Math.abs(deq10 - 10) < 0.2 * 10, `d_eq(10) = ${deq10}`);
  });

  it('iidEquivalentDimension ignores invalid rows and is null when no pair remains', () => {
    // Hand-checked points on a line; the row at 100 is marked invalid and must not count.
    const x = [0, 100, 1, 2];
    const dl = Float64Array.from(x.flatMap((a) => x.map((b) => Math.abs(a - b))));
    const valid = Uint8Array.from([1, 0, 1, 1]);
    // Valid pair distances 1, 2, 1: mean 4/3, population sd √(2/9) → CV = √2/4.
    assert.ok(Math.abs(pairDistanceCv(dl, 4, valid)! - Math.SQRT2 / 4) < 1e-12);
    assert.equal(iidEquivalentDimension(dl, 4, Uint8Array.from([1, 0, 0, 0])), null);
  });
});
