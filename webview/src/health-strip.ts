// The health strip: every measure as baseline → with suggestions (→ your selection once a
// what-if result is in), each change marked with the direction it moved and whether that is an
// improvement for that measure (colour plus a glyph plus hidden words, never colour alone).

import type { Measures } from '../../extension/src/protocol';
import { el, setSafeAttribute, uniqueId, type Child } from './create-element';
import { changeWord, judgeChange, measureCatalog, type MeasureChange, type MeasureSpec } from '../../extension/src/measure-catalog';

export interface StripInput {
  baseline: Measures;
  suggested: Measures;
  suggestedCount: number;
  /** Suggested terms added to the stop list since the review (the panel is then out of date). */
  addedCount?: number;
  selection: { measures: Measures; removedCount: number } | null;
  pending: boolean;
}

export function renderHealthStrip(input: StripInput): HTMLElement {
  const legend = el('p', { className: 'lw-strip__legend' }, [
    el('span', { className: 'lw-key lw-key--baseline', text: 'baseline' }),
    arrow(),
    el('span', { className: 'lw-key', text: `with ${plural(input.suggestedCount, 'suggested term')}` }),
    input.addedCount ? el('span', { className: 'lw-key lw-key--added', text: `(${input.addedCount === input.suggestedCount ? 'all' : input.addedCount.toLocaleString('en-US')} added to the stop list since)` }) : null,
    input.selection ? arrow() : null,
    input.selection ? el('span', { className: 'lw-key lw-key--selection', text: selectionKey(input.selection.removedCount) }) : null,
    input.pending ? pendingNote() : null,
  ]);
  const primary = el('div', { className: `lw-strip__primary${input.selection ? ' lw-strip--three' : ''}` });
  for (const spec of measureCatalog) if (spec.primary) primary.append(renderTile(spec, input));
  return el('div', { className: 'lw-strip', attrs: { 'data-pending': input.pending } }, [legend, primary, renderMeasureTable(input)]);
}

/**
 * Marks a strip and its live line (built by renderHealthStrip and renderLiveSummary) as waiting
 * for an answer, or not, without building them again: the same attribute and "updating…" note
 * as a strip built with `pending`.
 */
export function setStripPending(strip: HTMLElement, live: HTMLElement, pending: boolean): void {
  markStripPending(strip, pending);
  setSafeAttribute(live, 'data-pending', pending);
}

function markStripPending(strip: HTMLElement, pending: boolean): void {
  setSafeAttribute(strip, 'data-pending', pending);
  const legend = strip.querySelector('.lw-strip__legend');
  const note = legend?.querySelector('.lw-pending') ?? null;
  if (pending && note === null) legend?.append(pendingNote());
  if (!pending) note?.remove();
}

function pendingNote(): HTMLElement {
  return el('span', { className: 'lw-pending', text: 'updating…', attrs: { role: 'status' } });
}

/**
 * Puts a new selection into a strip that already shows one (built by renderHealthStrip with a
 * selection): the selection's value spans, the measure details that follow the selection, the
 * legend's count and the pending mark change, the rest stays. The result is the strip
 * renderHealthStrip builds for `input` (test/webview-browser.test.ts compares the two). An
 * answer drawn this way restyles and lays out tens of elements instead of the strip's ~420.
 * Returns false, changing nothing, when the strip has no selection column yet.
 */
export function updateStripSelection(strip: HTMLElement, input: StripInput): boolean {
  const selection = input.selection;
  const key = strip.querySelector('.lw-key--selection');
  if (selection === null || key === null) return false;
  key.textContent = selectionKey(selection.removedCount);
  for (const spec of measureCatalog) {
    for (const holder of strip.querySelectorAll(`[data-measure="${spec.id}"]`)) {
      holder.querySelector('.lw-v--selection')?.replaceWith(selectionSpan(spec, input.suggested, selection.measures));
      if (spec.primary || !spec.detail) continue;
      const detail = spec.detail(selection.measures);
      const shown = holder.querySelector('.lw-measures__detail');
      if (detail === null) shown?.remove();
      else if (shown !== null) shown.textContent = detail;
      else holder.querySelector('th > span')?.after(el('span', { className: 'lw-measures__detail', text: detail }));
    }
  }
  markStripPending(strip, input.pending);
  return true;
}

