import { isUtf8 } from 'node:buffer';
import { UserError } from '../user-error';
import { completeUtf8Length, utf8Census } from './utf8-boundary';

export type CorpusEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

export interface DetectedEncoding {
  encoding: CorpusEncoding;
  /** Bytes of byte-order mark to skip. */
  bomLength: number;
  /** Something the user should know about how the bytes were read. */
  note: string | null;
}

/** How far a NUL byte marks a file as binary (common practice, no source: git and grep look at a similar prefix). */
export const BINARY_PROBE_BYTES = 64 * 1024;

/**
 * Decides how to decode a file from its first bytes. BOMs per the Unicode standard: EF BB BF
 * (UTF-8), FF FE (UTF-16 LE), FE FF (UTF-16 BE). Without a BOM, a NUL byte means binary (or
 * UTF-16 without a BOM, which we cannot read reliably), and bytes that are not valid UTF-8 are
 * read as windows-1252, the usual source of such files.
 */
export function detectEncoding(head: Uint8Array, file: string, headIsWholeFile: boolean): DetectedEncoding {
  if (head.length >= 3 && head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf) {
    // A BOM does not make the rest text: binary after it is still binary.
    const probe = head.subarray(3, 3 + BINARY_PROBE_BYTES);
    if (!strayNuls(probe)) refuseBinary(probe, 3, file, 'after its UTF-8 byte-order mark');
    return { encoding: 'utf-8', bomLength: 3, note: nulNote(probe, 3) };
  }
  if (head.length >= 2 && head[0] === 0xff && head[1] === 0xfe) return utf16(head, 'utf-16le', file);
  if (head.length >= 2 && head[0] === 0xfe && head[1] === 0xff) return utf16(head, 'utf-16be', file);

  const probe = head.subarray(0, BINARY_PROBE_BYTES);
  const nul = probe.indexOf(0);
  const kind = binaryKind(head);
  if (kind === null && nul >= 0 && strayNuls(probe)) {
    // Text with a stray NUL or two (a database export): read as UTF-8 text, with a note.
    return { encoding: 'utf-8', bomLength: 0, note: nulNote(probe, 0) };
  }
  if (nul >= 0 || startsAsPdf(head)) {
    throw new UserError(
      kind !== null
        ? `${kind.what}, not text: ${kind.todo}`
        : `looks like a binary file (a NUL byte at offset ${nul}); a corpus must be text (UTF-8, or UTF-16 with a byte-order mark)`,
      file,
      null,
    );
  }
  const checked = headIsWholeFile ? head : head.subarray(0, completeUtf8Length(head));
  if (isUtf8(checked)) return { encoding: 'utf-8', bomLength: 0, note: null };
  // Plainly UTF-8 with a few stray bytes: stays UTF-8 (the decoder notes the bytes and their line).
  const census = utf8Census(checked);
  if (census.validMultiByte > census.invalid) return { encoding: 'utf-8', bomLength: 0, note: null };
  const bad = firstInvalidUtf8Offset(checked);
  return {
    encoding: 'windows-1252',
    bomLength: 0,
    note: `not valid UTF-8 (first bad byte at offset ${bad}); read as windows-1252 (Latin-1)`,
  };
}

/** Offset of the first byte that breaks UTF-8, for the note; a plain scan is fine on a head sample. */
export function firstInvalidUtf8Offset(bytes: Uint8Array): number {
  let lo = 0;
  let hi = bytes.length;
  // Binary search on prefix validity: a prefix cut inside a sequence is invalid too, so trim it.
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    const prefix = bytes.subarray(0, mid);
    if (isUtf8(prefix.subarray(0, completeUtf8Length(prefix)))) lo = mid;
    else hi = mid;
  }
  return completeUtf8Length(bytes.subarray(0, lo));
}

/**
 * A probe that is text but for a few NUL bytes: at most one NUL and one other control byte per
 * 4 KiB (TAB, LF, VT, FF and CR are text), and valid UTF-8 otherwise. Binary formats hold NULs
 * and control bytes by the hundred in 64 KiB; a CSV exported from a database sometimes holds a
 * stray NUL in one field, and refusing the whole file for it left the user nothing to review.
 */
