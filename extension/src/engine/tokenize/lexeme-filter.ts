import { hashOf } from './chunk-table';

/**
 * Which strings can be lexemes of one wink-nlp instance, by their FNV-1a hash (chunk-table.ts's
 * `hashOf`, the hash the chunk scan computes anyway): a Bloom filter of one int32 per probe. A
 * "no" is exact, a "yes" means "ask wink". The chunk-cached coder asks wink whether a chunk is a
 * lexeme for every chunk it meets for the first time (~310k asks for half the 100k bench
 * corpus, ~97% of them no): a keyed load on wink's 90k-key dictionary with a string just cut out
 * of its document, which V8 hashes and seeks in its string table, ~1.3 µs each. The filter
 * answers the noes in a few nanoseconds.
 *
 * Why a "no" is exact (wink-nlp 2.4 src/cache.js, and our reader of its model,
 * wink-core-model.ts): `lookup(text)` is `lexemesHash[text]`, where `lexemesHash` is
 * `model.features.lexeme.hash`; it is built from `model.features.lexeme.list` (each entry at its
 * index), and the only code that adds a key, `getFeaturesIndex`, pushes that key onto the same
 * list. So every key of the hash is an entry of the list, which only grows. The filter holds the
 * hash of every entry up to the list's length, and catches up with the list before it answers.
 */
export class LexemeFilter {
  /** 2^16 words of 32 bits; a key sets two bits of the word its hash's high half picks. */
  private readonly words: Int32Array;
  /** Entries of `list` whose hashes are in `words`. */
  private seen: number;

  /**
   * `list`: the instance's `model.features.lexeme.list` (its lexemes by index; it only grows).
   * `startFrom`: a filter whose list is, entry for entry, the start of this one (the model's own
   * lexemes, which every instance's list begins with): its words are copied instead of hashing
   * those 87,593 entries again (~2.7 ms, once per file of a corpus of many files).
   */
  constructor(
    private readonly list: readonly unknown[],
    startFrom?: LexemeFilter,
  ) {
    if (startFrom === undefined) {
      this.words = new Int32Array(1 << 16);
      this.seen = 0;
    } else {
      if (startFrom.seen !== startFrom.list.length) startFrom.catchUp();
      this.words = startFrom.words.slice();
      this.seen = startFrom.seen;
    }
  }

  /** False when no lexeme of the instance has the FNV-1a hash `hash` (then the string is none). */
  mayHave(hash: number): boolean {
    if (this.seen !== this.list.length) this.catchUp();
    const mask = bitsOf(hash);
    return (this.words[hash >>> 16]! & mask) === mask;
  }

  private catchUp(): void {
    const { list, words } = this;
    for (let k = this.seen; k < list.length; k++) {
      const entry = list[k];
      // A key of the hash is the entry as a property name.
      const key = typeof entry === 'string' ? entry : String(entry);
      const hash = hashOf(key, 0, key.length);
      words[hash >>> 16] |= bitsOf(hash);
    }
    this.seen = list.length;
  }
}

/** The two bits a hash sets in the word its high half picks (from its low ten bits). */
function bitsOf(hash: number): number {
  return (1 << (hash & 31)) | (1 << ((hash >>> 5) & 31));
}
