import { mulberry32, randomBelow } from '../random/seeded-random';

export type Statistic = 'mean' | 'median';

/**
 * Change of a per-query statistic between two settings on the same queries, with a percentile
 * bootstrap interval (Efron & Tibshirani 1993, "An Introduction to the Bootstrap", ch. 13):
 * queries are resampled with replacement, the same draw for both settings (paired), `draws`
 * times, seeded. Queries with NaN in either setting are left out.
 * Returns null when fewer than 2 queries have both values.
 */
export function pairedBootstrap(
  before: Float64Array,
  after: Float64Array,
  statistic: Statistic,
  draws: number,
  seed: number,
  level = 0.95,
): { change: number; low: number; high: number; queries: number } | null {
  const a: number[] = [];
  const b: number[] = [];
  for (let i = 0; i < before.length; i++) {
    if (Number.isNaN(before[i]!) || Number.isNaN(after[i]!)) continue;
    a.push(before[i]!);
    b.push(after[i]!);
  }
  const n = a.length;
  if (n < 2) return null;
  const stat = statistic === 'mean' ? meanOf : medianOf;
  const change = stat(b) - stat(a);
  const random = mulberry32(seed);
  const changes = new Float64Array(draws);
  const ofA = resampled(a, statistic);
  const ofB = resampled(b, statistic);
  const picks = new Uint32Array(n);
  for (let d = 0; d < draws; d++) {
    for (let i = 0; i < n; i++) picks[i] = randomBelow(random, n);
    changes[d] = ofB(picks) - ofA(picks);
  }
  changes.sort();
  const tail = (1 - level) / 2;
  const at = (q: number): number => changes[Math.min(draws - 1, Math.max(0, Math.round(q * (draws - 1))))]!;
  return { change, low: at(tail), high: at(1 - tail), queries: n };
}

function meanOf(x: number[]): number {
  let s = 0;
  for (const v of x) s += v;
  return s / x.length;
}

function medianOf(x: number[]): number {
  const s = [...x].sort((p, q) => p - q);
  const h = s.length >> 1;
  return s.length % 2 === 1 ? s[h]! : (s[h - 1]! + s[h]!) / 2;
}

/**
 * The statistic of a resample of `values` given as the indices drawn. The mean adds in draw
 * order, as a copied resample would. The median is an order statistic of the original values:
 * count how often each is drawn (by its rank) and walk the counts, O(n) a draw instead of a sort,
 * with the same arithmetic as sorting the resample, so the same interval to the bit.
 */
function resampled(values: readonly number[], statistic: Statistic): (picks: Uint32Array) => number {
  if (statistic === 'median') {
    const median = new ResampleMedian(values);
    return (picks) => median.of(picks);
  }
  return (picks) => {
    let s = 0;
    for (let i = 0; i < picks.length; i++) s += values[picks[i]!]!;
    return s / picks.length;
  };
}

/** Medians of resamples of fixed values, each resample given as the indices drawn. */
class ResampleMedian {
  /** rank[j]: position of value j in ascending order (ties broken by index). */
  private readonly rank: Uint32Array;
  private readonly sorted: Float64Array;
  private readonly counts: Uint32Array;

  constructor(values: readonly number[]) {
    const n = values.length;
    const order = Array.from({ length: n }, (_, i) => i).sort((p, q) => values[p]! - values[q]! || p - q);
    this.rank = new Uint32Array(n);
    this.sorted = new Float64Array(n);
    order.forEach((j, r) => {
      this.rank[j] = r;
      this.sorted[r] = values[j]!;
    });
    this.counts = new Uint32Array(n);
  }

  of(picks: Uint32Array): number {
    const { rank, sorted, counts } = this;
    const n = picks.length;
    counts.fill(0);
    for (let i = 0; i < n; i++) counts[rank[picks[i]!]!]!++;
    const h = n >> 1;
    // The (h−1)-th and h-th smallest of the resample (0-based).
    let seen = 0;
    let lower = Number.NaN;
    for (let r = 0; r < n; r++) {
      const c = counts[r]!;
      if (c === 0) continue;
      if (Number.isNaN(lower) && seen + c > h - 1) lower = sorted[r]!;
      seen += c;
      if (seen > h) return n % 2 === 1 ? sorted[r]! : (lower + sorted[r]!) / 2;
    }
    throw new Error('unreachable: the counts add up to n');
  }
}
