import { SAME_POINT } from './gram-distances';
import { iidDimensionOfCv } from './iid-equivalent-dimension';
import { NO_NEIGHBOR, TIE_TOLERANCE, type KnnLists } from './knn';
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
 *   seen (the k-th score only rises, so this holds every value tied with the final one), of
 *   which the row keeps the count of those tied with the final one (see reduceSweep);
 * - the radius slack's k-th and 10k-th distance: the distances whose squared distance is at most
 *   a bound read beforehand from every 8th entry of the row (a quantile of about 1.5 times 10k/m, so
 *   ~1.5–2·10k values are kept); when fewer than 10k fall under it, the row's distances are gathered
 *   again. Ranks among the gathered values are ranks in the row, so the values are radiusSlack's.
 * At m = 2,000 the matrix is 32 MB; the panel's what-if used to read it about 9 times per toggle.
 * The rows write their own outputs and the sums across rows are added up afterwards, in row
 * order (reduceSweep), so blocks of rows can be swept by two threads (SharedRowSweep).
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
  /**
   * Rows per block of the iid dimension's pair sums (see SweepRows.block); m (the default) is the
   * Report's one running sum. The what-if's sweep, which two threads share, sums per block.
   */
  blockRows = m,
): SampleRowMeasures {
  const rowScale = scale ?? new Float64Array(m).fill(1);
  const rows = Math.max(1, blockRows);
  const blocks = Math.ceil(m / rows);
  const out = sweepOutputs(m, k, blocks);
  const sweep = new SweepRows(gram, m, k, valid, rowScale, pairShift(gram, m, valid, rowScale), out, rows);
  // One call per row rather than one long loop: the row's code is optimised like any function,
  // not by on-stack replacement part way through each call (which, under tsx, was thrown away
  // again at the end of every call).
  for (let b = 0; b < blocks; b++) sweep.block(b, interrupt);
  // The outputs are this call's own: handed over as they are.
  return reduceSweep(sweep, out, blocks, false);
}

/**
 * What the sweep leaves per row, and per block of rows, for reduceSweep to add up in row order:
 * whatever thread computed a row, the sums come out the same. The arrays may be shared between
 * threads (measures/shared-row-sweep.ts); every row writes all of its entries, an invalid row
 * its "none" values.
 */
export interface SweepOutputs {
  knn: KnnLists;
  nnDist: Float64Array;
  zScores: Float64Array;
  contrast: Float64Array;
  slack: Float64Array;
  /** The row's mean distance to the others (NaN without others), for mean-to-nearest. */
  rowMean: Float64Array;
  rowMin: Float64Array;
  /** The bin of the row's nearest similarity, −1 when it has none. */
  nearBin: Int32Array;
  /** How many values tied with the row's k-th score (tieAwareKOccurrence's group), 0 without a list. */
  tieGroup: Int32Array;
  /** Per block: the iid pair sums Σe and Σe² of its rows, side by side. */
  blockPairs: Float64Array;
  /** Per block: its rows' pair similarity histogram (SIMILARITY_BINS counts). */
  blockBins: Float64Array;
}

/** Outputs of a sweep over m rows in `blocks` blocks (plain arrays; shared ones come from a SharedRowSweep). */
export function sweepOutputs(m: number, k: number, blocks: number, buffer: (bytes: number) => ArrayBufferLike = (bytes) => new ArrayBuffer(bytes)): SweepOutputs {
  const f64 = (n: number) => new Float64Array(buffer(8 * n));
  const i32 = (n: number) => new Int32Array(buffer(4 * n));
  return {
    knn: { neighbors: new Uint32Array(buffer(4 * m * k)), sims: f64(m * k) },
    nnDist: f64(m * k),
    zScores: f64(m),
    contrast: f64(m),
    slack: f64(m),
    rowMean: f64(m),
    rowMin: f64(m),
    nearBin: i32(m),
    tieGroup: i32(m),
    blockPairs: f64(2 * blocks),
    blockBins: f64(SIMILARITY_BINS * blocks),
  };
}

/**
 * The shift of the iid dimension's pair sums: the mean distance of the first valid row (NaN when
 * none), read before the sweep so that every block sums around the same value.
 */
