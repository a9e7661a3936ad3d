import { createTokenizer } from '../extension/src/engine/tokenize/create-tokenizer';
import { requireSklearn } from './reference/run-sklearn';
import { assertSameTokens, base, sklearnTokensMany } from './support/sklearn-analyzer';
import { readAllFortunes } from './support/tokenize-oracle';

// Slow suite: tokenizer "pattern" against scikit-learn's analyzer (CountVectorizer(...).build_analyzer(),
// Debian's python3-sklearn) on every Debian fortune; the quick file compares generated Unicode text.

describe('tokenize (sweep): tokenizer "pattern" equals scikit-learn\'s analyzer on Debian fortunes (every saying; source: Debian package "fortunes")', function () {
  this.timeout(600_000);
  const docs = readAllFortunes();
  let theirs: string[][][] = [];
  before(() => {
    requireSklearn();
    theirs = sklearnTokensMany(docs, [
      { lowercase: true, ngram_range: [1, 1] },
      { lowercase: false, ngram_range: [1, 2] },
    ]);
  });

  it('default token_pattern, lowercase, unigrams', () => {
    assertSameTokens(createTokenizer(base), theirs[0]!, docs);
  });
  it('default token_pattern, case kept, unigrams and bigrams', () => {
    assertSameTokens(createTokenizer({ ...base, lowercase: false, ngrams: 2 }), theirs[1]!, docs);
  });
});
