import Papa from 'papaparse';
import { UserError } from '../user-error';

export type EmitRecord = (fields: string[], line: number, malformedQuote: boolean) => void;

/** A record this long without an end is almost surely an unclosed quote swallowing the file. */
export const MAX_RECORD_CHARS = 128 * 1024 * 1024;

/**
 * Streams CSV/TSV records (RFC 4180 quoting, via papaparse's core parser) out of LF-normalised
 * text chunks, each with the 1-based line where it starts. The start line of the next record is
 * this one's plus the line breaks inside its fields plus one, so quoted multi-line fields keep
 * every later line number right.
 */
export class CsvRecordSplitter {
  private readonly parser: Papa.Parser;
  private parts: string[] = [];
  private pendingChars = 0;
  /** Re-parse the pending text only once it has doubled, so one long record stays linear. */
  private attemptAt = 0;
  private line = 1;

  /** `quoted` false: no field is quoted (TSV as IANA text/tab-separated-values defines it). */
  constructor(
    delimiter: string,
    private readonly file: string,
    quoted = true,
  ) {
    // papaparse always has a quote character; U+FFFF is a Unicode noncharacter, absent from text.
    const quote = quoted ? '"' : '\uffff';
    this.parser = new Papa.Parser({ delimiter, newline: '\n', quoteChar: quote, escapeChar: quote, comments: false });
  }

  push(chunk: string, emit: EmitRecord): void {
    if (chunk.length === 0) return;
    this.parts.push(chunk);
    this.pendingChars += chunk.length;
    if (this.pendingChars > MAX_RECORD_CHARS) {
      this.parse(emit, true);
      throw new UserError(
        `a record starting on line ${this.line} runs past ${MAX_RECORD_CHARS / 1024 / 1024} Mi characters without ending; is a quote left open?`,
        this.file,
        this.line,
      );
    }
    if (this.pendingChars < this.attemptAt) return;
    this.parse(emit, false);
  }

  /** Parses what is left; `dropPartial` discards an unfinished last record (input cut at a limit). */
  end(emit: EmitRecord, dropPartial: boolean): void {
    if (dropPartial) {
      this.parse(emit, false);
      this.parts = [];
      this.pendingChars = 0;
      return;
    }
    if (this.pendingChars > 0) this.parse(emit, true);
  }

  private parse(emit: EmitRecord, final: boolean): void {
    const text = this.parts.length === 1 ? (this.parts[0] as string) : this.parts.join('');
    const startLine = this.line;
    const result = this.parser.parse(text, 0, !final) as Papa.ParseResult<string[]>;
    const malformed = new Set<number>();
    for (const err of result.errors) {
      if (err.code === 'MissingQuotes' && final) {
        const line = startLine + countNewlines(text, 0, err.index ?? text.length);
        throw new UserError(
          `unclosed quote: the quoted field opened on line ${line} never closes (RFC 4180 §2: a quote inside a quoted field is written as two quotes)`,
          this.file,
          line,
        );
      }
      if (err.code === 'InvalidQuotes' && typeof err.row === 'number') malformed.add(err.row);
    }
    const rows = result.data;
    for (let i = 0; i < rows.length; i++) {
      const fields = rows[i] as string[];
      emit(fields, this.line, malformed.has(i));
      let breaks = 1;
      for (let f = 0; f < fields.length; f++) breaks += countNewlines(fields[f] as string, 0, (fields[f] as string).length);
      this.line += breaks;
    }
    if (final) {
      this.parts = [];
      this.pendingChars = 0;
      this.attemptAt = 0;
      return;
    }
    const cursor = result.meta.cursor;
    const rest = cursor >= text.length ? '' : text.slice(cursor);
    this.parts = rest.length > 0 ? [rest] : [];
    this.pendingChars = rest.length;
    this.attemptAt = rest.length * 2;
  }
}

function countNewlines(s: string, from: number, to: number): number {
  let n = 0;
  let i = s.indexOf('\n', from);
  while (i >= 0 && i < to) {
    n++;
    i = s.indexOf('\n', i + 1);
  }
  return n;
}
