import type { Measures } from '../../protocol';
import type { Csr } from '../matrix/csr';
import { rowsWithWeight } from '../matrix/rows-with-weight';
import { distancesFromGram, validRowsFromGram } from './gram-distances';
import { hubnessSummary, kOccurrenceHistogram, tieAwareKOccurrence, topHubPositions } from './hubness';
import { iidEquivalentDimension } from './iid-equivalent-dimension';
import { knnFromSimilarities, neighborDistances } from './knn';
import { knnTermMass } from './knn-term-mass';
import { labelPrecisionAtK } from './label-precision';
import { meanToNearest } from './mean-to-nearest';
import { mleDimension } from './mle-dimension';
import { neighborStandout } from './neighbor-standout';
import { neighborTurnover } from './neighbor-turnover';
import { radiusSlack } from './radius-slack';
import { relativeContrast } from './relative-contrast';
import { sampleSimilarities } from './sample-similarity';
import { similarityHistograms } from './similarity-histograms';
import { cumulativeMassShare, pairMass, termSums, type PairMass, type TermSums } from './term-sums';
import { twoNN } from './two-nn';

/** How many terms the cumulative-mass chart shows. */
export const CUMULATIVE_MASS_TERMS = 200;
/** How many top hubs are returned for the Report's hub list. */
export const TOP_HUBS = 50;
/** Sampled rows must be unit length to this tolerance (or empty) for dot product = cosine. */
const UNIT_TOLERANCE = 1e-6;

export interface MeasureDistancesOptions {
  /** Sorted distinct row indices of X (see sampleIndices); the quadratic measures use only these. */
  sample: Uint32Array;
  k: number;
  /** Recorded in the Report; the sample is already drawn. */
  seed: number;
  /** One label per sample position, −1 = none; null when the corpus has no label column. */
  labels: Int32Array | null;
  /** The baseline's `neighbors` on the same sample and k; null for the baseline itself. */
  baselineNeighbors: Uint32Array | null;
  /** termSums(X) when the caller already has it. */
  sums?: TermSums;
  /**
   * Rows with a non-zero weight in the whole corpus when X holds only the sampled rows: the
   * what-if passes the masked sample alone (with `sums` of the whole masked corpus) to avoid an
   * n-sized copy.
   */
  rowsWithWeight?: number;
  /**
   * The m×m cosines of X's sample rows when the caller already has them (the what-if keeps them
   * up to date across toggles); overwritten with distances here, like the one computed inside.
   */
  gram?: Float64Array;
}

export interface MeasureDistancesResult {
  measures: Measures;
  /** m×k sample positions, nearest first; NO_NEIGHBOR where none (empty rows, tiny samples). */
  neighbors: Uint32Array;
  /** m×k cosines matching `neighbors`, descending; NaN where none. */
  neighborSims: Float64Array;
  /** N_k per sample position. */
  /** Expected N_k (ties at the k-th place share their slots), so not always whole. */
  kOccurrence: Float64Array;
  /** Up to TOP_HUBS sample positions by N_k, highest first. */
  hubPositions: Uint32Array;
  /** Per term: similarity inside k-NN pairs, each unordered pair once (for the neighbour lift). */
  termKnnMass: Float64Array;
  pairMass: PairMass;
}

/**
 * All distance-health measures of one weighted matrix X (rows l2-normalised or all zero).
 * Linear parts (pair mass, background similarity, top-term shares) are exact over all of X;
 * quadratic parts use the m×m similarity matrix of the sample, which is converted to distances
 * in place once the similarity-based measures are done, so peak memory is one m×m array.
 */
export function measureDistances(X: Csr, options: MeasureDistancesOptions): MeasureDistancesResult {
  const { sample, k, seed, labels, baselineNeighbors } = options;
  const m = sample.length;
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`measureDistances: k must be a positive integer, got ${k}`);
  if (labels !== null && labels.length !== m) throw new RangeError(`measureDistances: ${labels.length} labels for a sample of ${m}`);
  if (baselineNeighbors !== null && baselineNeighbors.length !== m * k) {
    throw new RangeError(`measureDistances: baseline neighbours are not ${m}×${k}`);
  }

  const sums = options.sums ?? termSums(X);
  const mass = pairMass(sums, options.rowsWithWeight ?? rowsWithWeight(X));

  if (options.gram !== undefined && options.gram.length !== m * m) throw new RangeError(`measureDistances: gram is not ${m}×${m}`);
  const gram = options.gram ?? sampleSimilarities(X, sample);
  const valid = validRowsFromGram(gram, m);
  for (let i = 0; i < m; i++) {
    const sq = gram[i * m + i];
    if (valid[i] && Math.abs(sq - 1) > UNIT_TOLERANCE) {
      throw new RangeError(`measureDistances: row ${sample[i]} has squared norm ${sq}; rows must be l2-normalised`);
    }
  }

  const knn = knnFromSimilarities(gram, m, k, valid);
  const nearest = new Float64Array(m);
  for (let i = 0; i < m; i++) nearest[i] = knn.sims[i * k];
  const standout = neighborStandout(gram, m, valid, nearest);
  const similarity = similarityHistograms(gram, m, valid, nearest);

  // Ties at the k-th place share their slots (all-identical documents are no hubs): safety hook.
  const counts = tieAwareKOccurrence(gram, m, k, knn.neighbors, knn.sims, valid);
  const hubness = hubnessSummary(counts, valid, k);
  const termKnnMass = knnTermMass(X, sample, knn.neighbors, k);

  // One sort of the term masses serves the chart and both top-term shares.
  const cumulativeMass = cumulativeMassShare(mass.perTerm, mass.total, CUMULATIVE_MASS_TERMS);
  const shareOfTop = (count: number) => (cumulativeMass.length === 0 ? 0 : cumulativeMass[Math.min(count, cumulativeMass.length) - 1]);

  const dist = distancesFromGram(gram, m);
  const nnDist = neighborDistances(dist, m, knn.neighbors, k);

  const measures: Measures = {
    sample: { documents: m, k, seed },
    backgroundSimilarity: mass.backgroundSimilarity,
    neighborStandout: standout,
    contrast: relativeContrast(dist, m, valid),
    meanToNearest: meanToNearest(dist, m, valid),
    iidEquivalentDimension: iidEquivalentDimension(dist, m, valid),
    hubness,
    intrinsicDimension: { twoNN: twoNN(nnDist, m, k), mle: mleDimension(nnDist, m, k) },
    radiusSlack: radiusSlack(dist, m, valid, k),
    topTermsMassShare: { top10: shareOfTop(10), top100: shareOfTop(100) },
    labelPrecisionAtK: labels === null ? null : labelPrecisionAtK(knn.neighbors, labels, k),
    neighborTurnover: baselineNeighbors === null ? null : neighborTurnover(baselineNeighbors, knn.neighbors, m, k),
    distributions: {
      similarity,
      // Bins 0..3k: the mean is k, and anything past 3k is a hub by any reading.
      kOccurrence: kOccurrenceHistogram(counts, valid, 3 * k),
      cumulativeMass,
    },
  };

  return {
    measures,
    neighbors: knn.neighbors,
    neighborSims: knn.sims,
    kOccurrence: counts,
    hubPositions: topHubPositions(counts, TOP_HUBS),
    termKnnMass,
    pairMass: mass,
  };
}

