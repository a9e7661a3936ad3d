// Composes the Distance Review page from a Report plus the reader's toggles. Everything shown is
// derived from (report, view state, latest what-if answer); rendering never reads it elsewhere.

import type { Measures, Report, WhatIfPrefetchResultMessage, WhatIfResultMessage } from '../../extension/src/protocol';
import { ChartPanel } from './charts';
import { watchTheme } from './chart-theme';
import { el, replaceChildren } from './create-element';
import { renderHealthStrip, renderLiveSummary, setStripPending, updateStripSelection, type StripInput } from './health-strip';
import type { HostBridge } from './host-bridge';
import { renderHubList } from './hub-list';
import { renderReportHeader, renderSettingsFooter } from './report-header';
import { TermTable } from './term-table';
import { renderVerdictSummary } from './verdict-summary';
import { PAGE_SIZE, reportKeyOf, restoreViewState, type ViewState } from './view-state';
import { WhatIfPrefetcher, type PrefetchedAnswer } from './what-if-prefetcher';
import { WhatIfRequester } from './what-if-requester';

/**
 * How long the pointer (or the keyboard focus) rests on a term's toggle before its what-if is
 * asked ahead of a click. A person's pointer presses 100-250 ms after entering a small box, and
 * the engine needs about 200 ms at 100k, so every ms of this wait is a ms of the click's (it
 * was 80). The cost: a pointer that moves slowly along the toggles' column asks for the rows it
 * passes, and those prefetches are thrown away (a newer prefetch or a click stops one part way,
 * ReviewWorkerClient): engine work on both cores, not a later click's wait.
 */
const PREFETCH_AFTER_MS = 30;

/**
 * How long a click's answer may take before the strip is marked as waiting ("updating…", the
 * selection's values faded). Most answers at 100k come in ~100 ms; marking at once restyled the
 * strip in the click's own frame, which the editor's page renders before it passes the click's
 * request on, and again in the answer's (docs/performance.md, "What-if in the real editor: the
 * click's frame").
 */
const PENDING_MARK_AFTER_MS = 150;

interface Loaded {
  report: Report;
  checked: Set<string>;
  /**
   * Each term that is not stopped, by its place in the Report's rows (loudness order): the
   * selection is put in that order from the checked set alone, instead of filtering the ~115,000
   * rows of a 100k corpus four times in a click's handler (in a Chromium trace of the e2e clicks
   * the handler's median fell from 1.7 to 1.4 ms).
   */
  rank: Map<string, number>;
  suggestionSet: Set<string>;
  table: TermTable;
  charts: ChartPanel;
  stripSlot: HTMLElement;
  checkedCount: HTMLElement;
  liveSlot: HTMLElement;
  addButton: HTMLButtonElement | null;
  resetButton: HTMLButtonElement | null;
}

export class PanelApp {
  private readonly state: ViewState;
  private readonly requester: WhatIfRequester;
  private readonly prefetcher: WhatIfPrefetcher;
  /** The term whose toggle the pointer or focus rests on, and the timer that prefetches it. */
  private hovered: string | null = null;
  private hoverTimer: ReturnType<typeof setTimeout> | null = null;
  /** The performance mark of the latest request posted (one is kept). */
  private lastMark = '';
  /** When each what-if request was posted (panel clock), for the e2e latency split. */
  private readonly sentAt = new Map<number, number>();
  private readonly statusSlot: HTMLElement;
  private readonly content: HTMLElement;
  private loaded: Loaded | null = null;
  /** Whether the strip may show its waiting mark (PENDING_MARK_AFTER_MS after a wait began), and the timer that allows it. */
  private pendingMarked = false;
  private pendingTimer: ReturnType<typeof setTimeout> | null = null;
  /** What the strip was last built from (renderStrip): when only `pending` changes, it is marked, not rebuilt. */
  private stripShown: { measures: Measures | null; removedCount: number; suggestedCount: number; addedCount: number } | null = null;
  /** What the host says changed since the shown Report (see StaleMessage). */
  private stale: { reason: string | null; added: string[] } = { reason: null, added: [] };
  private readonly staleSlot: HTMLElement;

