import { strict as assert } from 'node:assert';
import { twoRanks } from '../extension/src/engine/measures/measure-sample-rows';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';

/** The reference: the values at both ranks of a sorted copy (Array.prototype.sort, numeric). */
function bySort(values: number[], r1: number, r2: number): [number, number] {
  const sorted = [...values].sort((a, b) => a - b);
  return [sorted[r1]!, sorted[r2]!];
}

function check(values: number[], r1: number, r2: number, buckets = 64): void {
  const a = Float64Array.from(values);
  const out = new Float64Array(2);
  twoRanks(a, a.length, r1, r2, new Int32Array(buckets), new Float64Array(a.length), out);
  assert.deepEqual(Array.from(out), bySort(values, r1, r2), `ranks ${r1}, ${r2} of ${values.length}`);
  assert.deepEqual(Array.from(a), values, 'the input was reordered');
}

describe('measures/two-ranks (the radius slack\'s k-th and 10k-th distance)', () => {
  it('equals a sort at every pair of ranks on small arrays, with ties, zeros and one far value', () => {
    const random = mulberry32(7);
    for (let trial = 0; trial < 300; trial++) {
      const n = 1 + Math.floor(random() * 40);
      const values = Array.from({ length: n }, () => {
        const u = random();
        // a few exact repeats and zeros (copies of a row), mostly a narrow band, now and then a far value
        return u < 0.15 ? 0 : u < 0.3 ? 1.25 : u < 0.33 ? 40 * random() : 1.2 + 0.1 * random();
      });
      const r1 = Math.floor(random() * n);
      const r2 = r1 + Math.floor(random() * (n - r1));
      check(values, r1, r2, 1 + Math.floor(random() * 70));
    }
  });

  it('equals a sort on rows of distances the size the sweep sees, ranks k − 1 and 10k − 1', () => {
    const random = mulberry32(11);
    for (let trial = 0; trial < 20; trial++) {
      const values = Array.from({ length: 200 + Math.floor(random() * 250) }, () => Math.sqrt(2 - 2 * random() ** 3));
      check(values, 9, 99);
      check(values, 99, 99);
    }
  });

  it('all values equal, and values one ulp apart', () => {
    check([3, 3, 3, 3], 0, 3);
    const tiny = [1, 1 + Number.EPSILON, 1, 1 + 2 * Number.EPSILON, 1 + Number.EPSILON];
    check(tiny, 1, 3);
    check([5e-324, 0, 1e-323, 0], 0, 2);
  });
});
