import { strict as assert } from 'node:assert';
import { medianOf, quantileSorted, quantilesOf } from '../extension/src/engine/measures/quantile';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';

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

  it('quantilesOf gives quantileSorted of the sorted non-NaN values, to the bit, without sorting (zeros of both signs, infinities, repeats)', () => {
    const random = mulberry32(29);
    const pool = [0, -0, 0, -0, 1, -1, 2.5, 1e-300, -1e-300, Infinity, -Infinity, NaN, 5e-324];
    const qs = [0.5, 0.1, 0.9, 0, 1, 0.25, 0.75];
    let zeros = 0;
    for (const n of [0, 1, 2, 3, 4, 5, 7, 10, 11, 40, 101, 2000]) {
      for (let round = 0; round < 25; round++) {
        const values = Float64Array.from({ length: n }, () => (random() < 0.4 ? pool[Math.floor(random() * pool.length)]! : Math.round((random() - 0.3) * 8) / 4));
        const before = values.slice();
        const sorted = values.filter((v) => !Number.isNaN(v)).sort();
        const got = quantilesOf(values, qs);
        if (sorted.length === 0) {
          assert.equal(got, null);
          continue;
        }
        qs.forEach((q, i) => {
          const want = quantileSorted(sorted, q);
          if (want === 0) zeros++;
          assert.ok(Object.is(got![i], want), `n=${n} round ${round} q=${q}: ${got![i]} against ${want} (${Array.from(sorted).join(',')})`);
        });
        assert.deepEqual(Array.from(values), Array.from(before), 'the input is not reordered');
      }
    }
    assert.ok(zeros > 50, 'zeros of both signs were drawn');
  });
});
