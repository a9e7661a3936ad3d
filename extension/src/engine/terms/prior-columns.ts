import type { TermIndex } from '../what-if/term-index';
import { ENGLISH_FUNCTION_WORDS, ENGLISH_LIGHT_WORDS } from './function-words';

/**
 * Columns of the vocabulary that the function-word prior names, spelled the way the tokenizer
 * spells them (lower-cased, stemmed, …). With bigrams on, a bigram made only of function words
 * ("of the") belongs to the prior too.
 */
export function priorColumns(
  index: TermIndex,
  tokenize: (text: string) => string[],
  bigrams: boolean,
  words: readonly string[] = ENGLISH_FUNCTION_WORDS,
): Set<number> {
  const forms = new Set<string>();
  for (const word of words) for (const form of tokenize(word)) if (!form.includes(' ')) forms.add(form);
  const columns = new Set(index.columnsOf(forms));
  if (bigrams) {
    for (let j = 0; j < index.terms.length; j++) {
      const term = index.terms[j]!;
      const space = term.indexOf(' ');
      if (space > 0 && forms.has(term.slice(0, space)) && forms.has(term.slice(space + 1))) columns.add(j);
    }
  }
  return columns;
}

/** Columns of the light words (see ENGLISH_LIGHT_WORDS) that are not function words already. */
export function lightWordColumns(index: TermIndex, tokenize: (text: string) => string[], functionWords: ReadonlySet<number>): Set<number> {
  const columns = priorColumns(index, tokenize, false, ENGLISH_LIGHT_WORDS);
  for (const c of functionWords) columns.delete(c);
  return columns;
}

/** Columns of the protected words (negations by default), in the tokenizer's spelling. */
export function protectedColumns(index: TermIndex, tokenize: (text: string) => string[], words: readonly string[]): Set<number> {
  const forms = new Set<string>();
  for (const word of words) {
    forms.add(word);
    // Only whole-word forms: wink-nlp splits "cannot" into "can" + "not", and "can" must not
    // become protected because "cannot" is.
    const tokens = tokenize(word);
    if (tokens.length === 1) forms.add(tokens[0]!);
  }
  return new Set(index.columnsOf(forms));
}
