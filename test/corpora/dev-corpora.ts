import { AUSTEN_CHAPTERS } from './austen-chapters';
import { FINE_FOOD_REVIEWS, FINE_FOOD_REVIEWS_5K } from './fine-food-reviews';
import { FORTUNE_CATEGORIES, fortunesAvailable, readFortunes } from './fortunes';
import { KERNEL_DOCS } from './kernel-docs';
import { KJV_CHAPTERS } from './kjv-chapters';
import type { DevCorpus } from './labelled-corpus';
import { MAN_PAGES } from './man-pages';
import { PACKAGE_DESCRIPTIONS, PACKAGE_DESCRIPTIONS_20K, PACKAGE_SYNOPSES } from './package-descriptions';
import { PYTHON_DOCS } from './python-docs';
import { RATED_SENTENCES } from './rated-sentences';
import { REUTERS_SAMPLE } from './reuters-sample';
import { SOTU } from './sotu';
import { SPAM_ASSASSIN } from './spam-assassin';
import { WEBSTER_DEFINITIONS } from './webster-definitions';
import { WEBSTER_PARTS_OF_SPEECH } from './webster-parts-of-speech';
import { WORDNET_GLOSSES } from './wordnet-glosses';

/**
 * Debian fortunes, 12 categories. Source: Debian package `fortunes`. CHECK: the fortunes test
 * (test/review-fortunes.test.ts) judges the suggestions on it, so nothing is tuned on it.
 */
export const FORTUNES: DevCorpus = {
  name: 'fortunes',
  genre: 'short quotations and jokes',
  role: 'CHECK',
  source: 'Debian fortunes; label = category file',
  missing: 'apt-get install fortunes',
  available: fortunesAvailable,
  load: async () => readFortunes(FORTUNE_CATEGORIES).map((f) => ({ text: f.text, label: f.category })),
};

/** The development set (test/corpora/README.md): TUNE first, then CHECK. */
export const DEV_CORPORA: readonly DevCorpus[] = [SPAM_ASSASSIN, SOTU, MAN_PAGES, WEBSTER_DEFINITIONS, WEBSTER_PARTS_OF_SPEECH, FORTUNES, PACKAGE_DESCRIPTIONS, KJV_CHAPTERS, RATED_SENTENCES, REUTERS_SAMPLE, AUSTEN_CHAPTERS, FINE_FOOD_REVIEWS, KERNEL_DOCS, PYTHON_DOCS, WORDNET_GLOSSES, PACKAGE_SYNOPSES];

/**
 * Larger versions of development corpora, run only when named (`npm run quality -- <name>`):
 * they check that the rule holds at the size a user's corpus may have, and take minutes each.
 */
export const LARGE_CORPORA: readonly DevCorpus[] = [PACKAGE_DESCRIPTIONS_20K, FINE_FOOD_REVIEWS_5K];

/** The corpora a quality script runs: the development set, or the ones named (large ones included). */
export function corporaNamed(names: readonly string[]): DevCorpus[] {
  if (names.length === 0) return [...DEV_CORPORA];
  const all = [...DEV_CORPORA, ...LARGE_CORPORA];
  const unknown = names.filter((n) => !all.some((c) => c.name === n));
  if (unknown.length > 0) throw new Error(`unknown corpus ${unknown.join(', ')}; known: ${all.map((c) => c.name).join(', ')}`);
  return all.filter((c) => names.includes(c.name));
}
