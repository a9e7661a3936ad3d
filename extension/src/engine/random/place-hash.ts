/**
 * A document's sampling key from its place (file key, line): a 53-bit hash scaled to [0, 1).
 * The review's sample is the m documents with the smallest keys (bottom-k sampling: Cohen &
 * Kaplan, "Summarizing data using bottom-k sketches", PODC 2007), which depends only on the places
 * and the seed — not on how the corpus is split into files or in which order shards are read —
 * so a review spread over many machines picks exactly the documents one process picks.
 *
 * The string hash is MurmurHash3's x86_32 (Austin Appleby, public domain), run twice with
 * different seeds; the line is mixed in with MurmurHash3's 32-bit finaliser. Not cryptographic.
 */
export function hashFileKey(key: string, seed: number): [number, number] {
  return [murmur3(key, seed >>> 0), murmur3(key, (seed ^ 0x9e3779b9) >>> 0)];
}

/** The sampling key of line `line` of a file whose key hashes to `fileHash`. */
export function placeKey(fileHash: readonly [number, number], line: number): number {
  const hi = fmix32((fileHash[0] ^ Math.imul(line >>> 0, 0xcc9e2d51)) >>> 0);
  const lo = fmix32((fileHash[1] ^ Math.imul((line / 4294967296) >>> 0, 0x1b873593) ^ Math.imul(line >>> 0, 0x85ebca6b)) >>> 0);
  return (hi * 2097152 + (lo >>> 11)) / 9007199254740992;
}

/** MurmurHash3's 32-bit finaliser: every input bit reaches every output bit. */
export function fmix32(h: number): number {
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

export function murmur3(text: string, seed: number): number {
  const bytes = Buffer.from(text, 'utf8');
  let h = seed >>> 0;
  const c1 = 0xcc9e2d51;
  const c2 = 0x1b873593;
  const blocks = bytes.length - (bytes.length % 4);
  for (let i = 0; i < blocks; i += 4) {
    let k = bytes[i]! | (bytes[i + 1]! << 8) | (bytes[i + 2]! << 16) | (bytes[i + 3]! << 24);
    k = Math.imul(k, c1);
    k = (k << 15) | (k >>> 17);
    k = Math.imul(k, c2);
    h ^= k;
    h = (h << 13) | (h >>> 19);
    h = (Math.imul(h, 5) + 0xe6546b64) | 0;
  }
  const tail = bytes.length & 3;
  if (tail > 0) {
    let k = 0;
    if (tail === 3) k ^= bytes[blocks + 2]! << 16;
    if (tail >= 2) k ^= bytes[blocks + 1]! << 8;
    k ^= bytes[blocks]!;
    k = Math.imul(k, c1);
    k = (k << 15) | (k >>> 17);
    k = Math.imul(k, c2);
    h ^= k;
  }
  h ^= bytes.length;
  return fmix32(h >>> 0);
}
