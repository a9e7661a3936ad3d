import { strict as assert } from 'node:assert';
import { mulberry32, sampleIndices } from '../extension/src/engine/random/seeded-random';
import { sampleSimilarities } from '../extension/src/engine/measures/sample-similarity';
import { denseToCsr, dot, randomUnitRows } from './measures-fixtures';

describe('measures/sample-similarity', () => {
  it('sampleSimilarities equals brute-force dot products of the sampled rows', () => {
    // Source: definition of the Gram matrix; brute-force dense dot products as reference.
    const rows = randomUnitRows(mulberry32(5), 60, 30, 0.15, 9);
    const X = denseToCsr(rows);
    const sample = sampleIndices(60, 25, 3);
    const sims = sampleSimilarities(X, sample);
    const m = sample.length;
    for (let i = 0; i < m; i++) {
      for (let j = 0; j < m; j++) {
        const expected = dot(rows[sample[i]!]!, rows[sample[j]!]!);
        assert.ok(Math.abs(sims[i * m + j]! - expected) < 1e-12, `(${i}, ${j})`);
      }
    }
  });

  it('sampleSimilarities works on unnormalised rows and keeps squared norms on the diagonal', () => {
    // Hand-checked: a = (1, 2, 0), b = (0, 3, 4), c = 0 → a·a = 5, b·b = 25, a·b = 6.
    const X = denseToCsr([[1, 2, 0], [0, 0, 0], [0, 3, 4]]);
    const sims = sampleSimilarities(X, Uint32Array.from([0, 1, 2]));
    assert.deepEqual(Array.from(sims), [5, 0, 6, 0, 0, 0, 6, 0, 25]);
  });

  it('sampleSimilarities rejects indices outside the matrix', () => {
    assert.throws(() => sampleSimilarities(denseToCsr([[1]]), Uint32Array.from([3])), RangeError);
  });
});
