import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { availableWhen, cached, evenlySpaced, squeeze, unpackedDebianPackage, type DevCorpus, type LabelledDoc } from './labelled-corpus';

const PACKAGE = 'wordnet-base';

/** Nouns' lexicographer files whose share gives at least this many of the capped documents. */
const MIN_PER_CLASS = 40;
const MAX_DOCUMENTS = 3000;

/**
 * WordNet's lexicographer files for nouns, by number (WordNet 3.0's lexnames(5WN), shipped in
 * the same package as a manual page; the data lines carry only the number).
 */
const NOUN_FILES: Readonly<Record<string, string>> = {
  '03': 'Tops', '04': 'act', '05': 'animal', '06': 'artifact', '07': 'attribute', '08': 'body',
  '09': 'cognition', '10': 'communication', '11': 'event', '12': 'feeling', '13': 'food', '14': 'group',
  '15': 'location', '16': 'motive', '17': 'object', '18': 'person', '19': 'phenomenon', '20': 'plant',
  '21': 'possession', '22': 'process', '23': 'quantity', '24': 'relation', '25': 'shape', '26': 'state',
  '27': 'substance', '28': 'time',
};

function dataNoun(): string {
  return path.join(unpackedDebianPackage(PACKAGE), 'usr', 'share', 'wordnet', 'data.noun');
}

/**
 * One synset line of data.noun (wndb(5WN)): "offset lex_filenum ss_type w_cnt word lex_id … |
 * gloss". The gloss is the definition, then examples in double quotes after semicolons.
 */
function glossOf(line: string): { file: string; gloss: string } | null {
  if (line.startsWith('  ')) return null; // the licence at the top of the file
  const bar = line.indexOf(' | ');
  if (bar < 0) return null;
  const file = line.split(' ', 3)[1]!;
  return { file, gloss: squeeze(line.slice(bar + 3)) };
}

/**
 * Dictionary definitions: WordNet 3.0's noun glosses (definition and usage examples), labelled
 * by the lexicographer file the synset was filed under (animal, artifact, person, food, …), the
 * classes with at least 40 of 3,000 glosses evenly spaced over the file. Short texts (~80
 * characters) written in one house style, a genre no other corpus of the set has. Source:
 * Debian package wordnet-base (Princeton WordNet 3.0), unpacked with `apt-get download` +
 * `dpkg -x`. Added as CHECK in the fifteenth session and run once with the rule as it stood.
 */
export const WORDNET_GLOSSES: DevCorpus = {
  name: 'wordnet-glosses',
  genre: 'dictionary definitions',
  role: 'CHECK',
  source: 'Debian wordnet-base data.noun (Princeton WordNet 3.0); label = lexicographer file',
  missing: 'apt-get update (the corpus is unpacked from `apt-get download wordnet-base`)',
  available: availableWhen(dataNoun),
  load: () =>
    cached('wordnet-glosses', async () => {
      const all: LabelledDoc[] = [];
      for (const line of readFileSync(dataNoun(), 'utf8').split('\n')) {
        const g = glossOf(line);
        const label = g === null ? undefined : NOUN_FILES[g.file];
        if (g !== null && label !== undefined && g.gloss.length > 0) all.push({ text: g.gloss, label });
      }
      const spaced = evenlySpaced(all, MAX_DOCUMENTS);
      const counts = new Map<string, number>();
      for (const d of spaced) counts.set(d.label, (counts.get(d.label) ?? 0) + 1);
      return spaced.filter((d) => counts.get(d.label)! >= MIN_PER_CLASS);
    }),
};
