import { diagonalOf, rowToDistances, SAME_POINT } from './gram-distances';
import { addKOccurrenceOfRow } from './hubness';
import { iidDimensionOfCv, pairDistanceCvAfter } from './iid-equivalent-dimension';
import { emptyKnnLists, NO_NEIGHBOR, nearestOfRow, nearestScratch, type KnnLists } from './knn';
import { meanToNearestOf, meanToNearestSums } from './mean-to-nearest';
import { medianStandout, standoutGivenSum } from './neighbor-standout';
import { bucketOf, radiusScratch, radiusSlackSummary, slackFromCounts } from './radius-slack';
import { contrastSummary, type ContrastSummary } from './relative-contrast';
import { binOf, SIMILARITY_BINS, type SimilarityHistograms } from './similarity-histograms';

/** Everything the sample's m×m matrix gives the Measures, plus what the Report's suggestions reuse. */
export interface SampleRowMeasures {
  knn: KnnLists;
  /** Tie-aware N_k per sample position (see tieAwareKOccurrence). */
  kOccurrence: Float64Array;
  standout: number | null;
  similarity: SimilarityHistograms;
  contrast: ContrastSummary | null;
  meanToNearest: number | null;
  iidEquivalentDimension: number | null;
  radiusSlack: { median: number } | null;
  /** m×k distances to the neighbours in `knn` (NaN where none), for the intrinsic dimension. */
  nnDist: Float64Array;
}

/**
 * The sampled measures in one sweep over the rows of the m×m cosine matrix: each row is read
 * from memory once and every measure that looks at it (k-NN, standout, histograms, N_k; then,
 * once the row is turned into distances in place, contrast, mean-to-nearest, the first pass of
 * the iid-equivalent dimension and the radius slack) runs while it is in cache, the cheap ones
 * sharing a loop. At m = 2,000 the matrix is 32 MB and a pass per measure cost the panel's
 * what-if about 11 passes per toggle; this is about 5. The separate functions (relativeContrast,
 * meanToNearest, …) stay the reference: every sum here runs over the same values in the same
 * order, so the figures are theirs bit for bit (test/measures-measure-sample-rows.test.ts).
 * `gram` ends as distances (see distancesFromGram); `valid` from validRowsFromGram.
 */
export function measureSampleRows(gram: Float64Array, m: number, k: number, valid: Uint8Array): SampleRowMeasures {
  const knn = emptyKnnLists(m, k);
  const best = nearestScratch(k);
  const norms = diagonalOf(gram, m);
  const zScores = new Float64Array(m);
  const pairBins = new Float64Array(SIMILARITY_BINS);
  const nearBins: number[] = new Array(SIMILARITY_BINS).fill(0);
  const kOccurrence = new Float64Array(m);
  const tied = new Uint32Array(m);
  const contrast = new Float64Array(m);
  const slack = new Float64Array(m);
  const slackScratch = radiusScratch(m);
  const toNearest = meanToNearestSums();
  const firstPass = { sum: 0, count: 0 };
  const nnDist = new Float64Array(m * k).fill(NaN);
  // Imports read once into locals: a module loader may reach them through getters (tsx's does),
  // which would cost a call per element in the loops below.
  const bins = SIMILARITY_BINS;
  const binOfSimilarity = binOf;
  const bucketOfDistance = bucketOf;
  const samePoint = SAME_POINT;

  for (let i = 0; i < m; i++) {
    const base = i * m;
    if (!valid[i]) {
      // An empty row is nobody's neighbour and no query; it still becomes a row of distances.
      zScores[i] = NaN;
      contrast[i] = NaN;
      slack[i] = NaN;
      rowToDistances(gram, i, m, norms);
      continue;
    }
    nearestOfRow(gram, i, m, k, valid, knn, best);
    const nearest = knn.sims[i * k]!;

    // Cosines: the standout's mean and the pair histogram in one pass, then the standout's
    // deviations and N_k's tied candidates in a second (both need the first pass's results).
    let sum = 0;
    let others = 0;
    for (let j = 0; j < m; j++) {
      if (j === i || !valid[j]) continue;
      const s = gram[base + j]!;
      sum += s;
      others++;
      if (j > i) pairBins[binOfSimilarity(s, bins)]++;
    }
    if (!Number.isNaN(nearest)) nearBins[binOfSimilarity(nearest, bins)]++;
    zScores[i] = standoutGivenSum(gram, i, m, valid, nearest, sum, others);
    addKOccurrenceOfRow(gram, i, m, k, knn.neighbors, knn.sims, valid, kOccurrence, tied);

    // Distances: the row is turned into distances in place and, in the same pass, read by the
    // contrast (min, max), mean-to-nearest (sum, min), the iid dimension's first pass (pairs
    // after i, one running sum in row order) and the radius slack's bucket count.
    const ni = norms[i]!;
    let dMin = Infinity;
    let dMax = -Infinity;
    let dSum = 0;
    let upperSum = firstPass.sum;
    let upperCount = firstPass.count;
    const counts = slackScratch.counts;
    counts.fill(0);
    for (let j = 0; j < m; j++) {
      const sq = ni + norms[j]! - 2 * gram[base + j]!;
      const d = j === i ? 0 : sq > samePoint * (ni + norms[j]!) ? Math.sqrt(sq) : 0;
      gram[base + j] = d;
      if (j === i || !valid[j]) continue;
      if (d < dMin) dMin = d;
      if (d > dMax) dMax = d;
      dSum += d;
      if (j > i) {
        upperSum += d;
        upperCount++;
      }
      counts[bucketOfDistance(d)]++;
    }
    firstPass.sum = upperSum;
    firstPass.count = upperCount;
    contrast[i] = dMin > 0 && dMin < Infinity ? (dMax - dMin) / dMin : NaN;
    if (others > 0) {
      toNearest.sumMean += dSum / others;
      toNearest.sumMin += dMin;
      toNearest.queries++;
    }
    slack[i] = slackFromCounts(gram, i, m, valid, k, others, slackScratch);
    for (let r = 0; r < k; r++) {
      const j = knn.neighbors[i * k + r]!;
      if (j !== NO_NEIGHBOR) nnDist[i * k + r] = gram[base + j]!;
    }
  }

  return {
    knn,
    kOccurrence,
    standout: medianStandout(zScores),
    similarity: { start: 0, binWidth: 1 / SIMILARITY_BINS, pairs: Array.from(pairBins), nearest: nearBins },
    contrast: contrastSummary(contrast),
    meanToNearest: meanToNearestOf(toNearest),
    iidEquivalentDimension: iidDimensionOfCv(pairDistanceCvAfter(gram, m, valid, 1, firstPass)),
    radiusSlack: radiusSlackSummary(slack),
    nnDist,
  };
}
