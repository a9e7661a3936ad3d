/**
 * Splits LF-normalised text chunks into lines with their 1-based numbers. A line longer than a
 * chunk is kept as parts and joined once, so a 50 MB line costs one copy, not fifty.
 */
export class LineSplitter {
  private parts: string[] = [];
  private line = 1;

  push(chunk: string, emit: (text: string, line: number) => void): void {
    let start = 0;
    let nl = chunk.indexOf('\n');
    while (nl >= 0) {
      let text = chunk.slice(start, nl);
      if (this.parts.length > 0) {
        this.parts.push(text);
        text = this.parts.join('');
        this.parts = [];
      }
      emit(text, this.line++);
      start = nl + 1;
      nl = chunk.indexOf('\n', start);
    }
    if (start < chunk.length) this.parts.push(start === 0 ? chunk : chunk.slice(start));
  }

  /** Emits the last line when it has no newline; `dropPartial` discards it (input cut at a limit). */
  end(emit: (text: string, line: number) => void, dropPartial: boolean): void {
    if (this.parts.length > 0 && !dropPartial) emit(this.parts.join(''), this.line);
    this.parts = [];
  }
}
