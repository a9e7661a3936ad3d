/** Value `get` returns for a key that is not in the table. */
export const ABSENT = -1;

/** Entries kept before the table starts over; a bound on memory, not on correctness. */
const MAX_ENTRIES = 1 << 20;

// One slot is eight int32s side by side (two slots to a cache line): the key's hash, the value,
// the key's length in UTF-16 code units, then the key itself when it is short (INLINE code units
// or fewer, two to an int32, the first in the low half), else where its code units sit in `chars`.
const HASH = 0;
const VALUE = 1;
const LENGTH = 2;
const KEY = 3;
const OFFSET = KEY;
const SLOT = 8;
/** Code units of a key kept in its slot: five int32s of two each. */
const INLINE = 10;

/**
 * A hash table from chunks of text to int32 values, looked up by (text, start, end) without
 * cutting the chunk out of its document: the tokenizer's hot loop sees ~90 chunks per document
 * and nearly all are hits, so a substring and a Map lookup per chunk (as `text.split()` then
 * `Map.get` would cost) is the larger part of the work. Open addressing; a key of up to INLINE
 * code units (~96% of the tokens of the bench corpus, most of English) is kept in its slot, so a
 * lookup touches one cache line and no string object; a longer key's code units are copied into
 * one Uint16Array beside the slots. (With every key in that array, each lookup read two places
 * far apart in memory, and the profile of the pattern tokenizer put ~40% of its scan in those
 * two loads.) The hash is FNV-1a over UTF-16 code units, computed by the caller while it scans
 * the chunk (`hashOf` gives the same).
 */
export class ChunkTable {
  private slots = new Int32Array(0);
  private chars = new Uint16Array(0);
  private used = 0; // code units of `chars` in use
  private mask = 0;
  size = 0;

  /**
   * `maxEntries`: how many entries it keeps before it starts over (tests pass a small one);
   * `capacity`: slots to begin with, a power of two (a warm-up passes a small one, so that a few
   * keys take the paths of probing, growing and long keys).
   */
  constructor(
    private readonly maxEntries = MAX_ENTRIES,
    private readonly capacity = 1 << 16,
  ) {
    this.clear();
  }

  /** Forgets every entry (when maxEntries is reached; the caller is told by `set`'s result). */
  clear(): void {
    const capacity = this.capacity;
    this.slots = emptySlots(capacity);
    this.chars = new Uint16Array(capacity >>> 2);
    this.used = 0;
    this.mask = capacity - 1;
    this.size = 0;
  }

  /** The value stored for text[start, end) whose FNV-1a hash is `hash`, or ABSENT. */
  get(text: string, start: number, end: number, hash: number): number {
    const { slots, mask } = this;
    const length = end - start;
    for (let slot = hash & mask; ; slot = (slot + 1) & mask) {
      const at = slot * SLOT;
      const v = slots[at + VALUE]!;
      if (v === ABSENT) return ABSENT;
      if (slots[at + HASH] !== hash || slots[at + LENGTH] !== length) continue;
      if (length > INLINE) {
        if (this.sameLongKey(slots[at + OFFSET]!, text, start, end)) return v;
        continue;
      }
      let j = start;
      let w = at + KEY;
      for (; j + 1 < end; j += 2, w++) if (slots[w] !== (text.charCodeAt(j) | (text.charCodeAt(j + 1) << 16))) break;
      if (j + 1 < end) continue;
      if (j === end || slots[w] === text.charCodeAt(j)) return v;
    }
  }

  /** Whether the long key stored at `offset` of `chars` is text[start, end) (same length). */
  private sameLongKey(offset: number, text: string, start: number, end: number): boolean {
    const { chars } = this;
    const shift = offset - start;
    let j = start;
    while (j < end && chars[shift + j] === text.charCodeAt(j)) j++;
    return j === end;
  }

  /** The value stored for `key`, or ABSENT. */
  getKey(key: string): number {
    return this.get(key, 0, key.length, hashOf(key, 0, key.length));
  }

  /**
   * Stores `value` (never ABSENT) for `key`, replacing an earlier one. Returns false when the
   * table was full and has been cleared first, so the caller can drop what its values point to.
   */
  set(key: string, value: number): boolean {
    const hash = hashOf(key, 0, key.length);
    const slot = this.find(key, hash);
    if (this.slots[slot * SLOT + VALUE] !== ABSENT) {
      this.slots[slot * SLOT + VALUE] = value;
      return true;
    }
    return this.insertAbsent(key, 0, key.length, hash, value);
  }

