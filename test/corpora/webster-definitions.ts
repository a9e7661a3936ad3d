import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { gunzipSync } from 'node:zlib';
import { availableWhen, cached, evenlySpaced, squeeze, unpackedDebianPackage, type DevCorpus, type LabelledDoc } from './labelled-corpus';

const PACKAGE = 'dict-gcide';

/** Subject labels whose share gives at least this many of the capped documents. */
const MIN_PER_CLASS = 40;
const MAX_DOCUMENTS = 3000;

function dictionaryFile(): string {
  return path.join(unpackedDebianPackage(PACKAGE), 'usr', 'share', 'dictd', 'gcide.dict.dz');
}

/**
 * An entry's first line: the headword, then its pronunciation between backslashes
 * ("Abandon \A*ban"don\ ([.a]*b…), v. t. [etymology…"), at the start of a line.
 */
const ENTRY_START = /^[^\s].*?\\[^\\]*\\/;
/** A line that is only a source mark ("[1913 Webster]", "[WordNet 1.5]", "[PJC]"): a sense ends there. */
const SOURCE_MARK = /^\s*\[([^\]]*)\]\s*$/;
/** A subject label in the dictionary's own form: "(Zool.)", "(Bot.)", "(Naut.)", "(Civil Law.)". */
const SUBJECT = /\(([A-Z][a-z]+(?: [A-Z][a-z]+)?)\.\)\s/;

/**
 * Each entry's first sense, when it comes from the 1913 Webster (not from WordNet, which the
 * wordnet-glosses corpus holds, nor from later contributors) and carries a subject label: the
 * label, and the definition after it, with the dictionary's markup taken out (bracketed notes
 * and accent codes, braces around cross-referenced words, "--Author." citations). Cross-references
 * alone ("See Mataco.") are left out.
 */
function subjectDefinitions(dictionary: string): LabelledDoc[] {
  const docs: LabelledDoc[] = [];
  let sense: string[] | null = null;
  let done = false;
  const finish = (mark: string) => {
    if (sense === null || done) return;
    done = true;
    if (!mark.includes('Webster')) return;
    const text = sense.join(' ');
    const subject = SUBJECT.exec(text);
    if (subject === null) return;
    const definition = squeeze(
      text
        .slice(subject.index + subject[0].length)
        .replace(/\[[^\]]*\]/g, ' ')
        .replace(/[{}]/g, '')
        .replace(/--[A-Z][^ ]*\.?/g, ' '),
    );
    if (definition.length < 10 || /^See /.test(definition)) return;
    docs.push({ text: definition, label: subject[1]! });
  };
  for (const line of dictionary.split('\n')) {
    if (ENTRY_START.test(line)) {
      sense = [line];
      done = false;
      continue;
    }
    if (sense === null || done) continue;
    const mark = SOURCE_MARK.exec(line);
    if (mark !== null) finish(mark[1]!);
    else sense.push(line.trim());
  }
  return docs;
}

/**
 * Dictionary definitions of another house style: the first sense of the entries of Webster's
 * Revised Unabridged Dictionary (1913) that carry a subject label — zoology, botany, chemistry,
 * medicine, anatomy, mineralogy, … — labelled by it, the labels with at least 40 of 3,000
 * definitions evenly spaced over the dictionary. Written to formulas whose grammar words mark
 * the subject ("Any one of numerous species of …", "A genus of …", "The act of …"), like the
 * WordNet glosses but from other authors, another century and other classes. Source: Debian
 * package dict-gcide (GNU Collaborative International Dictionary of English, which holds the
 * 1913 Webster and marks each sense's source), unpacked with `apt-get download` + `dpkg -x`.
 * Added as TUNE in the sixteenth session, before its first run, so that the rule's treatment of
 * formulaic text can be chosen on a corpus of its own (docs/methods.md §9).
 */
export const WEBSTER_DEFINITIONS: DevCorpus = {
  name: 'webster-definitions',
  genre: 'dictionary definitions (1913)',
  role: 'TUNE',
  source: 'Debian dict-gcide (the 1913 Webster senses of GCIDE); label = subject label',
  missing: 'apt-get update (the corpus is unpacked from `apt-get download dict-gcide`)',
  available: availableWhen(dictionaryFile),
  load: () =>
    cached('webster-definitions', async () => {
      const all = subjectDefinitions(gunzipSync(readFileSync(dictionaryFile())).toString('utf8'));
      const spaced = evenlySpaced(all, MAX_DOCUMENTS);
      const counts = new Map<string, number>();
      for (const d of spaced) counts.set(d.label, (counts.get(d.label) ?? 0) + 1);
      return spaced.filter((d) => counts.get(d.label)! >= MIN_PER_CLASS);
    }),
};
