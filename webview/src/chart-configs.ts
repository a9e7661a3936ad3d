// Chart.js configurations for the four panel charts, built from the Report's distributions.
// Pure: data and theme in, configuration out; charts.ts owns the canvases.

import type { ChartConfiguration, TooltipItem } from 'chart.js';
import type { Distributions, TermRow } from '../../extension/src/protocol';
import type { ChartTheme } from './chart-theme';
import { withAlpha } from './chart-theme';
import { formatAxisShare, formatCount, formatNumber, formatRatio, formatShare } from './format';

export interface Setting {
  label: string;
  distributions: Distributions;
}

interface XY {
  x: number;
  y: number;
}
interface TermPoint extends XY {
  term: string;
  /** The lift itself when y was raised to the log axis's floor. */
  lift?: number;
}

const SCATTER_OTHERS_MAX = 3000;

function common(theme: ChartTheme) {
  return {
    responsive: true,
    maintainAspectRatio: false,
    animation: false as const,
    normalized: true,
    plugins: {
      // One legend for every chart: each series by its own marker (circle = the review's
      // baseline, diamond = the setting compared with it), not the library's filled boxes.
      legend: {
        position: 'bottom' as const,
        labels: { color: theme.foreground, usePointStyle: true, pointStyleWidth: 14, boxHeight: 8, padding: 10, font: { family: theme.fontFamily, size: theme.fontSize } },
      },
      tooltip: { titleFont: { family: theme.fontFamily }, bodyFont: { family: theme.fontFamily } },
    },
  };
}

/** Marker of each side of a comparison, in every chart and its legend. */
const MARKER = { baseline: 'circle', current: 'rectRot' } as const;

function axis(theme: ChartTheme, title: string) {
  return {
    // A dotted grid that stays behind the data; the axis line itself solid.
    grid: { color: theme.grid, tickColor: theme.grid },
    border: { color: theme.grid, dash: [2, 3] },
    ticks: { color: theme.muted, font: { family: theme.fontFamily, size: theme.fontSize } },
    title: { display: true, text: title, color: theme.muted, font: { family: theme.fontFamily, size: theme.fontSize } },
  };
}

/** Histogram counts as shares of their total, at bin centres. */
function histogramShares(h: Distributions['similarity'], counts: readonly number[]): XY[] {
  let total = 0;
  for (const c of counts) total += c;
  return counts.map((c, i) => ({ x: h.start + (i + 0.5) * h.binWidth, y: total > 0 ? c / total : 0 }));
}

export function similarityConfig(baseline: Setting, current: Setting, theme: ChartTheme): ChartConfiguration<'line', XY[]> {
  const b = baseline.distributions.similarity;
  const c = current.distributions.similarity;
  const line = (label: string, data: XY[], color: string, dashed: boolean, fill: boolean, marker: 'circle' | 'rectRot') => ({
    label,
    data,
    borderColor: color,
    backgroundColor: fill ? withAlpha(color, 0.14) : 'transparent',
    borderWidth: 1.6,
    borderDash: dashed ? [5, 3] : [],
    fill: fill ? ('origin' as const) : false,
    // Small solid markers on the pair curves tell the two settings apart without colour (and on
    // a dark theme, where a faint fill alone vanished); the nearest-neighbour curves stay dashed.
    pointStyle: marker,
    pointRadius: fill ? 2 : 0,
    pointBackgroundColor: color,
    pointBorderColor: color,
    pointHoverRadius: 4,
    tension: 0.2,
  });
  return {
    type: 'line',
    data: {
      datasets: [
        line(`pairs · ${baseline.label}`, histogramShares(b, b.pairs), theme.baseline, false, true, MARKER.baseline),
        line(`nearest · ${baseline.label}`, histogramShares(b, b.nearest), theme.baseline, true, false, MARKER.baseline),
        line(`pairs · ${current.label}`, histogramShares(c, c.pairs), theme.current, false, true, MARKER.current),
        line(`nearest · ${current.label}`, histogramShares(c, c.nearest), theme.current, true, false, MARKER.current),
      ],
    },
    options: {
      ...common(theme),
      interaction: { mode: 'nearest', intersect: false },
      scales: {
        x: { ...axis(theme, 'cosine similarity'), type: 'linear', min: Math.min(b.start, c.start), ticks: { ...axis(theme, '').ticks, maxTicksLimit: 8 } },
        y: { ...axis(theme, 'share'), beginAtZero: true, ticks: { ...axis(theme, '').ticks, callback: (v) => formatAxisShare(Number(v)) } },
      },
      plugins: {
        ...common(theme).plugins,
        tooltip: {
          ...common(theme).plugins.tooltip,
          callbacks: {
            title: (items: TooltipItem<'line'>[]) => `similarity ≈ ${formatNumber(items[0]?.parsed.x ?? 0)}`,
            label: (item: TooltipItem<'line'>) => `${item.dataset.label ?? ''}: ${formatShare(item.parsed.y)}`,
          },
        },
      },
    },
  };
}

