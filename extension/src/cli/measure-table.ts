import type { Measures } from '../protocol';

export interface MeasureLine {
  label: string;
  get(m: Measures): number | null;
  /** Which way is healthier; null where the figure describes the space rather than judges it. */
  better: 'lower' | 'higher' | null;
  digits: number;
}

/** The measures printed by the CLI, in reading order: the ones that track neighbour quality first. */
export const MEASURE_LINES: readonly MeasureLine[] = [
  { label: 'background similarity (mean cosine)', get: (m) => m.backgroundSimilarity, better: 'lower', digits: 3 },
  { label: 'neighbour standout (median z)', get: (m) => m.neighborStandout, better: 'higher', digits: 2 },
  { label: 'label precision@k', get: (m) => m.labelPrecisionAtK, better: 'higher', digits: 3 },
  { label: 'hubness skewness', get: (m) => m.hubness?.skewness ?? null, better: 'lower', digits: 2 },
  { label: 'hubs (N_k > 2k)', get: (m) => m.hubness?.hubs ?? null, better: 'lower', digits: 0 },
  { label: 'orphans (N_k = 0)', get: (m) => m.hubness?.orphans ?? null, better: 'lower', digits: 0 },
  { label: 'mass share of top 10 terms', get: (m) => m.topTermsMassShare.top10, better: 'lower', digits: 3 },
  { label: 'mass share of top 100 terms', get: (m) => m.topTermsMassShare.top100, better: 'lower', digits: 3 },
  { label: 'radius slack (median)', get: (m) => m.radiusSlack?.median ?? null, better: 'higher', digits: 3 },
  { label: 'relative contrast (median)', get: (m) => m.contrast?.median ?? null, better: null, digits: 3 },
  { label: 'mean-to-nearest distance ratio', get: (m) => m.meanToNearest, better: null, digits: 3 },
  { label: 'iid-equivalent dimension', get: (m) => m.iidEquivalentDimension, better: null, digits: 1 },
  { label: 'intrinsic dimension (TwoNN)', get: (m) => m.intrinsicDimension.twoNN, better: null, digits: 1 },
  { label: 'intrinsic dimension (MLE)', get: (m) => m.intrinsicDimension.mle, better: null, digits: 1 },
  { label: 'neighbour turnover vs current', get: (m) => m.neighborTurnover, better: null, digits: 3 },
];

export function formatNumber(x: number | null, digits: number): string {
  if (x === null || !Number.isFinite(x)) return '–';
  return digits === 0 ? String(Math.round(x)) : x.toFixed(digits);
}

/** "better", "worse" or "" for a change from a to b. */
export function verdict(line: MeasureLine, a: number | null, b: number | null): string {
  if (line.better === null || a === null || b === null) return '';
  const eps = 10 ** -line.digits / 2;
  if (Math.abs(b - a) < eps) return 'same';
  return (b < a) === (line.better === 'lower') ? 'better' : 'worse';
}
