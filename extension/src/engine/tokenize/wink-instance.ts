import type { WinkMethods } from 'wink-nlp';

/** Which wink-nlp pipe to run: none (tokens only) or sentence boundaries (for bigrams). */
export type WinkPipe = 'tokens' | 'sentences';

const instances = new Map<WinkPipe, WinkMethods>();

/**
 * The wink-nlp instance for a pipe, created on first use and kept: loading the English model
 * takes a few hundred milliseconds, which a review should pay once, and a CLI run that fails
 * before tokenising should not pay at all. The empty pipe skips part-of-speech, entities,
 * negation and sentiment, none of which a bag of words uses.
 */
export function winkInstance(pipe: WinkPipe): WinkMethods {
  let nlp = instances.get(pipe);
  if (nlp === undefined) {
    // Required here rather than imported at the top so the model is parsed only when needed.
    const winkNLP = require('wink-nlp') as (model: unknown, pipe: string[]) => WinkMethods;
    nlp = winkNLP(winkModel(), pipe === 'tokens' ? [] : ['sbd']);
    instances.set(pipe, nlp);
  }
  return nlp;
}

/** Porter stemmer shipped with the model (the same one `its.stem` calls). */
export function winkStemmer(): (word: string) => string {
  return winkModel().addons.stem;
}

function winkModel(): { addons: { stem: (word: string) => string } } {
  return require('wink-eng-lite-web-model') as { addons: { stem: (word: string) => string } };
}
