// The sample's hash and bottom-k selection.
// Sources: MurmurHash3 x86_32 test vectors from SMHasher's reference implementation (Austin
// Appleby), as listed on Wikipedia's MurmurHash page (from memory, checked against the published
// values): ("", 0) → 0, ("", 1) → 0x514E28B7, ("hello", 0) → 0x248BFA47,
// ("The quick brown fox jumps over the lazy dog", 0x9747B28C) → 0x2FA826CD.
// Bottom-k: Cohen & Kaplan, "Summarizing data using bottom-k sketches", PODC 2007 — the k
// smallest keys, whatever the order the items come in.
import { strict as assert } from 'node:assert';
import { BottomK, compareRanked } from '../extension/src/engine/random/bottom-k';
import { hashFileKey, murmur3, placeKey } from '../extension/src/engine/random/place-hash';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';

describe('place hash and bottom-k', () => {
  it('murmur3 matches the MurmurHash3 x86_32 reference vectors', () => {
    assert.equal(murmur3('', 0), 0);
    assert.equal(murmur3('', 1), 0x514e28b7);
    assert.equal(murmur3('hello', 0), 0x248bfa47);
    assert.equal(murmur3('The quick brown fox jumps over the lazy dog', 0x9747b28c), 0x2fa826cd);
  });

  it('placeKey is in [0, 1), differs by line, file and seed, and is roughly uniform', () => {
    const h = hashFileKey('part-0.jsonl', 1);
    const keys = Array.from({ length: 20000 }, (_, i) => placeKey(h, i + 1));
    assert.ok(keys.every((k) => k >= 0 && k < 1));
    assert.equal(new Set(keys).size, keys.length);
    assert.notEqual(placeKey(hashFileKey('part-1.jsonl', 1), 1), keys[0]);
    assert.notEqual(placeKey(hashFileKey('part-0.jsonl', 2), 1), keys[0]);
    // Ten equal bins of 2,000 expected: each within ±5 standard deviations (sd ≈ 42).
    const bins = new Array<number>(10).fill(0);
    for (const k of keys) bins[Math.floor(k * 10)]!++;
    for (const b of bins) assert.ok(Math.abs(b - 2000) < 5 * Math.sqrt(2000 * 0.9), `bin count ${b}`);
  });

  it('BottomK keeps the k smallest, the same set in any arrival order', () => {
    const random = mulberry32(7);
    const items = Array.from({ length: 500 }, (_, i) => ({ key: Math.floor(random() * 100) / 100, file: `f${i % 3}`, line: i }));
    const expected = [...items].sort(compareRanked).slice(0, 37);
    for (let trial = 0; trial < 5; trial++) {
      const shuffled = [...items].sort(() => random() - 0.5);
      const kept = new BottomK<(typeof items)[number]>(37);
      for (const item of shuffled) kept.push(item);
      assert.deepEqual(kept.items(), expected);
    }
    const none = new BottomK(0);
    none.push({ key: 0, file: 'a', line: 1 });
    assert.equal(none.size, 0);
  });
});
