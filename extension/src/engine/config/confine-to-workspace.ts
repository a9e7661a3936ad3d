import { realpathSync } from 'node:fs';
import * as path from 'node:path';
import { UserError } from '../user-error';

/**
 * Resolves `p` against the workspace root and refuses a path that leaves it, following symlinks
 * where the path exists. In an untrusted workspace a loudword.json must not make the extension
 * read (or later write) files elsewhere on the machine.
 */
export function confineToWorkspace(root: string, p: string): string {
  const base = path.resolve(root);
  const resolved = path.resolve(base, p);
  const escapes = (from: string, to: string): boolean => {
    const rel = path.relative(from, to);
    return rel === '..' || rel.startsWith('..' + path.sep) || path.isAbsolute(rel);
  };
  if (escapes(base, resolved)) {
    throw new UserError(`"${p}" points outside the workspace (${base}); an untrusted workspace may only name files inside it`, null, null);
  }
  const real = realOrNull(resolved);
  const realBase = realOrNull(base);
  if (real !== null && realBase !== null && escapes(realBase, real)) {
    throw new UserError(`"${p}" leads outside the workspace through a symbolic link (to ${real})`, null, null);
  }
  return resolved;
}

function realOrNull(p: string): string | null {
  try {
    return realpathSync.native(p);
  } catch {
    return null;
  }
}
