// Writing the CLI's output: to a file given with --out (a new file beside it renamed over it, so
// a full disk or a kill never leaves half a report where an old one was), or to stdout, where a
// reader that goes away early (`| head`) or a full disk is one line, not a stack trace.
import { randomBytes } from 'node:crypto';
import { constants } from 'node:fs';
import { open, rename, stat, unlink, writeFile } from 'node:fs/promises';
import * as path from 'node:path';
import { UserError } from '../engine/user-error';
import { writeErrorMessage } from '../engine/read/regular-file';

/** A plain description of a file system error, for a one-line message after the path. */
export function describeSystemError(e: NodeJS.ErrnoException): string {
  switch (e.code) {
    case 'ENOENT':
      return 'does not exist';
    case 'ENOTDIR':
      return 'a part of the path is not a folder';
    case 'EIO':
      return 'input/output error (a failing disk or a network file system?)';
    case 'EMFILE':
    case 'ENFILE':
      return 'too many open files';
    case 'ENOMEM':
      return 'out of memory';
    default:
      return writeErrorMessage(e);
  }
}

/** Writes `text` to the file `out`: atomically for a regular (or new) file, directly for a device or pipe. */
export async function writeOutputFile(out: string, text: string): Promise<void> {
  const target = path.resolve(out);
  const existing = await stat(target).catch(() => null);
  if (existing !== null && !existing.isFile()) {
    // /dev/null, /dev/stdout, a named pipe: there is nothing to replace, write straight in.
    try {
      await writeFile(target, text);
    } catch (e) {
      throw new UserError(`cannot write the report: ${writeErrorMessage(e)}`, out, null);
    }
    return;
  }
  const temp = path.join(path.dirname(target), `.${path.basename(target)}.loudword-${process.pid}-${randomBytes(4).toString('hex')}.tmp`);
  let done = false;
  try {
    const handle = await open(temp, constants.O_WRONLY | constants.O_CREAT | constants.O_EXCL, existing === null ? 0o666 : existing.mode & 0o7777);
    try {
      await handle.writeFile(text);
      await handle.sync();
    } finally {
      await handle.close();
    }
    await rename(temp, target);
    done = true;
  } catch (e) {
    throw new UserError(`cannot write the report: ${writeErrorMessage(e)}; ${existing === null ? 'no file was created' : 'the old file is unchanged'}`, out, null);
  } finally {
    if (!done) await unlink(temp).catch(() => undefined);
  }
}

let stdoutBroken: unknown = null;

/**
 * Writes to stdout and waits until it is flushed, so an EPIPE or ENOSPC surfaces here as a
 * UserError (one line, exit 1) rather than as an unhandled 'error' event with a stack.
 */
export function writeStdout(text: string): Promise<void> {
  if (stdoutBroken !== null) return Promise.reject(stdoutError(stdoutBroken));
  return new Promise((resolve, reject) => {
    process.stdout.write(text, (e) => (e ? reject(stdoutError(e)) : resolve()));
  });
}

function stdoutError(e: unknown): UserError {
  return new UserError(writeErrorMessage(e), '(standard output)', null);
}

/** Keeps a later stdout error (after our write resolved) from crashing the process with a stack. */
export function guardStdout(): void {
  process.stdout.on('error', (e) => {
    stdoutBroken = e;
  });
}
