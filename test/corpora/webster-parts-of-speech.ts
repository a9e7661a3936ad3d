import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { availableWhen, cached, evenlySpaced, type DevCorpus, type LabelledDoc } from './labelled-corpus';
import { dictionaryFile, plainDefinition, SUBJECT, websterFirstSenses } from './webster-definitions';

/** Parts of speech whose share gives at least this many of the capped documents. */
const MIN_PER_CLASS = 40;
const MAX_DOCUMENTS = 3000;

/**
 * The part of speech on an entry line, after the pronunciation and any variant in parentheses:
 * "Abdicator \Ab"di*ca`tor\, n." → "n.". Only a plain noun, adjective, adverb, transitive or
 * intransitive verb; a mark that goes on ("n. pl.", "v. t. & i.") is no single class, and one
 * followed by inflections ("n.; pl. …") puts them before the definition.
 */
const PART_OF_SPEECH = /^[^\s].*?\\[^\\]*\\\s*(?:\([^)]*\)\s*)*,\s*(n\.|a\.|adv\.|v\. t\.|v\. i\.)(?=\s*(?:\[|,\s|$))/;

/** The part of speech of an entry line (PART_OF_SPEECH), or null. */
export function partOfSpeech(entry: string): string | null {
  return PART_OF_SPEECH.exec(entry)?.[1] ?? null;
}

/**
 * The text without its bracketed notes, nested ones included: the etymology after the part of
 * speech holds accent codes in brackets of their own ("[F. d['e]sagr['e]ment.]").
 */
function withoutBrackets(text: string): string {
  let out = text;
  for (let before = ''; before !== out; ) {
    before = out;
    out = out.replace(/\[[^[\]]*\]/g, ' ');
  }
  return out;
}

/**
 * Each first sense of the 1913 Webster with no subject label (those are webster-definitions'),
 * labelled by its entry's part of speech: the definition after the entry line's part of speech,
 * in plain text, without a leading sense number.
 */
function partOfSpeechDefinitions(dictionary: string): LabelledDoc[] {
  const docs: LabelledDoc[] = [];
  for (const { text, entry } of websterFirstSenses(dictionary)) {
    if (SUBJECT.test(text)) continue;
    const pos = PART_OF_SPEECH.exec(entry);
    if (pos === null) continue;
    const definition = plainDefinition(withoutBrackets(text.slice(pos[0].length)).replace(/^\s*1\.\s/, ' '));
    // A label of its own in parentheses ("(Gr. Antiq.) A rhapsodist."): a subject after all.
    if (definition !== null && !/^\([A-Z][^)]*\.\)/.test(definition)) docs.push({ text: definition, label: pos[1]! });
  }
  return docs;
}

/**
 * Dictionary definitions whose class the grammar words mark: the first sense of the 1913
 * Webster's entries that carry no subject label, labelled by the headword's part of speech (noun,
 * adjective, adverb, transitive and intransitive verb), the classes with at least 40 of 3,000
 * definitions evenly spaced over the dictionary. The house style writes each class to its own
 * formula — "To make …" for a verb, "Of or pertaining to …", "Having …" for an adjective, "One
 * who …", "The act of …" for a noun, "In a … manner" for an adverb — so here the grammar words
 * are the signal, as in the WordNet glosses, where "someone who …" marks a person. Same source as
 * webster-definitions (Debian dict-gcide), none of its documents. Added as TUNE in the eighteenth
 * session, its role and design fixed before its first run, so that whether a grammar word that
 * goes with the content is kept can be chosen on a corpus of its own (docs/methods.md §9).
 */
export const WEBSTER_PARTS_OF_SPEECH: DevCorpus = {
  name: 'webster-parts-of-speech',
  genre: 'dictionary definitions (1913), by part of speech',
  role: 'TUNE',
  source: 'Debian dict-gcide (the 1913 Webster senses of GCIDE without a subject label); label = part of speech',
  missing: 'apt-get update (the corpus is unpacked from `apt-get download dict-gcide`)',
  available: availableWhen(dictionaryFile),
  load: () =>
    cached('webster-parts-of-speech', async () => {
      const all = partOfSpeechDefinitions(gunzipSync(readFileSync(dictionaryFile())).toString('utf8'));
      const spaced = evenlySpaced(all, MAX_DOCUMENTS);
      const counts = new Map<string, number>();
      for (const d of spaced) counts.set(d.label, (counts.get(d.label) ?? 0) + 1);
      return spaced.filter((d) => counts.get(d.label)! >= MIN_PER_CLASS);
    }),
};
