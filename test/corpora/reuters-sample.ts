import { readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { squeeze, type DevCorpus, type LabelledDoc, availableWhen, unpackedDebianPackage } from './labelled-corpus';

const PACKAGE = 'r-cran-tm';

/** The package's folder of data, unpacked into the cache (installing it would pull in all of R). */
function unpack(): string {
  return path.join(unpackedDebianPackage(PACKAGE), 'usr', 'lib', 'R', 'site-library', 'tm', 'texts');
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
  available: availableWhen(unpack),
  load: async () => {
    const docs: LabelledDoc[] = [];
    for (const label of ['acq', 'crude']) {
      const dir = path.join(unpack(), label);
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
