/**
 * A small seeded pseudo-random generator, so every sample and every test is reproducible.
 *
 * mulberry32 by Tommy Ettinger (public domain, 2017): one 32-bit state, a Weyl-sequence step
 * and an xorshift-multiply output mix. Its period is 2^32, which is plenty for drawing a few
 * thousand sample indices; it is not for cryptography.
 */
export function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A uniform integer in [0, bound) from a generator of [0, 1) floats. */
export function randomBelow(random: () => number, bound: number): number {
  return Math.floor(random() * bound);
}

/**
 * m distinct indices of 0..n−1, ascending, the same for the same (n, m, seed); m ≥ n gives all.
 *
 * Floyd's algorithm (Bentley & Floyd, "A sample of brilliance", CACM 30(9), 1987) draws exactly
 * m random numbers and needs memory for the m chosen only, so a 2,000-document sample of a
 * million-document corpus costs 2,000 steps, not a shuffle of a million.
 */
export function sampleIndices(n: number, m: number, seed: number): Uint32Array {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`sampleIndices: n must be a non-negative integer, got ${n}`);
  if (!Number.isInteger(m) || m < 0) throw new RangeError(`sampleIndices: m must be a non-negative integer, got ${m}`);
  if (m >= n) {
    const all = new Uint32Array(n);
    for (let i = 0; i < n; i++) all[i] = i;
    return all;
  }
  const random = mulberry32(seed);
  const chosen = new Set<number>();
  for (let j = n - m; j < n; j++) {
    const t = randomBelow(random, j + 1);
    chosen.add(chosen.has(t) ? j : t);
  }
  const out = Uint32Array.from(chosen);
  out.sort();
  return out;
}
