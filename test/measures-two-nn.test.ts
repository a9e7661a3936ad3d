import { strict as assert } from 'node:assert';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { twoNN } from '../extension/src/engine/measures/two-nn';
import { allValid, cubeDistances, knnByDistance, torusDistances } from './measures-fixtures';

function estimate(dist: Float64Array, n: number): number {
  const { distances } = knnByDistance(dist, n, 2, allValid(n));
  return twoNN(distances, n, 2)!;
}

describe('measures/two-nn', () => {
  const n = 2000;
  for (const d of [2, 5]) {
    it(`twoNN is within 15% of d = ${d} for a uniform cube rotated into 100 dimensions (n = 2000)`, () => {
      // Source: Facco, d'Errico, Rodriguez & Laio (2017), Scientific Reports 7 (docs/methods.md §6).
      const value = estimate(cubeDistances(d), n);
      assert.ok(Math.abs(value - d) < 0.15 * d, `twoNN = ${value}`);
    });
  }

  it('twoNN underestimates d = 10 in a cube by the boundary effect only (n = 2000)', () => {
    // Source: docs/methods.md §6 says within ~15%; measured here the same formula on scikit-learn 1.2.1
    // NearestNeighbors distances gives 8.5 for the d = 10 cube and 9.93 on the periodic 10-torus
    // (no faces), so the shortfall is the cube's boundary, not the estimator. Hence: the cube
    // within 20% below d, the torus within 15%.
    const cube = estimate(cubeDistances(10), n);
    assert.ok(cube < 10 && cube > 8, `cube twoNN = ${cube}`);
    const torus = estimate(torusDistances(mulberry32(9), n, 10), n);
    assert.ok(Math.abs(torus - 10) < 1.5, `torus twoNN = ${torus}`);
  });

  it('twoNN drops exact duplicates (r1 = 0) and is null when nothing is left', () => {
    // Hand-checked: μ = 2 for rows 0 and 1, row 2 a duplicate → d = 2 / (2 ln 2).
    const nn = Float64Array.from([1, 2, 1, 2, 0, 3]);
    assert.ok(Math.abs(twoNN(nn, 3, 2)! - 1 / Math.log(2)) < 1e-12);
    assert.equal(twoNN(Float64Array.from([0, 1, 0, 1]), 2, 2), null);
  });
});
