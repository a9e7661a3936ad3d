import type { Measures } from '../../protocol';
import type { Csr } from '../matrix/csr';
import { rowsWithWeight } from '../matrix/rows-with-weight';
import { validRowsFromGram } from './gram-distances';
import { hubnessSummary, kOccurrenceHistogram, topHubPositions } from './hubness';
import { knnTermMass } from './knn-term-mass';
import { labelPrecisionAtK } from './label-precision';
import { measureSampleRows, type SampleRowMeasures } from './measure-sample-rows';
import { mleDimension } from './mle-dimension';
import { neighborTurnover } from './neighbor-turnover';
import { sampleSimilarities } from './sample-similarity';
import type { PrepareRows, SharedRowSweep } from './shared-row-sweep';
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
   * up to date across toggles), or their kept dot products with `rowScale` (see
   * MeasuresFromGramOptions); only read.
   */
  gram?: Float64Array;
  rowScale?: Float64Array;
  /**
   * The exact sums and rows with weight, asked for only once the sample's measures and the
   * per-term k-NN mass are done (in place of `sums` and `rowsWithWeight`): a full pass begun on
   * another thread runs meanwhile instead of being waited for first (DistanceLab.measure). The
   * two halves share no input, so the figures are the same bits either way.
   */
  exact?: () => { sums: TermSums; rowsWithWeight: number };
  /**
   * The sweep `gram` and `rowScale` live in (one of its states), in blocks of all m rows, so
   * that the rows run in WebAssembly over the products where they were built (DistanceLab):
   * the same bits as measureSampleRows' one block (MeasuresFromGramOptions' `shared`).
   */
  shared?: { sweep: SharedRowSweep; ticket: number };
}

