import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { mulberry32, sampleIndices } from '../extension/src/engine/random/seeded-random';

describe('random/seeded-random', () => {
  it('mulberry32 repeats for a seed, differs across seeds, stays in [0, 1)', () => {
    const a = mulberry32(42);
    const b = mulberry32(42);
    const c = mulberry32(43);
    const xs = Array.from({ length: 1000 }, () => a());
    assert.deepEqual(xs, Array.from({ length: 1000 }, () => b()));
    assert.notDeepEqual(xs.slice(0, 10), Array.from({ length: 10 }, () => c()));
    assert.ok(xs.every((x) => x >= 0 && x < 1));
  });

  it('mulberry32 is roughly uniform: chi-square over 10 bins below the 0.1% critical value', () => {
    // Source: chi-square critical value for 9 degrees of freedom at p = 0.001 is 27.88
    // (standard statistical tables, from memory).
    const random = mulberry32(7);
    const bins = new Array<number>(10).fill(0);
    const n = 100_000;
    for (let i = 0; i < n; i++) bins[Math.floor(random() * 10)]!++;
    const expected = n / 10;
    const chi2 = bins.reduce((s, o) => s + ((o - expected) ** 2) / expected, 0);
    assert.ok(chi2 < 27.88, `chi2 = ${chi2}`);
  });

  it('sampleIndices gives m distinct sorted indices below n, the same for the same seed', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 5000 }), fc.integer({ min: 0, max: 300 }), fc.integer(), (n, m, seed) => {
        const s = sampleIndices(n, m, seed);
        assert.equal(s.length, Math.min(n, m));
        for (let i = 1; i < s.length; i++) assert.ok(s[i - 1]! < s[i]!);
        if (s.length > 0) assert.ok(s[s.length - 1]! < n);
        assert.deepEqual(sampleIndices(n, m, seed), s);
      }),
      { numRuns: 200 },
    );
  });

  it('sampleIndices with m ≥ n returns every index', () => {
    assert.deepEqual(Array.from(sampleIndices(5, 5, 1)), [0, 1, 2, 3, 4]);
    assert.deepEqual(Array.from(sampleIndices(3, 10, 1)), [0, 1, 2]);
    assert.equal(sampleIndices(0, 10, 1).length, 0);
  });

  it('sampleIndices changes with the seed and covers the range evenly', () => {
    assert.notDeepEqual(sampleIndices(1_000_000, 50, 1), sampleIndices(1_000_000, 50, 2));
    // Each index is drawn with probability m/n; over 200 seeds each of 20 indices is expected
    // 200·5/20 = 50 times (binomial sd ≈ 6.1). Common practice, no source: ±5 sd bounds.
    const hits = new Array<number>(20).fill(0);
    for (let seed = 0; seed < 200; seed++) for (const i of sampleIndices(20, 5, seed)) hits[i]!++;
    for (const h of hits) assert.ok(Math.abs(h - 50) < 31, `hits ${hits.join(',')}`);
  });

  it('sampleIndices rejects bad arguments with RangeError', () => {
    assert.throws(() => sampleIndices(-1, 2, 1), RangeError);
    assert.throws(() => sampleIndices(10, 2.5, 1), RangeError);
  });
});
