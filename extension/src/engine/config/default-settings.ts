import type { EffectiveSettings } from '../../protocol';

/**
 * What a review uses when loudword.json says nothing. The weighting defaults match
 * scikit-learn's TfidfVectorizer (raw tf, smooth idf, l2), so figures compare with a notebook.
 */
export const DEFAULT_SETTINGS: EffectiveSettings = Object.freeze({
  format: 'auto',
  text: null,
  label: null,
  stopList: 'stoplist.txt',
  tokens: { lowercase: true, minLength: 2, kinds: ['word', 'number', 'hashtag', 'emoji'], stem: false, ngrams: 1 },
  weighting: { tf: 'raw', idf: 'smooth', norm: 'l2' },
  prune: { minDf: 1, maxDf: 1 },
  sample: { documents: 2000, k: 10, seed: 1 },
  suggest: { max: 500, protect: ['not', 'no', 'never', 'nor', 'neither', 'none', 'nobody', 'nothing', 'nowhere', 'without', 'cannot'], functionWordPrior: true },
  limits: { maxBytes: 2 * 1024 ** 3 },
}) as EffectiveSettings;
