import { mkdtempSync, rmSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';

/**
 * A fresh folder under the system's temporary folder for the tests of the enclosing `describe`:
 * made before them, removed with everything in it after them. Call it in the body of a
 * `describe`; the returned function gives the folder's path inside hooks and tests.
 */
export function scratchFolder(prefix: string): () => string {
  let dir: string | null = null;
  before(() => {
    dir = mkdtempSync(path.join(os.tmpdir(), prefix));
  });
  after(() => {
    if (dir !== null) rmSync(dir, { recursive: true, force: true });
  });
  return () => {
    if (dir === null) throw new Error(`scratchFolder('${prefix}') read outside its describe's tests`);
    return dir;
  };
}
