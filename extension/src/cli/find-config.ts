import { existsSync } from 'node:fs';
import * as path from 'node:path';

export const CONFIG_FILE_NAME = 'loudword.json';

/** The loudword.json a review should read: beside the corpus first, then in the working folder. */
export function findConfig(corpusFile: string, cwd: string): string | null {
  for (const dir of [path.dirname(path.resolve(cwd, corpusFile)), cwd]) {
    const candidate = path.join(dir, CONFIG_FILE_NAME);
    if (existsSync(candidate)) return candidate;
  }
  return null;
}
