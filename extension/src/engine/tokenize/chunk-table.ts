/** Value `get` returns for a key that is not in the table. */
export const ABSENT = -1;

/** Entries kept before the table starts over; a bound on memory, not on correctness. */
const MAX_ENTRIES = 1 << 20;

/**
 * A hash table from chunks of text to int32 values, looked up by (text, start, end) without
 * cutting the chunk out of its document: the tokenizer's hot loop sees ~90 chunks per document
 * and nearly all are hits, so a substring and a Map lookup per chunk (as `text.split()` then
 * `Map.get` would cost) is the larger part of the work. Open addressing over typed arrays; the
 * hash is FNV-1a over UTF-16 code units, computed by the caller while it scans the chunk.
 */
export class ChunkTable {
  private keys: (string | undefined)[] = [];
  private hashes = new Int32Array(0);
  private values = new Int32Array(0);
  private mask = 0;
  size = 0;

  constructor() {
    this.clear();
  }

  /** Forgets every entry (when MAX_ENTRIES is reached; the caller is told by `set`'s result). */
  clear(): void {
    const capacity = 1 << 16;
    this.keys = new Array<string | undefined>(capacity);
    this.hashes = new Int32Array(capacity);
    this.values = new Int32Array(capacity).fill(ABSENT);
    this.mask = capacity - 1;
    this.size = 0;
  }

  /** The value stored for text[start, end) whose FNV-1a hash is `hash`, or ABSENT. */
  get(text: string, start: number, end: number, hash: number): number {
    const { keys, hashes, values, mask } = this;
    const length = end - start;
    for (let slot = hash & mask; ; slot = (slot + 1) & mask) {
      const v = values[slot]!;
      if (v === ABSENT) return ABSENT;
      if (hashes[slot] !== hash) continue;
      const key = keys[slot]!;
      if (key.length !== length) continue;
      let j = 0;
      while (j < length && key.charCodeAt(j) === text.charCodeAt(start + j)) j++;
      if (j === length) return v;
    }
  }

  /** The value stored for `key`, or ABSENT. */
  getKey(key: string): number {
    return this.get(key, 0, key.length, hashOf(key, 0, key.length));
  }

  /**
   * Stores `value` (≥ -0x7fffffff, never ABSENT) for `key`, replacing an earlier one. Returns
   * false when the table was full and has been cleared first, so the caller can drop what its
   * values point to.
   */
  set(key: string, value: number): boolean {
    const hash = hashOf(key, 0, key.length);
    for (let slot = hash & this.mask; ; slot = (slot + 1) & this.mask) {
      const v = this.values[slot]!;
      if (v === ABSENT) break;
      if (this.hashes[slot] === hash && this.keys[slot] === key) {
        this.values[slot] = value;
        return true;
      }
    }
    let kept = true;
    if (this.size >= MAX_ENTRIES) {
      this.clear();
      kept = false;
    } else if ((this.size + 1) * 2 > this.values.length) {
      this.rehash(this.values.length * 2);
    }
    let slot = hash & this.mask;
    while (this.values[slot] !== ABSENT) slot = (slot + 1) & this.mask;
    // A long key cut from a document would keep the whole document alive; store a copy.
    this.keys[slot] = key.length >= 13 ? (key + ' ').slice(0, -1) : key;
    this.hashes[slot] = hash;
    this.values[slot] = value;
    this.size++;
    return kept;
  }

  private rehash(capacity: number): void {
    const { keys, hashes, values } = this;
    this.keys = new Array<string | undefined>(capacity);
    this.hashes = new Int32Array(capacity);
    this.values = new Int32Array(capacity).fill(ABSENT);
    this.mask = capacity - 1;
    for (let i = 0; i < values.length; i++) {
      if (values[i] === ABSENT) continue;
      let slot = hashes[i]! & this.mask;
      while (this.values[slot] !== ABSENT) slot = (slot + 1) & this.mask;
      this.keys[slot] = keys[i];
      this.hashes[slot] = hashes[i]!;
      this.values[slot] = values[i]!;
    }
  }
}

/** FNV-1a (32-bit) of text[start, end) by UTF-16 code unit; the tokenizer's scan computes the same. */
export function hashOf(text: string, start: number, end: number): number {
  let h = FNV_OFFSET;
  for (let i = start; i < end; i++) h = Math.imul(h ^ text.charCodeAt(i), FNV_PRIME);
  return h;
}

export const FNV_OFFSET = 0x811c9dc5 | 0;
export const FNV_PRIME = 16777619;
