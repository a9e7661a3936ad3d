import { strict as assert } from 'node:assert';
import { NO_NEIGHBOR } from '../extension/src/engine/measures/knn';
import { neighborTurnover } from '../extension/src/engine/measures/neighbor-turnover';

describe('measures/neighbor-turnover', () => {
  it('neighborTurnover on a hand-checked case (docs/methods.md §7)', () => {
    // Source: docs/methods.md §7 definition, 1 − mean Jaccard. k = 2.
    // row 0: {1, 2} vs {2, 1} → J = 1; row 1: {0, 2} vs {0, 3} → 1/3;
    // row 2: {0, 1} vs {} → 0; row 3: {} vs {} → skipped. Turnover = 1 − (1 + 1/3 + 0)/3 = 5/9.
    const N = NO_NEIGHBOR;
    const a = Uint32Array.from([1, 2, 0, 2, 0, 1, N, N]);
    const b = Uint32Array.from([2, 1, 0, 3, N, N, N, N]);
    assert.ok(Math.abs(neighborTurnover(a, b, 4, 2)! - 5 / 9) < 1e-15);
    assert.equal(neighborTurnover(a, a, 4, 2), 0);
  });

  it('neighborTurnover is null when no row has neighbours and rejects mismatched shapes', () => {
    const none = new Uint32Array(4).fill(NO_NEIGHBOR);
    assert.equal(neighborTurnover(none, none, 2, 2), null);
    assert.throws(() => neighborTurnover(none, new Uint32Array(2), 2, 2), RangeError);
  });
});
