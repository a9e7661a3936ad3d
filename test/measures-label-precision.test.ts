import { strict as assert } from 'node:assert';
import { labelPrecisionAtK } from '../extension/src/engine/measures/label-precision';
import { NO_NEIGHBOR } from '../extension/src/engine/measures/knn';

describe('measures/label-precision', () => {
  it('labelPrecisionAtK on a hand-checked case (docs/methods.md §7)', () => {
    // Source: docs/methods.md §7 definition. k = 2; labels A A B B −1.
    // row 0 (A): 1 (A), 2 (B) → 1/2; row 1 (A): 0 (A), 4 (−1) → 1/2; row 2 (B): 3 (B), 0 → 1/2;
    // row 3 (B): 2 (B) and an empty slot → 1/1 (empty slots are not counted);
    // row 4 is unlabelled → not a query. Mean (0.5 + 0.5 + 0.5 + 1)/4 = 0.625.
    const labels = Int32Array.from([0, 0, 1, 1, -1]);
    const neighbors = Uint32Array.from([1, 2, 0, 4, 3, 0, 2, NO_NEIGHBOR, 0, 1]);
    assert.equal(labelPrecisionAtK(neighbors, labels, 2), 0.625);
  });

  it('labelPrecisionAtK is null without labelled queries and rejects a mismatched shape', () => {
    assert.equal(labelPrecisionAtK(Uint32Array.from([1, 0]), Int32Array.from([-1, -1]), 1), null);
    assert.throws(() => labelPrecisionAtK(Uint32Array.from([1, 0, 0]), Int32Array.from([0, 0]), 1), RangeError);
  });
});
