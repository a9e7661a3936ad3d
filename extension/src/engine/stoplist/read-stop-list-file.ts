import { readFile } from 'node:fs/promises';
import { UserError } from '../user-error';

/**
 * Reads the stop list file as UTF-8 (BOM dropped, as the editor does). A missing file is an
 * empty list that does not exist yet; a file with a NUL byte is not a stop list.
 */
export async function readStopListFile(path: string): Promise<{ text: string; exists: boolean }> {
  let bytes: Buffer;
  try {
    bytes = await readFile(path);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') return { text: '', exists: false };
    throw new UserError(`cannot read the stop list file (${code ?? (e as Error).message})`, path, null);
  }
  const nul = bytes.indexOf(0);
  if (nul >= 0) {
    const line = 1 + countLineBreaks(bytes.subarray(0, nul));
    throw new UserError(`not a stop list: a NUL byte at offset ${nul} (binary file?)`, path, line);
  }
  const text = bytes.toString('utf8');
  return { text: text.charCodeAt(0) === 0xfeff ? text.slice(1) : text, exists: true };
}

function countLineBreaks(bytes: Uint8Array): number {
  let n = 0;
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i];
    if (b === 0x0a || (b === 0x0d && bytes[i + 1] !== 0x0a)) n++;
  }
  return n;
}