  /**
   * Stores `value` (never ABSENT) for text[start, end), whose FNV-1a hash is `hash`, a key the
   * table does not hold (`get` has just said so): no hashing and no key compared on the way to
   * its slot. Returns false as `set` does.
   */
  insertAbsent(text: string, start: number, end: number, hash: number, value: number): boolean {
    let kept = true;
    if (this.size >= this.maxEntries) {
      this.clear();
      kept = false;
    } else if ((this.size + 1) * 2 > this.mask + 1) {
      this.rehash((this.mask + 1) * 2);
    }
    const { slots, mask } = this;
    let slot = hash & mask;
    while (slots[slot * SLOT + VALUE] !== ABSENT) slot = (slot + 1) & mask;
    const at = slot * SLOT;
    const length = end - start;
    slots[at + HASH] = hash;
    slots[at + VALUE] = value;
    slots[at + LENGTH] = length;
    if (length <= INLINE) {
      // Two code units to an int32; an odd key's last int32 has 0 in its high half.
      for (let j = 0; j < length; j += 2) slots[at + KEY + (j >> 1)] = text.charCodeAt(start + j) | (j + 1 < length ? text.charCodeAt(start + j + 1) << 16 : 0);
    } else {
      this.storeLongKey(at, text, start, end);
    }
    this.size++;
    return kept;
  }

  /** Copies a key longer than INLINE into `chars` and points the slot at `at` to it. */
  private storeLongKey(at: number, text: string, start: number, end: number): void {
    const length = end - start;
    if (this.used + length > this.chars.length) {
      let size = this.chars.length * 2;
      while (size < this.used + length) size *= 2;
      const grown = new Uint16Array(size);
      grown.set(this.chars.subarray(0, this.used));
      this.chars = grown;
    }
    for (let i = 0; i < length; i++) this.chars[this.used + i] = text.charCodeAt(start + i);
    this.slots[at + OFFSET] = this.used;
    this.used += length;
  }

  /** The slot holding `key`, or the empty slot where it would go. */
  private find(key: string, hash: number): number {
    for (let slot = hash & this.mask; ; slot = (slot + 1) & this.mask) {
      const at = slot * SLOT;
      if (this.slots[at + VALUE] === ABSENT) return slot;
      if (this.slots[at + HASH] !== hash || this.slots[at + LENGTH] !== key.length) continue;
      if (key.length > INLINE ? this.sameLongKey(this.slots[at + OFFSET]!, key, 0, key.length) : this.sameShortKey(at, key)) return slot;
    }
  }

  /** Whether the short key in the slot at `at` is `key` (same length). */
  private sameShortKey(at: number, key: string): boolean {
    for (let j = 0; j < key.length; j += 2) {
      const unit = key.charCodeAt(j) | (j + 1 < key.length ? key.charCodeAt(j + 1) << 16 : 0);
      if (this.slots[at + KEY + (j >> 1)] !== unit) return false;
    }
    return true;
  }

  /**
   * Moves every entry into a table of `capacity` slots. A slot's eight int32s are copied one by
   * one: `set` from a `subarray` made a typed array per entry (~100k in a tokenising thread at
   * 100k documents), which took half of the growths' CPU (docs/performance.md, "The pattern
   * review's start").
   */
  private rehash(capacity: number): void {
    const old = this.slots;
    const slots = emptySlots(capacity);
    const mask = capacity - 1;
    for (let at = 0; at < old.length; at += SLOT) {
      if (old[at + VALUE] === ABSENT) continue;
      let slot = old[at + HASH]! & mask;
      while (slots[slot * SLOT + VALUE] !== ABSENT) slot = (slot + 1) & mask;
      const to = slot * SLOT;
      for (let k = 0; k < SLOT; k++) slots[to + k] = old[at + k]!;
    }
    this.slots = slots;
    this.mask = mask;
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

/** `capacity` slots, every one ABSENT. */
function emptySlots(capacity: number): Int32Array<ArrayBuffer> {
  const slots = new Int32Array(capacity * SLOT);
  for (let s = 0; s < capacity; s++) slots[s * SLOT + VALUE] = ABSENT;
  return slots;
}