/** Lift below this is drawn at it on the log axis (a lift of 0 has no logarithm); the tooltip keeps the value. */
const LIFT_FLOOR = 0.01;

export function pullLiftConfig(terms: readonly TermRow[], suggestions: ReadonlySet<string>, theme: ChartTheme): ChartConfiguration<'scatter', TermPoint[]> {
  const highlighted: TermPoint[] = [];
  const others: TermPoint[] = [];
  let minX = Infinity;
  let maxX = 0;
  for (const t of terms) {
    if (t.neighborLift === null || !Number.isFinite(t.neighborLift) || !(t.pullShare > 0)) continue;
    const point = { x: t.pullShare, y: Math.max(LIFT_FLOOR, t.neighborLift), term: t.term, lift: t.neighborLift };
    if (suggestions.has(t.term)) highlighted.push(point);
    // The report lists terms loudest first, so the cap keeps the ones worth seeing.
    else if (others.length < SCATTER_OTHERS_MAX) others.push(point);
    else continue;
    minX = Math.min(minX, point.x);
    maxX = Math.max(maxX, point.x);
  }
  // Lift 1: the term's share of neighbour similarity equals its share of all-pair similarity,
  // i.e. it does not help pick neighbours. Drawn as a dashed reference line across the plot.
  const reference: TermPoint[] = maxX > 0 ? [{ x: minX, y: 1, term: '', lift: 1 }, { x: maxX, y: 1, term: '', lift: 1 }] : [];
  return {
    type: 'scatter',
    data: {
      datasets: [
        { label: 'suggested', data: highlighted, backgroundColor: withAlpha(theme.suggested, 0.85), borderColor: theme.suggested, pointStyle: 'rectRot', pointRadius: 4.5, pointHoverRadius: 6, order: 0 },
        // Grey at 0.35 alpha vanished on dark themes: a solid outline keeps the second series visible.
        { label: 'other terms', data: others, backgroundColor: withAlpha(theme.other, 0.45), borderColor: withAlpha(theme.other, 0.9), borderWidth: 1, pointStyle: 'circle', pointRadius: 2.5, pointHoverRadius: 4, order: 1 },
        { label: 'lift 1 (no neighbour signal)', data: reference, showLine: true, borderColor: theme.muted, borderDash: [5, 4], borderWidth: 1, pointRadius: 0, pointHitRadius: 0, order: 2 },
      ],
    },
    options: {
      ...common(theme),
      scales: {
        x: { ...axis(theme, 'pull share (log scale)'), type: 'logarithmic', ticks: { ...axis(theme, '').ticks, maxTicksLimit: 6, callback: logTick } },
        y: { ...axis(theme, 'neighbour lift (log scale)'), type: 'logarithmic', ticks: { ...axis(theme, '').ticks, callback: liftTick } },
      },
      plugins: {
        ...common(theme).plugins,
        tooltip: {
          ...common(theme).plugins.tooltip,
          filter: (item: TooltipItem<'scatter'>) => (item.raw as TermPoint).term !== '',
          callbacks: {
            label: (item: TooltipItem<'scatter'>) => {
              const p = item.raw as TermPoint;
              return `${p.term}: pull ${formatShare(p.x)}, lift ${formatRatio(p.lift ?? p.y)}`;
            },
          },
        },
      },
    },
  };
}

/** Lift ticks at 0.01, 0.1, 1, 10 … and at 0.3 and 3, so the region around 1 is readable. */
function liftTick(value: number | string): string | null {
  const v = Number(value);
  if (!(v > 0)) return null;
  const e = Math.log10(v);
  const mantissa = v / 10 ** Math.floor(e + 1e-9);
  if (Math.abs(mantissa - 1) < 1e-6 || Math.abs(mantissa - 3) < 1e-6) return formatRatio(v);
  return null;
}

