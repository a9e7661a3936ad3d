import { strict as assert } from 'node:assert';
import { labelChances, labelPrecisionAtK, samplePrecision } from '../extension/src/engine/measures/label-precision';
import { NO_NEIGHBOR } from '../extension/src/engine/measures/knn';

describe('measures/label-precision', () => {
  it('labelPrecisionAtK on a hand-checked case (docs/methods.md §7)', () => {
    // Source: docs/methods.md §7 definition. k = 2; labels A A B B −1 (pool of 5).
    // A missing neighbour counts the chance that another document of the pool carries the
    // query's label: counts A = 2, B = 2, so (2 − 1)/(5 − 1) = 0.25 for either.
    // row 0 (A): 1 (A), 2 (B) → 1/2; row 1 (A): 0 (A), 4 (−1, a miss) → 1/2; row 2 (B): 3 (B), 0 → 1/2;
    // row 3 (B): 2 (B) and an empty slot → (1 + 0.25)/2 = 0.625;
    // row 4 is unlabelled → not a query. Mean (0.5 + 0.5 + 0.5 + 0.625)/4 = 0.53125.
    const labels = Int32Array.from([0, 0, 1, 1, -1]);
    const neighbors = Uint32Array.from([1, 2, 0, 4, 3, 0, 2, NO_NEIGHBOR, 0, 1]);
    const sims = Float64Array.from([0.9, 0.5, 0.9, 0.2, 0.7, 0.1, 0.7, Number.NaN, 0.3, 0.2]);
    assert.equal(labelPrecisionAtK({ neighbors, sims }, labels, 2), 0.53125);
    // A listed neighbour at similarity 0 shares no term: it is a slot a library fills in its own
    // order, so it counts the chance too. Row 0's second neighbour (2, B) at 0: (1 + 0.25)/2.
    const zero = sims.slice();
    zero[1] = 0;
    assert.equal(labelPrecisionAtK({ neighbors, sims: zero }, labels, 2), (0.625 + 0.5 + 0.5 + 0.625) / 4);
  });

  it('a document with no neighbour counts the chance of a random one, as a k-NN library filling its list at similarity 0 would', () => {
    // Labels A A A B (pool 4), k = 3. Row 3 (B) has no neighbour: chance (1 − 1)/3 = 0.
    // Row 0 (A) has one neighbour (1, A) and two empty slots at (3 − 1)/3 each: (1 + 4/3)/3 = 7/9.
    // Rows 1 and 2 (A) have all three filled: 1 (A), 2 (A), 3 (B) → 2/3; 0 (A), 1 (A), 3 (B) → 2/3.
    const N = NO_NEIGHBOR;
    const labels = Int32Array.from([0, 0, 0, 1]);
    const neighbors = Uint32Array.from([1, N, N, 0, 2, 3, 0, 1, 3, N, N, N]);
    const sims = Float64Array.from(neighbors, (j) => (j === N ? Number.NaN : 0.5));
    const knn = { neighbors, sims };
    const per = samplePrecision(knn, labels, 3);
    assert.deepEqual(Array.from(per, (v) => Math.round(v * 1e12) / 1e12), [Math.round((7 / 9) * 1e12) / 1e12, Math.round((2 / 3) * 1e12) / 1e12, Math.round((2 / 3) * 1e12) / 1e12, 0]);
    // The mean counts the document without neighbours (it used to be left out, which favoured
    // lists that strip documents of their neighbours).
    assert.ok(Math.abs(labelPrecisionAtK(knn, labels, 3)! - (7 / 9 + 2 / 3 + 2 / 3 + 0) / 4) < 1e-12);
  });

  it('labelChances: (count − 1)/(pool − 1), an unlabelled document in the pool but no label', () => {
    const chance = labelChances(['a', 'a', 'b', null, 'a']);
    assert.equal(chance('a'), 2 / 4);
    assert.equal(chance('b'), 0);
    assert.equal(labelChances(['a'])('a'), 0);
  });

  it('labelPrecisionAtK is null without labelled queries and rejects a mismatched shape', () => {
    assert.equal(labelPrecisionAtK({ neighbors: Uint32Array.from([1, 0]), sims: Float64Array.from([1, 1]) }, Int32Array.from([-1, -1]), 1), null);
    assert.throws(() => labelPrecisionAtK({ neighbors: Uint32Array.from([1, 0, 0]), sims: new Float64Array(3) }, Int32Array.from([0, 0]), 1), RangeError);
  });
});