  constructor(
    root: HTMLElement,
    private readonly bridge: HostBridge,
  ) {
    this.state = restoreViewState(bridge.loadState());
    this.requester = new WhatIfRequester((m) => {
      this.sentAt.set(m.requestId, performance.now());
      const panelPosted = Date.now();
      // A mark that finds the request in a Chromium trace (E2E_TRACE in the e2e latency scenario).
      performance.clearMarks(this.lastMark);
      this.lastMark = `lw-whatif-posted-${panelPosted}`;
      performance.mark(this.lastMark);
      bridge.post({ ...m, panelPosted });
    });
    this.prefetcher = new WhatIfPrefetcher((m) => bridge.post(m));
    this.statusSlot = el('div', { className: 'lw-statusbar', attrs: { role: 'status', 'aria-live': 'polite' } });
    this.content = el('main', { className: 'lw-main' }, [
      el('p', { className: 'lw-empty', text: bridge.mode === 'panel' ? 'Waiting for a review… Run “Review distances” on a corpus file.' : 'Loading the report…' }),
    ]);
    this.staleSlot = el('div', { className: 'lw-stale-slot', attrs: { role: 'status', 'aria-live': 'polite' } });
    replaceChildren(root, [this.statusSlot, this.staleSlot, this.content]);
    watchTheme(() => this.loaded?.charts.mount());
  }

  showReport(report: Report): void {
    this.loaded?.charts.destroy();
    this.prefetcher.invalidate();
    this.hover(null);
    const key = reportKeyOf(report);
    if (key !== this.state.reportKey) {
      // A different corpus or stop list: the old toggles would not mean the same thing.
      this.state.reportKey = key;
      this.state.checked = null;
      this.state.whatIf = null;
      this.state.shown = PAGE_SIZE;
    }
    const stopped = new Set(report.terms.filter((t) => t.status === 'stopped').map((t) => t.term));
    const known = new Set(report.terms.map((t) => t.term));
    const suggestionSet = new Set(report.suggestions.filter((t) => !stopped.has(t)));
    const checked = new Set((this.state.checked ?? report.suggestions).filter((t) => known.has(t) && !stopped.has(t)));
    const rank = new Map<string, number>();
    report.terms.forEach((t, i) => {
      if (t.status !== 'stopped' && !rank.has(t.term)) rank.set(t.term, i);
    });
    const panel = this.bridge.mode === 'panel';

    const exportButton = panel ? button('Export HTML report', 'secondary', () => this.bridge.post({ type: 'exportHtml' })) : null;
    const resetButton = panel ? button('Reset to suggestions', 'secondary', () => this.resetToSuggestions()) : null;
    const addButton = panel ? button('Add checked terms to stop list', 'primary', () => this.addChecked()) : null;
    const checkedCount = el('span', { className: 'lw-checked-count' });
    const liveSlot = el('span', { className: 'lw-live-slot', attrs: { 'aria-live': 'polite' } });

    const table = new TermTable(report.terms, this.state, checked, {
      togglesEnabled: panel,
      actions: [liveSlot, checkedCount, resetButton, addButton].filter((x): x is HTMLElement => x !== null),
      onToggle: (term, on) => this.toggle(term, on),
      onToggleHover: (term) => this.hover(term),
      onTogglePress: (term) => this.press(term),
      onViewChange: () => this.save(),
    });
    const stripSlot = el('div', { className: 'lw-strip-slot' });
    const charts = new ChartPanel(report, this.currentSetting(report));

    this.loaded = { report, checked, rank, suggestionSet, table, charts, stripSlot, checkedCount, liveSlot, addButton, resetButton };
    this.stripShown = null;

    const termNote = panel
      ? el('p', { className: 'lw-hint', text: 'Check or uncheck terms to see what the measures and charts would be with that stop list.' })
      : el('p', { className: 'lw-hint lw-hint--standalone', text: 'What-if needs the editor: this report shows the baseline and the suggested stop list only.' });

    replaceChildren(this.content, [
      renderReportHeader(report, exportButton ? [exportButton] : []),
      renderVerdictSummary(report),
      section('Distance health', 'lw-sec-health', [stripSlot]),
      section('Terms', 'lw-sec-terms', [termNote, table.element]),
      section('Charts', 'lw-sec-charts', [charts.element]),
      section('Hub documents', 'lw-sec-hubs', [
        el('p', { className: 'lw-hint', text: 'Documents that turn up in the most nearest-neighbour lists of the sample (baseline).' }),
        renderHubList(report.hubs, report.baseline.sample.k, panel ? (line) => this.bridge.post({ type: 'revealLine', line }) : null),
      ]),
      renderSettingsFooter(report),
    ]);
    this.statusSlot.replaceChildren();
    charts.mount();
    this.renderStrip();
    this.renderSelectionControls();
    this.save();

    // A restored selection that differs from the suggestions needs its measures again.
    const removed = this.removedTerms();
    if (!sameSet(removed, suggestionSet) && (!this.state.whatIf || !sameSet(this.state.whatIf.removed, new Set(removed)))) {
      this.state.whatIf = null;
      this.requester.schedule(removed);
      this.renderStrip();
    }
  }

