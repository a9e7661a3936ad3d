/**
 * The q-quantile of ascending-sorted values by linear interpolation between order statistics
 * (Hyndman & Fan 1996, definition 7 — the default of R and NumPy), NaN for an empty input.
 */
export function quantileSorted(sorted: ArrayLike<number>, q: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = (n - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/** The median of the first `count` values (they are copied, not reordered); NaN if none. */
export function medianOf(values: Float64Array, count: number = values.length): number {
  const sorted = values.slice(0, count).sort();
  return quantileSorted(sorted, 0.5);
}
