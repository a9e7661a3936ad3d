import { randomBytes } from 'node:crypto';
import { promises as fs } from 'node:fs';

/**
 * Writes `text` to `file` so that no reader ever sees half of it: into a temporary file beside
 * it, flushed, then renamed over it (rename is atomic within a file system, POSIX rename(2)).
 * A shard step killed half-way leaves at most a stray temporary file, never a partial partial.
 */
export async function writeAtomically(file: string, text: string): Promise<void> {
  const temporary = `${file}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`;
  const handle = await fs.open(temporary, 'w');
  try {
    await handle.writeFile(text);
    await handle.sync();
  } finally {
    await handle.close();
  }
  try {
    await fs.rename(temporary, file);
  } catch (e) {
    await fs.rm(temporary, { force: true });
    throw e;
  }
}
