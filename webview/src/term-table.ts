// The ranked term table: sortable headers (buttons inside <th>, aria-sort), a status filter, a
// text search, a "stop this term" checkbox per row, and a row cap with "show more" so that
// tens of thousands of terms stay quick (only the rows on screen exist in the DOM).

import type { TermRow } from '../../extension/src/protocol';
import { el, replaceChildren, setSafeAttribute } from './create-element';
import { formatCount, formatFixed, formatNumber, formatRatio, formatShare } from './format';
import { orderTerms } from './term-order';
import { PAGE_SIZE, type SortKey, type StatusFilter, type ViewState } from './view-state';

interface Column {
  key: SortKey;
  label: string;
  title: string;
  numeric: boolean;
  /** Direction of the first click: numbers start high-to-low, text A to Z. */
  firstDescending: boolean;
}

const columns: readonly Column[] = [
  { key: 'checked', label: 'Stop', title: 'Checked terms are treated as stopped in the what-if', numeric: false, firstDescending: true },
  { key: 'term', label: 'Term', title: 'The term as tokenised', numeric: false, firstDescending: false },
  { key: 'df', label: 'df', title: 'Documents that contain the term', numeric: true, firstDescending: true },
  { key: 'idf', label: 'idf', title: 'Inverse document frequency with the configured formula', numeric: true, firstDescending: true },
  { key: 'pullShare', label: 'Pull share', title: 'Share of the all-pairs similarity mass that comes from this term', numeric: true, firstDescending: true },
  {
    key: 'neighborLift',
    label: 'Neighbour lift',
    title: "The term's share of similarity inside nearest-neighbour pairs divided by its pull share; below 1 it adds more background than neighbour signal",
    numeric: true,
    firstDescending: true,
  },
  { key: 'spread', label: 'Spread', title: "How evenly the term's weight is spread over documents (1 = everywhere evenly)", numeric: true, firstDescending: true },
  { key: 'loudness', label: 'Loudness', title: 'Combined score used to rank loud terms; higher is louder', numeric: true, firstDescending: true },
  { key: 'status', label: 'Status', title: 'suggested, already stopped, protected by the settings, or kept', numeric: false, firstDescending: false },
  { key: 'why', label: 'Why', title: 'Why the term is or is not suggested', numeric: false, firstDescending: false },
];

const statusOptions: ReadonlyArray<[StatusFilter, string]> = [
  ['all', 'All statuses'],
  ['suggested', 'Suggested'],
  ['stopped', 'Already stopped'],
  ['protected', 'Protected'],
  ['kept', 'Kept'],
  ['checked', 'Checked by you'],
];

export interface TermTableOptions {
  /** False in the standalone report: there is no engine to answer a what-if. */
  togglesEnabled: boolean;
  /** Extra controls placed at the end of the toolbar (buttons owned by the app). */
  actions: readonly HTMLElement[];
  onToggle(term: string, checked: boolean): void;
  /**
   * The pointer came to rest over a term's toggle (its cell) or the keyboard focus landed on it
   * (`term`), or left it (null): the app may prefetch that toggle's what-if.
   */
  onToggleHover?(term: string | null): void;
  /**
   * A button went down on a term's toggle (the pointer, or Space on the focused box): its click
   * comes when the button is released, typically ~0.1 s later (a common figure, from memory), so
   * the app may ask for that toggle's what-if now.
   */
  onTogglePress?(term: string): void;
  onViewChange(): void;
}

export class TermTable {
  readonly element: HTMLElement;
  private readonly tbody: HTMLTableSectionElement;
  private readonly headRow: HTMLTableRowElement;
  private readonly countLine: HTMLElement;
  private readonly moreButton: HTMLButtonElement;
  private readonly searchInput: HTMLInputElement;
  private readonly statusSelect: HTMLSelectElement;
  private order: number[] = [];
  private readonly maxPull: number;
  private searchTimer: ReturnType<typeof setTimeout> | undefined;

