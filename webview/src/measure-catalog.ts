// What each distance-health measure means to a reader, how to print it, and which direction is
// an improvement. "Better" follows methods.md §4: on text, lower background similarity, higher
// neighbour standout and lower hubness tracked neighbour quality, while relative contrast did
// not, so the contrast-type measures and the intrinsic dimension are shown without a verdict.

import type { Measures } from '../../extension/src/protocol';
import { formatCount, formatNumber, formatShare, NO_VALUE } from './format';

export type Better = 'lower' | 'higher' | 'neither';

export interface MeasureSpec {
  id: string;
  label: string;
  /** One plain sentence (or two) for the hover text and the accessible description. */
  meaning: string;
  better: Better;
  /** Primary measures get a large tile; the rest a compact one. */
  primary: boolean;
  value(m: Measures): number | null;
  format(v: number | null): string;
  /** Optional second line under the value (e.g. a range). */
  detail?(m: Measures): string | null;
}

export const measureCatalog: readonly MeasureSpec[] = [
  {
    id: 'backgroundSimilarity',
    label: 'Background similarity',
    meaning:
      'Mean cosine similarity over all document pairs, computed exactly. Lower is better: less of the similarity every pair gets comes from terms that every document uses.',
    better: 'lower',
    primary: true,
    value: (m) => m.backgroundSimilarity,
    format: formatNumber,
  },
  {
    id: 'neighborStandout',
    label: 'Neighbour standout',
    meaning:
      "For each sampled document, how many standard deviations its nearest neighbour's similarity lies above its similarities to all others; the median. Higher is better: nearest neighbours stand clear of the crowd.",
    better: 'higher',
    primary: true,
    value: (m) => m.neighborStandout,
    format: formatNumber,
  },
  {
    id: 'hubnessSkewness',
    label: 'Hubness skew',
    meaning:
      "Skewness of how often each sampled document appears in the others' k-nearest-neighbour lists. Lower is better: high skew means a few documents crowd into many lists.",
    better: 'lower',
    primary: true,
    value: (m) => m.hubness?.skewness ?? null,
    format: formatNumber,
  },
  {
    id: 'labelPrecisionAtK',
    label: 'Label precision@k',
    meaning:
      "Leave-one-out: the mean share of a document's k nearest neighbours that carry the same label. Higher is better. Needs a label column.",
    better: 'higher',
    primary: true,
    value: (m) => m.labelPrecisionAtK,
    format: formatShare,
  },
  {
    id: 'topTermsMassTop10',
    label: 'Top-10 term mass',
    meaning: 'Share of the all-pairs similarity carried by the 10 heaviest terms. Lower is better: similarity is not owned by a few terms.',
    better: 'lower',
    primary: false,
    value: (m) => m.topTermsMassShare.top10,
    format: formatShare,
  },
  {
    id: 'topTermsMassTop100',
    label: 'Top-100 term mass',
    meaning: 'Share of the all-pairs similarity carried by the 100 heaviest terms. Lower is better.',
    better: 'lower',
    primary: false,
    value: (m) => m.topTermsMassShare.top100,
    format: formatShare,
  },
  {
    id: 'hubs',
    label: 'Hubs',
    meaning: 'Sampled documents that appear in more than 2k neighbour lists. Fewer is better.',
    better: 'lower',
    primary: false,
    value: (m) => m.hubness?.hubs ?? null,
    format: formatCount,
  },
  {
    id: 'orphans',
    label: 'Orphans',
    meaning: "Sampled documents that appear in no other document's neighbour list. Fewer is better.",
    better: 'lower',
    primary: false,
    value: (m) => m.hubness?.orphans ?? null,
    format: formatCount,
  },
  {
    id: 'radiusSlack',
    label: 'Radius slack',
    meaning:
      'Median relative room a search radius has past the k-th neighbour before the number of hits grows tenfold. Higher is better: similarity thresholds are less fragile.',
    better: 'higher',
    primary: false,
    value: (m) => m.radiusSlack?.median ?? null,
    format: formatShare,
  },
  {
    id: 'iidEquivalentDimension',
    label: 'Concentration (iid dim.)',
    meaning:
      'The dimension of random Gaussian data whose distances would be as concentrated as these: 1 ÷ (2·CV²) of the sampled pair distances. Lower is better: distances spread out more.',
    better: 'lower',
    primary: false,
    value: (m) => m.iidEquivalentDimension,
    format: formatNumber,
  },
  {
    id: 'contrastMedian',
    label: 'Relative contrast',
    meaning:
      '(farthest − nearest) ÷ nearest distance for each sampled query; the median, with the 10th–90th percentile range. Shown for reference: on text it does not follow neighbour quality.',
    better: 'neither',
    primary: false,
    value: (m) => m.contrast?.median ?? null,
    format: formatNumber,
    detail: (m) => (m.contrast ? `p10–p90 ${formatNumber(m.contrast.p10)}–${formatNumber(m.contrast.p90)}` : null),
  },
  {
    id: 'meanToNearest',
    label: 'Mean ÷ nearest distance',
    meaning: 'Average distance divided by the average nearest-neighbour distance over the sampled queries. Shown for reference.',
    better: 'neither',
    primary: false,
    value: (m) => m.meanToNearest,
    format: formatNumber,
  },
  {
    id: 'intrinsicTwoNN',
    label: 'Intrinsic dim. (TwoNN)',
    meaning: 'Intrinsic dimension estimated from the ratio of second to first neighbour distances. Describes the data; no direction is better.',
    better: 'neither',
    primary: false,
    value: (m) => m.intrinsicDimension.twoNN,
    format: formatNumber,
  },
  {
    id: 'intrinsicMle',
    label: 'Intrinsic dim. (MLE)',
    meaning: 'Intrinsic dimension by maximum likelihood over the k nearest neighbour distances. Describes the data; no direction is better.',
    better: 'neither',
    primary: false,
    value: (m) => m.intrinsicDimension.mle,
    format: formatNumber,
  },
  {
    id: 'neighborTurnover',
    label: 'Neighbour turnover',
    meaning:
      'Share of neighbour-list membership that changed against the baseline (1 − mean Jaccard overlap). Shows how far a stop list moves the neighbours; neither good nor bad by itself.',
    better: 'neither',
    primary: false,
    value: (m) => m.neighborTurnover,
    format: formatShare,
  },
];

export type Verdict = 'better' | 'worse' | 'same' | 'neutral' | 'unknown';

/**
 * Compares a value with the baseline. Values that print the same count as unchanged, so the
 * colour never contradicts the digits a reader sees.
 */
export function verdict(spec: MeasureSpec, baseline: number | null, current: number | null): Verdict {
  if (baseline === null || current === null || !Number.isFinite(baseline) || !Number.isFinite(current)) return 'unknown';
  if (spec.format(baseline) === spec.format(current) || baseline === current) return 'same';
  if (spec.better === 'neither') return 'neutral';
  const up = current > baseline;
  return (spec.better === 'higher') === up ? 'better' : 'worse';
}

export function verdictWord(v: Verdict): string {
  switch (v) {
    case 'better':
      return 'better';
    case 'worse':
      return 'worse';
    case 'same':
      return 'unchanged';
    case 'neutral':
      return 'changed';
    default:
      return NO_VALUE;
  }
}
