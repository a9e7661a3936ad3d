import { MAX_RECORD_CHARS } from './csv-record-splitter';

/** Longest line kept as a document: the CSV record bound, far below V8's ~512 Mi-character string limit. */
export const MAX_LINE_CHARS = MAX_RECORD_CHARS;

/**
 * Splits LF-normalised text chunks into lines with their 1-based numbers. A line longer than a
 * chunk is kept as parts and joined once, so a 50 MB line costs one copy, not fifty. A line past
 * `maxChars` is not held at all: its parts are dropped as they come and `tooLong` is told its
 * number and length, so a 560 MB single line is skipped with a reason instead of failing to join.
 */
export class LineSplitter {
  private parts: string[] = [];
  private partChars = 0;
  private overflow = false;
  private line = 1;

  constructor(
    private readonly maxChars: number = MAX_LINE_CHARS,
    private readonly tooLong: (line: number, chars: number) => void = () => undefined,
  ) {}

  push(chunk: string, emit: (text: string, line: number) => void): void {
    let start = 0;
    let nl = chunk.indexOf('\n');
    while (nl >= 0) {
      const piece = nl - start;
      if (this.overflow || this.partChars + piece > this.maxChars) {
        this.tooLong(this.line++, this.partChars + piece);
        this.reset();
      } else {
        let text = chunk.slice(start, nl);
        if (this.parts.length > 0) {
          this.parts.push(text);
          text = this.parts.join('');
          this.reset();
        }
        emit(text, this.line++);
      }
      start = nl + 1;
      nl = chunk.indexOf('\n', start);
    }
    if (start < chunk.length) this.hold(start === 0 ? chunk : chunk.slice(start));
  }

  /** Emits the last line when it has no newline; `dropPartial` discards it (input cut at a limit). */
  end(emit: (text: string, line: number) => void, dropPartial: boolean): void {
    if (this.overflow && !dropPartial) this.tooLong(this.line, this.partChars);
    else if (this.parts.length > 0 && !dropPartial) emit(this.parts.join(''), this.line);
    this.reset();
  }

  private hold(part: string): void {
    this.partChars += part.length;
    if (this.overflow) return;
    if (this.partChars > this.maxChars) {
      this.overflow = true;
      this.parts = [];
    } else this.parts.push(part);
  }

  private reset(): void {
    this.parts = [];
    this.partChars = 0;
    this.overflow = false;
  }
}
