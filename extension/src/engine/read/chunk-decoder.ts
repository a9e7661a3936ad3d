import { isUtf8 } from 'node:buffer';
import type { CorpusEncoding } from './detect-encoding';
import { firstInvalidUtf8Offset } from './detect-encoding';
import { completeUtf8Length } from './utf8-boundary';
import { decodeWindows1252 } from './windows-1252';

/**
 * Turns a file's byte chunks into text chunks without ever joining them. UTF-8 that turns out to
 * be invalid part-way through switches to windows-1252 for the rest and leaves a note: the part
 * already read was valid UTF-8, and ASCII reads the same either way.
 */
export class ChunkDecoder {
  private encoding: CorpusEncoding;
  private carry: Uint8Array | null = null;
  private readonly utf16: InstanceType<typeof TextDecoder> | null;
  private offset = 0;
  readonly notes: string[] = [];

  constructor(encoding: CorpusEncoding, startOffset = 0) {
    this.encoding = encoding;
    this.offset = startOffset;
    this.utf16 = encoding === 'utf-16le' || encoding === 'utf-16be' ? new TextDecoder(encoding) : null;
  }

  decode(chunk: Uint8Array, final: boolean): string {
    if (this.utf16 !== null) return this.utf16.decode(chunk, { stream: !final });
    let bytes = chunk;
    if (this.carry !== null) {
      bytes = Buffer.concat([this.carry, chunk]);
      this.carry = null;
    }
    if (this.encoding === 'windows-1252') return decodeWindows1252(bytes);

    const whole = final ? bytes.length : completeUtf8Length(bytes);
    const body = bytes.subarray(0, whole);
    if (whole < bytes.length) this.carry = Uint8Array.from(bytes.subarray(whole));
    const bodyOffset = this.offset;
    this.offset += whole;
    if (isUtf8(body)) return Buffer.from(body.buffer, body.byteOffset, body.byteLength).toString('utf8');

    this.encoding = 'windows-1252';
    const bad = bodyOffset + firstInvalidUtf8Offset(body);
    this.notes.push(`not valid UTF-8 from byte offset ${bad}; read the rest as windows-1252 (Latin-1)`);
    const rest = this.carry === null ? body : Buffer.concat([body, this.carry]);
    this.carry = null;
    return decodeWindows1252(rest);
  }
}
