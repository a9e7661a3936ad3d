// The engine's stop-list TextEdits, checked before they become a WorkspaceEdit: an edit that
// points outside the document or overlaps another would make the editor reject the whole edit.

export interface Position0 { line: number; character: number }
/** Same shape as the engine's TextEdit: 0-based positions, end exclusive. */
export interface LineEdit { start: Position0; end: Position0; newText: string }

function compare(a: Position0, b: Position0): number {
  return a.line === b.line ? a.character - b.character : a.line - b.line;
}

function validPosition(p: Position0, lineLengths: readonly number[]): boolean {
  return Number.isInteger(p.line) && Number.isInteger(p.character) && p.line >= 0 && p.character >= 0
    && p.line < lineLengths.length && p.character <= (lineLengths[p.line] ?? 0);
}

/** Lengths of the lines of `text` split on \n, \r\n or \r, as the editor counts them. */
export function lineLengths(text: string): number[] {
  return text.split(/\r\n|\r|\n/).map((l) => l.length);
}

/**
 * Returns the edits sorted by position. Throws RangeError when one points outside `text`,
 * ends before it starts, or overlaps another.
 */
export function checkLineEdits(edits: readonly LineEdit[], text: string): LineEdit[] {
  const lengths = lineLengths(text);
  const sorted = [...edits].sort((a, b) => compare(a.start, b.start));
  let previousEnd: Position0 | null = null;
  for (const e of sorted) {
    if (!validPosition(e.start, lengths) || !validPosition(e.end, lengths)) {
      throw new RangeError(`stop-list edit outside the document: ${e.start.line}:${e.start.character}-${e.end.line}:${e.end.character}`);
    }
    if (compare(e.end, e.start) < 0) throw new RangeError('stop-list edit ends before it starts');
    if (previousEnd !== null && compare(e.start, previousEnd) < 0) throw new RangeError('stop-list edits overlap');
    previousEnd = e.end;
  }
  return sorted;
}
