// Checks on paths the user types on the command line (`--out`, `--stoplist` for apply). They are
// the user's own choice, so they are not confined to the project, but Loudword never writes over
// one of its inputs (the report replacing the corpus, terms appended to loudword.json), never
// into a directory and never into a folder that does not exist: each is a one-line error.
import { statSync, type Stats } from 'node:fs';
import * as path from 'node:path';
import { realPathAllowingMissing } from '../engine/config/confine-to-workspace';
import { UsageError } from './parse-args';

/** A bad path on the command line: printed as one line `loudword: PATH: what is wrong`, exit 2. */
export class PathArgumentError extends UsageError {
  override name = 'PathArgumentError';
}

export interface NamedInput {
  /** What the file is to the user ("the corpus", "the config file", "the stop list"). */
  role: string;
  file: string | null;
}

function statOrNull(p: string): Stats | null {
  try {
    return statSync(p);
  } catch {
    return null;
  }
}

/** The same file: one real path, or one inode (a hard link, a bind mount). */
export function sameFile(a: string, b: string): boolean {
  if (realPathAllowingMissing(a) === realPathAllowingMissing(b)) return true;
  const sa = statOrNull(a);
  const sb = statOrNull(b);
  return sa !== null && sb !== null && sa.dev === sb.dev && sa.ino === sb.ino;
}

/**
 * Refuses a file Loudword would write (`flag` names where it came from) that is a directory,
 * lies in a folder that does not exist, or is one of `inputs`. A device or pipe (/dev/null,
 * /dev/stdout) is allowed for --out; a stop list that is one is refused when it is read.
 */
export function checkWriteTarget(flag: string, target: string, inputs: readonly NamedInput[]): void {
  const abs = path.resolve(target);
  const shown = target;
  const st = statOrNull(abs);
  if (st !== null && st.isDirectory()) throw new PathArgumentError(`${shown}: ${flag} names a directory; give a file name`);
  const folder = path.dirname(abs);
  const fst = statOrNull(folder);
  if (fst === null) throw new PathArgumentError(`${shown}: ${flag} is in a folder that does not exist (${folder})`);
  if (!fst.isDirectory()) throw new PathArgumentError(`${shown}: ${flag} is in ${folder}, which is not a folder`);
  for (const input of inputs) {
    if (input.file !== null && sameFile(abs, input.file)) {
      throw new PathArgumentError(`${shown}: ${flag} is ${input.role} (${input.file}); Loudword never writes over one of its inputs`);
    }
  }
}
