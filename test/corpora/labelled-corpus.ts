import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import * as path from 'node:path';

/** One document of a labelled development corpus. */
export interface LabelledDoc {
  text: string;
  label: string;
}

/**
 * A labelled corpus of the development set (test/corpora/README.md). TUNE corpora may be used to
 * choose the suggestion method's constants; CHECK corpora only to check them afterwards.
 */
export interface DevCorpus {
  name: string;
  genre: string;
  role: 'TUNE' | 'CHECK';
  /** Where the text comes from (Debian or npm package) and what the label is. */
  source: string;
  available(): boolean;
  /** Why the corpus is not available and what to install. */
  missing: string;
  load(): Promise<LabelledDoc[]>;
}

/** Rendered corpora are cached here (git-ignored); delete the folder to rebuild them. */
export const CORPUS_CACHE = path.join(__dirname, '..', '..', '.cache', 'corpora');

export async function cached(name: string, build: () => Promise<LabelledDoc[]>): Promise<LabelledDoc[]> {
  const file = path.join(CORPUS_CACHE, `${name}.jsonl`);
  if (existsSync(file)) {
    return readFileSync(file, 'utf8').split('\n').filter((l) => l.length > 0).map((l) => JSON.parse(l) as LabelledDoc);
  }
  const docs = await build();
  mkdirSync(CORPUS_CACHE, { recursive: true });
  writeFileSync(file, docs.map((d) => JSON.stringify(d)).join('\n') + '\n');
  return docs;
}

/**
 * At most `max` items, spread evenly over the list (every (n/max)-th), so a capped corpus keeps
 * the proportions of its labels and is the same on every machine.
 */
export function evenlySpaced<T>(items: readonly T[], max: number): T[] {
  if (items.length <= max) return [...items];
  const out: T[] = [];
  for (let i = 0; i < max; i++) out.push(items[Math.floor((i * items.length) / max)]!);
  return out;
}

/** Whitespace runs to one space, ends trimmed. */
export function squeeze(text: string): string {
  return text.replace(/\s+/g, ' ').trim();
}

/**
 * The files of a Debian package, unpacked into the cache with `apt-get download` + `dpkg -x`
 * rather than installed (for data packages whose dependencies, such as all of R, are not
 * needed to read their files). Returns the folder that stands for the package's `/`.
 */
export function unpackedDebianPackage(name: string): string {
  const root = path.join(CORPUS_CACHE, name);
  if (existsSync(path.join(root, 'usr'))) return root;
  const debs = path.join(CORPUS_CACHE, 'debs');
  mkdirSync(debs, { recursive: true });
  execFileSync('apt-get', ['download', name], { cwd: debs, stdio: 'ignore' });
  const deb = readdirSync(debs).find((f) => f.startsWith(`${name}_`) && f.endsWith('.deb'));
  if (deb === undefined) throw new Error(`apt-get download ${name} left no .deb in ${debs}`);
  execFileSync('dpkg', ['-x', path.join(debs, deb), root]);
  return root;
}

/**
 * `available()` for a corpus read from files that must first be fetched (a Debian package
 * unpacked into the cache, an npm fixture): true when `where()` names something that exists; a
 * fetch that fails (no apt lists, no network) counts as not available, so the quality table
 * skips the corpus with its `missing` advice instead of stopping.
 */
export function availableWhen(...where: Array<() => string>): () => boolean {
  return () => {
    try {
      return where.every((w) => existsSync(w()));
    } catch {
      return false;
    }
  };
}
