import { NO_NEIGHBOR, TIE_TOLERANCE } from './knn';

/**
 * Hubness from k-occurrences (Radovanović, Nanopoulos & Ivanović 2010, "Hubs in space:
 * popular nearest neighbors in high-dimensional data", JMLR 11; docs/methods.md §5). N_k(x) counts the
 * k-NN lists of other points that contain x; its mean is k.
 */
export function kOccurrence(neighbors: Uint32Array, m: number, k: number): Uint32Array {
  const counts = new Uint32Array(m);
  for (let p = 0; p < m * k; p++) {
    const j = neighbors[p];
    if (j !== NO_NEIGHBOR) counts[j]++;
  }
  return counts;
}

/**
 * N_k when similarities tie at a row's k-th place. The k-NN lists break ties to the lower
 * position, so with all-identical documents the first k documents were everyone's neighbours
 * and the review reported k hubs that were an artefact of the order. Here a row whose k-th
 * similarity is shared by more candidates than it has slots left gives each of the tied
 * candidates an equal share of those slots: the expected N_k under a uniformly random tie-break.
 * Without such ties this is exactly kOccurrence. O(m) per row, on the m×m sample matrix.
 */
export function tieAwareKOccurrence(gram: Float64Array, m: number, k: number, neighbors: Uint32Array, neighborSims: Float64Array, valid: Uint8Array): Float64Array {
  const counts = new Float64Array(m);
  const tied = new Uint32Array(m);
  for (let i = 0; i < m; i++) addKOccurrenceOfRow(gram, i, m, k, neighbors, neighborSims, valid, counts, tied);
  return counts;
}

/** Row i's share of N_k (see tieAwareKOccurrence) added to `counts`; `tied` is m entries of scratch. */
export function addKOccurrenceOfRow(
  gram: Float64Array,
  i: number,
  m: number,
  k: number,
  neighbors: Uint32Array,
  neighborSims: Float64Array,
  valid: Uint8Array,
  counts: Float64Array,
  tied: Uint32Array,
): void {
  let filled = 0;
  while (filled < k && neighbors[i * k + filled] !== NO_NEIGHBOR) filled++;
  if (filled === 0) return;
  const last = neighborSims[i * k + filled - 1]!;
  const tol = TIE_TOLERANCE * Math.max(1, Math.abs(last));
  let firm = 0; // list entries clearly better than the last one: always neighbours
  for (let r = 0; r < filled; r++) {
    const j = neighbors[i * k + r]!;
    if (Math.abs(neighborSims[i * k + r]! - last) <= tol) continue;
    counts[j] += 1;
    firm++;
  }
  const slots = filled - firm;
  // One pass over the row collects the tied candidates.
  let group = 0;
  const base = i * m;
  for (let j = 0; j < m; j++) if (j !== i && valid[j] && Math.abs(gram[base + j]! - last) <= tol) tied[group++] = j;
  const share = slots / Math.max(group, slots);
  for (let g = 0; g < group; g++) counts[tied[g]!] += share;
}

export interface HubnessSummary {
  /** Moment skewness E[(N_k − μ)³]/σ³ over the valid rows. */
  skewness: number;
  /** Rows with N_k > 2k, the usual hub threshold in that line of work. */
  hubs: number;
  /** Rows with N_k = 0 (anti-hubs): nobody's neighbour. */
  orphans: number;
}

/**
 * Only valid rows count: an empty document is never anyone's neighbour, and counting it as an
 * orphan would report the stop list's side effect as hubness. null with fewer than 3 valid rows
 * (skewness is reported as 0 when every N_k is equal: no spread, no hubs).
 */
export function hubnessSummary(counts: ArrayLike<number>, valid: Uint8Array, k: number): HubnessSummary | null {
  let n = 0;
  let sum = 0;
  let hubs = 0;
  let orphans = 0;
  for (let i = 0; i < counts.length; i++) {
    if (!valid[i]) continue;
    n++;
    const c = counts[i]!;
    sum += c;
    if (c > 2 * k + 1e-9) hubs++;
    if (c < 1e-9) orphans++;
  }
  if (n < 3) return null;
  const mean = sum / n;
  let m2 = 0;
  let m3 = 0;
  for (let i = 0; i < counts.length; i++) {
    if (!valid[i]) continue;
    const d = counts[i]! - mean;
    m2 += d * d;
    m3 += d * d * d;
  }
  m2 /= n;
  m3 /= n;
  // Shares of tied slots leave rounding noise in an otherwise flat N_k: that is no spread.
  const skewness = m2 > 1e-12 * Math.max(1, mean * mean) ? m3 / Math.pow(m2, 1.5) : 0;
  return { skewness, hubs, orphans };
}

/**
 * Positions of the `count` most frequent neighbours with N_k > 0, highest first, ties to the
 * lower position (stable sort).
 */
export function topHubPositions(counts: ArrayLike<number>, count: number): Uint32Array {
  const positions: number[] = [];
  for (let i = 0; i < counts.length; i++) if (counts[i]! > 0) positions.push(i);
  positions.sort((a, b) => counts[b]! - counts[a]! || a - b);
  return Uint32Array.from(positions.slice(0, count));
}

/**
 * Histogram of N_k over valid rows: out[i] rows have N_k = i for i < lastBin, and out[lastBin]
 * rows have N_k ≥ lastBin.
 */
export function kOccurrenceHistogram(counts: ArrayLike<number>, valid: Uint8Array, lastBin: number): number[] {
  const out: number[] = new Array(lastBin + 1).fill(0);
  for (let i = 0; i < counts.length; i++) {
    if (!valid[i]) continue;
    out[Math.min(Math.round(counts[i]!), lastBin)]++;
  }
  return out;
}
