import { strict as assert } from 'node:assert';
import { similarityHistograms } from '../extension/src/engine/measures/similarity-histograms';

describe('measures/similarity-histograms', () => {
  it('similarityHistograms bins valid pairs and nearest similarities (hand-checked, 4 bins)', () => {
    // Pairs among valid rows 0, 1, 3: (0,1) = 0.1 → bin 0, (0,3) = 1 → last bin, (1,3) = 0.5 → bin 2.
    // Row 2 is invalid, so its pairs are not counted.
    const m = 4;
    const s = [
      [1, 0.1, 0.9, 1],
      [0.1, 1, 0.3, 0.5],
      [0.9, 0.3, 0, 0.3],
      [1, 0.5, 0.3, 1],
    ];
    const sims = Float64Array.from(s.flat());
    const valid = Uint8Array.from([1, 1, 0, 1]);
    const nearest = Float64Array.from([1, 0.5, NaN, 1]);
    const h = similarityHistograms(sims, m, valid, nearest, 4);
    assert.equal(h.start, 0);
    assert.equal(h.binWidth, 0.25);
    assert.deepEqual(h.pairs, [1, 0, 1, 1]);
    assert.deepEqual(h.nearest, [0, 0, 1, 2]);
  });
});