export function pairShift(gram: Float64Array, m: number, valid: Uint8Array, rowScale: Float64Array): number {
  const norms = squaredNorms(gram, m, rowScale);
  for (let i = 0; i < m; i++) if (valid[i]) return firstRowMeanDistance(gram, i, m, valid, rowScale, norms);
  return NaN;
}

/** Squared norms under the scale: 1 (or within rounding of it) for kept rows, 0 for empty ones. */
function squaredNorms(gram: Float64Array, m: number, rowScale: Float64Array): Float64Array {
  const norms = new Float64Array(m);
  for (let i = 0; i < m; i++) norms[i] = gram[i * m + i]! * rowScale[i]! * rowScale[i]!;
  return norms;
}

/**
 * The per-row part of measureSampleRows: the inputs, per-row scratch, and where the rows write
 * (`out`). Rows come in blocks of `blockRows` (block b: rows b·blockRows ..); a block's rows are
 * swept in order and their iid pair sums run on from one row to the next, starting at 0 in each
 * block, so a block's figures do not depend on which thread swept it or when.
 */
export class SweepRows {
  readonly bestScore: Float64Array;
  readonly bestPos: Uint32Array;
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
  /** The current block's histogram and running pair sums (the iid dimension's, around `shift`). */
  pairBins: Float64Array;
  pairSum = 0;
  pairSumSq = 0;

  constructor(
    readonly gram: Float64Array,
    readonly m: number,
    readonly k: number,
    readonly valid: Uint8Array,
    readonly rowScale: Float64Array,
    /** pairShift's value: Σe and Σe² give the pairs' mean and variance without a second pass. */
    readonly shift: number,
    readonly out: SweepOutputs,
    readonly blockRows: number,
  ) {
    this.bestScore = new Float64Array(k);
    this.bestPos = new Uint32Array(k);
    this.norms = squaredNorms(gram, m, rowScale);
    this.tieScore = new Float64Array(m);
    this.tiePos = new Uint32Array(m);
    this.near = new Float64Array(m);
    this.rankScratch = new Float64Array(m);
    this.probe = new Float64Array(Math.ceil(m / RADIUS_PROBE_STRIDE) + 1);
    let validTotal = 0;
    for (let i = 0; i < m; i++) if (valid[i]) validTotal++;
    this.validTotal = validTotal;
    this.pairBins = out.blockBins.subarray(0, SIMILARITY_BINS);
  }

  /** Block b's rows, in order, with their pair sums and histogram; `interrupt` as measureSampleRows'. */
  block(b: number, interrupt?: () => void): void {
    const first = b * this.blockRows;
    const end = Math.min(this.m, first + this.blockRows);
    this.pairBins = this.out.blockBins.subarray(b * SIMILARITY_BINS, (b + 1) * SIMILARITY_BINS);
    this.pairBins.fill(0);
    this.pairSum = 0;
    this.pairSumSq = 0;
    for (let i = first; i < end; i++) {
      if (interrupt !== undefined && (i & 31) === 0) interrupt();
      if (this.valid[i]) this.row(i);
      else this.noRow(i);
    }
    this.out.blockPairs[2 * b] = this.pairSum;
    this.out.blockPairs[2 * b + 1] = this.pairSumSq;
  }

  /** An invalid row's outputs: no neighbours, no figures. */
  noRow(i: number): void {
    const { out, k } = this;
    out.knn.neighbors.fill(NO_NEIGHBOR, i * k, (i + 1) * k);
    out.knn.sims.fill(NaN, i * k, (i + 1) * k);
    out.nnDist.fill(NaN, i * k, (i + 1) * k);
    out.zScores[i] = NaN;
    out.contrast[i] = NaN;
    out.slack[i] = NaN;
    out.rowMean[i] = NaN;
    out.rowMin[i] = NaN;
    out.nearBin[i] = -1;
    out.tieGroup[i] = 0;
  }

