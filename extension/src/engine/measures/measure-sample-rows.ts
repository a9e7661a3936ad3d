import { SAME_POINT } from './gram-distances';
import { iidDimensionOfCv } from './iid-equivalent-dimension';
import { emptyKnnLists, TIE_TOLERANCE, type KnnLists } from './knn';
import { meanToNearestOf, meanToNearestSums } from './mean-to-nearest';
import { medianStandout } from './neighbor-standout';
import { radiusSlackSummary } from './radius-slack';
import { contrastSummary, type ContrastSummary } from './relative-contrast';
import { selectRank } from './select-rank';
import { binOf, SIMILARITY_BINS, type SimilarityHistograms } from './similarity-histograms';

/** Everything the sample's m×m matrix gives the Measures, plus what the Report's suggestions reuse. */
export interface SampleRowMeasures {
  knn: KnnLists;
  /** Tie-aware N_k per sample position (see tieAwareKOccurrence). */
  kOccurrence: Float64Array;
  standout: number | null;
  /** Each row's z-score behind `standout` (standoutPerQuery's); NaN where a row has none. */
  standoutPerQuery: Float64Array;
  similarity: SimilarityHistograms;
  contrast: ContrastSummary | null;
  meanToNearest: number | null;
  iidEquivalentDimension: number | null;
  radiusSlack: { median: number } | null;
  /** m×k distances to the neighbours in `knn` (NaN where none), for the intrinsic dimension. */
  nnDist: Float64Array;
}

/**
 * The sampled measures in one sweep that reads the m×m matrix once, one pass per row. Row i's
 * cosines are c_ij = gram_ij·scale_i·scale_j (the what-if hands over its kept dot products and
 * each row's 1/‖kept row‖, so no m×m cosine matrix is written per toggle; the Report's callers
 * pass unit rows and no scale). Each cosine and its distance are computed once and feed, in the
 * same pass: the k-NN selection (knnFromSimilarities' rule), the standout's sums, both
 * histograms, contrast, mean-to-nearest and the iid dimension's pair sums. What needs the row's
 * final k-th neighbour or k-NN radius is kept aside in the pass instead of read in a second one:
 * - N_k's tie candidates: every value that was within tolerance of the k-th place when it was
 *   seen (the k-th score only rises, so this holds every value tied with the final one);
 * - the radius slack's k-th and 10k-th distance: the distances whose squared distance is at most
 *   a bound read beforehand from every 8th entry of the row (a quantile of about twice 10k/m, so
 *   ~2·10k values are kept); when fewer than 10k fall under it, the row's distances are gathered
 *   again. Ranks among the gathered values are ranks in the row, so the values are radiusSlack's.
 * At m = 2,000 the matrix is 32 MB; the panel's what-if used to read it about 9 times per toggle.
 *
 * The separate functions (knnFromSimilarities, relativeContrast, meanToNearest, …) stay the
 * reference (test/measures-measure-sample-rows.test.ts): k-NN, N_k, histograms, contrast,
 * mean-to-nearest, radius slack and the neighbour distances are theirs bit for bit (same values,
 * same order of summation). Two variances are summed in one pass around a shift instead of two
 * passes around the mean — the standout's per row (shifted by the row's first cosine, so a row
 * of equal values still has exactly no spread) and the iid dimension's over all pairs (shifted
 * by the first row's mean distance): equal to ~1e-13 relative, as each shift lies within the
 * spread of its values. `gram` is only read; `valid` from validRowsFromGram (its diagonal).
 */
export function measureSampleRows(
  gram: Float64Array,
  m: number,
  k: number,
  valid: Uint8Array,
  scale?: Float64Array,
  /** Called every few rows; throws to abandon the sweep (nothing outside it is written). */
  interrupt?: () => void,
): SampleRowMeasures {
  const sweep = new RowSweep(gram, m, k, valid, scale ?? new Float64Array(m).fill(1));
  // One call per row rather than one long loop: the row's code is optimised like any function,
  // not by on-stack replacement part way through each call (which, under tsx, was thrown away
  // again at the end of every call).
  for (let i = 0; i < m; i++) {
    if (interrupt !== undefined && (i & 31) === 0) interrupt();
    if (valid[i]) sweep.row(i);
  }
  return sweep.result();
}

