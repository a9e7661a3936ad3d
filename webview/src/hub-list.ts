// The hub documents: those found in the most k-nearest-neighbour lists. In the editor a row is
// a button that asks the host to reveal the document's line; in the standalone report it is text.

import type { HubRow } from '../../extension/src/protocol';
import { el } from './create-element';
import { formatCount } from './format';

const MAX_ROWS = 100;

export function renderHubList(hubs: readonly HubRow[], k: number, onReveal: ((line: number) => void) | null): HTMLElement {
  if (hubs.length === 0) return el('p', { className: 'lw-empty', text: 'No hub documents in the sample.' });
  // A many-file corpus names each hub by file and line, far wider than "line 1,234": its rows get
  // a wider first column, cut with an ellipsis and the whole name in the title.
  const shown = hubs.slice(0, MAX_ROWS);
  const byFile = shown.some((hub) => hub.file !== undefined);
  const list = el('ol', { className: byFile ? 'lw-hubs lw-hubs--files' : 'lw-hubs', attrs: { 'aria-label': 'Hub documents' } });
  for (const hub of shown) {
    const where = hub.file === undefined ? `line ${formatCount(hub.line)}` : `${hub.file}:${hub.line}`;
    const parts = [
      hub.file === undefined
        ? el('span', { className: 'lw-hub__line', text: where })
        : // Cut at the start, not the end: the folders repeat from row to row, the file's own name
          // and line are what tell the rows apart (right-to-left overflow, the text itself isolated
          // left to right so that its order stays).
          el('span', { className: 'lw-hub__line lw-hub__line--file', attrs: { title: where } }, [el('bdi', { text: where })]),
      el('span', { className: 'lw-hub__k', text: `in ${formatCount(hub.kOccurrence)} lists`, attrs: { title: `Appears in ${hub.kOccurrence} of the sampled ${k}-nearest-neighbour lists (mean is ${k})` } }),
      el('span', { className: 'lw-hub__preview', text: hub.preview }),
    ];
    // A hub of a many-file corpus (a shards folder) is in a file the panel has no editor for.
    const row = onReveal && hub.file === undefined
      ? el('button', { className: 'lw-hub', attrs: { type: 'button', 'data-line': hub.line, title: `Go to line ${hub.line}` } }, parts)
      : el('div', { className: 'lw-hub', attrs: { 'data-line': hub.line } }, parts);
    if (onReveal && hub.file === undefined) row.addEventListener('click', () => onReveal(hub.line));
    list.append(el('li', {}, [row]));
  }
  return list;
}
