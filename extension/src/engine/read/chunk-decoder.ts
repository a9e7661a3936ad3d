import { isAscii, isUtf8 } from 'node:buffer';
import type { CorpusEncoding } from './detect-encoding';
import { firstInvalidUtf8Offset } from './detect-encoding';
import { completeUtf8Length, utf8Census } from './utf8-boundary';
import { decodeWindows1252 } from './windows-1252';

/**
 * Turns a file's byte chunks into text chunks without ever joining them. UTF-8 that turns out to
 * be invalid part-way through is judged by what the file has shown so far:
 *  - it already held valid multi-byte UTF-8, or the bad chunk holds more valid multi-byte
 *    characters than bad bytes: it is UTF-8 with stray bytes; each becomes U+FFFD (the WHATWG
 *    decoder's replacement of a maximal invalid subpart) and a note names the first line;
 *  - otherwise (ASCII so far, then bytes like 0xE9 alone): windows-1252 from there on, with a
 *    note, since the part already read was ASCII and reads the same either way.
 * A file cut at limits.maxBytes inside a multi-byte character drops the partial character.
 */
export class ChunkDecoder {
  private encoding: CorpusEncoding;
  private carry: Uint8Array | null = null;
  private readonly utf16: InstanceType<typeof TextDecoder> | null;
  private offset = 0;
  /** Line breaks (LF, and CR not before LF) in the bytes decoded so far, for notes. */
  private lineBreaks = 0;
  private lastWasCr = false;
  private sawMultiByte = false;
  private stray: { bytes: number; firstLine: number; firstOffset: number } | null = null;
  private switchNote: string | null = null;

  constructor(encoding: CorpusEncoding, startOffset = 0) {
    this.encoding = encoding;
    this.offset = startOffset;
    this.utf16 = encoding === 'utf-16le' || encoding === 'utf-16be' ? new TextDecoder(encoding) : null;
  }

  /** What the user should know about the decoding so far. */
  get notes(): string[] {
    const out: string[] = [];
    if (this.stray !== null) {
      const s = this.stray;
      out.push(`line ${s.firstLine}: a byte that is not UTF-8 (offset ${s.firstOffset}) was read as U+FFFD${s.bytes > 1 ? `; ${s.bytes} such bytes in all` : ''}; the rest is UTF-8`);
    }
    if (this.switchNote !== null) out.push(this.switchNote);
    return out;
  }

  /** `dropPartial`: the input was cut at a size limit, so a character cut in half is dropped. */
  decode(chunk: Uint8Array, final: boolean, dropPartial = false): string {
    if (this.utf16 !== null) {
      const even = final && dropPartial ? chunk.subarray(0, chunk.length - (chunk.length % 2)) : chunk;
      return this.utf16.decode(even, { stream: !final });
    }
    let bytes = chunk;
    if (this.carry !== null) {
      bytes = Buffer.concat([this.carry, chunk]);
      this.carry = null;
    }
    if (this.encoding === 'windows-1252') return decodeWindows1252(bytes);

    const complete = completeUtf8Length(bytes);
    const whole = final && !dropPartial ? bytes.length : complete;
    const body = bytes.subarray(0, whole);
    if (!final && whole < bytes.length) this.carry = Uint8Array.from(bytes.subarray(whole));
    const bodyOffset = this.offset;
    this.offset += whole;
    if (isUtf8(body)) {
      // Node's native check: a byte loop here was ~0.1 s of the main thread per 60 MB read.
      if (!this.sawMultiByte && !isAscii(body)) this.sawMultiByte = true;
      this.countLines(body);
      return Buffer.from(body.buffer, body.byteOffset, body.byteLength).toString('utf8');
    }

    const census = utf8Census(body);
    if (this.sawMultiByte || census.validMultiByte > census.invalid) {
      this.sawMultiByte = true;
      const firstLine = 1 + this.lineBreaks + countLineBreaks(body.subarray(0, census.firstInvalid), this.lastWasCr);
      if (this.stray === null) this.stray = { bytes: 0, firstLine, firstOffset: bodyOffset + census.firstInvalid };
      this.stray.bytes += census.invalid;
      this.countLines(body);
      return Buffer.from(body.buffer, body.byteOffset, body.byteLength).toString('utf8');
    }

    this.encoding = 'windows-1252';
    const bad = bodyOffset + firstInvalidUtf8Offset(body);
    this.switchNote = `not valid UTF-8 from byte offset ${bad}; read the rest as windows-1252 (Latin-1)`;
    const rest = this.carry === null ? body : Buffer.concat([body, this.carry]);
    this.carry = null;
    return decodeWindows1252(rest);
  }

  private countLines(body: Uint8Array): void {
    this.lineBreaks += countLineBreaks(body, this.lastWasCr);
    if (body.length > 0) this.lastWasCr = body[body.length - 1] === 0x0d;
  }
}

/** LF, and CR not followed by LF (a CR at the very end counts; an LF right after `afterCr` does not). */
function countLineBreaks(b: Uint8Array, afterCr: boolean): number {
  let n = 0;
  const buf = Buffer.from(b.buffer, b.byteOffset, b.byteLength);
  for (let i = buf.indexOf(0x0a); i >= 0; i = buf.indexOf(0x0a, i + 1)) {
    if (!(i === 0 ? afterCr : buf[i - 1] === 0x0d)) n++;
  }
  for (let i = buf.indexOf(0x0d); i >= 0; i = buf.indexOf(0x0d, i + 1)) n++;
  return n;
}

