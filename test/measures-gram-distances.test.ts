import { strict as assert } from 'node:assert';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { distancesFromGram, validRowsFromGram } from '../extension/src/engine/measures/gram-distances';
import { sampleSimilarities } from '../extension/src/engine/measures/sample-similarity';
import { denseToCsr, dot, randomUnitRows } from './measures-fixtures';

describe('measures/gram-distances', () => {
  it('‖a − b‖² = 2 − 2·cos(a, b) on random sparse unit vectors', () => {
    // Source: docs/methods.md §2 — exact identity for l2-normalised vectors; brute-force ‖a − b‖ here.
    const rows = randomUnitRows(mulberry32(21), 40, 50, 0.1);
    const m = rows.length;
    const all = Uint32Array.from(rows.keys());
    const gram = sampleSimilarities(denseToCsr(rows), all);
    const cos = Float64Array.from(gram);
    const dist = distancesFromGram(gram, m);
    for (let a = 0; a < m; a++) {
      for (let b = 0; b < m; b++) {
        const diff = rows[a]!.map((v, t) => v - rows[b]![t]!);
        const brute = Math.sqrt(dot(diff, diff));
        assert.ok(Math.abs(dist[a * m + b]! - brute) < 1e-7, `distance (${a}, ${b})`);
        assert.ok(Math.abs(dist[a * m + b]! ** 2 - (2 - 2 * cos[a * m + b]!)) < 1e-12, `identity (${a}, ${b})`);
      }
    }
  });

  it('distancesFromGram gives raw Euclidean distances for unnormalised points', () => {
    // Hand-checked: (0, 0), (3, 4), (6, 8) → distances 5, 10, 5.
    const gram = sampleSimilarities(denseToCsr([[0, 0], [3, 4], [6, 8]]), Uint32Array.from([0, 1, 2]));
    const dist = distancesFromGram(gram, 3);
    assert.deepEqual(Array.from(dist), [0, 5, 10, 5, 0, 5, 10, 5, 0]);
  });

  it('validRowsFromGram marks all-zero rows invalid', () => {
    const gram = sampleSimilarities(denseToCsr([[1, 0], [0, 0], [0, 1]]), Uint32Array.from([0, 1, 2]));
    assert.deepEqual(Array.from(validRowsFromGram(gram, 3)), [1, 0, 1]);
  });
});
