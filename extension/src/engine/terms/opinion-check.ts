import type { WinkMethods } from 'wink-nlp';

/**
 * Share of documents that carry a clear opinion, by wink-nlp's sentiment scorer (a general
 * English sentiment lexicon with negation handling, the library's `its.sentiment`, in −1..1).
 * Read on the first characters of a sample of documents: enough for short texts, which is where
 * the question matters.
 */
export function opinionShare(texts: readonly string[]): number {
  if (texts.length === 0) return 0;
  const nlp = sentimentInstance();
  let strong = 0;
  for (const text of texts) {
    const s = nlp.readDoc(text).out(nlp.its.sentiment) as unknown as number;
    if (Math.abs(s) >= STRONG_SENTIMENT) strong++;
  }
  return strong / texts.length;
}

/** |sentiment| from which a text reads as a clear opinion (wink's scale; common practice, no source). */
export const STRONG_SENTIMENT = 0.25;

/**
 * When at least this share of documents carries a clear opinion, the corpus reads as opinion
 * text: its labels, if any, are likely ratings or stances, and negations, intensifiers and
 * contrast words carry them (docs/methods.md §9). Set above every topic-labelled corpus of the
 * development set (highest 0.31: fortunes and the State of the Union addresses); no opinion
 * corpus was at hand to tune it on, so it is a bound, not a fit.
 */
export const OPINION_SHARE = 0.45;

/**
 * Only documents this short (mean kept tokens) can read as opinion text: the check reads each
 * document's first 120 characters, a fair part of a short review but only the greeting of a
 * speech or a report (State of the Union openings read as 47% "opinion", their full text far
 * less). The cap only has to keep speeches and reports out: film and product reviews average a
 * few hundred words at most (film reviews about 230 — from memory), so a cap at that length would
 * split one corpus of reviews by its mean; 500 is twice that, and the development set's long
 * documents (man pages, KJV chapters, speeches) read far below the share anyway (docs/methods.md §9).
 */
export const SHORT_DOCUMENT_TOKENS = 500;

let instance: WinkMethods | null = null;
function sentimentInstance(): WinkMethods {
  if (instance === null) {
    const winkNLP = require('wink-nlp') as (model: unknown, pipe: string[]) => WinkMethods;
    instance = winkNLP(require('wink-eng-lite-web-model'), ['sbd', 'negation', 'sentiment']);
  }
  return instance;
}
