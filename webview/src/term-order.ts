// Sorting and filtering of the term rows, kept apart from the DOM so it can be reasoned about
// (and reused by the scatter chart). Returns row indices; never reorders the report's array.

import type { TermRow, TermStatus } from '../../extension/src/protocol';
import type { SortKey, StatusFilter } from './view-state';

export interface TermOrderOptions {
  sort: { key: SortKey; descending: boolean };
  status: StatusFilter;
  search: string;
  checked: ReadonlySet<string>;
}

const statusRank: Record<TermStatus, number> = { suggested: 0, stopped: 1, protected: 2, kept: 3 };

export function orderTerms(terms: readonly TermRow[], o: TermOrderOptions): number[] {
  const needle = o.search.trim().toLowerCase();
  const keep: number[] = [];
  for (let i = 0; i < terms.length; i += 1) {
    const t = terms[i]!;
    if (o.status === 'checked') {
      if (!o.checked.has(t.term)) continue;
    } else if (o.status !== 'all' && t.status !== o.status) continue;
    if (needle && !t.term.toLowerCase().includes(needle)) continue;
    keep.push(i);
  }
  const sign = o.sort.descending ? -1 : 1;
  const key = o.sort.key;
  keep.sort((a, b) => {
    const c = compareBy(key, terms[a]!, terms[b]!, o.checked);
    if (c !== 0) return c === 2 || c === -2 ? c / 2 : sign * c;
    // Ties keep the report's order (its loudness ranking), whichever way the column runs.
    return a - b;
  });
  return keep;
}

/** −1/0/1 for ordinary comparisons; ±2 when one side is missing (missing always sorts last). */
function compareBy(key: SortKey, a: TermRow, b: TermRow, checked: ReadonlySet<string>): number {
  switch (key) {
    case 'term':
      return cmpText(a.term, b.term);
    case 'why':
      return cmpText(a.why, b.why);
    case 'status':
      return cmp(statusRank[a.status] ?? 9, statusRank[b.status] ?? 9);
    case 'checked':
      return cmp(checked.has(a.term) ? 1 : 0, checked.has(b.term) ? 1 : 0);
    default:
      return cmpNullable(a[key], b[key]);
  }
}

function cmp(a: number, b: number): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

function cmpNullable(a: number | null, b: number | null): number {
  const aMissing = a === null || !Number.isFinite(a);
  const bMissing = b === null || !Number.isFinite(b);
  if (aMissing && bMissing) return 0;
  if (aMissing) return 2;
  if (bMissing) return -2;
  return cmp(a, b);
}

const collator = new Intl.Collator('en', { sensitivity: 'base', numeric: true });
function cmpText(a: string, b: string): number {
  return Math.sign(collator.compare(a, b));
}
