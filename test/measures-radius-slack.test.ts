import { strict as assert } from 'node:assert';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { radiusSlack, radiusSlackPerQuery } from '../extension/src/engine/measures/radius-slack';
import { allValid, torusDistances } from './measures-fixtures';

function lineDistances(x: number[]): Float64Array {
  return Float64Array.from(x.flatMap((a) => x.map((b) => Math.abs(a - b))));
}

describe('measures/radius-slack', () => {
  it('radiusSlackPerQuery on an evenly spaced line (hand-checked)', () => {
    // Points 0..40, query 20, k = 2: neighbours at 1, 1, 2, 2, … so r_2 = 1 and r_20 = 10
    // → slack (10 − 1)/1 = 9.
    const x = [...Array(41).keys()];
    const slack = radiusSlackPerQuery(lineDistances(x), 41, allValid(41), 2);
    assert.equal(slack[20], 9);
  });

  it('radiusSlackPerQuery uses the farthest row when the sample holds fewer than 10k others', () => {
    // Points 0..4, query 0, k = 1: r_1 = 1; only 4 others (< 10) → r = 4 → slack 3.
    const slack = radiusSlackPerQuery(lineDistances([0, 1, 2, 3, 4]), 5, allValid(5), 1);
    assert.equal(slack[0], 3);
  });

  it('radiusSlackPerQuery skips invalid queries, duplicates (r_k = 0) and too few others', () => {
    const dist = lineDistances([0, 0, 5]);
    const slack = radiusSlackPerQuery(dist, 3, Uint8Array.from([1, 1, 0]), 1);
    assert.ok(slack.every((v) => Number.isNaN(v)));
    assert.equal(radiusSlack(dist, 3, Uint8Array.from([1, 1, 0]), 1), null);
  });

  for (const d of [2, 3]) {
    it(`radiusSlack median ≈ 10^(1/d) − 1 for points uniform on the flat ${d}-torus (k = 10)`, () => {
      // Source: the count within radius r grows like r^d in d dimensions (volume of a ball;
      // common practice, no source), so r_10k/r_k = 10^(1/d). No boundary on a torus.
      const n = 1500;
      const dist = torusDistances(mulberry32(300 + d), n, d);
      const expected = Math.pow(10, 1 / d) - 1;
      const median = radiusSlack(dist, n, allValid(n), 10)!.median;
      assert.ok(Math.abs(median - expected) < 0.15 * expected, `median ${median} vs ${expected}`);
    });
  }
});