function selectionKey(removedCount: number): string {
  return `your selection (${plural(removedCount, 'term')})`;
}

/** The selection's value, judged against the suggestions (see valueChain). */
function selectionSpan(spec: MeasureSpec, suggested: Measures, measures: Measures): HTMLElement {
  const sug = spec.value(suggested);
  const sel = spec.value(measures);
  return valueSpan(spec, 'selection', sel, sug, judgeChange(spec, sug, sel), 'your selection, against the suggestions');
}

/** The headline measures: one tile each, values large. */
function renderTile(spec: MeasureSpec, input: StripInput): HTMLElement {
  const labelId = uniqueId('lw-m');
  const meaningId = uniqueId('lw-d');
  // A tile of dashes says nothing; say what the measure needs instead (a what-if cannot give it one).
  const absent = spec.whenAbsent !== undefined && spec.value(input.baseline) === null && spec.value(input.suggested) === null;
  return el(
    'div',
    {
      className: 'lw-tile',
      attrs: { role: 'group', tabindex: 0, title: spec.meaning, 'aria-labelledby': labelId, 'aria-describedby': meaningId, 'data-measure': spec.id },
    },
    [
      el('div', { className: 'lw-tile__label', text: spec.label, attrs: { id: labelId } }),
      absent
        ? el('p', { className: 'lw-tile__absent' }, absentNote(spec.whenAbsent ?? ''))
        : el('div', { className: 'lw-tile__values' }, valueChain(spec, input)),
      meaningDetails(spec, meaningId),
    ],
  );
}

/** The note's flags (`--label`) as unbreakable code, so a narrow tile never splits one at its hyphens. */
function absentNote(text: string): Child[] {
  return text.split(/(--[a-z-]+)/).map((part, i) => (i % 2 === 1 ? el('code', { text: part }) : part));
}

/** The other measures: a compact table with aligned columns, one row per measure. */
function renderMeasureTable(input: StripInput): HTMLElement {
  const head = el('tr', {}, [
    el('th', { text: 'Measure', attrs: { scope: 'col' } }),
    el('th', { className: 'lw-num', text: 'Baseline', attrs: { scope: 'col' } }),
    el('th', { className: 'lw-num', text: 'Suggested', attrs: { scope: 'col' } }),
    input.selection ? el('th', { className: 'lw-num', text: 'Selection', attrs: { scope: 'col' } }) : null,
  ]);
  const body = el('tbody');
  for (const spec of measureCatalog) {
    if (spec.primary) continue;
    const meaningId = uniqueId('lw-d');
    const base = spec.value(input.baseline);
    const sug = spec.value(input.suggested);
    const detailSource = input.selection?.measures ?? input.suggested;
    const detail = spec.detail ? spec.detail(detailSource) : null;
    body.append(
      el('tr', { attrs: { tabindex: 0, title: spec.meaning, 'aria-describedby': meaningId, 'data-measure': spec.id } }, [
        el('th', { attrs: { scope: 'row' } }, [
          el('span', { text: spec.label }),
          detail ? el('span', { className: 'lw-measures__detail', text: detail }) : null,
          meaningDetails(spec, meaningId),
        ]),
        el('td', { className: 'lw-num' }, [valueSpan(spec, 'baseline', base, null, null)]),
        el('td', { className: 'lw-num' }, [valueSpan(spec, 'suggested', sug, base, judgeChange(spec, base, sug), 'with suggestions')]),
        input.selection ? el('td', { className: 'lw-num' }, [selectionSpan(spec, input.suggested, input.selection.measures)]) : null,
      ]),
    );
  }
  return el('table', { className: 'lw-measures', attrs: { 'aria-label': 'More distance measures' } }, [el('thead', {}, [head]), body]);
}

