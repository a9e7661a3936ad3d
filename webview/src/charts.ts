// The four charts with a caption each saying how to read them. Only the chart.js pieces used
// here are registered, which keeps the bundle small. Charts are rebuilt on a theme change
// (their colours are read once from CSS) and updated in place when a what-if result arrives.

import {
  BarController,
  BarElement,
  CategoryScale,
  Chart,
  Filler,
  Legend,
  LinearScale,
  LineController,
  LineElement,
  LogarithmicScale,
  PointElement,
  ScatterController,
  Tooltip,
  type ChartConfiguration,
} from 'chart.js';
import type { Report } from '../../extension/src/protocol';
import { cumulativeMassConfig, kOccurrenceConfig, pullLiftConfig, similarityConfig, type Setting } from './chart-configs';
import { readChartTheme, type ChartTheme } from './chart-theme';
import { el } from './create-element';

Chart.register(BarController, BarElement, CategoryScale, Filler, Legend, LinearScale, LineController, LineElement, LogarithmicScale, PointElement, ScatterController, Tooltip);

/**
 * How far out of the panel's view a chart still counts as in view (px): one wheel step or two,
 * so a chart about to scroll in is drawn with the answer. A choice of ours, no source.
 */
const IN_VIEW_MARGIN_PX = 200;

type ChartId = 'similarity' | 'pullLift' | 'cumulativeMass' | 'kOccurrence';

/** The charts that draw the current setting (baseline against it); the others show the Report alone. */
const DEPENDS_ON_CURRENT: ReadonlySet<ChartId> = new Set(['similarity', 'kOccurrence']);

interface Figure {
  id: ChartId;
  title: string;
  caption: string;
  describe: string;
}

const figures: readonly Figure[] = [
  {
    id: 'similarity',
    title: 'Similarity distribution',
    caption:
      'Filled: cosine similarity of random document pairs. Dashed: similarity of each sampled document to its nearest neighbour. Healthy distances keep the two apart; a stop list that helps moves the filled curve left.',
    describe: 'Line chart of the share of document pairs and of nearest neighbours at each cosine similarity, baseline against the current setting.',
  },
  {
    id: 'pullLift',
    title: 'Pull share against neighbour lift',
    caption:
      'Each dot is a term. Far right: it carries much of the similarity every pair shares. Low: little of that similarity falls between true neighbours (lift below 1). Loud terms sit bottom right.',
    describe: 'Scatter chart of terms by pull share (logarithmic) and neighbour lift, suggested terms highlighted.',
  },
  {
    id: 'cumulativeMass',
    title: 'Similarity mass of the top terms',
    caption:
      'How much of the all-pairs similarity the heaviest terms carry, with the baseline stop list. A curve that rises steeply on the left means a few terms decide most distances.',
    describe: 'Line chart of the cumulative share of all-pairs similarity carried by the top terms.',
  },
  {
    id: 'kOccurrence',
    title: 'k-occurrence',
    caption:
      'How many documents appear in how many nearest-neighbour lists. A long tail to the right (hubs) and a tall bar at 0 (orphans) mean a few documents crowd out the rest.',
    describe: 'Bar chart of the number of documents by k-occurrence, baseline against the current setting.',
  },
];

export class ChartPanel {
  readonly element: HTMLElement;
  private readonly canvases = new Map<ChartId, HTMLCanvasElement>();
  private readonly charts = new Map<ChartId, Chart>();
  /** Charts that do not show the current setting yet (out of view at the update; see update). */
  private readonly stale = new Set<ChartId>();
  private laterFrame: number | null = null;
  private laterTimer: ReturnType<typeof setTimeout> | null = null;
  private current: Setting;
  /** The theme the charts were made with; a theme change mounts them again (panel-app watchTheme). */
  private theme: ChartTheme | null = null;

  constructor(
    private readonly report: Report,
    current: Setting,
  ) {
    this.current = current;
    this.element = el('div', { className: 'lw-charts' });
    for (const f of figures) {
      const canvas = el('canvas', { attrs: { role: 'img', 'aria-label': f.describe } }, [f.describe]);
      this.canvases.set(f.id, canvas);
      this.element.append(
        el('figure', { className: 'lw-chart', attrs: { 'data-chart': f.id } }, [
          el('figcaption', {}, [el('h3', { className: 'lw-chart__title', text: f.title }), el('p', { className: 'lw-chart__caption', text: f.caption })]),
          el('div', { className: 'lw-chart__box' }, [canvas]),
        ]),
      );
    }
  }

  /** Creates the charts; call once the element is in the document (chart.js measures it). */
  mount(): void {
    this.destroy();
    const theme = readChartTheme();
    this.theme = theme;
    Chart.defaults.color = theme.foreground;
    Chart.defaults.font.family = theme.fontFamily;
    Chart.defaults.font.size = theme.fontSize;
    for (const [id, config] of this.configs(theme)) {
      const canvas = this.canvases.get(id);
      if (canvas) this.charts.set(id, new Chart(canvas, config as ChartConfiguration));
    }
  }

