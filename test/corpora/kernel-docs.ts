import { readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { gunzipSync } from 'node:zlib';
import { availableWhen, cached, evenlySpaced, squeeze, type DevCorpus, type LabelledDoc, unpackedDebianPackage } from './labelled-corpus';

/** Versioned in Debian: the metapackage `linux-doc` holds no files. */
const PACKAGE = 'linux-doc-6.1';
/** Folders with at least this many English pages become labels (translations left out). */
const MIN_PAGES = 100;
const PER_FOLDER = 100;

function documentation(): string {
  return path.join(unpackedDebianPackage(PACKAGE), 'usr', 'share', 'doc', PACKAGE, 'Documentation');
}

/** Every `.rst.gz` under `dir`, as paths relative to it, sorted. */
function pages(dir: string, prefix = ''): string[] {
  const out: string[] = [];
  for (const entry of readdirSync(path.join(dir, prefix), { withFileTypes: true })) {
    const rel = path.join(prefix, entry.name);
    if (entry.isDirectory()) out.push(...pages(dir, rel));
    else if (entry.name.endsWith('.rst.gz')) out.push(rel);
  }
  return out.sort();
}

/**
 * The Linux kernel's documentation pages, reStructuredText as written (markup left in, as a
 * user would load the files), labelled by top-level folder (admin-guide, driver-api,
 * networking, ...): long technical documents of several kinds, like the man pages but from other
 * authors and another markup. Source: Debian package linux-doc-6.1, unpacked with
 * `apt-get download` + `dpkg -x`. The design (folders of ≥ 100 pages, 100 evenly spaced pages
 * each) was fixed before the corpus was first run.
 */
export const KERNEL_DOCS: DevCorpus = {
  name: 'kernel-docs',
  genre: 'technical documentation (reStructuredText)',
  role: 'CHECK',
  source: `Debian ${PACKAGE} Documentation/**/*.rst (unpacked, not installed); label = top-level folder with ≥ ${MIN_PAGES} pages`,
  missing: `apt-get update (the corpus is unpacked from \`apt-get download ${PACKAGE}\`)`,
  available: availableWhen(documentation),
  load: () =>
    cached('kernel-docs', async () => {
      const root = documentation();
      const docs: LabelledDoc[] = [];
      for (const folder of readdirSync(root, { withFileTypes: true }).filter((e) => e.isDirectory()).map((e) => e.name).sort()) {
        if (folder === 'translations') continue;
        const files = pages(root, folder);
        if (files.length < MIN_PAGES) continue;
        for (const f of evenlySpaced(files, PER_FOLDER)) {
          const text = squeeze(gunzipSync(readFileSync(path.join(root, f))).toString('utf8'));
          if (text.length > 0) docs.push({ text, label: folder });
        }
      }
      return docs;
    }),
};
