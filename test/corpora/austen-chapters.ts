import * as path from 'node:path';
import { cached, squeeze, type DevCorpus, type LabelledDoc, availableWhen, unpackedDebianPackage } from './labelled-corpus';
import { readRLazyLoadStrings } from './r-lazy-load';

const PACKAGE = 'r-cran-janeaustenr';

/** The package's folder of data, unpacked into the cache (installing it would pull in all of R). */
function unpack(): string {
  return path.join(unpackedDebianPackage(PACKAGE), 'usr', 'lib', 'R', 'site-library', 'janeaustenr', 'data');
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
  available: availableWhen(unpack),
  load: () =>
    cached('austen-chapters', async () => {
      const docs: LabelledDoc[] = [];
      for (const [novel, lines] of readRLazyLoadStrings(unpack())) {
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
