import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { cumulativeMassShare, pairMass, termSpread, termSums } from '../extension/src/engine/measures/term-sums';
import { denseToCsr, dot, randomUnitRows } from './measures-fixtures';

describe('measures/term-sums', () => {
  for (const seed of [1, 2, 3]) {
    it(`pairMass equals brute-force all-pairs sums to 1e-9 (corpus seed ${seed})`, () => {
      // Source: docs/methods.md §3 — P(t) = (S1² − S2)/2 must equal Σ_{a<b} x_at·x_bt; the check
      // value is the O(n²) brute-force sum itself.
      const random = mulberry32(seed);
      const rows = randomUnitRows(random, 40, 25, 0.2, 7);
      const X = denseToCsr(rows);
      const sums = termSums(X);
      const nonEmpty = rows.filter((r) => r.some((v) => v !== 0)).length;
      const mass = pairMass(sums, nonEmpty);
      const perTerm = new Array<number>(25).fill(0);
      let total = 0;
      let pairs = 0;
      let cosSum = 0;
      for (let a = 0; a < rows.length; a++) {
        for (let b = a + 1; b < rows.length; b++) {
          for (let t = 0; t < 25; t++) perTerm[t]! += rows[a]![t]! * rows[b]![t]!;
          total += dot(rows[a]!, rows[b]!);
          const bothNonEmpty = rows[a]!.some((v) => v !== 0) && rows[b]!.some((v) => v !== 0);
          if (bothNonEmpty) {
            pairs++;
            cosSum += dot(rows[a]!, rows[b]!);
          }
        }
      }
      for (let t = 0; t < 25; t++) assert.ok(Math.abs(mass.perTerm[t]! - perTerm[t]!) < 1e-9, `term ${t}`);
      assert.ok(Math.abs(mass.total - total) < 1e-9);
      // Background similarity = brute-force mean pairwise cosine over non-empty documents.
      assert.ok(Math.abs(mass.backgroundSimilarity - cosSum / pairs) < 1e-9);
    });
  }

  it('termSums gives df and the squared-distance mass identity D(t) = n·S2 − S1²', () => {
    // Source: docs/methods.md §3 — Σ_{a<b} (x_at − x_bt)² = n·S2(t) − S1(t)², checked by brute force.
    const random = mulberry32(11);
    const rows = randomUnitRows(random, 30, 12, 0.3);
    const sums = termSums(denseToCsr(rows));
    const n = rows.length;
    let totalSq = 0;
    for (let t = 0; t < 12; t++) {
      let brute = 0;
      for (let a = 0; a < n; a++) for (let b = a + 1; b < n; b++) brute += (rows[a]![t]! - rows[b]![t]!) ** 2;
      assert.ok(Math.abs(n * sums.s2[t]! - sums.s1[t]! ** 2 - brute) < 1e-9, `term ${t}`);
      assert.equal(sums.df[t], rows.filter((r) => r[t] !== 0).length);
      totalSq += brute;
    }
    // Summed over terms: Σ_{a<b} ‖x_a − x_b‖² = n·Σ‖x_d‖² − ‖Σ x_d‖².
    let sumNorms = 0;
    let sumVecSq = 0;
    for (let t = 0; t < 12; t++) {
      sumNorms += sums.s2[t]!;
      sumVecSq += sums.s1[t]! ** 2;
    }
    assert.ok(Math.abs(n * sumNorms - sumVecSq - totalSq) < 1e-9);
  });

  it('termSpread equals the brute-force normalised entropy, 1 for an even term, 0 for a single document', () => {
    // Source: Shannon entropy H = −Σ p ln p with p_d = x_dt/S1(t), normalised by ln n
    // (definition; brute force here).
    const rows = [
      [0.5, 1, 0.2],
      [0.5, 0, 0.7],
      [0.5, 0, 0.1],
      [0.5, 0, 0],
    ];
    const spread = termSpread(termSums(denseToCsr(rows)), rows.length);
    assert.ok(Math.abs(spread[0]! - 1) < 1e-12);
    assert.equal(spread[1], 0);
    const col = [0.2, 0.7, 0.1];
    const s = col.reduce((a, b) => a + b, 0);
    const h = -col.reduce((acc, x) => acc + (x / s) * Math.log(x / s), 0);
    assert.ok(Math.abs(spread[2]! - h / Math.log(4)) < 1e-12);
  });

  it('pair mass shares sum to 1 and the cumulative share ends at 1 (property)', () => {
    // Source: docs/methods.md §3 — Σ_t P(t) is the total, so the shares partition it.
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1_000_000 }), fc.integer({ min: 2, max: 30 }), (seed, n) => {
        const rows = randomUnitRows(mulberry32(seed), n, 8, 0.4);
        const mass = pairMass(termSums(denseToCsr(rows)), n);
        if (!(mass.total > 0)) return;
        const shareSum = mass.perTerm.reduce((a, p) => a + p / mass.total, 0);
        assert.ok(Math.abs(shareSum - 1) < 1e-9);
        const cum = cumulativeMassShare(mass.perTerm, mass.total, 200);
        assert.equal(cum.length, 8);
        assert.ok(Math.abs(cum[cum.length - 1]! - 1) < 1e-9);
        for (let i = 1; i < cum.length; i++) assert.ok(cum[i]! >= cum[i - 1]! - 1e-15);
      }),
      { numRuns: 100 },
    );
  });

  it('cumulativeMassShare adds the heaviest terms first, stops at maxTerms and leaves the input alone', () => {
    // Hand-checked: masses 1, 5, 3, 1 of total 10 → 0.5, 0.8, 0.9, 1 (the top-10 / top-100 shares
    // of the Report are read from this list).
    const perTerm = Float64Array.from([1, 5, 3, 1]);
    const cum = cumulativeMassShare(perTerm, 10, 10);
    assert.deepEqual(cum.map((x) => Math.round(x * 1e12) / 1e12), [0.5, 0.8, 0.9, 1]);
    assert.deepEqual(cumulativeMassShare(perTerm, 10, 2), [0.5, 0.8]);
    assert.deepEqual(Array.from(perTerm), [1, 5, 3, 1]);
    assert.deepEqual(cumulativeMassShare(perTerm, 0, 2), [0, 0]);
  });

  it('cumulativeMassShare gives the shares of the whole vocabulary sorted, to the bit (ties, zeros of both signs, infinities; a NaN answered as before)', () => {
    // The reference: every mass sorted, the heaviest first, summed in that order.
    const sortedShares = (perTerm: Float64Array, total: number, maxTerms: number): number[] => {
      const all = perTerm.slice().sort().reverse().subarray(0, Math.min(maxTerms, perTerm.length));
      let sum = 0;
      return Array.from(all, (x) => {
        sum += x;
        return total > 0 ? sum / total : 0;
      });
    };
    const random = mulberry32(41);
    const pool = [0, -0, 1, 2, 0.5, Infinity, -Infinity, -1, 1e-300];
    for (const n of [1, 2, 5, 199, 200, 201, 1000, 5000]) {
      for (let round = 0; round < 10; round++) {
        const perTerm = Float64Array.from({ length: n }, () => (random() < 0.3 ? pool[Math.floor(random() * pool.length)]! : Math.round(random() * 64) / 8));
        const before = perTerm.slice();
        for (const maxTerms of [1, 10, 200]) {
          const got = cumulativeMassShare(perTerm, 97.5, maxTerms);
          const want = sortedShares(perTerm, 97.5, maxTerms);
          assert.equal(got.length, want.length);
          got.forEach((x, i) => assert.ok(Object.is(x, want[i]), `n=${n} round ${round} max ${maxTerms} at ${i}: ${x} against ${want[i]}`));
        }
        assert.deepEqual(Array.from(perTerm), Array.from(before), 'the input is untouched');
      }
    }
    // With a NaN the answer is the selection's, as before the heap: here NaN sorts last and is not among the top.
    const withNaN = Float64Array.from([3, NaN, 1, 2, 5, 4]);
    assert.deepEqual(cumulativeMassShare(withNaN, 15, 3), [5 / 15, 9 / 15, 12 / 15]);
  });
});