export interface MeasureDistancesResult {
  measures: Measures;
  /** m×k sample positions, nearest first; NO_NEIGHBOR where none (empty rows, tiny samples). */
  neighbors: Uint32Array;
  /** m×k cosines matching `neighbors`, descending; NaN where none. */
  neighborSims: Float64Array;
  /** Each sample position's neighbour standout z-score (NaN where none), for paired comparisons. */
  standoutPerQuery: Float64Array;
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
 * quadratic parts use the m×m similarity matrix of the sample, read once row by row (distances
 * are taken from it row by row), so peak memory is one m×m array.
 */
export function measureDistances(X: Csr, options: MeasureDistancesOptions): MeasureDistancesResult {
  const { sample, k } = options;
  if (options.gram !== undefined && options.gram.length !== sample.length * sample.length) {
    throw new RangeError(`measureDistances: gram is not ${sample.length}×${sample.length}`);
  }
  // measuresFromGram's two halves, the sampled one first, with the per-term k-NN mass (it needs
  // only the neighbours) before the exact sums are asked for.
  const sampled = sampledMeasures({ ...options, gram: options.gram ?? sampleSimilarities(X, sample), rowOf: (i) => sample[i]! });
  const termKnnMass = knnTermMass(X, sample, sampled.neighbors, k);
  const given = options.exact?.();
  const exact = exactMeasures(given?.sums ?? options.sums ?? termSums(X), given?.rowsWithWeight ?? options.rowsWithWeight ?? rowsWithWeight(X));
  return { ...joinHalves(sampled, exact), hubPositions: topHubPositions(sampled.kOccurrence, TOP_HUBS), termKnnMass };
}

export interface MeasuresFromGramOptions {
  k: number;
  seed: number;
  labels: Int32Array | null;
  baselineNeighbors: Uint32Array | null;
  /** Exact term sums of the whole (masked) corpus, and its rows with any weight. */
  sums: TermSums;
  rowsWithWeight: number;
  /**
   * The sample's m×m cosines (read only), or with `rowScale` its kept dot products: the cosine
   * is then gram_ij·rowScale_i·rowScale_j (the what-if's IncrementalGram, which so never writes
   * an m×m cosine matrix per toggle).
   */
  gram: Float64Array;
  rowScale?: Float64Array;
  /** The document behind sample position i, for error messages. */
  rowOf?: (i: number) => number;
  /** Called between rows of the sample's sweep; throws to abandon it (a what-if prefetch a click overtook). */
  interrupt?: () => void;
  /** Rows per block of the sample's sweep (measureSampleRows); the Report's default is all of them. */
  blockRows?: number;
  /**
   * The sweep shared with another thread (the what-if's): `gram` and `rowScale` are one of its
   * states, and the sweep is opened under `ticket`; the same bits as without it, with its blockRows.
   * With `views`, the per-row arrays returned (neighbors, neighborSims, standoutPerQuery) are the
   * sweep's shared outputs, valid until its next sweep opens (SharedRowSweep.sweep), not copies.
   * With `prepare`, each block's rows of `gram` are prepared just before they are swept
   * (SharedRowSweep.sweep: the what-if's dot-product update, row by row); the diagonal and
   * `rowScale` are final already.
   */
  shared?: { sweep: SharedRowSweep; ticket: number; views?: boolean; prepare?: PrepareRows };
}

export type MeasuresFromGramResult = Omit<MeasureDistancesResult, 'hubPositions' | 'termKnnMass'>;

/**
 * The Measures from exact sums and the sample's cosines alone: what the panel's what-if needs
 * per toggle (its sums and cosines are kept up to date by engine/what-if/), without the per-term
 * k-NN mass and hub list that only the Report's suggestions use. measureDistances adds those.
 * The two halves (sampledMeasures, exactMeasures) share no input, so the what-if may compute
 * them on two threads and join them (joinMeasures) into the same object.
 */
export function measuresFromGram(options: MeasuresFromGramOptions): MeasuresFromGramResult {
  return joinHalves(sampledMeasures(options), exactMeasures(options.sums, options.rowsWithWeight));
}

/** The result both entry points share, from the sampled half and the exact half. */
function joinHalves(sampled: ReturnType<typeof sampledMeasures>, exact: ExactMeasures): MeasuresFromGramResult {
  return {
    measures: joinMeasures(sampled.measures, exact),
    neighbors: sampled.neighbors,
    neighborSims: sampled.neighborSims,
    standoutPerQuery: sampled.standoutPerQuery,
    kOccurrence: sampled.kOccurrence,
    pairMass: exact.mass,
  };
}

/** The Measures' fields that come from the whole corpus's exact sums (the pair mass). */
export interface ExactMeasures {
  mass: PairMass;
  backgroundSimilarity: number;
  topTermsMassShare: Measures['topTermsMassShare'];
  cumulativeMass: number[];
}

/** The Measures' fields that come from the sample's m×m matrix: everything but ExactMeasures. */
export type SampledFields = Omit<Measures, 'backgroundSimilarity' | 'topTermsMassShare' | 'distributions'> & {
  distributions: Omit<Measures['distributions'], 'cumulativeMass'>;
};

/** The pair mass and what the Measures read from it, from exact sums of the (masked) corpus. */
export function exactMeasures(sums: TermSums, rowsWithWeight: number): ExactMeasures {
  const mass = pairMass(sums, rowsWithWeight);
  // One sort of the term masses serves the chart and both top-term shares.
  const cumulativeMass = cumulativeMassShare(mass.perTerm, mass.total, CUMULATIVE_MASS_TERMS);
  const shareOfTop = (count: number) => (cumulativeMass.length === 0 ? 0 : cumulativeMass[Math.min(count, cumulativeMass.length) - 1]);
  return { mass, backgroundSimilarity: mass.backgroundSimilarity, topTermsMassShare: { top10: shareOfTop(10), top100: shareOfTop(100) }, cumulativeMass };
}

/** The sampled measures and the k-NN state behind them (measuresFromGram's options less the sums). */
export function sampledMeasures(options: Omit<MeasuresFromGramOptions, 'sums' | 'rowsWithWeight'>): { measures: SampledFields } & Omit<MeasuresFromGramResult, 'measures' | 'pairMass'> {
  const { k, labels, baselineNeighbors, gram } = options;
  const m = Math.round(Math.sqrt(gram.length));
  if (m * m !== gram.length) throw new RangeError(`measuresFromGram: gram of ${gram.length} entries is not square`);
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`measureDistances: k must be a positive integer, got ${k}`);
  if (labels !== null && labels.length !== m) throw new RangeError(`measureDistances: ${labels.length} labels for a sample of ${m}`);
  if (baselineNeighbors !== null && baselineNeighbors.length !== m * k) {
    throw new RangeError(`measureDistances: baseline neighbours are not ${m}×${k}`);
  }

