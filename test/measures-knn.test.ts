import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { knnFromSimilarities, neighborDistances, NO_NEIGHBOR, TIE_TOLERANCE } from '../extension/src/engine/measures/knn';
import { sampleSimilarities } from '../extension/src/engine/measures/sample-similarity';
import { denseToCsr, knnByDistance, randomUnitRows } from './measures-fixtures';

function gramOf(rows: number[][]): Float64Array {
  return sampleSimilarities(denseToCsr(rows), Uint32Array.from(rows.keys()));
}

describe('measures/knn', () => {
  it('knnFromSimilarities matches a full sort with ties to the lower position', () => {
    // Source: definition of k-NN; reference = stable sort of each row (common practice, no source).
    const rows = randomUnitRows(mulberry32(3), 50, 6, 0.5, 11).map((r) => r.map((v) => Math.round(v * 4) / 4));
    // Rounding creates many ties; renormalise so the diagonal stays 1 for non-empty rows.
    const unit = rows.map((r) => {
      const n = Math.hypot(...r);
      return n > 0 ? r.map((v) => v / n) : r;
    });
    const m = unit.length;
    const k = 5;
    const sims = gramOf(unit);
    const { neighbors, sims: best } = knnFromSimilarities(sims, m, k);
    for (let i = 0; i < m; i++) {
      const empty = unit[i]!.every((v) => v === 0);
      const candidates = [...Array(m).keys()].filter((j) => j !== i && !unit[j]!.every((v) => v === 0));
      // Values within TIE_TOLERANCE are ties (knn.ts); none sit near that gap here, so a plain
      // comparison that rounds such gaps to ties is a fair reference.
      const gap = (a: number, b: number) => sims[i * m + b]! - sims[i * m + a]!;
      candidates.sort((a, b) => (Math.abs(gap(a, b)) <= TIE_TOLERANCE ? a - b : gap(a, b)));
      for (let r = 0; r < k; r++) {
        if (empty) {
          assert.equal(neighbors[i * k + r], NO_NEIGHBOR);
          assert.ok(Number.isNaN(best[i * k + r]));
        } else {
          assert.equal(neighbors[i * k + r], candidates[r], `row ${i} rank ${r}`);
          assert.equal(best[i * k + r], sims[i * m + candidates[r]!]);
        }
      }
    }
  });

  it('knnFromSimilarities never lists the row itself, nor an empty row (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e6 }), fc.integer({ min: 2, max: 25 }), fc.integer({ min: 1, max: 8 }), (seed, n, k) => {
        const rows = randomUnitRows(mulberry32(seed), n, 5, 0.5, 4);
        const sims = gramOf(rows);
        const { neighbors, sims: best } = knnFromSimilarities(sims, n, k);
        for (let i = 0; i < n; i++) {
          for (let r = 0; r < k; r++) {
            const j = neighbors[i * k + r]!;
            assert.notEqual(j, i);
            if (j !== NO_NEIGHBOR) assert.ok(rows[j]!.some((v) => v !== 0));
            if (r > 0 && j !== NO_NEIGHBOR) assert.ok(best[i * k + r - 1]! >= best[i * k + r]!);
          }
        }
      }),
      { numRuns: 100 },
    );
  });

  it('knnFromSimilarities pads with NO_NEIGHBOR when the sample is smaller than k + 1', () => {
    const sims = gramOf([[1, 0], [0.6, 0.8], [0, 1]]);
    const { neighbors } = knnFromSimilarities(sims, 3, 4);
    // Hand-checked: row 0's cosines are 0.6 (row 1) and 0 (row 2).
    assert.deepEqual(Array.from(neighbors.slice(0, 4)), [1, 2, NO_NEIGHBOR, NO_NEIGHBOR]);
  });

  it('knnFromSimilarities on −distance ranks nearest first, and neighborDistances reads the distances back', () => {
    // Hand-checked points on a line: 0, 1, 3, 7.
    const x = [0, 1, 3, 7];
    const dist = Float64Array.from(x.flatMap((a) => x.map((b) => Math.abs(a - b))));
    const { neighbors, distances } = knnByDistance(dist, 4, 2, new Uint8Array(4).fill(1));
    assert.deepEqual(Array.from(neighbors), [1, 2, 0, 2, 1, 0, 2, 1]);
    assert.deepEqual(Array.from(distances), [1, 3, 1, 2, 2, 3, 4, 6]);
    assert.deepEqual(neighborDistances(dist, 4, neighbors, 2), distances);
  });

  it('knnFromSimilarities rejects k < 1 and a wrongly sized matrix', () => {
    assert.throws(() => knnFromSimilarities(new Float64Array(4), 2, 0), RangeError);
    assert.throws(() => knnFromSimilarities(new Float64Array(5), 2, 1), RangeError);
  });
});
