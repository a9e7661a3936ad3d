import { constants, type Stats } from 'node:fs';
import { open, type FileHandle } from 'node:fs/promises';
import { UserError } from '../user-error';

// Loudword reads only regular files, and checks the size before reading (README "What it
// promises on bad input"). A FIFO named as a config or stop list used to block forever, and
// /dev/zero as a stop list grew to 13 GB. Opening with O_NONBLOCK returns at once for a FIFO,
// so the kind of file is judged on the open descriptor (fstat), not on a path that could be
// swapped between a stat and the open.

/** What a special file is, for the message. */
export function fileKind(s: Stats): string {
  if (s.isDirectory()) return 'a directory';
  if (s.isFIFO()) return 'a named pipe (FIFO)';
  if (s.isSocket()) return 'a socket';
  if (s.isCharacterDevice()) return 'a character device';
  if (s.isBlockDevice()) return 'a block device';
  return 'not a regular file';
}

/** Message for an fs error code when reading `what` ("the stop list"). */
export function readErrorMessage(what: string, e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code;
  switch (code) {
    case 'ENOENT':
      return `${what} does not exist`;
    case 'EACCES':
    case 'EPERM':
      return `${what} cannot be read: permission denied`;
    case 'EISDIR':
      return `${what} is a directory, not a file`;
    case 'ENOTDIR':
      return `${what} is not inside a folder (a part of its path is a file)`;
    case 'ELOOP':
      return `${what} is a loop of symbolic links`;
    case 'EIO':
      return `${what} cannot be read: input/output error`;
    default:
      return `${what} cannot be read (${code ?? (e as Error).message})`;
  }
}

/**
 * Opens `file` for reading if it is a regular file of at most `maxBytes` bytes. Errors from the
 * open itself (ENOENT, EACCES, …) are thrown as they are, so a caller can treat a missing file
 * as it wishes; a special or too large file is a UserError naming `what`.
 */
export async function openRegularFile(file: string, what: string, maxBytes: number): Promise<{ handle: FileHandle; stat: Stats }> {
  const handle = await open(file, constants.O_RDONLY | constants.O_NONBLOCK);
  try {
    const stat = await handle.stat();
    if (!stat.isFile()) throw new UserError(`${what} is ${fileKind(stat)}; Loudword reads regular files only`, file, null);
    if (stat.size > maxBytes) {
      throw new UserError(`${what} is ${formatBytes(stat.size)}, more than the ${formatBytes(maxBytes)} a ${what.replace(/^the /, '')} may have; is it the right file?`, file, null);
    }
    return { handle, stat };
  } catch (e) {
    await handle.close();
    throw e;
  }
}

/**
 * Reads a whole regular file of at most `maxBytes` bytes and refuses one that changed size
 * while it was read (a file still being written): the bytes are one snapshot or none.
 */
export async function readRegularFile(file: string, what: string, maxBytes: number): Promise<{ bytes: Buffer; stat: Stats }> {
  const { handle, stat } = await openRegularFile(file, what, maxBytes);
  try {
    // One byte more than the size, to see growth during the read.
    const bytes = Buffer.alloc(stat.size + 1);
    let got = 0;
    for (;;) {
      const { bytesRead } = await handle.read(bytes, got, bytes.length - got, got);
      if (bytesRead === 0) break;
      got += bytesRead;
      if (got === bytes.length) break;
    }
    const after = await handle.stat();
    if (got !== stat.size || after.size !== stat.size || after.mtimeMs !== stat.mtimeMs) {
      throw new UserError(`${what} changed while it was being read (${formatBytes(stat.size)} → ${formatBytes(Math.max(got, after.size))}); try again once it is saved`, file, null);
    }
    return { bytes: bytes.subarray(0, got), stat };
  } finally {
    await handle.close();
  }
}

export function formatBytes(n: number): string {
  if (n < 1024) return `${n} bytes`;
  const units = ['KiB', 'MiB', 'GiB', 'TiB'];
  let v = n / 1024;
  let u = 0;
  while (v >= 1024 && u < units.length - 1) {
    v /= 1024;
    u++;
  }
  return `${v >= 100 ? Math.round(v) : v.toFixed(1)} ${units[u]}`;
}

/** Message for an fs error code when writing (a report, a stop list): what went wrong, in words. */
export function writeErrorMessage(e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code;
  switch (code) {
    case 'ENOSPC':
      return 'the disk is full';
    case 'EDQUOT':
      return 'the disk quota is used up';
    case 'EACCES':
    case 'EPERM':
      return 'permission denied';
    case 'EROFS':
      return 'read-only file system';
    case 'EPIPE':
      return 'the reader closed the pipe before all output was written';
    case 'EISDIR':
      return 'it is a directory';
    default:
      return code ?? (e as Error).message;
  }
}
