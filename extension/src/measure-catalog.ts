// The one list of distance-health measures: what each is called, what it means in one line,
// which direction is healthier (or that it is shown and not judged), and how its number is
// written. The CLI tables (cli/format-text.ts, cli/format-markdown.ts), the panel's health strip
// (webview/src/health-strip.ts) and the README's "What is measured" table all come from here;
// test/measure-catalog.test.ts fails when the README's table differs.
//
// Direction (docs/methods.md §4 and §8): on labelled text corpora, lower background similarity,
// higher neighbour standout and lower hubness went with better label precision; relative contrast
// *fell* while precision rose. The iid-equivalent dimension is a concentration figure of the same
// kind — removing function words makes rows more orthogonal, so pair distances bunch near √2 and it
// rises while neighbours improve (the demo corpus: 68.1 → 77.2 with label precision 0.954 → 0.964)
// — so it is shown, not judged, like relative contrast, mean-to-nearest and the intrinsic dimensions.
//
// Pure: no Node and no DOM types, so the extension, the CLI and the webview bundle import it alike.

import { formatCount, formatNumber, formatShare } from './number-format';
import type { Measures } from './protocol';

/** Which direction is healthier; 'neither' = shown, not judged. */
export type Better = 'lower' | 'higher' | 'neither';

export interface MeasureSpec {
  /** Stable id (the panel's data-measure attribute; tests and the e2e driver rely on it). */
  id: string;
  label: string;
  /** One plain sentence (or two): hover text, accessible description, README table. */
  meaning: string;
  better: Better;
  /** The docs/methods.md section that defines it and gives its source. */
  methods: number;
  /** Headline measures: a large tile in the panel. */
  primary: boolean;
  value(m: Measures): number | null;
  format(v: number | null): string;
  /** Optional second line under the value (e.g. a range). */
  detail?(m: Measures): string | null;
  /**
   * Shown in place of "— → —" when the measure has no value with or without the suggestions
   * because the review lacked an input it needs (what to do to get it).
   */
  whenAbsent?: string;
}

export const measureCatalog: readonly MeasureSpec[] = [
  {
    id: 'backgroundSimilarity',
    label: 'Background similarity',
    meaning:
      'Mean cosine similarity over all document pairs, computed exactly. Lower is better: less of the similarity every pair gets comes from terms that every document uses.',
    better: 'lower',
    methods: 3,
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
    methods: 4,
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
    methods: 5,
    primary: true,
    value: (m) => m.hubness?.skewness ?? null,
    format: formatNumber,
  },
  {
    id: 'labelPrecisionAtK',
    label: 'Label precision@k',
    meaning:
      "Leave-one-out: the mean share of a document's k nearest neighbours that carry the same label; a place no document sharing a term fills counts as a random document. Higher is better. Needs a label column.",
    better: 'higher',
    methods: 7,
    primary: true,
    value: (m) => m.labelPrecisionAtK,
    format: formatShare,
    whenAbsent: 'No label column: name one ("label" in loudword.json, or --label) to measure it.',
  },
  {
    id: 'topTermsMassTop10',
    label: 'Top-10 term mass',
    meaning: 'Share of the all-pairs similarity carried by the 10 heaviest terms. Lower is better: similarity is not owned by a few terms.',
    better: 'lower',
    methods: 3,
    primary: false,
    value: (m) => m.topTermsMassShare.top10,
    format: formatShare,
  },
  {
    id: 'topTermsMassTop100',
    label: 'Top-100 term mass',
    meaning: 'Share of the all-pairs similarity carried by the 100 heaviest terms. Lower is better.',
    better: 'lower',
    methods: 3,
    primary: false,
    value: (m) => m.topTermsMassShare.top100,
    format: formatShare,
  },
  {
    id: 'hubs',
    label: 'Hubs',
    meaning: 'Sampled documents that appear in more than 2k neighbour lists. Fewer is better.',
    better: 'lower',
    methods: 5,
    primary: false,
    value: (m) => m.hubness?.hubs ?? null,
    format: formatCount,
  },
  {
    id: 'orphans',
    label: 'Orphans',
    meaning: "Sampled documents that appear in no other document's neighbour list. Fewer is better.",
    better: 'lower',
    methods: 5,
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
    methods: 4,
    primary: false,
    value: (m) => m.radiusSlack?.median ?? null,
    format: formatShare,
  },
  {
    id: 'iidEquivalentDimension',
    label: 'iid-equivalent dimension',
    meaning:
      'The dimension of random Gaussian data whose distances would be as concentrated as these: 1 ÷ (2·CV²) of the sampled pair distances. Shown for reference: on text it rises as neighbours get better.',
    better: 'neither',
    methods: 4,
    primary: false,
    value: (m) => m.iidEquivalentDimension,
    format: formatNumber,
  },
  {
    id: 'contrastMedian',
    label: 'Relative contrast',
    meaning:
      '(farthest − nearest) ÷ nearest distance for each sampled query; the median, with the 10th–90th percentile range. Shown for reference: on text it falls as neighbours get better.',
    better: 'neither',
    methods: 4,
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
    methods: 4,
    primary: false,
    value: (m) => m.meanToNearest,
    format: formatNumber,
  },
  {
    id: 'intrinsicTwoNN',
    label: 'Intrinsic dim. (TwoNN)',
    meaning: 'Intrinsic dimension estimated from the ratio of second to first neighbour distances. Describes the data; no direction is better.',
    better: 'neither',
    methods: 6,
    primary: false,
    value: (m) => m.intrinsicDimension.twoNN,
    format: formatNumber,
  },
  {
    id: 'intrinsicMle',
    label: 'Intrinsic dim. (MLE)',
    meaning: 'Intrinsic dimension by maximum likelihood over the k nearest neighbour distances. Describes the data; no direction is better.',
    better: 'neither',
    methods: 6,
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
    methods: 7,
    primary: false,
    value: (m) => m.neighborTurnover,
    format: formatShare,
  },
];

/** How a value moved against the baseline, read through the measure's healthier direction. */
export type MeasureChange = 'better' | 'worse' | 'same' | 'neutral' | 'unknown';

/**
 * Compares a value with the baseline. Values that print the same count as unchanged, so a
 * verdict never contradicts the digits a reader sees.
 */
export function judgeChange(spec: MeasureSpec, baseline: number | null, current: number | null): MeasureChange {
  if (baseline === null || current === null || !Number.isFinite(baseline) || !Number.isFinite(current)) return 'unknown';
  if (spec.format(baseline) === spec.format(current) || baseline === current) return 'same';
  if (spec.better === 'neither') return 'neutral';
  const up = current > baseline;
  return (spec.better === 'higher') === up ? 'better' : 'worse';
}

/** The change in words: 'better', 'worse', 'unchanged', 'changed' (not judged) or 'no value'. */
export function changeWord(change: MeasureChange): string {
  switch (change) {
    case 'better':
      return 'better';
    case 'worse':
      return 'worse';
    case 'same':
      return 'unchanged';
    case 'neutral':
      return 'changed';
    default:
      return 'no value';
  }
}

/**
 * The change in words for a printed table: only judged measures get one ('better', 'worse',
 * 'unchanged'); a measure shown for reference, or a missing value, gets ''.
 */
export function judgedChangeWord(spec: MeasureSpec, baseline: number | null, current: number | null): string {
  const change = judgeChange(spec, baseline, current);
  return change === 'neutral' || change === 'unknown' ? '' : changeWord(change);
}

/** The healthier direction in words, as the README's table writes it. */
export function betterWord(better: Better): string {
  return better === 'neither' ? 'shown, not judged' : better;
}