  /**
   * Row i's part of every measure (i a valid row). measures/sweep-rows.wat is this (with block,
   * noRow and the helpers below) in WebAssembly, which the what-if's SharedRowSweep runs: a change
   * here is made there too (test/measures-sweep-rows-wasm.test.ts compares the two byte for byte).
   */
  row(i: number): void {
    const { gram, m, k, valid, rowScale, norms, bestScore, bestPos, tieScore, near, validTotal, shift, pairBins, out } = this;
    const { knn, zScores, contrast, slack, nnDist } = out;
    // Imports read once into locals: a module loader may reach them through getters (tsx's
    // does), which would cost a call per element in the loops below.
    const bins = SIMILARITY_BINS;
    const binOfSimilarity = binOf;
    const samePoint = SAME_POINT;
    const tieTolerance = TIE_TOLERANCE;
    const base = i * m;
    const si = rowScale[i]!;
    const ni = norms[i]!;
    const limit = radiusBound(gram, i, m, valid, rowScale, norms, Math.min(10 * k, validTotal - 1), validTotal - 1, this.probe, this.rankBuckets);
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
        tieScore[ties++] = s;
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

    for (let r = 0; r < k; r++) {
      if (r >= filled) {
        knn.neighbors[i * k + r] = NO_NEIGHBOR;
        knn.sims[i * k + r] = NaN;
        nnDist[i * k + r] = NaN;
        continue;
      }
      const j = bestPos[r]!;
      knn.neighbors[i * k + r] = j;
      knn.sims[i * k + r] = bestScore[r]!;
      const nj = norms[j]!;
      const sq = ni + nj - 2 * bestScore[r]!;
      nnDist[i * k + r] = sq > samePoint * (ni + nj) ? Math.sqrt(sq) : 0;
    }
    const nearest = filled > 0 ? bestScore[0]! : NaN;
    out.nearBin[i] = Number.isNaN(nearest) ? -1 : binOfSimilarity(nearest, bins);
    contrast[i] = dMin > 0 && dMin < Infinity ? (dMax - dMin) / dMin : NaN;
    out.rowMean[i] = others > 0 ? dSum / others : NaN;
    out.rowMin[i] = others > 0 ? dMin : NaN;
    // standout (standoutGivenSum): the z-score of the nearest similarity
    zScores[i] = NaN;
    if (others >= 2 && !Number.isNaN(nearest)) {
      const mean = sum / others;
      const meanDev = devSum / others;
      const sd = Math.sqrt(Math.max(0, devSumSq / others - meanDev * meanDev));
      if (sd > 1e-12 * Math.max(1, Math.abs(mean))) zScores[i] = (nearest - mean) / sd;
    }
    // N_k's tie group (addKOccurrenceOfRow): the values tied with the k-th, counted here and
    // added up by reduceSweep in row order
    let group = 0;
    if (filled > 0) {
      const last = bestScore[filled - 1]!;
      const tol = tieTolerance * Math.max(1, Math.abs(last));
      for (let g = 0; g < ties; g++) if (Math.abs(tieScore[g]! - last) <= tol) group++;
    }
    out.tieGroup[i] = group;
    // radius slack (radiusSlackPerQuery): the k-th and the 10k-th smallest distance of the row
    slack[i] = NaN;
    if (others >= k) {
      const far = Math.min(10 * k, others);

      if (nNear < far) nNear = gatherDistances(gram, i, m, valid, rowScale, norms, near);
      twoRanks(near, nNear, k - 1, far - 1, this.rankBuckets, this.rankScratch, this.ranks);
      const rK = this.ranks[0]!;
      const rFar = this.ranks[1]!;
      slack[i] = rK > 0 ? (rFar - rK) / rK : NaN;
    }
  }
}

/**
 * The rows' outputs added up in row order (and the blocks' in block order): the sums of N_k,
 * mean-to-nearest and the iid dimension, the histograms, and each measure's summary. N_k as
 * addKOccurrenceOfRow adds it: a row's firm list entries count 1 and the values tied with its
 * k-th place share the remaining slots. When they are no more than those slots they are the
 * list's own tied entries (each candidate the sweep kept aside is in the list or beyond it), so
 * each list entry counts 1; otherwise the row is read again for them (tiedPositions).
 * With `copy` (the default) the per-row arrays handed back (knn, standoutPerQuery, nnDist) are
 * copies of `out`'s; without, `out`'s own, for a caller that owns `out` or reads them before the
 * next sweep writes it (the what-if's thread: a click's copies were ~0.4 MB of garbage).
 */