/** measureSampleRows' state: the inputs, per-row scratch, and what the rows add up. */
class RowSweep {
  readonly knn: KnnLists;
  readonly bestScore: Float64Array;
  readonly bestPos: Uint32Array;
  /** Squared norms under the scale: 1 (or within rounding of it) for kept rows, 0 for empty ones. */
  readonly norms: Float64Array;
  readonly tieScore: Float64Array;
  readonly tiePos: Uint32Array;
  readonly near: Float64Array;
  /** twoRanks' working space and answer. */
  readonly rankBuckets = new Int32Array(RANK_BUCKETS);
  readonly rankScratch: Float64Array;
  readonly ranks = new Float64Array(2);
  readonly probe: Float64Array;
  readonly validTotal: number;
  readonly zScores: Float64Array;
  readonly pairBins: Float64Array;
  readonly nearBins: number[];
  readonly kOccurrence: Float64Array;
  readonly contrast: Float64Array;
  readonly slack: Float64Array;
  readonly toNearest = meanToNearestSums();
  readonly nnDist: Float64Array;
  /**
   * The iid dimension's pairs (j > i), summed as deviations from `shift`, the mean distance of
   * the first valid row: Σe and Σe² give the mean and variance without a second pass.
   */
  readonly shift: number;
  validSeen = 0;
  pairCount = 0;
  pairSum = 0;
  pairSumSq = 0;

  constructor(
    readonly gram: Float64Array,
    readonly m: number,
    readonly k: number,
    readonly valid: Uint8Array,
    readonly rowScale: Float64Array,
  ) {
    this.knn = emptyKnnLists(m, k);
    this.bestScore = new Float64Array(k);
    this.bestPos = new Uint32Array(k);
    this.norms = new Float64Array(m);
    for (let i = 0; i < m; i++) this.norms[i] = gram[i * m + i]! * rowScale[i]! * rowScale[i]!;
    this.tieScore = new Float64Array(m);
    this.tiePos = new Uint32Array(m);
    this.near = new Float64Array(m);
    this.rankScratch = new Float64Array(m);
    this.probe = new Float64Array(Math.ceil(m / RADIUS_PROBE_STRIDE) + 1);
    let validTotal = 0;
    for (let i = 0; i < m; i++) if (valid[i]) validTotal++;
    this.validTotal = validTotal;
    this.zScores = new Float64Array(m).fill(NaN);
    this.pairBins = new Float64Array(SIMILARITY_BINS);
    this.nearBins = new Array<number>(SIMILARITY_BINS).fill(0);
    this.kOccurrence = new Float64Array(m);
    this.contrast = new Float64Array(m).fill(NaN);
    this.slack = new Float64Array(m).fill(NaN);
    this.nnDist = new Float64Array(m * k).fill(NaN);
    let shift = NaN;
    for (let i = 0; i < m && Number.isNaN(shift); i++) if (valid[i]) shift = firstRowMeanDistance(gram, i, m, valid, rowScale, this.norms);
    this.shift = shift;
  }