export function strayNuls(probe: Uint8Array): boolean {
  const bound = Math.max(1, Math.floor(probe.length / 4096));
  let nuls = 0;
  let controls = 0;
  for (let i = 0; i < probe.length; i++) {
    const b = probe[i]!;
    if (b >= 0x20 || (b >= 0x09 && b <= 0x0d)) continue;
    if (b === 0) {
      if (++nuls > bound) return false;
    } else if (++controls > bound) return false;
  }
  return isUtf8(probe.subarray(0, completeUtf8Length(probe)));
}

/** The note on the stray NULs of a probe that strayNuls accepted; null when it holds none. */
function nulNote(probe: Uint8Array, base: number): string | null {
  const first = probe.indexOf(0);
  if (first < 0) return null;
  let count = 0;
  for (let i = first; i < probe.length; i++) if (probe[i] === 0) count++;
  const where = count === 1 ? `a NUL byte at offset ${base + first}` : `${count} NUL bytes (the first at offset ${base + first})`;
  return `${where} among text that is otherwise UTF-8: read as text, ${count === 1 ? 'it is a character' : 'each is a character'} no token holds`;
}

function refuseBinary(probe: Uint8Array, base: number, file: string, where: string): void {
  const nul = probe.indexOf(0);
  if (nul >= 0) {
    throw new UserError(`looks like a binary file (a NUL byte at offset ${base + nul}, ${where}); a corpus must be text`, file, null);
  }
}

/**
 * UTF-16 with a BOM. Text has no U+0000 and no unpaired surrogate; binary bytes after FF FE
 * decode into both soon, so a few in the first 64 KiB mean binary (common practice, no source).
 */
function utf16(head: Uint8Array, encoding: 'utf-16le' | 'utf-16be', file: string): DetectedEncoding {
  const probe = head.subarray(2, 2 + BINARY_PROBE_BYTES);
  const units = probe.length >> 1;
  let nulUnits = 0;
  let loneSurrogates = 0;
  for (let i = 0; i < units; i++) {
    const u = encoding === 'utf-16le' ? probe[2 * i]! | (probe[2 * i + 1]! << 8) : (probe[2 * i]! << 8) | probe[2 * i + 1]!;
    if (u === 0) nulUnits++;
    else if (u >= 0xd800 && u <= 0xdbff) {
      const next = i + 1 < units ? (encoding === 'utf-16le' ? probe[2 * i + 2]! | (probe[2 * i + 3]! << 8) : (probe[2 * i + 2]! << 8) | probe[2 * i + 3]!) : 0xdc00;
      if (next >= 0xdc00 && next <= 0xdfff) i++;
      else loneSurrogates++;
    } else if (u >= 0xdc00 && u <= 0xdfff) loneSurrogates++;
  }
  if (nulUnits + loneSurrogates > 0) {
    throw new UserError(`looks like a binary file (${nulUnits} NUL and ${loneSurrogates} unpaired surrogate code units after its UTF-16 byte-order mark); a corpus must be text`, file, null);
  }
  return { encoding, bomLength: 2, note: null };
}

/** ISO 32000's "%PDF-": no text file starts so, though a PDF may hold no NUL in its first bytes. */
function startsAsPdf(head: Uint8Array): boolean {
  return head[0] === 0x25 && head[1] === 0x50 && head[2] === 0x44 && head[3] === 0x46 && head[4] === 0x2d;
}