  onWhatIfResult(message: WhatIfResultMessage): void {
    const panelReceived = Date.now();
    const started = performance.now();
    const sent = this.sentAt.get(message.requestId);
    this.sentAt.delete(message.requestId);
    const latest = this.requester.accept(message.requestId);
    if (!this.loaded || !latest) return;
    const slot = this.loaded.stripSlot.dataset;
    if (this.showing(message.removed)) {
      // Already drawn from a prefetch (the same bits: the engine adopted it); nothing to redraw.
      if (sent !== undefined) slot.commitMs = (started - sent).toFixed(1);
      this.renderStrip();
      return;
    }
    this.draw(message.removed, message.measures);
    // The engine's share of the wait and the panel's own (state, strip and charts), for the e2e
    // latency scenario to print beside the click's.
    if (message.engineMs !== undefined) slot.engineMs = message.engineMs.toFixed(1);
    if (message.hostMs !== undefined) slot.hostMs = message.hostMs.toFixed(1);
    if (sent !== undefined) slot.roundTripMs = (started - sent).toFixed(1);
    slot.panelMs = (performance.now() - started).toFixed(1);
    slot.source = 'answer';
    // Each hop's time (WhatIfHops) and the panel's own two, for the e2e scenario's split.
    slot.hops = JSON.stringify({ ...message.hops, panelReceived, panelDrawn: Date.now() });
  }

  /** A prefetch's answer: kept for a click to come, or shown when a click is waiting for it. */
  onPrefetchResult(message: WhatIfPrefetchResultMessage): void {
    const started = performance.now();
    const answer = this.prefetcher.accept(message);
    if (!this.loaded || answer === null || !sameSet(answer.removed, new Set(this.removedTerms())) || this.showing(answer.removed)) return;
    this.drawPrefetched(answer, started, 'prefetch');
  }

  /** Whether the strip already shows the measures of exactly `removed`. */
  private showing(removed: readonly string[]): boolean {
    return this.state.whatIf !== null && sameSet(removed, new Set(this.state.whatIf.removed));
  }

  private drawPrefetched(answer: PrefetchedAnswer, started: number, source: 'held' | 'prefetch'): void {
    const l = this.loaded;
    if (!l) return;
    this.draw(answer.removed, answer.measures);
    const slot = l.stripSlot.dataset;
    if (answer.engineMs !== undefined) slot.engineMs = answer.engineMs.toFixed(1);
    if (answer.hostMs !== undefined) slot.hostMs = answer.hostMs.toFixed(1);
    delete slot.roundTripMs;
    delete slot.hops;
    slot.panelMs = (performance.now() - started).toFixed(1);
    slot.source = source;
  }

  /** Shows `measures` as the selection's: state, charts, strip. */
  private draw(removed: readonly string[], measures: Measures): void {
    const l = this.loaded;
    if (!l) return;
    this.state.whatIf = { removed: [...removed], measures };
    this.save();
    // Charts first: they set canvas fonts, which need the computed style, and right after the
    // strip's DOM changed that forced a style recalculation of the whole panel.
    const chartsFrom = performance.now();
    l.charts.update(this.currentSetting(l.report));
    const chartsMs = performance.now() - chartsFrom;
    this.renderStrip();
    l.stripSlot.dataset.chartsMs = chartsMs.toFixed(1);
  }

  /** The pointer or focus came to rest on `term`'s toggle (or left, null): prefetch it soon. */
  private hover(term: string | null): void {
    if (term === this.hovered && (term === null || this.hoverTimer !== null)) return;
    this.hovered = term;
    if (this.hoverTimer !== null) clearTimeout(this.hoverTimer);
    this.hoverTimer = null;
    if (term === null || this.bridge.mode !== 'panel') return;
    this.hoverTimer = setTimeout(() => {
      this.hoverTimer = null;
      this.prefetch(term);
    }, PREFETCH_AFTER_MS);
  }

