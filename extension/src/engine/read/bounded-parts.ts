/**
 * The pieces of one record that spans chunks (a line, a JSON array's element), held until its end
 * and joined once, so a 50 MB record costs one copy, not fifty. Past `maxChars` the pieces are
 * dropped as they come and only their length is counted, so a 560 MB record is skipped with a
 * reason instead of failing to join (V8's strings end near 512 Mi characters).
 */
export class BoundedParts {
  private parts: string[] = [];
  private chars = 0;
  private overflow = false;
  /** The length of the last record close() refused as past the bound. */
  refusedChars = 0;

  constructor(private readonly maxChars: number) {}

  /** Keeps a piece that does not end the record. */
  hold(part: string): void {
    this.chars += part.length;
    if (this.overflow) return;
    if (this.chars > this.maxChars) {
      this.overflow = true;
      this.parts = [];
    } else this.parts.push(part);
  }

  /**
   * The whole record once its last piece `last` is here, or null when it is past the bound (its
   * length then in `refusedChars`); either way the holder is empty again. No object per record:
   * the line splitter closes one for every line of a corpus.
   */
  close(last: string): string | null {
    if (this.parts.length === 0 && !this.overflow && last.length <= this.maxChars) return last;
    const chars = this.chars + last.length;
    let text: string | null = null;
    if (this.overflow || chars > this.maxChars) this.refusedChars = chars;
    else {
      this.parts.push(last);
      text = this.parts.join('');
    }
    this.clear();
    return text;
  }

  /** Whether a piece is held (or was counted past the bound). */
  get holding(): boolean {
    return this.chars > 0 || this.parts.length > 0;
  }

  /** Drops what is held (the input was cut at a size limit). */
  clear(): void {
    this.parts = [];
    this.chars = 0;
    this.overflow = false;
  }
}
