import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { gunzipSync } from 'node:zlib';
import { availableWhen, cached, evenlySpaced, squeeze, unpackedDebianPackage, type DevCorpus, type LabelledDoc } from './labelled-corpus';

const PACKAGE = 'dict-gcide';

/** Subject labels whose share gives at least this many of the capped documents. */
const MIN_PER_CLASS = 40;
const MAX_DOCUMENTS = 3000;

export function dictionaryFile(): string {
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
export const SUBJECT = /\(([A-Z][a-z]+(?: [A-Z][a-z]+)?)\.\)\s/;

/** An entry's first sense as written (its entry line included), when the 1913 Webster is its source. */
export interface FirstSense {
  /** The entry line and the sense's lines, joined by spaces. */
  text: string;
  /** The entry line alone ("Abdicator \Ab"di*ca`tor\, n."). */
  entry: string;
}

/**
 * Each entry's first sense, when it comes from the 1913 Webster (not from WordNet, which the
 * wordnet-glosses corpus holds, nor from later contributors): a sense ends at its source mark.
 */
export function websterFirstSenses(dictionary: string): FirstSense[] {
  const out: FirstSense[] = [];
  let sense: string[] | null = null;
  let done = false;
  for (const line of dictionary.split('\n')) {
    if (ENTRY_START.test(line)) {
      sense = [line];
      done = false;
      continue;
    }
    if (sense === null || done) continue;
    const mark = SOURCE_MARK.exec(line);
    if (mark === null) {
      sense.push(line.trim());
      continue;
    }
    done = true;
    if (mark[1]!.includes('Webster')) out.push({ text: sense.join(' '), entry: sense[0]! });
  }
  return out;
}

/**
 * A definition with the dictionary's markup taken out: bracketed notes and accent codes, braces
 * around cross-referenced words, "--Author." citations; null for a cross-reference alone ("See
 * Mataco.") or a fragment.
 */
export function plainDefinition(text: string): string | null {
  const definition = squeeze(
    text
      .replace(/\[[^\]]*\]/g, ' ')
      .replace(/[{}]/g, '')
      .replace(/--[A-Z][^ ]*\.?/g, ' '),
  );
  return definition.length < 10 || /^See /.test(definition) ? null : definition;
}

/**
 * Each first sense of the 1913 Webster that carries a subject label: the label, and the
 * definition after it in plain text (plainDefinition), with the entry line it came from.
 */
function subjectDefinitions(dictionary: string): Array<LabelledDoc & { entry: string }> {
  const docs: Array<LabelledDoc & { entry: string }> = [];
  for (const { text, entry } of websterFirstSenses(dictionary)) {
    const subject = SUBJECT.exec(text);
    if (subject === null) continue;
    const definition = plainDefinition(text.slice(subject.index + subject[0].length));
    if (definition !== null) docs.push({ text: definition, label: subject[1]!, entry });
  }
  return docs;
}

/**
 * The corpus's documents, each with its entry line: the subjects with at least MIN_PER_CLASS of
 * MAX_DOCUMENTS definitions evenly spaced over the dictionary.
 */
export function websterSubjectDocuments(): Array<LabelledDoc & { entry: string }> {
  const spaced = evenlySpaced(subjectDefinitions(gunzipSync(readFileSync(dictionaryFile())).toString('utf8')), MAX_DOCUMENTS);
  const counts = new Map<string, number>();
  for (const d of spaced) counts.set(d.label, (counts.get(d.label) ?? 0) + 1);
  return spaced.filter((d) => counts.get(d.label)! >= MIN_PER_CLASS);
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
    cached('webster-definitions', async () => websterSubjectDocuments().map(({ text, label }) => ({ text, label }))),
};
