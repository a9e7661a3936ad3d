import { readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { availableWhen, cached, evenlySpaced, squeeze, type DevCorpus, type LabelledDoc, unpackedDebianPackage } from './labelled-corpus';

/** Versioned in Debian, like the interpreter. */
const PACKAGE = 'python3.11-doc';
/** Sections with at least this many pages become labels. */
const MIN_PAGES = 15;
/** The library reference has 317 pages: capped so it does not swamp the other kinds. */
const PER_SECTION = 100;

function sources(): string {
  return path.join(unpackedDebianPackage(PACKAGE), 'usr', 'share', 'doc', 'python3.11', 'html', '_sources');
}

/**
 * Python's documentation, the reStructuredText sources Sphinx ships beside the HTML (markup
 * left in), labelled by section: library reference, C API, what's new, how-tos, tutorial.
 * Long documents of different kinds about one subject, so the label is the kind of document
 * rather than its topic. Source: Debian package python3.11-doc (html/_sources), unpacked with
 * `apt-get download` + `dpkg -x`. The design (sections of ≥ 15 pages, at most 100 evenly spaced
 * pages each) was fixed before the corpus was first run.
 */
export const PYTHON_DOCS: DevCorpus = {
  name: 'python-docs',
  genre: 'technical documentation by kind (reStructuredText)',
  role: 'CHECK',
  source: `Debian ${PACKAGE} html/_sources/**/*.rst.txt (unpacked, not installed); label = section with ≥ ${MIN_PAGES} pages`,
  missing: `apt-get update (the corpus is unpacked from \`apt-get download ${PACKAGE}\`)`,
  available: availableWhen(sources),
  load: () =>
    cached('python-docs', async () => {
      const root = sources();
      const docs: LabelledDoc[] = [];
      for (const section of readdirSync(root, { withFileTypes: true }).filter((e) => e.isDirectory()).map((e) => e.name).sort()) {
        const files = readdirSync(path.join(root, section), { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.rst.txt')).sort();
        if (files.length < MIN_PAGES) continue;
        for (const f of evenlySpaced(files, PER_SECTION)) {
          const text = squeeze(readFileSync(path.join(root, section, f), 'utf8'));
          if (text.length > 0) docs.push({ text, label: section });
        }
      }
      return docs;
    }),
};