  /** Row i's part of every measure (i a valid row). */
  row(i: number): void {
    const { gram, m, k, valid, rowScale, norms, bestScore, bestPos, tieScore, tiePos, near, validTotal, shift } = this;
    const { knn, zScores, pairBins, nearBins, kOccurrence, contrast, slack, toNearest, nnDist } = this;
    // Imports read once into locals: a module loader may reach them through getters (tsx's
    // does), which would cost a call per element in the loops below.
    const bins = SIMILARITY_BINS;
    const binOfSimilarity = binOf;
    const samePoint = SAME_POINT;
    const tieTolerance = TIE_TOLERANCE;
    const base = i * m;
    const si = rowScale[i]!;
    const ni = norms[i]!;
    const limit = radiusBound(gram, i, m, valid, rowScale, norms, Math.min(10 * k, validTotal - 1), validTotal - 1, this.probe);
    let filled = 0;
    let bar = -Infinity; // a score must beat this to enter the full list
    let keep = -Infinity; // a score at least this is kept aside as a possible tie at the k-th place
    let ties = 0;
    let nNear = 0;
    let sum = 0;
    let others = 0;
    let first = NaN;
    let devSum = 0;
    let devSumSq = 0;
    let dMin = Infinity;
    let dMax = -Infinity;
    let dSum = 0;
    let eSum = this.pairSum;
    let eSumSq = this.pairSumSq;

    for (let j = 0; j < m; j++) {
      if (j === i || !valid[j]) continue;
      const s = gram[base + j]! * si * rowScale[j]!;
      const nj = norms[j]!;
      const sq = ni + nj - 2 * s;
      const d = sq > samePoint * (ni + nj) ? Math.sqrt(sq) : 0;
      if (s >= keep) {
        tieScore[ties] = s;
        tiePos[ties++] = j;
        if (filled < k || s > bar) {
          // nearestOfRow's rule: shift clearly worse entries down; equal scores stay ahead.
          let slot = filled < k ? filled++ : k - 1;
          while (slot > 0 && s > bestScore[slot - 1]! + tieTolerance * Math.max(1, Math.abs(bestScore[slot - 1]!))) {
            bestScore[slot] = bestScore[slot - 1]!;
            bestPos[slot] = bestPos[slot - 1]!;
            slot--;
          }
          bestScore[slot] = s;
          bestPos[slot] = j;
          if (filled === k) {
            const kth = bestScore[k - 1]!;
            bar = kth + tieTolerance * Math.max(1, Math.abs(kth));
            keep = kth - 4 * tieTolerance * Math.max(1, Math.abs(kth));
          }
        }
      }
      if (sq <= limit) near[nNear++] = d;
      sum += s;
      if (others === 0) first = s;
      const dev = s - first;
      devSum += dev;
      devSumSq += dev * dev;
      others++;
      if (d < dMin) dMin = d;
      if (d > dMax) dMax = d;
      dSum += d;
      if (j > i) {
        pairBins[binOfSimilarity(s, bins)]++;
        const e = d - shift;
        eSum += e;
        eSumSq += e * e;
      }
    }
    this.pairSum = eSum;
    this.pairSumSq = eSumSq;
    this.validSeen++;
    this.pairCount += validTotal - this.validSeen;

    for (let r = 0; r < filled; r++) {
      const j = bestPos[r]!;
      knn.neighbors[i * k + r] = j;
      knn.sims[i * k + r] = bestScore[r]!;
      const nj = norms[j]!;
      const sq = ni + nj - 2 * bestScore[r]!;
      nnDist[i * k + r] = sq > samePoint * (ni + nj) ? Math.sqrt(sq) : 0;
    }
    const nearest = filled > 0 ? bestScore[0]! : NaN;
    if (!Number.isNaN(nearest)) nearBins[binOfSimilarity(nearest, bins)]++;
    contrast[i] = dMin > 0 && dMin < Infinity ? (dMax - dMin) / dMin : NaN;
    if (others > 0) {
      toNearest.sumMean += dSum / others;
      toNearest.sumMin += dMin;
      toNearest.queries++;
    }
    // standout (standoutGivenSum): the z-score of the nearest similarity
    if (others >= 2 && !Number.isNaN(nearest)) {
      const mean = sum / others;
      const meanDev = devSum / others;
      const sd = Math.sqrt(Math.max(0, devSumSq / others - meanDev * meanDev));
      if (sd > 1e-12 * Math.max(1, Math.abs(mean))) zScores[i] = (nearest - mean) / sd;
    }
    // N_k (addKOccurrenceOfRow): firm list entries count 1, the values tied with the k-th share the rest
    if (filled > 0) {
      const last = bestScore[filled - 1]!;
      const tol = tieTolerance * Math.max(1, Math.abs(last));
      let firm = 0;
      for (let r = 0; r < filled; r++) {
        if (Math.abs(bestScore[r]! - last) <= tol) continue;
        kOccurrence[bestPos[r]!] += 1;
        firm++;
      }
      let group = 0;
      for (let g = 0; g < ties; g++) if (Math.abs(tieScore[g]! - last) <= tol) tiePos[group++] = tiePos[g]!;
      const slots = filled - firm;
      const share = slots / Math.max(group, slots);
      for (let g = 0; g < group; g++) kOccurrence[tiePos[g]!] += share;
    }
    // radius slack (radiusSlackPerQuery): the k-th and the 10k-th smallest distance of the row
    if (others >= k) {
      const far = Math.min(10 * k, others);

      if (nNear < far) nNear = gatherDistances(gram, i, m, valid, rowScale, norms, near);
      twoRanks(near, nNear, k - 1, far - 1, this.rankBuckets, this.rankScratch, this.ranks);
      const rK = this.ranks[0]!;
      const rFar = this.ranks[1]!;
      slack[i] = rK > 0 ? (rFar - rK) / rK : NaN;
    }
  }

  result(): SampleRowMeasures {
    return {
      knn: this.knn,
      kOccurrence: this.kOccurrence,
      standout: medianStandout(this.zScores),
      standoutPerQuery: this.zScores,
      similarity: { start: 0, binWidth: 1 / SIMILARITY_BINS, pairs: Array.from(this.pairBins), nearest: this.nearBins },
      contrast: contrastSummary(this.contrast),
      meanToNearest: meanToNearestOf(this.toNearest),
      iidEquivalentDimension: iidDimensionOfCv(shiftedCv(this.pairSum, this.pairSumSq, this.pairCount, this.shift)),
      radiusSlack: radiusSlackSummary(this.slack),
      nnDist: this.nnDist,
    };
  }
}

/** How many value ranges twoRanks counts in. */
const RANK_BUCKETS = 64;

/**
 * The values of ranks r1 and r2 (0 = smallest) among a[0..n), into out[0] and out[1]; `a` is
 * not reordered. Each value is counted in one of `buckets.length` equal ranges between the
 * least and the greatest value; the bucket a value falls in never decreases as the value grows
 * (a difference, a product by a positive constant and a floor each keep the order), so rank r
 * lies in the bucket where the running count passes r, and only that bucket's values are
 * selected among. Two quickselects over the gathered radius values cost more than the rest of
 * a row's radius slack (their comparisons are a coin toss for the branch predictor); the counts
 * and the gather are mostly predictable. Values equal to the same bits as selectRank's.
 */
