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
  /** terms[0, indexed) are in idOf; the ones `append` added after them are indexed when `id` next runs. */
  private indexed = 0;

  id(term: string): number {
    if (this.indexed < this.terms.length) this.index();
    let id = this.idOf.get(term);
    if (id === undefined) {
      id = this.terms.length;
      this.idOf.set(term, id);
      this.terms.push(term);
      this.indexed++;
    }
    return id;
  }

  /**
   * Adds a term the caller knows is not in the vocabulary yet, and returns its id, without the
   * look-up and the map entry (~2 µs a term at 10^5 terms) until `id` is called again.
   */
  append(term: string): number {
    this.terms.push(term);
    return this.terms.length - 1;
  }

  private index(): void {
    for (let id = this.indexed; id < this.terms.length; id++) this.idOf.set(this.terms[id]!, id);
    this.indexed = this.terms.length;
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
