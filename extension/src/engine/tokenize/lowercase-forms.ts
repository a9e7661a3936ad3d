import type { WinkMethods } from 'wink-nlp';

type Tokens = ReturnType<ReturnType<WinkMethods['readDoc']>['tokens']>;

/**
 * The lower-cased form of each token: the surface text lower-cased, except the parts of a
 * contraction, which take wink-nlp's normal form ("n't" → "not", "ca" → "can", "'re" → "are").
 * wink's normal form of every other token is not just lower-cased: it respells ("through" →
 * "thru", "colour" → "color", "cd" → "could", "da" → "the", "b4" → "before") and keeps some
 * names capitalised ("Steve"), so a term would not be the word the user's pipeline sees
 * (scikit-learn lower-cases and nothing else) and a suggestion could name a word the corpus
 * never spells that way. `values` is the surface text, when the caller already has it.
 */
export function lowercaseForms(tokens: Tokens, its: WinkMethods['its'], values?: readonly string[]): string[] {
  const surface = values ?? (tokens.out() as string[]);
  const contraction = tokens.out(its.contractionFlag) as unknown as boolean[];
  let normals: string[] | null = null;
  const forms = new Array<string>(surface.length);
  for (let i = 0; i < surface.length; i++) {
    if (contraction[i]) {
      normals ??= tokens.out(its.normal) as string[];
      forms[i] = normals[i]!;
    } else {
      forms[i] = surface[i]!.toLowerCase();
    }
  }
  return forms;
}
