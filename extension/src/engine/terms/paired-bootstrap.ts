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
  const ra = new Array<number>(n);
  const rb = new Array<number>(n);
  for (let d = 0; d < draws; d++) {
    for (let i = 0; i < n; i++) {
      const j = randomBelow(random, n);
      ra[i] = a[j]!;
      rb[i] = b[j]!;
    }
    changes[d] = stat(rb) - stat(ra);
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
