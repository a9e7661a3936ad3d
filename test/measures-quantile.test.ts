import { strict as assert } from 'node:assert';
import { medianOf, quantileSorted } from '../extension/src/engine/measures/quantile';

describe('measures/quantile', () => {
  it('quantileSorted matches NumPy’s default (linear) quantiles', () => {
    // Source: numpy 1.24.2 (Debian, /usr/bin/python3): np.quantile([1, 2, 4, 8, 16],
    // [0.1, 0.5, 0.9, 0.25]) → [1.4, 4, 12.8, 2].
    const sorted = [1, 2, 4, 8, 16];
    const expected = [1.4, 4, 12.8, 2];
    [0.1, 0.5, 0.9, 0.25].forEach((q, i) => assert.ok(Math.abs(quantileSorted(sorted, q) - expected[i]!) < 1e-12));
    assert.ok(Number.isNaN(quantileSorted([], 0.5)));
  });

  it('medianOf copies before sorting and honours count', () => {
    // Source: np.median([3, 1, 2, 10]) → 2.5 (numpy 1.24.2).
    const values = Float64Array.from([3, 1, 2, 10, 99]);
    assert.equal(medianOf(values, 4), 2.5);
    assert.deepEqual(Array.from(values), [3, 1, 2, 10, 99]);
  });
});
