import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync } from 'node:fs';
import * as path from 'node:path';
import { CORPUS_CACHE, cached, squeeze, type DevCorpus, type LabelledDoc } from './labelled-corpus';
import { readRLazyLoadStrings } from './r-lazy-load';

const PACKAGE = 'r-cran-janeaustenr';
const DATA = path.join(CORPUS_CACHE, PACKAGE, 'usr', 'lib', 'R', 'site-library', 'janeaustenr', 'data');

/** Unpacked into the cache rather than installed: installing would pull in all of R. */
function unpack(): void {
  if (existsSync(DATA)) return;
  const debs = path.join(CORPUS_CACHE, 'debs');
  mkdirSync(debs, { recursive: true });
  execFileSync('apt-get', ['download', PACKAGE], { cwd: debs, stdio: 'ignore' });
  const deb = readdirSync(debs).find((f) => f.startsWith(`${PACKAGE}_`) && f.endsWith('.deb'));
  if (deb === undefined) throw new Error(`apt-get download ${PACKAGE} left no .deb in ${debs}`);
  execFileSync('dpkg', ['-x', path.join(debs, deb), path.join(CORPUS_CACHE, PACKAGE)]);
}

const CHAPTER = /^\s*chapter\s+([ivxlc]+|\d+)\b/i;

/**
 * Novels: the chapters of Jane Austen's six completed novels (Project Gutenberg texts), labelled by
 * novel. Source: Debian package r-cran-janeaustenr (one character vector of lines per novel),
 * read from its R data base by r-lazy-load.ts. A chapter runs from its heading to the next; the
 * front matter before the first heading is left out.
 */
export const AUSTEN_CHAPTERS: DevCorpus = {
  name: 'austen-chapters',
  genre: 'novel chapters',
  role: 'CHECK',
  source: 'Debian r-cran-janeaustenr (Project Gutenberg texts); label = novel',
  missing: 'apt-get update (the corpus is unpacked from `apt-get download r-cran-janeaustenr`)',
  available: () => {
    try {
      unpack();
      return existsSync(DATA);
    } catch {
      return false;
    }
  },
  load: () =>
    cached('austen-chapters', async () => {
      unpack();
      const docs: LabelledDoc[] = [];
      for (const [novel, lines] of readRLazyLoadStrings(DATA)) {
        let current: string[] | null = null;
        const flush = (): void => {
          const text = current === null ? '' : squeeze(current.join('\n'));
          if (text.length > 0) docs.push({ text, label: novel });
        };
        for (const line of lines) {
          if (CHAPTER.test(line)) {
            flush();
            current = [];
          } else if (current !== null) current.push(line);
        }
        flush();
      }
      return docs;
    }),
};
