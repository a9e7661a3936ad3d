import { createTermCoder, type TokenSettings } from './create-tokenizer';
import type { TermCoder } from './term-coder';
import { freshWinkInstance } from './wink-instance';

/**
 * A term coder whose tokeniser has seen nothing before, in this thread. wink-nlp's output depends
 * on what its instance has tokenised before (chunk-cached-unigrams.ts, point 2), so a file's terms
 * are a function of the file alone only when each file starts from a fresh instance and its
 * documents go through it in order. That is what makes a corpus of many files count the same
 * whether one process reads them all or each shard step reads one (matrix/count-each-file.ts).
 */
export function freshTermCoder(tokens: TokenSettings): TermCoder {
  // The pattern tokenizer keeps no state between documents and never calls wink: a wink
  // instance for it would only cost time.
  if (tokens.tokenizer === 'pattern') return createTermCoder(tokens);
  return createTermCoder(tokens, { nlp: freshWinkInstance(tokens.ngrams === 2 ? 'sentences' : 'tokens') });
}
