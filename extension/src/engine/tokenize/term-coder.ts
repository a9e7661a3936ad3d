import { IdList } from './id-list';

/**
 * A tokenizer that gives term ids instead of strings: `encode` appends the ids of a document's
 * terms to a list, and `terms[id]` is the term. Ids are dense and stay valid for the coder's
 * life (first-seen order), so a batch only has to name the terms it used for the first time.
 */
export interface TermCoder {
  encode(text: string, out: IdList): void;
  readonly terms: readonly string[];
  /** Runs without spaces longer than MAX_RUN cut into pieces so far (long-runs.ts). */
  readonly longRunsCut: number;
}

/** Term ↔ id, ids in first-seen order. */
export class Vocabulary {
  readonly terms: string[] = [];
  private readonly idOf = new Map<string, number>();

  id(term: string): number {
    let id = this.idOf.get(term);
    if (id === undefined) {
      id = this.terms.length;
      this.idOf.set(term, id);
      this.terms.push(term);
    }
    return id;
  }
}

/** A coder over a string tokenizer (bigrams, the pattern tokenizer, whole-document wink). */
export function internedCoder(tokenize: ((text: string) => string[]) & { readonly longRunsCut: number }): TermCoder {
  const vocabulary = new Vocabulary();
  return {
    encode(text, out) {
      const terms = tokenize(text);
      out.reserve(terms.length);
      for (let i = 0; i < terms.length; i++) out.push(vocabulary.id(terms[i]!));
    },
    terms: vocabulary.terms,
    get longRunsCut() {
      return tokenize.longRunsCut;
    },
  };
}

/** The string tokenizer a coder amounts to: `encode`, then each id's term. */
export function decodingTokenizer(coder: TermCoder): ((text: string) => string[]) & { readonly longRunsCut: number } {
  const ids = new IdList();
  const tokenize = (text: string): string[] => {
    ids.length = 0;
    coder.encode(text, ids);
    const out = new Array<string>(ids.length);
    for (let i = 0; i < ids.length; i++) out[i] = coder.terms[ids.at(i)]!;
    return out;
  };
  return Object.defineProperty(tokenize, 'longRunsCut', { get: () => coder.longRunsCut }) as typeof tokenize & { readonly longRunsCut: number };
}