/**
 * What a binary file is, by the signature its format starts with, and what to do instead, for
 * the files a corpus is often kept in before it is text. Signatures: PKWARE's ZIP APPNOTE (local
 * file header "PK\x03\x04"; .xlsx, .docx, .ods, .odt are ZIP packages), ISO 32000 (PDF,
 * "%PDF-"), RFC 1952 (gzip, 1F 8B), Microsoft's Compound File Binary format (D0 CF 11 E0:
 * .xls, .doc before 2007), Apache Parquet ("PAR1"), and the compressors other than gzip, which
 * Node reads none of: xz (Tukaani's .xz format, FD 37 7A 58 5A 00), bzip2 ("BZh" and a block size
 * digit), Zstandard (RFC 8878, 28 B5 2F FD), 7-Zip ("7z" BC AF 27 1C) and RAR ("Rar!" 1A 07); and
 * the files a data frame is saved to other than text: a Python pickle of protocol 2 to 5 (PEP 307:
 * the PROTO opcode 80 and the protocol number; pandas' to_pickle), Arrow IPC and Feather
 * ("ARROW1"), HDF5 (89 "HDF" 0D 0A 1A 0A; pandas' to_hdf) and SQLite ("SQLite format 3" and a NUL).
 */
export function binaryKind(head: Uint8Array): { what: string; todo: string } | null {
  const starts = (...bytes: number[]): boolean => bytes.every((b, i) => head[i] === b);
  if (starts(0x50, 0x4b, 0x03, 0x04)) {
    return { what: 'a ZIP archive (an .xlsx, .docx, .ods or .odt file is one)', todo: 'save a spreadsheet as CSV (UTF-8), a document as plain text, or unpack an archive of text files and review their folder' };
  }
  if (startsAsPdf(head)) return { what: 'a PDF', todo: 'extract its text first (for example with pdftotext), one document a line or one file a document (--input-format files)' };
  if (starts(0x1f, 0x8b)) return { what: 'gzip-compressed', todo: 'name it with .gz at the end (corpus.csv.gz) and it is read as it is' };
  if (starts(0xd0, 0xcf, 0x11, 0xe0)) return { what: 'an Office file of the pre-2007 kind (.xls, .doc)', todo: 'save a spreadsheet as CSV (UTF-8), a document as plain text' };
  if (starts(0x50, 0x41, 0x52, 0x31)) return { what: 'a Parquet file', todo: 'name it with .parquet at the end and it is read as one' };
  const recompress = (tool: string): string => `decompress it (${tool}), or compress it with gzip instead (a .gz file is read as it is)`;
  if (starts(0xfd, 0x37, 0x7a, 0x58, 0x5a, 0x00)) return { what: 'xz-compressed', todo: recompress('xz -dk FILE') };
  if (starts(0x42, 0x5a, 0x68) && head[3]! >= 0x31 && head[3]! <= 0x39) return { what: 'bzip2-compressed', todo: recompress('bunzip2 -k FILE') };
  if (starts(0x28, 0xb5, 0x2f, 0xfd)) return { what: 'Zstandard-compressed', todo: recompress('zstd -d FILE') };
  if (starts(0x37, 0x7a, 0xbc, 0xaf, 0x27, 0x1c)) return { what: 'a 7-Zip archive', todo: 'unpack it and review the files or their folder' };
  if (starts(0x52, 0x61, 0x72, 0x21, 0x1a, 0x07)) return { what: 'a RAR archive', todo: 'unpack it and review the files or their folder' };
  const asText = 'write the data frame as text: df.to_csv("corpus.csv", index=False), or df.to_json("corpus.jsonl", orient="records", lines=True)';
  if (head[0] === 0x80 && head[1]! >= 2 && head[1]! <= 5) return { what: "a Python pickle (pandas' to_pickle)", todo: asText };
  if (starts(0x41, 0x52, 0x52, 0x4f, 0x57, 0x31)) return { what: 'an Arrow or Feather file', todo: asText };
  if (starts(0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a)) return { what: "an HDF5 file (pandas' to_hdf)", todo: asText };
  if (starts(...[...Buffer.from('SQLite format 3', 'latin1')], 0x00)) {
    return { what: 'an SQLite database', todo: 'export the table that holds the texts as CSV, for example: sqlite3 -header -csv FILE "select * from TABLE" > corpus.csv' };
  }
  return null;
}