  constructor(
    private readonly terms: readonly TermRow[],
    private readonly state: ViewState,
    private readonly checked: Set<string>,
    private readonly options: TermTableOptions,
  ) {
    let maxPull = 0;
    for (const t of terms) if (Number.isFinite(t.pullShare) && t.pullShare > maxPull) maxPull = t.pullShare;
    this.maxPull = maxPull;

    this.searchInput = el('input', {
      className: 'lw-input',
      attrs: { type: 'search', placeholder: 'Find a term', 'aria-label': 'Find a term', spellcheck: 'false', autocomplete: 'off' },
    });
    this.searchInput.value = state.search;
    this.searchInput.addEventListener('input', () => {
      clearTimeout(this.searchTimer);
      this.searchTimer = setTimeout(() => {
        this.state.search = this.searchInput.value;
        this.state.shown = PAGE_SIZE;
        this.refresh();
        this.options.onViewChange();
      }, 120);
    });

    this.statusSelect = el('select', { className: 'lw-select', attrs: { 'aria-label': 'Filter by status' } });
    for (const [value, label] of statusOptions) {
      const option = el('option', { text: label, attrs: { value } });
      if (value === state.status) option.selected = true;
      this.statusSelect.append(option);
    }
    this.statusSelect.addEventListener('change', () => {
      this.state.status = this.statusSelect.value as StatusFilter;
      this.state.shown = PAGE_SIZE;
      this.refresh();
      this.options.onViewChange();
    });

    this.countLine = el('span', { className: 'lw-count', attrs: { 'aria-live': 'polite' } });
    const toolbar = el('div', { className: 'lw-toolbar' }, [
      this.searchInput,
      this.statusSelect,
      this.countLine,
      el('span', { className: 'lw-toolbar__spacer' }),
      ...options.actions,
    ]);

    this.headRow = el('tr');
    for (const c of columns) {
      const button = el('button', { className: 'lw-sort', attrs: { type: 'button', 'data-sort': c.key, title: c.title } }, [
        el('span', { text: c.label }),
        el('span', { className: 'lw-sort__glyph', attrs: { 'aria-hidden': 'true' } }),
      ]);
      button.addEventListener('click', () => this.sortBy(c));
      this.headRow.append(el('th', { className: `lw-col-${c.key}${c.numeric ? ' lw-num' : ''}`, attrs: { scope: 'col' } }, [button]));
    }

    this.tbody = el('tbody');
    this.tbody.addEventListener('change', (event) => {
      const input = event.target;
      if (!(input instanceof HTMLInputElement) || input.type !== 'checkbox') return;
      const term = input.closest('tr')?.getAttribute('data-term');
      if (term === null || term === undefined) return;
      this.options.onToggle(term, input.checked);
    });
    // Delegated like 'change': rows come and go with sorting, filtering and "show more".
    const toggleOf = (target: EventTarget | null): string | null => {
      if (!(target instanceof Element)) return null;
      const box = target.closest('td')?.querySelector('input.lw-check');
      if (!(box instanceof HTMLInputElement) || box.disabled) return null;
      return box.closest('tr')?.getAttribute('data-term') ?? null;
    };
    const hover = (term: string | null): void => this.options.onToggleHover?.(term);
    this.tbody.addEventListener('pointerover', (event) => hover(toggleOf(event.target)));
    this.tbody.addEventListener('pointerleave', () => hover(null));
    this.tbody.addEventListener('focusin', (event) => hover(toggleOf(event.target)));
    this.tbody.addEventListener('focusout', () => hover(null));
    const press = (term: string | null): void => {
      if (term !== null) this.options.onTogglePress?.(term);
    };
    // Only the main button: a right button opens a menu, and the checkbox toggles on the release
    // of the left one (and of Space, not its press).
    this.tbody.addEventListener('pointerdown', (event) => {
      if (event.button === 0) press(toggleOf(event.target));
    });
    this.tbody.addEventListener('keydown', (event) => {
      if (event.key === ' ' && !event.repeat) press(toggleOf(event.target));
    });

    const table = el('table', { className: 'lw-table', attrs: { 'aria-label': 'Terms ranked by how loud they are' } }, [el('thead', {}, [this.headRow]), this.tbody]);

    this.moreButton = el('button', { className: 'lw-button lw-button--secondary lw-more', attrs: { type: 'button' } });
    this.moreButton.addEventListener('click', () => {
      const from = Math.min(this.state.shown, this.order.length);
      this.state.shown += PAGE_SIZE;
      this.renderRows(from);
      this.options.onViewChange();
    });

    this.element = el('div', { className: 'lw-terms' }, [toolbar, el('div', { className: 'lw-table-wrap' }, [table]), this.moreButton]);
    this.refresh();
  }

  /** Re-sorts and re-filters, then redraws the visible rows. */
  refresh(): void {
    this.order = orderTerms(this.terms, { sort: this.state.sort, status: this.state.status, search: this.state.search, checked: this.checked });
    this.renderHeader();
    this.renderRows();
  }

  /** Brings the checkboxes on screen in line with `checked` (after a reset). */
  syncChecks(): void {
    for (const input of this.tbody.querySelectorAll<HTMLInputElement>('input[type=checkbox]')) {
      const term = input.closest('tr')?.getAttribute('data-term');
      if (term !== null && term !== undefined && !input.disabled) input.checked = this.checked.has(term);
    }
    this.renderCount();
  }

  private sortBy(c: Column): void {
    const current = this.state.sort;
    this.state.sort = current.key === c.key ? { key: c.key, descending: !current.descending } : { key: c.key, descending: c.firstDescending };
    this.refresh();
    this.options.onViewChange();
  }

