// Per-term signals of the suggestion rule, checked against values computed by hand.
// Sources: the negative-binomial (Gamma–Poisson) variance Var(c) = μ + μ²/r and the Poisson
// df prediction Σ(1 − e^(−μ_d)) — Church & Gale (1995), "Poisson mixtures", Natural Language
// Engineering 1(2), and "Inverse document frequency (IDF): a measure of deviations from Poisson".
import { strict as assert } from 'node:assert';
import { csrOf } from './support/csr-of';
import { termCountStats } from '../extension/src/engine/terms/term-count-stats';
import { residualIdf, termSignal } from '../extension/src/engine/terms/term-signals';

describe('termCountStats', () => {
  it('termCountStats: df, Σc, Σc², Σc·L and the length sums of a 3×3 count matrix (by hand)', () => {
    const s = termCountStats(csrOf([[2, 1, 0], [1, 0, 3], [1, 1, 0]]));
    assert.equal(s.documents, 3);
    assert.equal(s.totalTokens, 9); // lengths 3, 4, 2
    assert.equal(s.sumLengthSq, 29); // 9 + 16 + 4
    assert.deepEqual([...s.df], [3, 2, 1]);
    assert.deepEqual([...s.cf], [4, 2, 3]);
    assert.deepEqual([...s.sumCountSq], [6, 2, 9]);
    assert.deepEqual([...s.sumCountLength], [12, 5, 12]); // 2·3+1·4+1·2; 1·3+1·2; 3·4
  });

  it('termCountStats: empty documents are not counted', () => {
    const s = termCountStats(csrOf([[0, 0], [1, 1]]));
    assert.equal(s.documents, 1);
    assert.equal(s.sumLengthSq, 4);
  });
});

describe('termSignal', () => {
  it('termSignal: burstiness = (Σ(c−μ)² − Σμ)/Σμ² with μ_d = p·L_d, and its Poisson standard error (by hand)', () => {
    // Term 0: p = 4/9, μ = (4/3, 16/9, 8/9); Σ(c−μ)² = 86/81, Σμ² = 464/81, Σμ = 4.
    const s = termCountStats(csrOf([[2, 1, 0], [1, 0, 3], [1, 1, 0]]));
    const t = termSignal(s, 0);
    assert.ok(Math.abs(t.burstiness - -238 / 464) < 1e-12, String(t.burstiness));
    assert.ok(Math.abs(t.burstinessSe - (Math.sqrt(1252) * 9) / 464) < 1e-12, String(t.burstinessSe));
    assert.equal(t.docFraction, 1);
  });

  it('termSignal: a term that is all in one of many equal documents is bursty, one spread evenly is not', () => {
    // 20 documents of 60 tokens each: term 0 five times in each, term 1 forty times in the first.
    const dense = Array.from({ length: 20 }, (_, d) => (d === 0 ? [5, 40, 15] : [5, 0, 55]));
    const s = termCountStats(csrOf(dense));
    const even = termSignal(s, 0);
    const clumped = termSignal(s, 1);
    // Even: every count equals its expectation, so Σ(c−μ)² = 0 and b = −Σμ/Σμ² = −1/μ = −0.2 (μ = 5).
    assert.ok(Math.abs(even.burstiness - -0.2) < 1e-12, String(even.burstiness));
    // Clumped: μ_d = 2 everywhere; Σ(c−μ)² = 38² + 19·4 = 1520; Σμ = 40; Σμ² = 80 → b = 18.5.
    assert.ok(Math.abs(clumped.burstiness - 18.5) < 1e-12, String(clumped.burstiness));
  });
});

describe('residualIdf', () => {
  it('residualIdf: log2(predicted df / df), predicted df = Σ(1 − e^(−p·L_d)) (by hand)', () => {
    // cf 2 over two one-token documents: p = 1, predicted df = 2(1 − e^−1) = 1.2642; df 2.
    assert.ok(Math.abs(residualIdf(2, 2, [1, 1]) - Math.log2(1 - Math.exp(-1))) < 1e-12);
    // A bursty term: cf 10 all in one of ten 10-token documents: p = 0.1, predicted df = 10(1 − e^−1).
    assert.ok(Math.abs(residualIdf(10, 1, new Array(10).fill(10)) - Math.log2(10 * (1 - Math.exp(-1)))) < 1e-12);
  });

  it('residualIdf: no answer without occurrences', () => {
    assert.ok(Number.isNaN(residualIdf(0, 0, [3, 4])));
  });
});
