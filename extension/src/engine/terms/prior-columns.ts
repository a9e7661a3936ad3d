import type { TermIndex } from '../what-if/term-index';
import { MARKUP_NAMES } from './markup-names';
import { wordClasses, type WordClass } from './function-words';

export type PriorClass = WordClass | 'markup' | 'phrase';

/**
 * Columns of the vocabulary the prior names, each with its class, spelled the way the tokenizer
 * spells them (lower-cased, stemmed, …). With bigrams on, a bigram of two closed-class words
 * ("of the") is a 'phrase'. A word the tokenizer splits ("cannot" → "can" + "not") names no column.
 */
export function priorColumns(index: TermIndex, tokenize: (text: string) => string[], bigrams: boolean): Map<number, PriorClass> {
  const out = new Map<number, PriorClass>();
  const forms = priorForms(tokenize);
  for (const [form, { cls }] of forms) {
    const c = index.column(form);
    if (c !== undefined) out.set(c, cls);
  }
  if (bigrams) {
    for (let j = 0; j < index.terms.length; j++) {
      const term = index.terms[j]!;
      const space = term.indexOf(' ');
      if (space <= 0) continue;
      const a = forms.get(term.slice(0, space))?.cls;
      const b = forms.get(term.slice(space + 1))?.cls;
      if (a !== undefined && b !== undefined && a !== 'markup' && b !== 'markup') out.set(j, 'phrase');
    }
  }
  return out;
}

/**
 * Each spelling the tokenizer gives the prior's words, with the first word that takes it and its
 * class (the classes of function-words.ts in their order, then markup names), so the choice never
 * depends on the corpus. A word the tokenizer splits ("cannot" → "can" + "not") names none.
 */
export function priorForms(tokenize: (text: string) => string[]): Map<string, { word: string; cls: PriorClass }> {
  const forms = new Map<string, { word: string; cls: PriorClass }>();
  const add = (word: string, cls: PriorClass): void => {
    const tokens = tokenize(word);
    if (tokens.length === 1 && !tokens[0]!.includes(' ') && !forms.has(tokens[0]!)) forms.set(tokens[0]!, { word, cls });
  };
  for (const [word, cls] of wordClasses()) add(word, cls);
  for (const word of MARKUP_NAMES) add(word, 'markup');
  return forms;
}

/**
 * The share of the corpus's word tokens that are the prior's grammar words (markup names and
 * bigrams left out): how much the text reads as English to the rule. English prose of any genre
 * spends a large part of its tokens on them; text in another language, or code and logs, very
 * little (docs/methods.md §9, "Text that is not English"). With bigrams the denominator counts
 * only the unigram columns, so the share does not halve.
 */
export function grammarTokenShare(prior: ReadonlyMap<number, PriorClass>, cf: Float64Array, terms: readonly string[], bigrams: boolean): number {
  let grammar = 0;
  for (const [c, cls] of prior) if (cls !== 'markup' && cls !== 'phrase') grammar += cf[c]!;
  let words = 0;
  for (let c = 0; c < cf.length; c++) if (!bigrams || terms[c]!.indexOf(' ') < 0) words += cf[c]!;
  return words > 0 ? grammar / words : 0;
}

/** Columns of the protected words ("suggest.protect"), in the tokenizer's spelling. */
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