  private renderHeader(): void {
    for (const th of this.headRow.children) {
      const button = th.querySelector('button');
      const key = button?.getAttribute('data-sort');
      const glyph = th.querySelector('.lw-sort__glyph');
      if (key === this.state.sort.key) {
        setSafeAttribute(th, 'aria-sort', this.state.sort.descending ? 'descending' : 'ascending');
        if (glyph) glyph.textContent = this.state.sort.descending ? '▾' : '▴';
      } else {
        setSafeAttribute(th, 'aria-sort', 'none');
        if (glyph) glyph.textContent = '';
      }
    }
  }

  /** Draws rows up to `state.shown`; with `from`, keeps the rows already there and appends. */
  private renderRows(from = 0): void {
    const limit = Math.min(this.state.shown, this.order.length);
    const rows: HTMLTableRowElement[] = [];
    for (let i = from; i < limit; i += 1) rows.push(this.renderRow(this.terms[this.order[i]!]!));
    if (from === 0) replaceChildren(this.tbody, rows);
    else this.tbody.append(...rows);
    const hidden = this.order.length - limit;
    this.moreButton.hidden = hidden <= 0;
    this.moreButton.textContent = `Show ${formatCount(Math.min(PAGE_SIZE, hidden))} more (${formatCount(hidden)} not shown)`;
    this.renderCount();
  }

  private renderCount(): void {
    const shown = Math.min(this.state.shown, this.order.length);
    const of = this.order.length === this.terms.length ? '' : ` (${formatCount(this.terms.length)} in all)`;
    this.countLine.textContent = `${formatCount(shown)} of ${formatCount(this.order.length)} terms${of}`;
  }

  private renderRow(t: TermRow): HTMLTableRowElement {
    const stopped = t.status === 'stopped';
    const box = el('input', {
      className: 'lw-check',
      attrs: {
        type: 'checkbox',
        'aria-label': `Stop “${t.term}”`,
        title: stopped ? 'Already in the stop list' : this.options.togglesEnabled ? 'Treat this term as stopped' : 'What-if needs the editor',
      },
    });
    box.checked = stopped || this.checked.has(t.term);
    box.disabled = stopped || !this.options.togglesEnabled;

    // The bar is the cell's background (panel.css .lw-pull), not a positioned child: 500 rows of
    // positioned bars were 500 paint layers that every frame touching the table walked again.
    const pull = el('td', { className: 'lw-num lw-pull', text: formatShare(t.pullShare) });
    if (this.maxPull > 0 && Number.isFinite(t.pullShare)) {
      // CSSOM, not a style attribute: allowed under the panel's CSP.
      pull.style.setProperty('--lw-bar', String(Math.max(0, Math.min(1, t.pullShare / this.maxPull))));
    }

    pull.classList.add('lw-col-pullShare');
    const lift = formatRatio(t.neighborLift);
    // Below ~600 px only stop, term, pull share and status stay as columns (panel.css); the rest
    // opens under the term with one click, instead of a wide table scrolling inside the page.
    const more = el('details', { className: 'lw-rowmore' }, [
      el('summary', { className: 'lw-rowmore__term', text: t.term }),
      el('dl', { className: 'lw-rowmore__facts' }, [
        ...fact('df', formatCount(t.df)),
        ...fact('idf', formatFixed(t.idf, 2)),
        ...fact('Neighbour lift', lift),
        ...fact('Spread', formatFixed(t.spread, 2)),
        ...fact('Loudness', formatNumber(t.loudness)),
        ...fact('Why', t.why),
      ]),
    ]);
    return el('tr', { attrs: { 'data-term': t.term, 'data-status': t.status } }, [
      el('td', { className: 'lw-col-checked' }, [box]),
      el('td', { className: 'lw-termcell lw-col-term' }, [el('span', { className: 'lw-term lw-term--wide', text: t.term, attrs: { title: t.term } }), more]),
      el('td', { className: 'lw-num lw-col-df', text: formatCount(t.df) }),
      el('td', { className: 'lw-num lw-col-idf', text: formatFixed(t.idf, 2) }),
      pull,
      el('td', { className: `lw-num lw-col-neighborLift${t.neighborLift !== null && t.neighborLift < 1 ? ' lw-low' : ''}`, text: lift }),
      el('td', { className: 'lw-num lw-col-spread', text: formatFixed(t.spread, 2) }),
      el('td', { className: 'lw-num lw-col-loudness', text: formatNumber(t.loudness) }),
      el('td', { className: 'lw-col-status' }, [el('span', { className: `lw-status lw-status--${safeClass(t.status)}`, text: t.status })]),
      el('td', { className: 'lw-why lw-col-why', text: t.why, attrs: { title: t.why } }),
    ]);
  }
}

function fact(name: string, value: string): HTMLElement[] {
  return [el('dt', { text: name }), el('dd', { text: value })];
}

/** Status comes from the report; only known words may become part of a class name. */
function safeClass(status: string): string {
  return /^(suggested|stopped|protected|kept)$/.test(status) ? status : 'other';
}
