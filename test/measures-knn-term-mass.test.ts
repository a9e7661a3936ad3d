import { strict as assert } from 'node:assert';
import { mulberry32, sampleIndices } from '../extension/src/engine/random/seeded-random';
import { knnFromSimilarities } from '../extension/src/engine/measures/knn';
import { knnTermMass } from '../extension/src/engine/measures/knn-term-mass';
import { sampleSimilarities } from '../extension/src/engine/measures/sample-similarity';
import { denseToCsr, randomUnitRows } from './measures-fixtures';

describe('measures/knn-term-mass', () => {
  it('knnTermMass equals the brute-force sum over unordered k-NN pairs', () => {
    // Source: definition (docs/methods.md "Names"); brute force over the set of pairs.
    const rows = randomUnitRows(mulberry32(8), 80, 20, 0.2, 13);
    const X = denseToCsr(rows);
    const sample = sampleIndices(80, 40, 4);
    const m = sample.length;
    const k = 4;
    const { neighbors } = knnFromSimilarities(sampleSimilarities(X, sample), m, k);
    const pairs = new Set<string>();
    for (let q = 0; q < m; q++) {
      for (let r = 0; r < k; r++) {
        const nb = neighbors[q * k + r]!;
        if (nb !== 0xffffffff) pairs.add(`${Math.min(q, nb)},${Math.max(q, nb)}`);
      }
    }
    const expected = new Array<number>(20).fill(0);
    for (const p of pairs) {
      const [a, b] = p.split(',').map(Number) as [number, number];
      for (let t = 0; t < 20; t++) expected[t]! += rows[sample[a]!]![t]! * rows[sample[b]!]![t]!;
    }
    const mass = knnTermMass(X, sample, neighbors, k);
    for (let t = 0; t < 20; t++) assert.ok(Math.abs(mass[t]! - expected[t]!) < 1e-12, `term ${t}`);
  });

  it('knnTermMass counts a mutual pair once (hand-checked)', () => {
    // Rows 0 and 1 are each other's only neighbour; x_0 · x_1 on term 0 = 0.6·0.8 = 0.48.
    const X = denseToCsr([[0.6, 0.8], [0.8, 0.6]]);
    const mass = knnTermMass(X, Uint32Array.from([0, 1]), Uint32Array.from([1, 0]), 1);
    assert.ok(Math.abs(mass[0]! - 0.48) < 1e-15 && Math.abs(mass[1]! - 0.48) < 1e-15);
  });
});
