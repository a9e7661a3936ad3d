import { BoundedParts } from './bounded-parts';
import { MAX_RECORD_CHARS } from './csv-record-splitter';

/** Longest line kept as a document: the CSV record bound, far below V8's ~512 Mi-character string limit. */
export const MAX_LINE_CHARS = MAX_RECORD_CHARS;

/**
 * Splits LF-normalised text chunks into lines with their 1-based numbers. A line longer than a
 * chunk is held in parts (bounded-parts.ts); a line past `maxChars` is not held at all, and
 * `tooLong` is told its number and length, so a 560 MB single line is skipped with a reason.
 */
export class LineSplitter {
  private readonly held: BoundedParts;
  private line = 1;

  constructor(
    maxChars: number = MAX_LINE_CHARS,
    private readonly tooLong: (line: number, chars: number) => void = () => undefined,
  ) {
    this.held = new BoundedParts(maxChars);
  }

  push(chunk: string, emit: (text: string, line: number) => void): void {
    let start = 0;
    let nl = chunk.indexOf('\n');
    while (nl >= 0) {
      this.deliver(this.held.close(chunk.slice(start, nl)), emit);
      start = nl + 1;
      nl = chunk.indexOf('\n', start);
    }
    if (start < chunk.length) this.held.hold(start === 0 ? chunk : chunk.slice(start));
  }

  /** Emits the last line when it has no newline; `dropPartial` discards it (input cut at a limit). */
  end(emit: (text: string, line: number) => void, dropPartial: boolean): void {
    if (this.held.holding && !dropPartial) this.deliver(this.held.close(''), emit);
    else this.held.clear();
  }

  private deliver(text: string | null, emit: (text: string, line: number) => void): void {
    const line = this.line++;
    if (text !== null) emit(text, line);
    else this.tooLong(line, this.held.refusedChars);
  }
}
