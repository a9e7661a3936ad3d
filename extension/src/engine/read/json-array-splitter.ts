import { UserError } from '../user-error';
import { BoundedParts } from './bounded-parts';
import { MAX_RECORD_CHARS } from './csv-record-splitter';

/**
 * Splits a JSON array (RFC 8259 §5: `[ value , value … ]`) given as LF-normalised text chunks into
 * the source text of its top-level elements, each with the 1-based line it starts on, so a file of
 * records (`[{"text": …}, …]`, what pandas' `to_json(orient="records")` and many APIs write) is
 * read one record at a time instead of parsed whole. The splitter only follows brackets, braces
 * and strings; each element's own text is parsed by the caller (JSON.parse), so a malformed
 * record is skipped with its line like a broken JSON Lines line.
 *
 * An element longer than a chunk is held in parts (bounded-parts.ts); one longer than `maxChars`
 * is not held at all, and `tooLong` is told its line and length. Text that is not an array — another top-level value,
 * a missing comma between elements, anything after the closing bracket — is the user's to fix
 * and throws a UserError with the line.
 */
export class JsonArraySplitter {
  private state: 'before' | 'element-next' | 'in-element' | 'after-element' | 'closed' = 'before';
  private line = 1;
  /** Inside the current element: nesting depth, inside a string, after a backslash in one. */
  private depth = 0;
  private inString = false;
  private escaped = false;
  /** The current element is a bare scalar (number, true, null), ended by a separator. */
  private scalar = false;
  private elementLine = 0;
  private readonly held: BoundedParts;

  constructor(
    private readonly file: string,
    maxChars: number = MAX_RECORD_CHARS,
    private readonly tooLong: (line: number, chars: number) => void = () => undefined,
  ) {
    this.held = new BoundedParts(maxChars);
  }

  push(chunk: string, emit: (text: string, line: number) => void): void {
    const n = chunk.length;
    let i = 0;
    /** Where the current element's text starts in this chunk (0 when it began in an earlier one). */
    let start = 0;
    /** The next backslash and line feed at or after the last look (n: none), found once per stretch. */
    let nextBackslash = -1;
    let nextNewline = -1;
    while (i < n) {
      const c = chunk.charCodeAt(i);
      if (this.state === 'in-element') {
        if (this.inString) {
          if (this.escaped) {
            this.escaped = false;
            i++;
            continue;
          }
          // Most of a record is string: jump to its next quote, backslash or (invalid, but
          // counted) line break rather than looking at every character.
          if (nextBackslash < i) nextBackslash = indexOrEnd(chunk, '\\', i);
          if (nextNewline < i) nextNewline = indexOrEnd(chunk, '\n', i);
          const quote = indexOrEnd(chunk, '"', i);
          const stop = Math.min(quote, nextBackslash, nextNewline);
          if (stop === n) {
            i = n;
            continue;
          }
          if (stop === nextBackslash) this.escaped = true;
          else if (stop === nextNewline) this.line++;
          else {
            this.inString = false;
            if (this.depth === 0) {
              this.finish(chunk, start, stop + 1, emit);
              i = stop + 1;
              continue;
            }
          }
          i = stop + 1;
          continue;
        }
        if (this.scalar) {
          if (c === COMMA || c === CLOSE_BRACKET || isSpace(c)) {
            this.finish(chunk, start, i, emit);
            continue; // the separator is read in the state after the element
          }
          i++;
          continue;
        }
        if (c === QUOTE) this.inString = true;
        else if (c === OPEN_BRACE || c === OPEN_BRACKET) this.depth++;
        else if (c === CLOSE_BRACE || c === CLOSE_BRACKET) {
          this.depth--;
          if (this.depth === 0) {
            this.finish(chunk, start, i + 1, emit);
            i++;
            continue;
          }
        } else if (c === NEWLINE) this.line++;
        i++;
        continue;
      }
      if (c === NEWLINE) {
        this.line++;
        i++;
        continue;
      }
      if (isSpace(c) || (c === BOM && this.state === 'before' && this.line === 1)) {
        i++;
        continue;
      }
      switch (this.state) {
        case 'before':
          if (c !== OPEN_BRACKET) throw new UserError(`not a JSON array of documents: it starts with ${shown(chunk, i)}, where a JSON array starts with "["`, this.file, this.line);
          this.state = 'element-next';
          i++;
          break;
        case 'element-next':
          // A closing bracket here ends an empty array or follows a trailing comma; both read as the end.
          if (c === CLOSE_BRACKET) {
            this.state = 'closed';
            i++;
            break;
          }
          if (c === COMMA) throw new UserError('a comma where an element of the JSON array should be', this.file, this.line);
          this.state = 'in-element';
          this.elementLine = this.line;
          this.depth = 0;
          this.scalar = false;
          start = i;
          if (c === QUOTE) this.inString = true;
          else if (c === OPEN_BRACE || c === OPEN_BRACKET) this.depth = 1;
          else this.scalar = true;
          i++;
          break;
        case 'after-element':
          if (c === COMMA) this.state = 'element-next';
          else if (c === CLOSE_BRACKET) this.state = 'closed';
          else throw new UserError(`${shown(chunk, i)} after the element that starts on line ${this.elementLine}, where a comma or the array's "]" should be`, this.file, this.line);
          i++;
          break;
        case 'closed':
          throw new UserError(`${shown(chunk, i)} after the JSON array's closing "]": a file holds one array (for one JSON object a line, name it .jsonl)`, this.file, this.line);
      }
    }
    if (this.state === 'in-element') this.held.hold(start === 0 ? chunk : chunk.slice(start));
  }

  /**
   * At the end of the input. `cut`: the input stopped at a size limit, so an unfinished element
   * is dropped quietly; otherwise an array that is not closed is an error.
   */
  end(emit: (text: string, line: number) => void, cut: boolean): void {
    if (cut) return this.held.clear();
    if (this.state === 'in-element' && this.scalar) this.finish('', 0, 0, emit);
    if (this.state === 'before') throw new UserError('no documents: the file holds no JSON array', this.file, null);
    if (this.state !== 'closed') {
      const where = this.state === 'in-element' ? `inside the element that starts on line ${this.elementLine}` : 'before the array\'s closing "]"';
      throw new UserError(`the file ends ${where}: the JSON array is not complete`, this.file, this.line);
    }
  }

  private finish(chunk: string, start: number, end: number, emit: (text: string, line: number) => void): void {
    this.state = 'after-element';
    this.scalar = false;
    this.inString = false;
    this.escaped = false;
    const text = this.held.close(chunk.slice(start, end));
    if (text !== null) emit(text, this.elementLine);
    else this.tooLong(this.elementLine, this.held.refusedChars);
  }
}

const NEWLINE = 0x0a;
const QUOTE = 0x22;
const COMMA = 0x2c;
const OPEN_BRACKET = 0x5b;
const CLOSE_BRACKET = 0x5d;
const OPEN_BRACE = 0x7b;
const CLOSE_BRACE = 0x7d;
const BOM = 0xfeff;

function indexOrEnd(chunk: string, c: string, from: number): number {
  const at = chunk.indexOf(c, from);
  return at < 0 ? chunk.length : at;
}

/** RFC 8259 §2: insignificant whitespace is space, tab, line feed and carriage return. */
function isSpace(c: number): boolean {
  return c === 0x20 || c === 0x09 || c === 0x0d || c === NEWLINE;
}

function shown(chunk: string, i: number): string {
  return JSON.stringify(chunk.slice(i, i + 12));
}