  /**
   * The current setting changed (what-if result or reset): swap the data of the two charts that
   * show it, keep the canvases. Pull share against lift and the top terms' mass describe the
   * Report alone; rebuilding them (thousands of points) on every toggle cost the click most of
   * its time in the panel. A chart scrolled out of the panel's view (more than IN_VIEW_MARGIN_PX
   * away) is updated after the next frame instead: the answer's frame then shows the strip
   * without waiting for chart.js (~8–13 ms for the two charts in the editor), and the chart is
   * current one frame later, before a reader can scroll to it.
   */
  update(current: Setting): void {
    this.current = current;
    if (this.charts.size === 0) return;
    const now = new Set<ChartId>();
    for (const id of DEPENDS_ON_CURRENT) {
      if (this.inView(id)) {
        now.add(id);
        this.stale.delete(id);
      } else this.stale.add(id);
    }
    this.redraw(now);
    if (this.stale.size > 0) this.redrawStaleLater();
    this.markStale();
  }

  destroy(): void {
    this.cancelLater();
    this.stale.clear();
    this.markStale();
    for (const chart of this.charts.values()) chart.destroy();
    this.charts.clear();
  }

  /** Swaps in the current setting's data of the charts `ids` and draws them. */
  private redraw(ids: ReadonlySet<ChartId>): void {
    if (ids.size === 0) return;
    // The theme read at mount: reading the computed style on every update forced a style
    // recalculation of the whole panel (~5 ms of a click in a headless Chromium profile).
    const theme = this.theme ?? readChartTheme();
    for (const [id, config] of this.configs(theme, ids)) {
      const chart = this.charts.get(id);
      if (!chart) continue;
      chart.data = config.data as Chart['data'];
      chart.update('none');
    }
    // When the charts last drew the current setting, for the e2e latency scenario.
    this.element.dataset.drawnAt = performance.now().toFixed(1);
  }

  /**
   * Whether chart `id` is within IN_VIEW_MARGIN_PX of the panel's view. Read before anything in
   * the answer's task changes the page, so the layout is the last frame's and nothing is laid
   * out again for it.
   */
  private inView(id: ChartId): boolean {
    const canvas = this.canvases.get(id);
    if (!canvas || !canvas.isConnected) return true;
    const r = canvas.getBoundingClientRect();
    if (r.width === 0 && r.height === 0) return false;
    return r.bottom >= -IN_VIEW_MARGIN_PX && r.top <= window.innerHeight + IN_VIEW_MARGIN_PX;
  }

  /** The stale charts, drawn in a task after the next frame (the one that shows the strip). */
  private redrawStaleLater(): void {
    if (this.laterFrame !== null || this.laterTimer !== null) return;
    this.laterFrame = requestAnimationFrame(() => {
      this.laterFrame = null;
      this.laterTimer = setTimeout(() => {
        this.laterTimer = null;
        const ids = new Set(this.stale);
        this.stale.clear();
        this.redraw(ids);
        this.markStale();
      }, 0);
    });
  }

  /** Which charts wait to show the current setting (data-stale on each figure, their count on the panel), for tests and the e2e scenario. */
  private markStale(): void {
    this.element.dataset.stale = String(this.stale.size);
    for (const figure of this.element.querySelectorAll<HTMLElement>('.lw-chart')) {
      if (this.stale.has(figure.dataset.chart as ChartId)) figure.dataset.stale = '';
      else delete figure.dataset.stale;
    }
  }

  private cancelLater(): void {
    if (this.laterFrame !== null) cancelAnimationFrame(this.laterFrame);
    if (this.laterTimer !== null) clearTimeout(this.laterTimer);
    this.laterFrame = null;
    this.laterTimer = null;
  }

  private configs(theme: ReturnType<typeof readChartTheme>, only: ReadonlySet<ChartId> | null = null): Array<[ChartId, ChartConfiguration<'line' | 'scatter' | 'bar', unknown[]>]> {
    const baseline: Setting = { label: 'baseline', distributions: this.report.baseline.distributions };
    const k = this.report.baseline.sample.k;
    const build: Array<[ChartId, () => ChartConfiguration<'line' | 'scatter' | 'bar', unknown[]>]> = [
      ['similarity', () => similarityConfig(baseline, this.current, theme) as ChartConfiguration<'line', unknown[]>],
      ['pullLift', () => pullLiftConfig(this.report.terms, new Set(this.report.suggestions), theme) as ChartConfiguration<'scatter', unknown[]>],
      ['cumulativeMass', () => cumulativeMassConfig(baseline, theme) as ChartConfiguration<'line', unknown[]>],
      ['kOccurrence', () => kOccurrenceConfig(baseline, this.current, k, theme) as ChartConfiguration<'bar', unknown[]>],
    ];
    return build.filter(([id]) => only === null || only.has(id)).map(([id, make]) => [id, make()]);
  }
}