  /**
   * A button went down on `term`'s toggle: ask for its what-if now, without the rest a hover
   * waits for. A pointer that presses as it arrives (no rest) then still gains the press's
   * length before the click; a press that ends elsewhere only costs a prefetch.
   */
  private press(term: string): void {
    if (this.bridge.mode !== 'panel') return;
    if (this.hoverTimer !== null) clearTimeout(this.hoverTimer);
    this.hoverTimer = null;
    this.hovered = term;
    this.prefetch(term);
  }

  /** Asks ahead for the selection a click on `term` would make (none needed for the suggestions: the Report has them). */
  private prefetch(term: string): void {
    const l = this.loaded;
    if (!l || this.hovered !== term) return;
    const row = l.report.terms.find((t) => t.term === term);
    if (row === undefined || row.status === 'stopped') return;
    const next = new Set(l.checked);
    if (next.has(term)) next.delete(term);
    else next.add(term);
    const removed = inReportOrder(next, l.rank);
    if (sameSet(removed, l.suggestionSet)) return;
    this.prefetcher.ask(removed);
  }

  /** The host's word on whether the shown Report still describes the files. */
  setStale(reason: string | null, added: readonly string[]): void {
    this.stale = { reason, added: [...added] };
    this.prefetcher.invalidate();
    if (reason === null) {
      this.staleSlot.replaceChildren();
    } else {
      const again = this.bridge.mode === 'panel' ? button('Review again', 'primary', () => this.bridge.post({ type: 'reviewAgain' })) : null;
      replaceChildren(this.staleSlot, [
        el('div', { className: 'lw-stale' }, [
          el('span', { className: 'lw-stale__text', text: `Out of date: ${reason} since this review. The figures below are from before.` }),
          again,
        ]),
      ]);
    }
    this.renderStrip();
  }

  setBusy(stage: string | null): void {
    if (stage === null) {
      this.statusSlot.replaceChildren();
      return;
    }
    replaceChildren(this.statusSlot, [el('span', { className: 'lw-spinner', attrs: { 'aria-hidden': 'true' } }), el('span', { text: `Working: ${stage}…` })]);
  }

  showError(message: string): void {
    // A failed what-if answers with an error: the requester must not wait for it any more.
    this.requester.failed();
    replaceChildren(this.statusSlot, [el('div', { className: 'lw-error', text: message, attrs: { role: 'alert' } })]);
  }

  private toggle(term: string, on: boolean): void {
    const l = this.loaded;
    if (!l) return;
    if (on) l.checked.add(term);
    else l.checked.delete(term);
    this.state.checked = [...l.checked];
    this.selectionChanged();
  }

  private resetToSuggestions(): void {
    const l = this.loaded;
    if (!l) return;
    l.checked.clear();
    for (const t of l.suggestionSet) l.checked.add(t);
    this.state.checked = null;
    l.table.syncChecks();
    this.selectionChanged();
  }

  private addChecked(): void {
    const terms = this.removedTerms();
    if (terms.length > 0) this.bridge.post({ type: 'addTerms', terms });
  }

  private selectionChanged(): void {
    const l = this.loaded;
    if (!l) return;
    const started = performance.now();
    const removed = this.removedTerms();
    const prefetched = this.prefetcher.selectionChanged(removed);
    if (sameSet(removed, l.suggestionSet)) {
      // Back at the suggestions: the report already holds those measures.
      this.requester.cancel();
      this.state.whatIf = null;
      l.charts.update(this.currentSetting(l.report));
    } else {
      // Always asked, also when a prefetch answers it: the host then adopts the prefetch's state
      // (ReviewSession.speculate) and its answer is the same, so it is not drawn again.
      this.requester.schedule(removed);
      if (prefetched !== null && prefetched !== 'awaited') this.drawPrefetched(prefetched, started, 'held');
    }
    this.save();
    if (!this.showing(removed)) this.renderStrip();
    this.renderSelectionControls();
    // The pointer still rests on a toggle: its what-if in the new state.
    const hovered = this.hovered;
    if (hovered !== null) {
      this.hovered = null;
      this.hover(hovered);
    }
  }

  /** Checked terms that are not already stopped, in the report's (loudness) order. */
  private removedTerms(): string[] {
    const l = this.loaded;
    if (!l) return [];
    return inReportOrder(l.checked, l.rank);
  }

  private selectionMeasures(): Measures | null {
    return this.state.whatIf?.measures ?? null;
  }

  private currentSetting(report: Report) {
    const selection = this.selectionMeasures();
    return selection
      ? { label: 'your selection', distributions: selection.distributions }
      : { label: 'with suggestions', distributions: report.suggested.distributions };
  }