export function twoRanks(a: Float64Array, n: number, r1: number, r2: number, buckets: Int32Array, scratch: Float64Array, out: Float64Array): void {
  let lo = Infinity;
  let hi = -Infinity;
  for (let t = 0; t < n; t++) {
    const x = a[t]!;
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  if (!(hi > lo)) {
    out[0] = out[1] = lo;
    return;
  }
  const count = buckets.length;
  const last = count - 1;
  const perUnit = count / (hi - lo);
  buckets.fill(0);
  for (let t = 0; t < n; t++) {
    const b = Math.floor((a[t]! - lo) * perUnit);
    buckets[b < last ? b : last]++;
  }
  // The bucket holding each rank and how many values lie in the buckets below it.
  let b1 = 0;
  let below1 = 0;
  while (below1 + buckets[b1]! <= r1) below1 += buckets[b1++]!;
  let b2 = 0;
  let below2 = 0;
  while (below2 + buckets[b2]! <= r2) below2 += buckets[b2++]!;
  let n1 = 0;
  let n2 = n; // the second bucket's values are gathered from the end of the scratch
  for (let t = 0; t < n; t++) {
    const x = a[t]!;
    const raw = Math.floor((x - lo) * perUnit);
    const b = raw < last ? raw : last;
    if (b === b1) scratch[n1++] = x;
    if (b === b2 && b2 !== b1) scratch[--n2] = x;
  }
  out[0] = selectRank(scratch, 0, n1 - 1, r1 - below1);
  out[1] = b2 === b1 ? selectRank(scratch, 0, n1 - 1, r2 - below1) : selectRank(scratch, n2, n - 1, n2 + r2 - below2);
}

/** Every how many entries radiusBound reads a row. */
const RADIUS_PROBE_STRIDE = 8;

/**
 * A squared distance below which about 2·far of row i's `others` distances lie, read from every
 * RADIUS_PROBE_STRIDE-th entry (Infinity when the row is too short to tell): its quantile is
 * twice far/others plus a few entries, so falling short of `far` (one more pass) is rare.
 */
function radiusBound(gram: Float64Array, i: number, m: number, valid: Uint8Array, rowScale: Float64Array, norms: Float64Array, far: number, others: number, probe: Float64Array): number {
  const base = i * m;
  const si = rowScale[i]!;
  const ni = norms[i]!;
  let n = 0;
  for (let j = 0; j < m; j += RADIUS_PROBE_STRIDE) {
    if (j === i || !valid[j]) continue;
    probe[n++] = ni + norms[j]! - 2 * (gram[base + j]! * si * rowScale[j]!);
  }
  const rank = Math.ceil((2 * far * n) / Math.max(1, others)) + 4;
  return rank >= n - 1 ? Infinity : selectRank(probe, 0, n - 1, rank);
}

/** Every distance of row i to the other valid rows into `out`; returns the count. */
function gatherDistances(gram: Float64Array, i: number, m: number, valid: Uint8Array, rowScale: Float64Array, norms: Float64Array, out: Float64Array): number {
  const base = i * m;
  const si = rowScale[i]!;
  const ni = norms[i]!;
  let n = 0;
  for (let j = 0; j < m; j++) {
    if (j === i || !valid[j]) continue;
    const nj = norms[j]!;
    const sq = ni + nj - 2 * (gram[base + j]! * si * rowScale[j]!);
    out[n++] = sq > SAME_POINT * (ni + nj) ? Math.sqrt(sq) : 0;
  }
  return n;
}

/** Mean distance of row i to the other valid rows (NaN when it has none): the iid pair sums' shift. */
function firstRowMeanDistance(gram: Float64Array, i: number, m: number, valid: Uint8Array, rowScale: Float64Array, norms: Float64Array): number {
  const scratch = new Float64Array(m);
  const n = gatherDistances(gram, i, m, valid, rowScale, norms, scratch);
  let sum = 0;
  for (let g = 0; g < n; g++) sum += scratch[g]!;
  return n > 0 ? sum / n : NaN;
}

/** sd/mean of values given as n deviations e from `shift`: mean = shift + Σe/n, var = Σe²/n − (Σe/n)². */
function shiftedCv(sumE: number, sumE2: number, n: number, shift: number): number | null {
  if (n < 2) return null;
  const meanE = sumE / n;
  const mean = shift + meanE;
  if (!(mean > 0)) return null;
  const variance = Math.max(0, sumE2 / n - meanE * meanE);
  return Math.sqrt(variance) / mean;
}