export function reduceSweep(sweep: SweepRows, out: SweepOutputs, blocks: number, copy = true): SampleRowMeasures {
  const { m, k, valid, validTotal } = sweep;
  const { knn, tieGroup } = out;
  // Imports read once into locals (see SweepRows.row).
  const none = NO_NEIGHBOR;
  const tieTolerance = TIE_TOLERANCE;
  const kOccurrence = new Float64Array(m);
  const nearBins = new Array<number>(SIMILARITY_BINS).fill(0);
  const toNearest = meanToNearestSums();
  let validSeen = 0;
  let pairCount = 0;
  for (let i = 0; i < m; i++) {
    if (!valid[i]) continue;
    validSeen++;
    pairCount += validTotal - validSeen;
    if (out.nearBin[i]! >= 0) nearBins[out.nearBin[i]!]++;
    if (!Number.isNaN(out.rowMean[i]!)) {
      toNearest.sumMean += out.rowMean[i]!;
      toNearest.sumMin += out.rowMin[i]!;
      toNearest.queries++;
    }
    let filled = 0;
    while (filled < k && knn.neighbors[i * k + filled] !== none) filled++;
    if (filled === 0) continue;
    const last = knn.sims[i * k + filled - 1]!;
    const tol = tieTolerance * Math.max(1, Math.abs(last));
    let firm = 0;
    for (let r = 0; r < filled; r++) if (!(Math.abs(knn.sims[i * k + r]! - last) <= tol)) firm++;
    const slots = filled - firm;
    const group = tieGroup[i]!;
    if (group <= slots) {
      for (let r = 0; r < filled; r++) kOccurrence[knn.neighbors[i * k + r]!] += 1;
      continue;
    }
    for (let r = 0; r < filled; r++) if (!(Math.abs(knn.sims[i * k + r]! - last) <= tol)) kOccurrence[knn.neighbors[i * k + r]!] += 1;
    const share = slots / group;
    for (const j of tiedPositions(sweep, i, last, tol)) kOccurrence[j] += share;
  }
  let pairSum = 0;
  let pairSumSq = 0;
  const pairBins = new Float64Array(SIMILARITY_BINS);
  for (let b = 0; b < blocks; b++) {
    // One block (the Report's sweep): its running sums as they are, not added to a zero.
    pairSum = b === 0 ? out.blockPairs[0]! : pairSum + out.blockPairs[2 * b]!;
    pairSumSq = b === 0 ? out.blockPairs[1]! : pairSumSq + out.blockPairs[2 * b + 1]!;
    for (let c = 0; c < SIMILARITY_BINS; c++) pairBins[c] += out.blockBins[b * SIMILARITY_BINS + c]!;
  }
  return {
    knn: copy ? { neighbors: knn.neighbors.slice(), sims: knn.sims.slice() } : { neighbors: knn.neighbors, sims: knn.sims },
    kOccurrence,
    standout: medianStandout(out.zScores),
    standoutPerQuery: copy ? out.zScores.slice() : out.zScores,
    similarity: { start: 0, binWidth: 1 / SIMILARITY_BINS, pairs: Array.from(pairBins), nearest: nearBins },
    contrast: contrastSummary(out.contrast),
    meanToNearest: meanToNearestOf(toNearest),
    iidEquivalentDimension: iidDimensionOfCv(shiftedCv(pairSum, pairSumSq, pairCount, sweep.shift)),
    radiusSlack: radiusSlackSummary(out.slack),
    nnDist: copy ? out.nnDist.slice() : out.nnDist,
  };
}

/**
 * The positions of row i whose score is within `tol` of `last`, ascending: the group the sweep
 * counted. It kept aside each score at least 4·tol below the k-th score of the moment, which only
 * rises to `last`, so every score within tol of `last` was kept aside, and these are the same.
 */
function tiedPositions(sweep: SweepRows, i: number, last: number, tol: number): number[] {
  const { gram, m, valid, rowScale } = sweep;
  const base = i * m;
  const si = rowScale[i]!;
  const tied: number[] = [];
  for (let j = 0; j < m; j++) {
    if (j === i || !valid[j]) continue;
    const s = gram[base + j]! * si * rowScale[j]!;
    if (Math.abs(s - last) <= tol) tied.push(j);
  }
  return tied;
}