function valueChain(spec: MeasureSpec, input: StripInput): Child[] {
  const base = spec.value(input.baseline);
  const values: Child[] = [valueSpan(spec, 'baseline', base, null, null)];
  const sug = spec.value(input.suggested);
  values.push(arrow(), valueSpan(spec, 'suggested', sug, base, judgeChange(spec, base, sug), 'with suggestions'));
  // Judged against the suggestions, not the baseline: the question a toggle asks is whether
  // the reader's own list does better or worse than the one suggested.
  if (input.selection) values.push(arrow(), selectionSpan(spec, input.suggested, input.selection.measures));
  return values;
}

/**
 * The measure's meaning (which says which direction is healthier) one click (or Enter) away: a disclosure, not only
 * a hover title, which touch screens and keyboards never show.
 */
function meaningDetails(spec: MeasureSpec, meaningId: string): HTMLElement {
  return el('details', { className: 'lw-meaning' }, [
    el('summary', { className: 'lw-meaning__toggle', text: 'What is this?' }),
    el('p', { className: 'lw-meaning__text', text: spec.meaning, attrs: { id: meaningId } }),
  ]);
}

function arrow(): HTMLElement {
  return el('span', { className: 'lw-arrow', text: '→', attrs: { 'aria-hidden': 'true' } });
}

function valueSpan(
  spec: MeasureSpec,
  role: string,
  value: number | null,
  base: number | null,
  v: MeasureChange | null,
  srLabel = 'baseline',
): HTMLElement {
  const children: Child[] = [
    el('span', { className: 'lw-sr', text: `${srLabel} ` }),
    el('span', { className: 'lw-v__num', text: spec.format(value), attrs: { 'data-role': role } }),
  ];
  // The glyph shows which way the number moved; the colour (from data-verdict) whether that helps.
  if (v !== null && v !== 'unknown' && v !== 'same' && value !== null && base !== null) {
    children.push(el('span', { className: 'lw-mark', text: value > base ? '▲' : '▼', attrs: { 'aria-hidden': 'true' } }));
  }
  if (v !== null) children.push(el('span', { className: 'lw-sr', text: ` (${changeWord(v)})` }));
  return el('span', { className: `lw-v lw-v--${role}`, attrs: { 'data-verdict': v ?? 'baseline' } }, children);
}

function plural(n: number, word: string): string {
  return `${n.toLocaleString('en-US')} ${word}${n === 1 ? '' : 's'}`;
}

/**
 * The headline measures in one line for the sticky term toolbar, so the effect of a toggle is
 * visible even when the strip has scrolled away (the panel is often short).
 */
export function renderLiveSummary(input: StripInput): HTMLElement {
  const current = input.selection?.measures ?? input.suggested;
  const parts: Child[] = [];
  for (const spec of measureCatalog) {
    if (!spec.primary) continue;
    // The reader's selection is judged against the suggestions, the suggestions against the baseline.
    const base = spec.value(input.selection ? input.suggested : input.baseline);
    const now = spec.value(current);
    if (now === null) continue;
    if (parts.length > 0) parts.push(el('span', { className: 'lw-live__sep', text: '·', attrs: { 'aria-hidden': 'true' } }));
    parts.push(
      el('span', { className: 'lw-live__item', attrs: { title: spec.meaning, 'data-measure': spec.id } }, [
        el('span', { className: 'lw-live__label', text: `${spec.label} ` }),
        valueSpan(spec, 'live', now, base, judgeChange(spec, base, now), input.selection ? 'your selection' : 'with suggestions'),
      ]),
    );
  }
  return el('span', { className: 'lw-live', attrs: { 'data-pending': input.pending } }, parts);
}
