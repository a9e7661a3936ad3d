import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { CORPUS_CACHE, squeeze, type DevCorpus, type LabelledDoc } from './labelled-corpus';

const PACKAGE = 'r-cran-tm';
const TEXTS = path.join(CORPUS_CACHE, PACKAGE, 'usr', 'lib', 'R', 'site-library', 'tm', 'texts');

/**
 * The package's files are unpacked into the cache rather than installed: the texts are plain XML
 * and installing the package would pull in all of R.
 */
function unpack(): void {
  if (existsSync(TEXTS)) return;
  const debs = path.join(CORPUS_CACHE, 'debs');
  mkdirSync(debs, { recursive: true });
  execFileSync('apt-get', ['download', PACKAGE], { cwd: debs, stdio: 'ignore' });
  const deb = readdirSync(debs).find((f) => f.startsWith(`${PACKAGE}_`) && f.endsWith('.deb'));
  if (deb === undefined) throw new Error(`apt-get download ${PACKAGE} left no .deb in ${debs}`);
  execFileSync('dpkg', ['-x', path.join(debs, deb), path.join(CORPUS_CACHE, PACKAGE)]);
}

function entity(text: string): string {
  return text
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&apos;/g, "'")
    .replace(/&#(\d+);/g, (_, n: string) => String.fromCharCode(Number(n)))
    .replace(/&amp;/g, '&');
}

/**
 * Newswire: the 70 Reuters-21578 stories (50 on acquisitions, 20 on crude oil) that the R text
 * mining package tm ships as plain XML. Source: Debian package r-cran-tm (texts/acq, texts/crude);
 * the collection is Lewis's Reuters-21578, Distribution 1.0. Label = the folder (acq / crude);
 * text = title and body.
 */
export const REUTERS_SAMPLE: DevCorpus = {
  name: 'reuters-sample',
  genre: 'newswire',
  role: 'CHECK',
  source: 'Debian r-cran-tm texts/acq + texts/crude (Reuters-21578); label = folder',
  missing: 'apt-get update (the corpus is unpacked from `apt-get download r-cran-tm`)',
  available: () => {
    if (existsSync(TEXTS)) return true;
    try {
      unpack();
      return existsSync(TEXTS);
    } catch {
      return false;
    }
  },
  load: async () => {
    unpack();
    const docs: LabelledDoc[] = [];
    for (const label of ['acq', 'crude']) {
      const dir = path.join(TEXTS, label);
      for (const file of readdirSync(dir).filter((f) => f.endsWith('.xml')).sort()) {
        const xml = readFileSync(path.join(dir, file), 'utf8');
        const title = /<TITLE>([\s\S]*?)<\/TITLE>/.exec(xml)?.[1] ?? '';
        const body = /<BODY>([\s\S]*?)<\/BODY>/.exec(xml)?.[1] ?? '';
        const text = squeeze(entity(`${title}\n${body}`));
        if (text.length > 0) docs.push({ text, label });
      }
    }
    return docs;
  },
};
