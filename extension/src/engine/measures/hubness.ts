import { NO_NEIGHBOR } from './knn';

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
export function hubnessSummary(counts: Uint32Array, valid: Uint8Array, k: number): HubnessSummary | null {
  let n = 0;
  let sum = 0;
  let hubs = 0;
  let orphans = 0;
  for (let i = 0; i < counts.length; i++) {
    if (!valid[i]) continue;
    n++;
    sum += counts[i];
    if (counts[i] > 2 * k) hubs++;
    if (counts[i] === 0) orphans++;
  }
  if (n < 3) return null;
  const mean = sum / n;
  let m2 = 0;
  let m3 = 0;
  for (let i = 0; i < counts.length; i++) {
    if (!valid[i]) continue;
    const d = counts[i] - mean;
    m2 += d * d;
    m3 += d * d * d;
  }
  m2 /= n;
  m3 /= n;
  const skewness = m2 > 0 ? m3 / Math.pow(m2, 1.5) : 0;
  return { skewness, hubs, orphans };
}

/**
 * Positions of the `count` most frequent neighbours with N_k > 0, highest first, ties to the
 * lower position (stable sort).
 */
export function topHubPositions(counts: Uint32Array, count: number): Uint32Array {
  const positions: number[] = [];
  for (let i = 0; i < counts.length; i++) if (counts[i] > 0) positions.push(i);
  positions.sort((a, b) => counts[b] - counts[a] || a - b);
  return Uint32Array.from(positions.slice(0, count));
}

/**
 * Histogram of N_k over valid rows: out[i] rows have N_k = i for i < lastBin, and out[lastBin]
 * rows have N_k ≥ lastBin.
 */
export function kOccurrenceHistogram(counts: Uint32Array, valid: Uint8Array, lastBin: number): number[] {
  const out: number[] = new Array(lastBin + 1).fill(0);
  for (let i = 0; i < counts.length; i++) {
    if (!valid[i]) continue;
    out[Math.min(counts[i], lastBin)]++;
  }
  return out;
}
