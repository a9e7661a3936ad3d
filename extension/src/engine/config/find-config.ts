import { statSync } from 'node:fs';
import * as path from 'node:path';

export const CONFIG_FILE_NAME = 'loudword.json';

/**
 * Where a review looks for its loudword.json, nearest first — the same rule for the CLI and the
 * editor, like .editorconfig or .gitignore: the corpus's folder, then each parent, up to and
 * including the project root. The project root is the editor's workspace folder when the corpus
 * lies inside it; otherwise (and on the command line) the nearest folder above the corpus that
 * holds `.git`, or the filesystem root when there is none. The nearest file wins; files are not
 * merged. Relative paths inside a config (the stop list) start at the config's own folder.
 */
export function configCandidates(corpusFile: string, workspaceRoot: string | null = null, isProjectRoot: (dir: string) => boolean = holdsGit): string[] {
  let dir = path.dirname(path.resolve(corpusFile));
  const stopAt = workspaceRoot !== null && isInsideFolder(workspaceRoot, dir) ? path.resolve(workspaceRoot) : null;
  const out: string[] = [];
  for (;;) {
    out.push(path.join(dir, CONFIG_FILE_NAME));
    if (stopAt !== null ? dir === stopAt : isProjectRoot(dir)) return out;
    const parent = path.dirname(dir);
    if (parent === dir) return out;
    dir = parent;
  }
}

/** The nearest loudword.json for `corpusFile` (see configCandidates), or null. Only regular files count. */
export function findConfig(corpusFile: string, workspaceRoot: string | null = null): string | null {
  // A folder of shards is its own first folder to look in.
  const start = statSync(corpusFile, { throwIfNoEntry: false })?.isDirectory() === true ? path.join(corpusFile, '*') : corpusFile;
  for (const candidate of configCandidates(start, workspaceRoot)) {
    if (statSync(candidate, { throwIfNoEntry: false })?.isFile() === true) return candidate;
  }
  return null;
}

/** True when `file` is `folder` or lies below it (after resolving `..`). */
export function isInsideFolder(folder: string, file: string): boolean {
  const rel = path.relative(path.resolve(folder), path.resolve(file));
  return rel === '' || (!rel.startsWith('..' + path.sep) && rel !== '..' && !path.isAbsolute(rel));
}

function holdsGit(dir: string): boolean {
  return statSync(path.join(dir, '.git'), { throwIfNoEntry: false }) !== undefined;
}