  private renderStrip(): void {
    const l = this.loaded;
    if (!l) return;
    const selection = this.selectionMeasures();
    const input: StripInput = {
      baseline: l.report.baseline,
      suggested: l.report.suggested,
      suggestedCount: l.suggestionSet.size,
      addedCount: this.stale.added.filter((t) => l.suggestionSet.has(t)).length,
      selection: selection ? { measures: selection, removedCount: this.state.whatIf?.removed.length ?? 0 } : null,
      pending: this.pendingMark(),
    };
    // A click only marks the strip as waiting: the values shown are the same, so the strip and
    // the live line stay in place and only their pending mark changes. Rebuilding them made the
    // click's frame recalculate the style of ~330 elements and lay out ~500 again, before the
    // editor's page passed the click's request on (a Chromium trace of the e2e what-if clicks).
    const shown = { measures: selection, removedCount: input.selection?.removedCount ?? 0, suggestedCount: input.suggestedCount, addedCount: input.addedCount ?? 0 };
    const last = this.stripShown;
    const strip = l.stripSlot.firstElementChild;
    const live = l.liveSlot.firstElementChild;
    if (last !== null && strip instanceof HTMLElement && live instanceof HTMLElement && last.suggestedCount === shown.suggestedCount && last.addedCount === shown.addedCount) {
      if (last.measures === shown.measures && last.removedCount === shown.removedCount) {
        setStripPending(strip, live, input.pending);
        return;
      }
      // An answer for another selection, where the strip already shows one: its values change
      // in place (the live line is small and is built again).
      if (last.measures !== null && updateStripSelection(strip, input)) {
        this.stripShown = shown;
        replaceChildren(l.liveSlot, [renderLiveSummary(input)]);
        return;
      }
    }
    this.stripShown = shown;
    replaceChildren(l.stripSlot, [renderHealthStrip(input)]);
    replaceChildren(l.liveSlot, [renderLiveSummary(input)]);
  }

  /**
   * Whether the strip shows its waiting mark: only while the strip does not show the current
   * selection (a prefetch may have), and once that wait has lasted PENDING_MARK_AFTER_MS.
   */
  private pendingMark(): boolean {
    const waiting = this.requester.pending && !this.showing(this.removedTerms());
    if (!waiting) {
      if (this.pendingTimer !== null) clearTimeout(this.pendingTimer);
      this.pendingTimer = null;
      this.pendingMarked = false;
    } else if (!this.pendingMarked && this.pendingTimer === null) {
      this.pendingTimer = setTimeout(() => {
        this.pendingTimer = null;
        this.pendingMarked = true;
        this.renderStrip();
      }, PENDING_MARK_AFTER_MS);
    }
    return waiting && this.pendingMarked;
  }

  private renderSelectionControls(): void {
    const l = this.loaded;
    if (!l) return;
    const n = this.removedTerms().length;
    l.checkedCount.textContent = `${n.toLocaleString('en-US')} checked`;
    if (l.addButton) l.addButton.disabled = n === 0;
    if (l.resetButton) l.resetButton.disabled = sameSet(this.removedTerms(), l.suggestionSet);
  }

  private save(): void {
    this.bridge.saveState(this.state);
  }
}

function section(title: string, id: string, children: readonly HTMLElement[]): HTMLElement {
  return el('section', { className: `lw-section ${id}`, attrs: { 'aria-labelledby': `${id}-h` } }, [el('h2', { text: title, attrs: { id: `${id}-h` } }), ...children]);
}

function button(label: string, kind: 'primary' | 'secondary', onClick: () => void): HTMLButtonElement {
  const b = el('button', { className: `lw-button lw-button--${kind}`, text: label, attrs: { type: 'button' } });
  b.addEventListener('click', onClick);
  return b;
}

/** The terms of `terms` that `rank` holds, in its order (the Report's rows that are not stopped). */
function inReportOrder(terms: Iterable<string>, rank: ReadonlyMap<string, number>): string[] {
  const kept: string[] = [];
  for (const t of terms) if (rank.has(t)) kept.push(t);
  return kept.sort((a, b) => rank.get(a)! - rank.get(b)!);
}

function sameSet(list: readonly string[], set: ReadonlySet<string>): boolean {
  if (list.length !== set.size) return false;
  for (const t of list) if (!set.has(t)) return false;
  return true;
}
