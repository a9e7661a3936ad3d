import { strict as assert } from 'node:assert';
import { NO_NEIGHBOR } from '../extension/src/engine/measures/knn';
import { neighborTurnover } from '../extension/src/engine/measures/neighbor-turnover';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';

/** The definition as first written: each of A's entries searched for among B's k (the reference). */
function searchedTurnover(a: Uint32Array, b: Uint32Array, m: number, k: number): number | null {
  let sum = 0;
  let rows = 0;
  for (let i = 0; i < m; i++) {
    let sizeA = 0;
    let sizeB = 0;
    let common = 0;
    for (let r = 0; r < k; r++) {
      if (b[i * k + r] !== NO_NEIGHBOR) sizeB++;
      const x = a[i * k + r]!;
      if (x === NO_NEIGHBOR) continue;
      sizeA++;
      for (let s = 0; s < k; s++) {
        if (b[i * k + s] === x) {
          common++;
          break;
        }
      }
    }
    const union = sizeA + sizeB - common;
    if (union === 0) continue;
    sum += common / union;
    rows++;
  }
  return rows === 0 ? null : 1 - sum / rows;
}

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

  it('neighborTurnover gives the value of the searched definition, to the bit, on lists with repeats, gaps and positions past m', () => {
    const random = mulberry32(17);
    for (const [m, k, spread] of [[40, 5, 8], [300, 10, 300], [25, 7, 40], [1, 3, 2]] as const) {
      for (let round = 0; round < 20; round++) {
        // spread > m puts positions past m in the lists (never in a sample's, but the answer must not change).
        const list = () => Uint32Array.from({ length: m * k }, () => (random() < 0.15 ? NO_NEIGHBOR : Math.floor(random() * spread)));
        const a = list();
        const b = round % 3 === 0 ? a.slice() : list();
        const got = neighborTurnover(a, b, m, k);
        const want = searchedTurnover(a, b, m, k);
        assert.ok(Object.is(got, want), `m=${m} k=${k} round ${round}: ${got} against ${want}`);
        assert.ok(Object.is(neighborTurnover(b, a, m, k), searchedTurnover(b, a, m, k)));
      }
    }
  });
});
