import { realpathSync } from 'node:fs';
import * as path from 'node:path';
import { UserError } from '../user-error';
import { parseJsonWithPositions } from './json-with-positions';

// The one confinement rule of Loudword (README "What it promises on bad input"): a path that a
// configuration file names, and every file Loudword writes because of it, must resolve — after
// symbolic links — inside the project folder (the folder of loudword.json, or the workspace in
// the editor). A cloned repository must not be able to make `loudword apply` append to a file
// elsewhere on the machine (a shell start-up file, say). A path the user types on the command
// line is the user's own choice and is not confined here (see cli/output-path.ts for its checks).

/**
 * The real path of `p` (absolute after this call): the realpath of its nearest existing
 * ancestor with the remaining, not yet existing, components appended. So a stop list that does
 * not exist yet under a symlinked folder is judged by where the folder really is.
 */
export function realPathAllowingMissing(p: string): string {
  let existing = path.resolve(p);
  const rest: string[] = [];
  for (;;) {
    try {
      return path.join(realpathSync.native(existing), ...rest.reverse());
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      // ENOENT: not there yet; ENOTDIR: a component is a file — judge by the part that exists.
      if (code !== 'ENOENT' && code !== 'ENOTDIR') throw e;
      const parent = path.dirname(existing);
      if (parent === existing) return path.join(existing, ...rest.reverse());
      rest.push(path.basename(existing));
      existing = parent;
    }
  }
}

/** True when `file` is `folder` itself or lies below it; both absolute and already resolved. */
export function isWithin(folder: string, file: string): boolean {
  const rel = path.relative(folder, file);
  return rel === '' || (rel !== '..' && !rel.startsWith('..' + path.sep) && !path.isAbsolute(rel));
}

export interface Confined {
  /** `p` resolved against the project folder, links not followed (what messages show). */
  resolved: string;
  /** Where it really is, links followed: the path to read and to write. */
  real: string;
}

/**
 * Resolves `p` against `projectDir` and returns where it really is, or null when it (or the
 * nearest existing folder above it) lies outside the project folder after following links.
 */
export function resolveInsideProject(projectDir: string, p: string, base: string = projectDir): Confined | null {
  const resolved = path.resolve(base, p);
  const realRoot = realPathAllowingMissing(projectDir);
  const real = realPathAllowingMissing(resolved);
  return isWithin(realRoot, real) ? { resolved, real } : null;
}

/**
 * Refuses a path named by `setting` in the config file `configFile` (relative to the config's
 * folder) that resolves outside `projectDir` (default: the config's folder):
 * `loudword.json:LINE: stopList "…" resolves outside the project folder (…)`.
 * `configText` is the config's text, to find the line.
 */
export function confineConfigPath(configFile: string, configText: string | null, setting: string, value: string, projectDir: string = path.dirname(configFile)): Confined {
  const base = path.dirname(configFile);
  const inside = resolveInsideProject(projectDir, value, base);
  if (inside !== null) return inside;
  const resolved = path.resolve(base, value);
  const real = realPathAllowingMissing(resolved);
  const via = isWithin(path.resolve(projectDir), resolved) ? ` through a symbolic link, to ${real}` : '';
  throw new UserError(
    `${setting} "${value}" resolves outside the project folder (${projectDir})${via}; a config file may only name files inside its project, so Loudword will not read or write it. Move the file into the project, or give it on the command line (--stoplist), which is your own choice`,
    configFile,
    lineOfKey(configText, setting),
  );
}

/** 1-based line of `key` in a config's text, or null when not found (or not parseable). */
export function lineOfKey(configText: string | null, key: string): number | null {
  if (configText === null) return null;
  try {
    return parseJsonWithPositions(configText).lineOf([key]);
  } catch {
    return null;
  }
}

/**
 * Resolves `p` against the workspace root and refuses a path that leaves it, following symlinks
 * (for a file that does not exist yet, those of its nearest existing folder). In an untrusted
 * workspace a loudword.json must not make the extension read (or later write) files elsewhere.
 */
export function confineToWorkspace(root: string, p: string): string {
  const base = path.resolve(root);
  const resolved = path.resolve(base, p);
  if (!isWithin(base, resolved)) {
    throw new UserError(`"${p}" points outside the workspace (${base}); an untrusted workspace may only name files inside it`, null, null);
  }
  if (resolveInsideProject(base, p) === null) {
    throw new UserError(`"${p}" leads outside the workspace through a symbolic link (to ${realPathAllowingMissing(resolved)})`, null, null);
  }
  return resolved;
}

/**
 * The editor's check before it edits a stop list: whatever setting named it, the file must
 * really lie inside the workspace (or, without one, the corpus's folder). Returns the real path.
 */
export function confineStopListWrite(projectDir: string, file: string): string {
  const inside = resolveInsideProject(projectDir, file);
  if (inside !== null) return inside.real;
  throw new UserError(
    `the stop list ${file} resolves outside the project folder (${projectDir}${realPathAllowingMissing(file) !== path.resolve(projectDir, file) ? `; it really is ${realPathAllowingMissing(file)}` : ''}), so Loudword will not write it. Point "stopList" in loudword.json (or the loudword.stopListFile setting) at a file inside the project`,
    null,
    null,
  );
}
