// measureSampleRows runs every sampled measure in one sweep over the rows. The reference is each
// measure's own whole-matrix function, which its test file ties to an outside value (scikit-learn,
// the papers of docs/methods.md §4–§6, textbook geometry); the sweep must give the same figures
// bit for bit, since it sums in the same order — except the standout and the iid-equivalent
// dimension, whose variances the sweep sums in one pass around a shift (to 1e-12 relative,
// common practice, no source).
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

/**
 * 400 rows over 40 columns: large enough next to 10k that the radius slack keeps only the values
 * under the bound read from every 8th entry; every 8th row a copy of row 0, so for those rows
 * the bound is 0 and too tight (fewer than 10k under it), and the row is gathered again.
 */
function cosinesWithCopies(seed: number, n: number): Float64Array {
  const rows = randomUnitRows(mulberry32(seed), n, 40, 0.2, 11);
  for (let r = 8; r < n; r += 8) rows[r] = rows[0]!.slice();
  return sampleSimilarities(denseToCsr(rows), Uint32Array.from({ length: n }, (_, i) => i));
}

describe('measures/measure-sample-rows', () => {
  for (const [seed, n, k, make] of [
    [1, 60, 5, cosines],
    [2, 200, 10, cosines],
    [3, 31, 3, cosines],
    [4, 12, 10, cosines],
    [5, 400, 3, cosinesWithCopies],
    [6, 400, 10, cosinesWithCopies],
  ] as const) {
    // All rows in one block (the Report's sweep), and in blocks of 7 (the what-if's, which two
    // threads share): the iid dimension's pair sums then run per block, the rest is unchanged.
    for (const blockRows of [n, 7]) it(`measureSampleRows equals the separate measure functions exactly (seed ${seed}, ${n} rows, k = ${k}, blocks of ${blockRows} rows)`, () => {
      const gram = make(seed, n);
      const valid = validRowsFromGram(gram, n);
      const got = measureSampleRows(gram.slice(), n, k, valid, undefined, undefined, blockRows);

      const reference = gram.slice();
      const knn = knnFromSimilarities(reference, n, k, valid);
      const nearest = Float64Array.from({ length: n }, (_, i) => knn.sims[i * k]!);
      const standout = neighborStandout(reference, n, valid, nearest);
      const similarity = similarityHistograms(reference, n, valid, nearest);
      const kOccurrence = tieAwareKOccurrence(reference, n, k, knn.neighbors, knn.sims, valid);
      const dist = distancesFromGram(reference, n);

      assert.deepEqual(got.knn, knn);
      assert.deepEqual(got.kOccurrence, kOccurrence);
      assert.ok(standout !== null && got.standout !== null);
      assert.ok(Math.abs(got.standout - standout) <= 1e-12 * Math.abs(standout), `standout ${got.standout} vs ${standout}`);
      assert.deepEqual(got.similarity, similarity);
      assert.deepEqual(got.nnDist, neighborDistances(dist, n, knn.neighbors, k));
      assert.deepEqual(got.contrast, relativeContrast(dist, n, valid));
      assert.equal(got.meanToNearest, meanToNearest(dist, n, valid));
      const iid = iidEquivalentDimension(dist, n, valid);
      assert.ok(iid !== null && got.iidEquivalentDimension !== null);
      assert.ok(Math.abs(got.iidEquivalentDimension - iid) <= 1e-12 * iid, `iid ${got.iidEquivalentDimension} vs ${iid}`);
      assert.deepEqual(got.radiusSlack, radiusSlack(dist, n, valid, k));
      // The data must exercise empty rows and (in the larger cases) tie sharing, or the check proves little.
      assert.ok(valid.includes(0), 'no empty row');
      if (n >= 60) assert.ok(kOccurrence.some((c) => c !== Math.round(c)), 'no shared tie at a k-th place');
    });
  }
});
