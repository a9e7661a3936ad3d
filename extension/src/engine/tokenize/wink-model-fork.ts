/** wink's core model after its loader has run (wink-eng-lite-web-model's load-core-model.js). */
export interface LoadedCoreModel {
  features: Record<string, LoadedFeature>;
  [part: string]: unknown;
}

interface LoadedFeature {
  list: unknown[];
  /** Value → index, for the features wink may add values to (absent for the others). */
  hash?: Record<string, number>;
  /** The next index `getFeaturesIndex` gives out (the list's length). */
  index?: number;
  [part: string]: unknown;
}

/**
 * A model for one more wink-nlp instance that starts in exactly the state a fresh read of the
 * model gives, without reading it again.
 *
 * Why this is the same (wink-nlp 2.4 src/cache.js): the only code of an instance that changes
 * its model is `getFeaturesIndex`, which, for a value a feature's `hash` lacks, sets
 * `hash[value] = index`, pushes the value onto its `list` and moves `index` on. Every other part
 * of the model (the packed lexicon, the expansions, the regexes, the layouts) is only read. So
 * each feature that has a `hash` gets its own `list` (a copy), its own `index`, and a `hash`
 * whose own keys are the values this instance adds, with the pristine hash as its prototype:
 * a lookup finds an added value first and every original one through the prototype, and the
 * pristine model never changes. The hash has no `Object.prototype` in its chain (the pristine
 * hash is made with `Object.create(null)`), so "constructor" or "__proto__" are plain keys, as
 * in wink's own. Nothing enumerates a hash (wink or this project: lexeme-filter.ts reads the list).
 */
export function forkOfCoreModel(pristine: LoadedCoreModel): LoadedCoreModel {
  const features: Record<string, LoadedFeature> = {};
  for (const name of Object.keys(pristine.features)) {
    const feature = pristine.features[name]!;
    features[name] =
      feature.hash === undefined ? feature : { ...feature, list: feature.list.slice(), hash: Object.create(feature.hash) as Record<string, number> };
  }
  return { ...pristine, features };
}