  const valid = validRowsFromGram(gram, m);
  const scale = options.rowScale;
  for (let i = 0; i < m; i++) {
    const sq = scale === undefined ? gram[i * m + i] : gram[i * m + i] * scale[i] * scale[i];
    if (valid[i] && Math.abs(sq - 1) > UNIT_TOLERANCE) {
      const row = options.rowOf?.(i) ?? i;
      throw new RangeError(`measureDistances: row ${row} has squared norm ${sq}; rows must be l2-normalised`);
    }
  }

  const rows =
    options.shared !== undefined
      ? options.shared.sweep.sweep(options.shared.ticket, gram, scale, valid, options.interrupt, options.shared.views === true, options.shared.prepare)
      : measureSampleRows(gram, m, k, valid, scale, options.interrupt, options.blockRows);
  return sampledFieldsOf(rows, valid, options);
}

/**
 * sampledMeasures once the sweep is done: the fields read off its rows (`valid` the sample's
 * valid rows). On the what-if's thread this runs while the review's thread waits for it
 * (test/bench/what-if-sweep-states.ts `tail` times it alone).
 */
export function sampledFieldsOf(rows: SampleRowMeasures, valid: Uint8Array, options: Pick<MeasuresFromGramOptions, 'k' | 'seed' | 'labels' | 'baselineNeighbors'>): { measures: SampledFields } & Omit<MeasuresFromGramResult, 'measures' | 'pairMass'> {
  const { k, seed, labels, baselineNeighbors } = options;
  const m = valid.length;
  const { knn, kOccurrence: counts } = rows;
  const hubness = hubnessSummary(counts, valid, k);

  const measures: SampledFields = {
    sample: { documents: m, k, seed },
    neighborStandout: rows.standout,
    contrast: rows.contrast,
    meanToNearest: rows.meanToNearest,
    iidEquivalentDimension: rows.iidEquivalentDimension,
    hubness,
    intrinsicDimension: { twoNN: twoNN(rows.nnDist, m, k), mle: mleDimension(rows.nnDist, m, k) },
    radiusSlack: rows.radiusSlack,
    labelPrecisionAtK: labels === null ? null : labelPrecisionAtK(knn, labels, k),
    neighborTurnover: baselineNeighbors === null ? null : neighborTurnover(baselineNeighbors, knn.neighbors, m, k),
    distributions: {
      similarity: rows.similarity,
      // Bins 0..3k: the mean is k, and anything past 3k is a hub by any reading.
      kOccurrence: kOccurrenceHistogram(counts, valid, 3 * k),
    },
  };

  return {
    measures,
    neighbors: knn.neighbors,
    neighborSims: knn.sims,
    standoutPerQuery: rows.standoutPerQuery,
    kOccurrence: counts,
  };
}

/** The Measures from its two halves, fields in the protocol's order. */
export function joinMeasures(sampled: SampledFields, exact: Omit<ExactMeasures, 'mass'>): Measures {
  return {
    sample: sampled.sample,
    backgroundSimilarity: exact.backgroundSimilarity,
    neighborStandout: sampled.neighborStandout,
    contrast: sampled.contrast,
    meanToNearest: sampled.meanToNearest,
    iidEquivalentDimension: sampled.iidEquivalentDimension,
    hubness: sampled.hubness,
    intrinsicDimension: sampled.intrinsicDimension,
    radiusSlack: sampled.radiusSlack,
    topTermsMassShare: exact.topTermsMassShare,
    labelPrecisionAtK: sampled.labelPrecisionAtK,
    neighborTurnover: sampled.neighborTurnover,
    distributions: {
      similarity: sampled.distributions.similarity,
      kOccurrence: sampled.distributions.kOccurrence,
      cumulativeMass: exact.cumulativeMass,
    },
  };
}
