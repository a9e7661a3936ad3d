import { IdList } from './id-list';

/**
 * A tokenizer that gives term ids instead of strings: `encodeAll` appends the ids of each
 * document's terms to one list, and `terms[id]` is the term. Ids are dense and stay valid for
 * the coder's life (first-seen order), so a batch only has to name the terms it used for the
 * first time. Taking a batch at once lets the chunk-cached coder run its wink misses together.
 */
export interface TermCoder {
  /**
   * Appends the term ids of texts[0], texts[1], … to `out`; docEnds[d] is out.length after
   * text d. Pushes to `longRunDocs` the index of each text that had an over-long run cut.
   */
  encodeAll(texts: readonly string[], out: IdList, docEnds: Uint32Array, longRunDocs: number[]): void;
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
    encodeAll(texts, out, docEnds, longRunDocs) {
      for (let d = 0; d < texts.length; d++) {
        const runsBefore = tokenize.longRunsCut;
        const terms = tokenize(texts[d]!);
        if (tokenize.longRunsCut !== runsBefore) longRunDocs.push(d);
        out.reserve(terms.length);
        for (let i = 0; i < terms.length; i++) out.push(vocabulary.id(terms[i]!));
        docEnds[d] = out.length;
      }
    },
    terms: vocabulary.terms,
    get longRunsCut() {
      return tokenize.longRunsCut;
    },
  };
}

/** The string tokenizer a coder amounts to: encode one text, then each id's term. */
export function decodingTokenizer(coder: TermCoder): ((text: string) => string[]) & { readonly longRunsCut: number } {
  const ids = new IdList();
  const end = new Uint32Array(1);
  const tokenize = (text: string): string[] => {
    ids.length = 0;
    coder.encodeAll([text], ids, end, []);
    const out = new Array<string>(ids.length);
    for (let i = 0; i < ids.length; i++) out[i] = coder.terms[ids.at(i)]!;
    return out;
  };
  return Object.defineProperty(tokenize, 'longRunsCut', { get: () => coder.longRunsCut }) as typeof tokenize & { readonly longRunsCut: number };
}
