// The status-bar text for a reviewed corpus: the one measure that says the most at a glance.
import type { Report } from '../../protocol';

function two(x: number): string {
  return x.toFixed(2);
}

/** "Loudword: bg sim 0.21 → 0.07" (baseline → with suggestions); no arrow when nothing is suggested. */
export function statusHeadline(report: Report): string {
  const before = report.baseline.backgroundSimilarity;
  const after = report.suggested.backgroundSimilarity;
  if (report.suggestions.length === 0) return `Loudword: bg sim ${two(before)}`;
  return `Loudword: bg sim ${two(before)} → ${two(after)}`;
}

/** The hover: what the figures mean and what a click does. */
export function statusTooltip(report: Report): string {
  const n = report.suggestions.length;
  return [
    `Background similarity (mean pairwise cosine) of ${report.input.documents} documents`,
    n === 0 ? 'No terms suggested for the stop list.' : `With the ${n} suggested stop term${n === 1 ? '' : 's'}: ${two(report.suggested.backgroundSimilarity)}`,
    'Click to open the Distance Review.',
  ].join('\n');
}
