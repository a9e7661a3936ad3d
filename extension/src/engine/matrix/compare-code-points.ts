/**
 * Orders strings by Unicode code point, as Python's sorted() does, so that column j of our
 * matrix is column j of scikit-learn's vocabulary_. JavaScript's default sort compares UTF-16
 * code units, which puts astral characters (emoji, U+10000 and up, stored as surrogates
 * D800–DFFF) before U+E000–U+FFFF (e.g. full-width forms); the fix-up below moves surrogates
 * above that range, the usual way to get code point order from UTF-16.
 */
export function compareCodePoints(a: string, b: string): number {
  const n = Math.min(a.length, b.length);
  for (let i = 0; i < n; i++) {
    let x = a.charCodeAt(i);
    let y = b.charCodeAt(i);
    if (x === y) continue;
    if (x >= 0xd800 && y >= 0xd800) {
      x = x >= 0xe000 ? x - 0x800 : x + 0x2000;
      y = y >= 0xe000 ? y - 0x800 : y + 0x2000;
    }
    return x - y;
  }
  return a.length - b.length;
}

/**
 * `terms` sorted by code point, as a new array. The native sort (UTF-16 code units, no JavaScript
 * comparator: ~4× faster on 100k terms) gives the same order unless some term holds a surrogate
 * and some term a unit in U+E000–U+FFFF, the only units the two orders rank differently; then it
 * sorts with compareCodePoints.
 */
export function sortByCodePoint(terms: readonly string[]): string[] {
  let surrogate = false;
  let highBmp = false;
  for (const t of terms) {
    for (let i = 0; i < t.length; i++) {
      const c = t.charCodeAt(i);
      if (c < 0xd800) continue;
      if (c < 0xe000) surrogate = true;
      else highBmp = true;
    }
  }
  return surrogate && highBmp ? [...terms].sort(compareCodePoints) : [...terms].sort();
}

/**
 * Where each of `terms` stands in `among`, or −1 where `among` lacks it; both in code point
 * order. A binary search from the last place found: for a shard's few thousand terms among a
 * merged vocabulary of hundreds of thousands, much less than a map of the vocabulary, which a
 * corpus of many small shards built once per shard and round (engine/shards/sum-shard.ts).
 */
export function placesAmong(terms: readonly string[], among: readonly string[]): Int32Array {
  const places = new Int32Array(terms.length);
  let from = 0;
  for (let i = 0; i < terms.length; i++) {
    const term = terms[i]!;
    let lo = from;
    let hi = among.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (compareCodePoints(among[mid]!, term) < 0) lo = mid + 1;
      else hi = mid;
    }
    places[i] = lo < among.length && among[lo] === term ? lo : -1;
    from = lo;
  }
  return places;
}
