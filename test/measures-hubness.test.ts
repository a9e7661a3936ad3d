import { strict as assert } from 'node:assert';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { hubnessSummary, kOccurrence, kOccurrenceHistogram, topHubPositions } from '../extension/src/engine/measures/hubness';
import { NO_NEIGHBOR } from '../extension/src/engine/measures/knn';
import { allValid, euclideanDistances, gaussianPoints, knnByDistance } from './measures-fixtures';

function skewnessFor(d: number, k: number): number {
  const n = 1500;
  const dist = euclideanDistances(gaussianPoints(mulberry32(500 + d), n, d), n, d);
  const { neighbors } = knnByDistance(dist, n, k, allValid(n));
  return hubnessSummary(kOccurrence(neighbors, n, k), allValid(n), k)!.skewness;
}

describe('measures/hubness', () => {
  it('hubness skewness on iid Gaussian data grows with dimension: d = 3 near 0, d = 100 above 1 (k = 10)', () => {
    // Source: Radovanović, Nanopoulos & Ivanović (2010), JMLR 11 — skewness of N_k grows with
    // dimension (docs/methods.md §5; from memory, qualitative).
    const low = skewnessFor(3, 10);
    const high = skewnessFor(100, 10);
    assert.ok(Math.abs(low) < 0.6, `d = 3 skewness ${low}`);
    assert.ok(high > 1, `d = 100 skewness ${high}`);
  });

  it('kOccurrence, hubs, orphans and top hubs on a hand-checked star', () => {
    // Rows 1..4 all list row 0 first; row 0 lists 1; k = 2 second choices spread as below.
    const k = 2;
    const neighbors = Uint32Array.from([1, 2, 0, 2, 0, 1, 0, 1, 0, 1, NO_NEIGHBOR, NO_NEIGHBOR]);
    const counts = kOccurrence(neighbors, 6, k);
    assert.deepEqual(Array.from(counts), [4, 4, 2, 0, 0, 0]);
    const valid = Uint8Array.from([1, 1, 1, 1, 1, 0]);
    const summary = hubnessSummary(counts, valid, k)!;
    // N_k over valid rows: 4, 4, 2, 0, 0 → mean 2; deviations 2, 2, 0, −2, −2 → m2 = 16/5,
    // m3 = 0 → skewness 0; hubs need N_k > 4 → 0; orphans 2 (the empty row 5 is not counted).
    assert.equal(summary.skewness, 0);
    assert.equal(summary.hubs, 0);
    assert.equal(summary.orphans, 2);
    assert.deepEqual(Array.from(topHubPositions(counts, 2)), [0, 1]);
    assert.deepEqual(kOccurrenceHistogram(counts, valid, 3), [2, 0, 1, 2]);
  });

  it('hubnessSummary is null with fewer than 3 valid rows', () => {
    assert.equal(hubnessSummary(Uint32Array.from([1, 1]), allValid(2), 1), null);
  });
});