/**
 * How many value ranges twoRanks (and radiusBound) count in. With ~250 distances kept aside per
 * row, most of twoRanks' time is the quickselects inside the two ranges it picks, so finer ranges
 * pay: a what-if sweep at m = 2,000 took ~80 ms with 16, ~57 with 64, ~54 with 256, ~56 with 1,024
 * and ~70 with 4,096 ranges (clearing the counts then costs more than the selections save).
 * sweep-rows.wat has the same number written in (its counts' size and scale).
 */
export const RANK_BUCKETS = 256;

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
  if (!countInRanges(a, n, buckets)) {
    out[0] = out[1] = RANGES[0]!;
    return;
  }
  const lo = RANGES[0]!;
  const perUnit = RANGES[1]!;
  const last = buckets.length - 1;
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

/** countInRanges' answer: the least value, the ranges per unit, the greatest value. */
const RANGES = new Float64Array(3);

/**
 * Counts each of a[0..n) in one of `buckets.length` equal ranges between the least and the
 * greatest value (the greatest in the last range), for twoRanks and bucketBound; RANGES gets the
 * least value, the ranges per unit and the greatest value. False, with nothing counted, when the
 * values are all equal (RANGES[0] their value).
 */
function countInRanges(a: Float64Array, n: number, buckets: Int32Array): boolean {
  let lo = Infinity;
  let hi = -Infinity;
  for (let t = 0; t < n; t++) {
    const x = a[t]!;
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  RANGES[0] = lo;
  RANGES[2] = hi;
  if (!(hi > lo)) return false;
  const last = buckets.length - 1;
  const perUnit = buckets.length / (hi - lo);
  RANGES[1] = perUnit;
  buckets.fill(0);
  for (let t = 0; t < n; t++) {
    const b = Math.floor((a[t]! - lo) * perUnit);
    buckets[b < last ? b : last]++;
  }
  return true;
}

/** Every how many entries radiusBound reads a row. */
const RADIUS_PROBE_STRIDE = 8;

/**
 * A squared distance below which about 1.5·far of row i's `others` distances lie, read from every
 * RADIUS_PROBE_STRIDE-th entry (Infinity when the row is too short to tell): its quantile is
 * 1.5 times far/others plus a few entries, so falling short of `far` (one more pass) is rare: at
 * m = 2,000 and k = 10 the 10k-th distance falls past the probe's rank 23 only when ~3.2 standard
 * deviations more of the 250 probe values than expected lie below it (none of 12,000 rows of
 * three what-if states; ~200 distances kept aside per row against ~255 at twice, which was 2.5 ms
 * slower per sweep). Any bound gives the same radius slack (the values under it are the row's
 * smallest, so their ranks are the row's; too few and the row is gathered again): the bound only
 * sets the work.
 */
function radiusBound(gram: Float64Array, i: number, m: number, valid: Uint8Array, rowScale: Float64Array, norms: Float64Array, far: number, others: number, probe: Float64Array, buckets: Int32Array): number {
  const base = i * m;
  const si = rowScale[i]!;
  const ni = norms[i]!;
  let n = 0;
  for (let j = 0; j < m; j += RADIUS_PROBE_STRIDE) {
    if (j === i || !valid[j]) continue;
    probe[n++] = ni + norms[j]! - 2 * (gram[base + j]! * si * rowScale[j]!);
  }
  const rank = Math.ceil((1.5 * far * n) / Math.max(1, others)) + 4;
  return rank >= n - 1 ? Infinity : bucketBound(probe, n, rank, buckets);
}

/**
 * A value at least the rank-th smallest of a[0..n) (0 = smallest): the top of the range, of
 * `buckets.length` equal ranges between the least and the greatest value, where the running
 * count passes `rank` (twoRanks' counts, without its selection). A quickselect here cost ~3 ms
 * more per what-if sweep at m = 2,000 (its comparisons are a coin toss for the branch
 * predictor), for a bound that only needs to be about right.
 */
function bucketBound(a: Float64Array, n: number, rank: number, buckets: Int32Array): number {
  if (!countInRanges(a, n, buckets)) return RANGES[2]!;
  const lo = RANGES[0]!;
  const perUnit = RANGES[1]!;
  const hi = RANGES[2]!;
  const last = buckets.length - 1;
  let b = 0;
  let below = buckets[0]!;
  while (below <= rank) below += buckets[++b]!;
  // Rounding may put a value just past its range's computed top: the next range's top is safe.
  return b + 1 >= last ? hi : lo + (b + 2) / perUnit;
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
