import { isUtf8 } from 'node:buffer';
import { randomBytes } from 'node:crypto';
import { constants, type Stats } from 'node:fs';
import { chown, open, readFile, realpath, rename, unlink } from 'node:fs/promises';
import * as path from 'node:path';
import { UserError } from '../user-error';
import { decodeWindows1252 } from '../read/windows-1252';
import { utf8Census } from '../read/utf8-boundary';
import { formatBytes, readErrorMessage, readRegularFile, writeErrorMessage } from '../read/regular-file';
import { addTermsToStopList } from './add-terms-to-stop-list';

// The stop list is the user's file: Loudword adds lines at its end and keeps every existing
// byte as it was — byte-order mark, encoding (UTF-8, UTF-16, windows-1252 "Latin-1"), line
// breaks. A write goes to a new file beside it that is then renamed over it, so a kill or a full
// disk leaves either the old file or the new one, never a half-written one; and a change by
// someone else between our read and our rename (another `apply`, an editor) is detected and
// refused rather than overwritten. README "What it promises on bad input".

/** A stop list is a list of words; past this it is not the file the user meant (/dev/zero, a corpus). */
export const MAX_STOP_LIST_BYTES = 64 * 1024 * 1024;

export type StopListEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

/** The stop list as read for an edit: its exact bytes and how to extend them. */
export interface StopListFile {
  /** The path as named (a symlink stays a symlink: the file it points at is written). */
  file: string;
  exists: boolean;
  /** The exact bytes read (empty for a missing file). */
  bytes: Buffer;
  encoding: StopListEncoding;
  bomLength: number;
  /** The text after the byte-order mark. */
  text: string;
  /** Stats of the file read, null when it does not exist. */
  stat: Stats | null;
  /** Something the user should know about how it was read (stray bytes). */
  note: string | null;
}

/**
 * Reads a stop list for reviewing or editing. A missing file is an empty list that does not
 * exist yet. A NUL byte (outside UTF-16) means it is not a stop list. Bytes that are not valid
 * UTF-8 make it windows-1252, unless the file is plainly UTF-8 with a few stray bytes (more
 * valid multi-byte characters than bad bytes): those stay UTF-8, with U+FFFD for the stray bytes.
 */
export async function readStopList(file: string): Promise<StopListFile> {
  let bytes: Buffer;
  let stat: Stats;
  try {
    ({ bytes, stat } = await readRegularFile(file, 'the stop list', MAX_STOP_LIST_BYTES));
  } catch (e) {
    if (e instanceof UserError) throw e;
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') {
      return { file, exists: false, bytes: Buffer.alloc(0), encoding: 'utf-8', bomLength: 0, text: '', stat: null, note: null };
    }
    throw new UserError(readErrorMessage('the stop list', e), file, null);
  }
  const decoded = decodeStopList(bytes, file);
  return { file, exists: true, bytes, stat, ...decoded };
}

function decodeStopList(bytes: Buffer, file: string): Pick<StopListFile, 'encoding' | 'bomLength' | 'text' | 'note'> {
  if (bytes[0] === 0xff && bytes[1] === 0xfe) return { encoding: 'utf-16le', bomLength: 2, text: bytes.subarray(2).toString('utf16le'), note: null };
  if (bytes[0] === 0xfe && bytes[1] === 0xff) return { encoding: 'utf-16be', bomLength: 2, text: swap16(bytes.subarray(2)).toString('utf16le'), note: null };
  const nul = bytes.indexOf(0);
  if (nul >= 0) {
    const line = 1 + countLineBreaks(bytes.subarray(0, nul));
    throw new UserError(`not a stop list: a NUL byte at offset ${nul} (binary file?)`, file, line);
  }
  const bomLength = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  const body = bytes.subarray(bomLength);
  if (isUtf8(body)) return { encoding: 'utf-8', bomLength, text: body.toString('utf8'), note: null };
  const { validMultiByte, invalid, firstInvalid } = utf8Census(body);
  if (bomLength > 0 || validMultiByte > invalid) {
    const line = 1 + countLineBreaks(body.subarray(0, firstInvalid));
    return { encoding: 'utf-8', bomLength, text: body.toString('utf8'), note: `line ${line}: ${invalid} byte(s) that are not UTF-8, read as U+FFFD` };
  }
  return { encoding: 'windows-1252', bomLength, text: decodeWindows1252(body), note: null };
}

function swap16(b: Uint8Array): Buffer {
  const out = Buffer.from(b.subarray(0, b.length - (b.length % 2)));
  out.swap16();
  return out;
}

function countLineBreaks(bytes: Uint8Array): number {
  let n = 0;
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i];
    if (b === 0x0a || (b === 0x0d && bytes[i + 1] !== 0x0a)) n++;
  }
  return n;
}

/** `text` in the file's encoding, or null when a character has no byte in it (windows-1252). */
export function encodeFor(encoding: StopListEncoding, text: string): Buffer | null {
  switch (encoding) {
    case 'utf-8':
      return Buffer.from(text, 'utf8');
    case 'utf-16le':
      return Buffer.from(text, 'utf16le');
    case 'utf-16be':
      return Buffer.from(text, 'utf16le').swap16();
    case 'windows-1252': {
      const out = Buffer.alloc(text.length);
      for (let i = 0; i < text.length; i++) {
        const byte = WINDOWS_1252_BYTE.get(text.charCodeAt(i));
        if (byte === undefined) return null;
        out[i] = byte;
      }
      return out;
    }
  }
}

