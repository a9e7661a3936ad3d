import { splitStopListLines, stopListTerm } from './stop-list-lines';
import type { TextEdit } from './text-edit';

/**
 * Deletes the entry lines (every occurrence) of the given terms, with their line breaks, and
 * nothing else. Adjacent lines go in one edit so the edits never overlap (a WorkspaceEdit
 * rejects overlapping ranges). A block at the very end of a file without a final line break
 * takes the break before it instead, so no empty last line is left behind.
 */
export function removeTermsFromStopList(text: string, terms: readonly string[]): { text: string; removed: string[]; edits: TextEdit[] } {
  const wanted = new Set(terms.map((t) => t.trim()));
  const lines = splitStopListLines(text);
  const drop: boolean[] = new Array<boolean>(lines.length).fill(false);
  const removed: string[] = [];
  for (let i = 0; i < lines.length; i++) {
    const term = stopListTerm((lines[i] as { text: string }).text);
    if (term === null || !wanted.has(term)) continue;
    drop[i] = true;
    if (!removed.includes(term)) removed.push(term);
  }
  const edits: TextEdit[] = [];
  for (let a = 0; a < lines.length; a++) {
    if (!drop[a]) continue;
    let b = a;
    while (b + 1 < lines.length && drop[b + 1]) b++;
    const lastLine = lines[b] as { text: string; eol: string };
    if (lastLine.eol !== '') edits.push({ start: { line: a, character: 0 }, end: { line: b + 1, character: 0 }, newText: '' });
    else if (a > 0) {
      const before = lines[a - 1] as { text: string };
      edits.push({ start: { line: a - 1, character: before.text.length }, end: { line: b, character: lastLine.text.length }, newText: '' });
    } else edits.push({ start: { line: 0, character: 0 }, end: { line: b, character: lastLine.text.length }, newText: '' });
    a = b;
  }
  return { text: applyEdits(text, lines, edits), removed, edits };
}

/** Applies non-overlapping edits (in document order) to the text they were computed on. */
function applyEdits(text: string, lines: ReadonlyArray<{ text: string; eol: string }>, edits: readonly TextEdit[]): string {
  if (edits.length === 0) return text;
  const lineStart: number[] = new Array<number>(lines.length);
  let offset = 0;
  for (let i = 0; i < lines.length; i++) {
    lineStart[i] = offset;
    const l = lines[i] as { text: string; eol: string };
    offset += l.text.length + l.eol.length;
  }
  const at = (p: { line: number; character: number }): number => (lineStart[p.line] as number) + p.character;
  let out = '';
  let cursor = 0;
  for (const e of edits) {
    out += text.slice(cursor, at(e.start)) + e.newText;
    cursor = at(e.end);
  }
  return out + text.slice(cursor);
}
