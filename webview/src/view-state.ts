// What the reader chose (sort, filter, search, toggles, last what-if), kept through
// acquireVsCodeApi().setState so a hidden panel comes back as it was left.

import type { Measures, Report, TermStatus } from '../../extension/src/protocol';

export type SortKey = 'checked' | 'term' | 'df' | 'idf' | 'pullShare' | 'neighborLift' | 'spread' | 'loudness' | 'status' | 'why';
export type StatusFilter = TermStatus | 'all' | 'checked';

export interface ViewState {
  version: 1;
  /** Which report the toggles belong to; toggles reset when a different report arrives. */
  reportKey: string | null;
  sort: { key: SortKey; descending: boolean };
  status: StatusFilter;
  search: string;
  /** Terms the reader checked to stop; null = the report's suggestions. */
  checked: string[] | null;
  /** How many table rows are shown (grows with "show more"). */
  shown: number;
  whatIf: { removed: string[]; measures: Measures } | null;
}

export const PAGE_SIZE = 500;

export function defaultViewState(): ViewState {
  return {
    version: 1,
    reportKey: null,
    sort: { key: 'loudness', descending: true },
    status: 'all',
    search: '',
    checked: null,
    shown: PAGE_SIZE,
    whatIf: null,
  };
}

const sortKeys: ReadonlySet<string> = new Set(['checked', 'term', 'df', 'idf', 'pullShare', 'neighborLift', 'spread', 'loudness', 'status', 'why']);
const statusFilters: ReadonlySet<string> = new Set(['all', 'checked', 'suggested', 'stopped', 'protected', 'kept']);

/** Accepts a stored state only if it has the expected shape; anything else gives the defaults. */
export function restoreViewState(stored: unknown): ViewState {
  const base = defaultViewState();
  if (typeof stored !== 'object' || stored === null) return base;
  const s = stored as Record<string, unknown>;
  if (s.version !== 1) return base;
  const sort = s.sort as Record<string, unknown> | undefined;
  if (sort && typeof sort.key === 'string' && sortKeys.has(sort.key)) {
    base.sort = { key: sort.key as SortKey, descending: sort.descending === true };
  }
  if (typeof s.status === 'string' && statusFilters.has(s.status)) base.status = s.status as StatusFilter;
  if (typeof s.search === 'string') base.search = s.search;
  if (typeof s.reportKey === 'string') base.reportKey = s.reportKey;
  if (Array.isArray(s.checked) && s.checked.every((t) => typeof t === 'string')) base.checked = s.checked as string[];
  if (typeof s.shown === 'number' && Number.isInteger(s.shown) && s.shown >= PAGE_SIZE) base.shown = s.shown;
  const w = s.whatIf as Record<string, unknown> | null | undefined;
  if (w && Array.isArray(w.removed) && typeof w.measures === 'object' && w.measures !== null) {
    base.whatIf = { removed: w.removed as string[], measures: w.measures as Measures };
  }
  return base;
}

/** A cheap fingerprint of a report: same corpus, same vocabulary, same suggestions. */
export function reportKeyOf(report: Report): string {
  const parts = [
    report.input.file,
    report.input.documents,
    report.vocabulary.terms,
    report.vocabulary.nonzeros,
    report.stopList.terms,
    report.suggestions.join('\u0000'),
  ].join('\u0001');
  // FNV-1a, 32 bit: only needs to tell reports apart, not resist anyone.
  let h = 0x811c9dc5;
  for (let i = 0; i < parts.length; i += 1) {
    h ^= parts.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(16);
}