/** Code point → byte, the inverse of decodeWindows1252 (built from it, so the two agree). */
const WINDOWS_1252_BYTE: ReadonlyMap<number, number> = (() => {
  const all = Buffer.alloc(256);
  for (let b = 0; b < 256; b++) all[b] = b;
  const text = decodeWindows1252(all);
  const m = new Map<number, number>();
  for (let b = 0; b < 256; b++) m.set(text.charCodeAt(b), b);
  return m;
})();

export interface AppendResult {
  added: string[];
  /** Terms the file's encoding cannot hold (windows-1252): left out, named to the user. */
  unrepresentable: string[];
  /** The whole new file, byte for byte: the old bytes, then the new lines. */
  bytes: Buffer;
  /** The lines appended (heading comment included), and the 1-based line they follow (0: none). */
  newLines: string[];
  afterLine: number;
}

/**
 * The new bytes of `list` with `terms` appended (no write). The old bytes are a prefix, unchanged.
 * `heading` as in addTermsToStopList: `loudword apply` passes ADDED_TERMS_HEADING, like the editor.
 */
export function appendTerms(list: StopListFile, terms: readonly string[], options: { heading?: string } = {}): AppendResult {
  const unrepresentable = terms.filter((t) => encodeFor(list.encoding, t) === null);
  const result = addTermsToStopList(list.text, terms.filter((t) => !unrepresentable.includes(t)), options);
  const filled = list.text.split(/\r\n|\r|\n/);
  const afterLine = filled[filled.length - 1] === '' ? filled.length - 1 : filled.length;
  if (result.added.length === 0) return { added: [], unrepresentable, bytes: list.bytes, newLines: [], afterLine };
  const tailText = result.text.slice(list.text.length);
  const tail = encodeFor(list.encoding, tailText);
  if (tail === null) throw new Error('appendTerms: a line break or term has no byte in the encoding'); // filtered above
  const newLines = tailText.split(/\r\n|\r|\n/).filter((l, i, all) => !(i === 0 && l === '' && afterLine === filled.length) && !(i === all.length - 1 && l === ''));
  return { added: result.added, unrepresentable, bytes: Buffer.concat([list.bytes, tail]), newLines, afterLine };
}

/** Test seam: runs after the new file is written and before the concurrent-change check. */
export interface ReplaceHooks {
  afterTempWritten?(tempFile: string): Promise<void> | void;
}

/**
 * Replaces the stop list `list` (as read) with `bytes`: a new file beside the real file (a
 * symlink is followed, so the link stays), flushed to disk, its mode and owner copied, then
 * renamed over the file. Refuses, leaving the file as it is, when the file is read-only, when it
 * changed since it was read (compared byte for byte just before the rename), or when the new
 * file cannot be written (a full disk, a read-only folder).
 */
export async function replaceStopList(list: StopListFile, bytes: Buffer, hooks: ReplaceHooks = {}): Promise<void> {
  const file = list.file;
  const real = await realTarget(file);
  if (list.stat !== null && (list.stat.mode & 0o222) === 0) {
    throw new UserError('the stop list is read-only; nothing was changed (make it writable to add terms)', file, null);
  }
  const temp = path.join(path.dirname(real), `.${path.basename(real)}.loudword-${process.pid}-${randomBytes(4).toString('hex')}.tmp`);
  let handle;
  try {
    handle = await open(temp, constants.O_WRONLY | constants.O_CREAT | constants.O_EXCL, list.stat === null ? 0o666 : list.stat.mode & 0o7777);
  } catch (e) {
    throw new UserError(`cannot create a new file beside the stop list in ${path.dirname(real)} (${writeErrorMessage(e)}); nothing was changed`, file, null);
  }
  let renamed = false;
  try {
    try {
      await handle.writeFile(bytes);
      await handle.sync();
    } catch (e) {
      throw new UserError(`cannot write the new stop list (${writeErrorMessage(e)}); nothing was changed`, file, null);
    } finally {
      await handle.close();
    }
    if (list.stat !== null) {
      // Keep the owner when we may (running as root on someone's file); otherwise it is ours.
      await chown(temp, list.stat.uid, list.stat.gid).catch(() => undefined);
    }
    await hooks.afterTempWritten?.(temp);
    await assertUnchangedSinceRead(list, real);
    await rename(temp, real);
    renamed = true;
  } finally {
    if (!renamed) await unlink(temp).catch(() => undefined);
  }
}

async function realTarget(file: string): Promise<string> {
  try {
    return await realpath(file);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw new UserError(readErrorMessage('the stop list', e), file, null);
    // A dangling symlink would be replaced by a file, and a missing file is created where named.
    return path.resolve(file);
  }
}

async function assertUnchangedSinceRead(list: StopListFile, real: string): Promise<void> {
  let now: Buffer | null;
  try {
    now = await readFile(real);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw new UserError(readErrorMessage('the stop list', e), list.file, null);
    now = null;
  }
  const changed = list.exists ? now === null || !now.equals(list.bytes) : now !== null;
  if (changed) {
    const what = now === null ? 'was deleted' : list.exists ? `was changed by someone else (${formatBytes(list.bytes.length)} when read, ${formatBytes(now.length)} now)` : 'was created by someone else';
    throw new UserError(`the stop list ${what} while Loudword worked; nothing was written. Run the command again`, list.file, null);
  }
}
