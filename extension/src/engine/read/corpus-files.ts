import { compareUtf8 } from '../random/compare-utf8';
import { readdir, stat } from 'node:fs/promises';
import * as path from 'node:path';
import { UserError } from '../user-error';

/** One file of a corpus given as a glob or a folder. */
export interface CorpusFile {
  /** Path to open. */
  path: string;
  /**
   * The file's name relative to the corpus root, with '/' separators: a document's place is
   * (key, line), the same on every machine that sees the same tree, wherever it is mounted.
   */
  key: string;
}

/** The start of the error for a folder with no file a table or lines can be read from (the editor then offers format "files"). */
export const NO_CORPUS_FILES = 'the folder holds no corpus files';

/**
 * File names a folder of shards may hold; anything else in it (a README, a .crc) is left out, and
 * so is .json, the name of the configs that sit beside a corpus (loudword.json, package.json): a
 * glob ('shards/*.json') names JSON arrays.
 */
const CORPUS_FILE = /\.(csv|tsv|tab|jsonl|ndjson|txt|text|parquet)(\.gz)?$/i;

/** True when `input` names more than one file: a glob pattern, or a folder. */
export async function isManyFilesInput(input: string): Promise<boolean> {
  if (hasGlob(input)) return true;
  try {
    return (await stat(input)).isDirectory();
  } catch {
    return false;
  }
}

export function hasGlob(input: string): boolean {
  return /[*?[]/.test(input);
}

/**
 * The files of a corpus given as a glob ('shards/*.jsonl', 'data/**\/part-*.parquet') or a
 * folder (every corpus file under it, recursively), in code point order of their keys, so the
 * document order — and every figure — is the same whatever order the file system lists them in.
 * A single file gives itself, keyed by its base name.
 */
export async function listCorpusFiles(input: string): Promise<CorpusFile[]> {
  if (!hasGlob(input)) {
    let isDir = false;
    try {
      isDir = (await stat(input)).isDirectory();
    } catch {
      return [{ path: input, key: path.basename(input) }];
    }
    if (!isDir) return [{ path: input, key: path.basename(input) }];
    const files = (await walk(input)).filter((rel) => CORPUS_FILE.test(rel));
    if (files.length === 0) {
      const json = (await walk(input)).some((rel) => /\.json(\.gz)?$/i.test(rel)) ? `; .json files are left out of a folder (configs share the name): name them with a glob, '${path.join(input, '*.json')}'` : '';
      throw new UserError(`${NO_CORPUS_FILES} (.csv, .tsv, .jsonl, .txt, .parquet, optionally .gz)${json}; for a folder of documents, one per file, use --input-format files (format "files")`, input, null);
    }
    return sorted(files.map((rel) => ({ path: path.join(input, rel), key: rel })));
  }
  const { root, pattern } = splitGlob(input);
  const matcher = globToRegExp(pattern);
  let all: string[];
  try {
    all = await walk(root);
  } catch (e) {
    throw new UserError(`cannot list the folder of the pattern (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`, root, null);
  }
  const files = all.filter((rel) => matcher.test(rel));
  if (files.length === 0) throw new UserError('no file matches the pattern', input, null);
  return sorted(files.map((rel) => ({ path: path.join(root, rel), key: rel })));
}

function sorted(files: CorpusFile[]): CorpusFile[] {
  return files.sort((a, b) => compareUtf8(a.key, b.key));
}

/** The folder part before the first segment with a wildcard, and the rest ('/' separated). */
export function splitGlob(input: string): { root: string; pattern: string } {
  const parts = input.split(/[\\/]/);
  let i = 0;
  while (i < parts.length - 1 && !hasGlob(parts[i]!)) i++;
  const rootParts = parts.slice(0, i);
  const root = rootParts.length === 0 ? '.' : rootParts.join('/') === '' ? '/' : rootParts.join('/');
  return { root, pattern: parts.slice(i).join('/') };
}

/** A shell-style glob as a RegExp over '/'-separated relative paths: *, ?, [...] and **. */
export function globToRegExp(pattern: string): RegExp {
  let re = '';
  for (let i = 0; i < pattern.length; i++) {
    const c = pattern[i]!;
    if (c === '*') {
      if (pattern[i + 1] === '*') {
        const slash = pattern[i + 2] === '/';
        re += slash ? '(?:[^/]*/)*' : '.*';
        i += slash ? 2 : 1;
      } else re += '[^/]*';
    } else if (c === '?') re += '[^/]';
    else if (c === '[') {
      const close = pattern.indexOf(']', i + 1);
      if (close < 0) re += '\\[';
      else {
        const body = pattern.slice(i + 1, close).replace(/^!/, '^').replace(/\\/g, '\\\\');
        re += `[${body}]`;
        i = close;
      }
    } else re += /[.+^${}()|\\]/.test(c) ? `\\${c}` : c;
  }
  return new RegExp(`^${re}$`);
}

/** Every file under `dir`, as '/'-separated paths relative to it; hidden entries are skipped. */
export async function walk(dir: string): Promise<string[]> {
  const out: string[] = [];
  const visit = async (rel: string): Promise<void> => {
    const entries = await readdir(rel === '' ? dir : path.join(dir, rel), { withFileTypes: true });
    for (const e of entries) {
      if (e.name.startsWith('.')) continue;
      const child = rel === '' ? e.name : `${rel}/${e.name}`;
      if (e.isDirectory()) await visit(child);
      else if (e.isFile() || e.isSymbolicLink()) out.push(child);
    }
  };
  await visit('');
  return out;
}