/** Tick labels only at powers of ten, so the log axis does not crowd. */
function logTick(value: number | string): string | null {
  const v = Number(value);
  if (!(v > 0)) return null;
  const exponent = Math.log10(v);
  return Math.abs(exponent - Math.round(exponent)) < 1e-9 ? formatAxisShare(v) : null;
}

export function cumulativeMassConfig(baseline: Setting, theme: ChartTheme): ChartConfiguration<'line', XY[]> {
  const data = baseline.distributions.cumulativeMass.map((y, i) => ({ x: i + 1, y }));
  return {
    type: 'line',
    data: {
      datasets: [
        {
          label: `top terms · ${baseline.label}`,
          data,
          borderColor: theme.baseline,
          backgroundColor: withAlpha(theme.baseline, 0.12),
          fill: 'origin',
          borderWidth: 1.8,
          pointStyle: MARKER.baseline,
          pointRadius: 0,
          pointHoverRadius: 4,
          pointBackgroundColor: theme.baseline,
        },
      ],
    },
    options: {
      ...common(theme),
      interaction: { mode: 'nearest', intersect: false },
      scales: {
        x: { ...axis(theme, 'number of top terms (log scale)'), type: 'logarithmic', min: 1, ticks: { ...axis(theme, '').ticks, callback: (v) => (isPowerOfTen(Number(v)) ? formatCount(Number(v)) : null) } },
        y: { ...axis(theme, 'share of all-pairs similarity'), min: 0, max: 1, ticks: { ...axis(theme, '').ticks, callback: (v) => formatAxisShare(Number(v)) } },
      },
      plugins: {
        ...common(theme).plugins,
        legend: { display: false },
        tooltip: {
          ...common(theme).plugins.tooltip,
          callbacks: {
            title: (items: TooltipItem<'line'>[]) => `top ${formatCount(items[0]?.parsed.x ?? 0)} terms`,
            label: (item: TooltipItem<'line'>) => `${formatShare(item.parsed.y)} of the similarity mass`,
          },
        },
      },
    },
  };
}

function isPowerOfTen(v: number): boolean {
  if (!(v > 0)) return false;
  const e = Math.log10(v);
  return Math.abs(e - Math.round(e)) < 1e-9;
}

export function kOccurrenceConfig(baseline: Setting, current: Setting, k: number, theme: ChartTheme): ChartConfiguration<'bar', number[]> {
  const b = baseline.distributions.kOccurrence;
  const c = current.distributions.kOccurrence;
  const bins = Math.max(b.length, c.length);
  const labels = Array.from({ length: bins }, (_, i) => (i === bins - 1 ? `≥${i}` : String(i)));
  const pad = (xs: readonly number[]) => Array.from({ length: bins }, (_, i) => xs[i] ?? 0);
  return {
    type: 'bar',
    data: {
      labels,
      datasets: [
        // Lighter fills with a solid outline: both series keep their edge on a dark theme.
        { label: baseline.label, data: pad(b), backgroundColor: withAlpha(theme.baseline, 0.5), borderColor: theme.baseline, borderWidth: 1, pointStyle: MARKER.baseline, barPercentage: 1, categoryPercentage: 0.85 },
        { label: current.label, data: pad(c), backgroundColor: withAlpha(theme.current, 0.5), borderColor: theme.current, borderWidth: 1, pointStyle: MARKER.current, barPercentage: 1, categoryPercentage: 0.85 },
      ],
    },
    options: {
      ...common(theme),
      scales: {
        x: { ...axis(theme, `k-occurrence: in how many ${k}-NN lists a document appears`), ticks: { ...axis(theme, '').ticks, maxRotation: 0, autoSkipPadding: 6 } },
        y: { ...axis(theme, 'documents'), beginAtZero: true },
      },
      plugins: {
        ...common(theme).plugins,
        tooltip: {
          ...common(theme).plugins.tooltip,
          callbacks: {
            title: (items: TooltipItem<'bar'>[]) => `in ${items[0]?.label ?? ''} lists`,
            label: (item: TooltipItem<'bar'>) => `${item.dataset.label ?? ''}: ${formatCount(item.parsed.y)} documents`,
          },
        },
      },
    },
  };
}
