import { readStopList } from './stop-list-file';

/**
 * Reads the stop list file for a review: its text after any byte-order mark, decoded as
 * stop-list-file.ts decides (UTF-8, UTF-16 with a BOM, or windows-1252). A missing file is an
 * empty list that does not exist yet; a file with a NUL byte is not a stop list; a FIFO, a
 * device or a file over MAX_STOP_LIST_BYTES is refused before it is read.
 */
export async function readStopListFile(path: string): Promise<{ text: string; exists: boolean }> {
  const { text, exists } = await readStopList(path);
  return { text, exists };
}
