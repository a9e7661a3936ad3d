// measureSampleRows runs every sampled measure in one sweep over the rows. The reference is each
// measure's own whole-matrix function, which its test file ties to an outside value (scikit-learn,
// the papers of docs/methods.md §4–§6, textbook geometry); the sweep must give the same figures
// bit for bit, since it sums in the same order.
import { strict as assert } from 'node:assert';
import { distancesFromGram, validRowsFromGram } from '../extension/src/engine/measures/gram-distances';
import { tieAwareKOccurrence } from '../extension/src/engine/measures/hubness';
import { iidEquivalentDimension } from '../extension/src/engine/measures/iid-equivalent-dimension';
import { knnFromSimilarities, neighborDistances } from '../extension/src/engine/measures/knn';
import { meanToNearest } from '../extension/src/engine/measures/mean-to-nearest';
import { measureSampleRows } from '../extension/src/engine/measures/measure-sample-rows';
import { neighborStandout } from '../extension/src/engine/measures/neighbor-standout';
import { radiusSlack } from '../extension/src/engine/measures/radius-slack';
import { relativeContrast } from '../extension/src/engine/measures/relative-contrast';
import { sampleSimilarities } from '../extension/src/engine/measures/sample-similarity';
import { similarityHistograms } from '../extension/src/engine/measures/similarity-histograms';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { denseToCsr, randomUnitRows } from './measures-fixtures';

/** Unit rows with empty rows, exact duplicates and few columns (so cosine ties at the k-th place). */
function cosines(seed: number, n: number): Float64Array {
  const random = mulberry32(seed);
  const rows = randomUnitRows(random, n, 12, 0.25, 9);
  for (let r = 5; r < n; r += 13) rows[r] = rows[r - 3]!.slice();
  return sampleSimilarities(denseToCsr(rows), Uint32Array.from({ length: n }, (_, i) => i));
}

describe('measures/measure-sample-rows', () => {
  for (const [seed, n, k] of [
    [1, 60, 5],
    [2, 200, 10],
    [3, 31, 3],
    [4, 12, 10],
  ] as const) {
    it(`measureSampleRows equals the separate measure functions exactly (seed ${seed}, ${n} rows, k = ${k})`, () => {
      const gram = cosines(seed, n);
      const valid = validRowsFromGram(gram, n);
      const got = measureSampleRows(gram.slice(), n, k, valid);

      const reference = gram.slice();
      const knn = knnFromSimilarities(reference, n, k, valid);
      const nearest = Float64Array.from({ length: n }, (_, i) => knn.sims[i * k]!);
      const standout = neighborStandout(reference, n, valid, nearest);
      const similarity = similarityHistograms(reference, n, valid, nearest);
      const kOccurrence = tieAwareKOccurrence(reference, n, k, knn.neighbors, knn.sims, valid);
      const dist = distancesFromGram(reference, n);

      assert.deepEqual(got.knn, knn);
      assert.deepEqual(got.kOccurrence, kOccurrence);
      assert.equal(got.standout, standout);
      assert.deepEqual(got.similarity, similarity);
      assert.deepEqual(got.nnDist, neighborDistances(dist, n, knn.neighbors, k));
      assert.deepEqual(got.contrast, relativeContrast(dist, n, valid));
      assert.equal(got.meanToNearest, meanToNearest(dist, n, valid));
      assert.equal(got.iidEquivalentDimension, iidEquivalentDimension(dist, n, valid));
      assert.deepEqual(got.radiusSlack, radiusSlack(dist, n, valid, k));
      // The data must exercise empty rows and (in the larger cases) tie sharing, or the check proves little.
      assert.ok(valid.includes(0), 'no empty row');
      if (n >= 60) assert.ok(kOccurrence.some((c) => c !== Math.round(c)), 'no shared tie at a k-th place');
    });
  }
});
