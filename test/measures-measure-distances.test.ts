import { strict as assert } from 'node:assert';
import { mulberry32, sampleIndices } from '../extension/src/engine/random/seeded-random';
import { measureDistances } from '../extension/src/engine/measures/measure-distances';
import { NO_NEIGHBOR } from '../extension/src/engine/measures/knn';
import { denseToCsr, dot, randomUnitRows } from './measures-fixtures';

const n = 150;
const cols = 40;
const rows = randomUnitRows(mulberry32(77), n, cols, 0.12, 17);
const X = denseToCsr(rows);
const labelsOf = (sample: Uint32Array) => Int32Array.from(sample, (r) => (r % 5 === 4 ? -1 : r % 3));

describe('measures/measure-distances', () => {
  it('measureDistances: background similarity is the brute-force mean pairwise cosine (docs/methods.md §3)', () => {
    // Source: docs/methods.md §3; brute force over all non-empty pairs.
    const sample = sampleIndices(n, 60, 1);
    const { measures } = measureDistances(X, { sample, k: 5, seed: 1, labels: null, baselineNeighbors: null });
    const nonEmpty = rows.filter((r) => r.some((v) => v !== 0));
    let sum = 0;
    let pairs = 0;
    for (let a = 0; a < nonEmpty.length; a++) {
      for (let b = a + 1; b < nonEmpty.length; b++) {
        sum += dot(nonEmpty[a]!, nonEmpty[b]!);
        pairs++;
      }
    }
    assert.ok(Math.abs(measures.backgroundSimilarity - sum / pairs) < 1e-12);
    assert.deepEqual(measures.sample, { documents: 60, k: 5, seed: 1 });
    assert.equal(measures.labelPrecisionAtK, null);
    assert.equal(measures.neighborTurnover, null);
  });

  it('measureDistances fills every measure with consistent distributions', () => {
    const sample = sampleIndices(n, n, 1);
    const k = 4;
    const r = measureDistances(X, { sample, k, seed: 1, labels: labelsOf(sample), baselineNeighbors: null });
    const m = sample.length;
    const valid = rows.filter((row) => row.some((v) => v !== 0)).length;
    const { measures } = r;
    for (const value of [
      measures.neighborStandout,
      measures.contrast?.median,
      measures.meanToNearest,
      measures.iidEquivalentDimension,
      measures.hubness?.skewness,
      measures.intrinsicDimension.twoNN,
      measures.intrinsicDimension.mle,
      measures.radiusSlack?.median,
      measures.labelPrecisionAtK,
    ]) {
      assert.ok(typeof value === 'number' && Number.isFinite(value), `${JSON.stringify(measures)}`);
    }
    const sim = measures.distributions.similarity;
    assert.equal(sim.pairs.reduce((a, b) => a + b, 0), (valid * (valid - 1)) / 2);
    assert.equal(sim.nearest.reduce((a, b) => a + b, 0), valid);
    assert.equal(measures.distributions.kOccurrence.length, 3 * k + 1);
    assert.equal(measures.distributions.kOccurrence.reduce((a, b) => a + b, 0), valid);
    // The figures are wired to the right inputs: neighbour standout and the iid-equivalent
    // dimension recomputed by brute force from the dense rows (docs/methods.md §4 definitions).
    const validRows = Array.from(sample).filter((r) => rows[r]!.some((v) => v !== 0));
    const z: number[] = [];
    const distances: number[] = [];
    for (const a of validRows) {
      const sims = validRows.filter((b) => b !== a).map((b) => dot(rows[a]!, rows[b]!));
      const mean = sims.reduce((x, y) => x + y, 0) / sims.length;
      const sd = Math.sqrt(sims.reduce((x, y) => x + (y - mean) ** 2, 0) / sims.length);
      if (sd > 1e-12) z.push((Math.max(...sims) - mean) / sd);
      for (const b of validRows) if (b > a) distances.push(Math.sqrt(Math.max(0, 2 - 2 * dot(rows[a]!, rows[b]!))));
    }
    z.sort((x, y) => x - y);
    const median = z.length % 2 === 1 ? z[(z.length - 1) / 2]! : (z[z.length / 2 - 1]! + z[z.length / 2]!) / 2;
    assert.ok(Math.abs(measures.neighborStandout! - median) < 1e-9, `standout ${measures.neighborStandout} vs ${median}`);
    const dMean = distances.reduce((x, y) => x + y, 0) / distances.length;
    const cv = Math.sqrt(distances.reduce((x, y) => x + (y - dMean) ** 2, 0) / distances.length) / dMean;
    assert.ok(Math.abs(measures.iidEquivalentDimension! - 1 / (2 * cv * cv)) < 1e-6, `iid ${measures.iidEquivalentDimension} vs ${1 / (2 * cv * cv)}`);
    const cum = measures.distributions.cumulativeMass;
    assert.equal(cum.length, cols);
    assert.ok(Math.abs(cum[9]! - measures.topTermsMassShare.top10) < 1e-12);
    assert.ok(Math.abs(measures.topTermsMassShare.top100 - 1) < 1e-12);
    // Every N_k sums to the number of filled neighbour slots; empty rows have none.
    const filled = r.neighbors.filter((j) => j !== NO_NEIGHBOR).length;
    assert.equal(r.kOccurrence.reduce((a, b) => a + b, 0), filled);
    assert.equal(filled, valid * k);
    for (let i = 1; i < r.hubPositions.length; i++) {
      assert.ok(r.kOccurrence[r.hubPositions[i - 1]!]! >= r.kOccurrence[r.hubPositions[i]!]!);
    }
    assert.equal(r.termKnnMass.length, cols);
    assert.equal(r.neighborSims.length, m * k);
  });

  it('measureDistances is deterministic, and turnover against itself is 0 and after a mask is in (0, 1]', () => {
    const sample = sampleIndices(n, 80, 3);
    const k = 5;
    const options = { sample, k, seed: 3, labels: null, baselineNeighbors: null };
    const a = measureDistances(X, options);
    const b = measureDistances(X, options);
    assert.deepEqual(a.measures, b.measures);
    const same = measureDistances(X, { ...options, baselineNeighbors: a.neighbors });
    assert.equal(same.measures.neighborTurnover, 0);
    // Mask the heaviest term and renormalise: the neighbour lists must change somewhere.
    let heaviest = 0;
    for (let t = 1; t < cols; t++) if (a.pairMass.perTerm[t]! > a.pairMass.perTerm[heaviest]!) heaviest = t;
    const masked = rows.map((row) => {
      const out = row.map((v, t) => (t === heaviest ? 0 : v));
      const norm = Math.hypot(...out);
      return norm > 0 ? out.map((v) => v / norm) : out;
    });
    const after = measureDistances(denseToCsr(masked, cols), { ...options, baselineNeighbors: a.neighbors });
    const turnover = after.measures.neighborTurnover!;
    assert.ok(turnover > 0 && turnover <= 1, `turnover ${turnover}`);
    assert.equal(after.pairMass.perTerm[heaviest], 0);
  });

  it('measureDistances rejects rows that are not unit length, and mismatched labels', () => {
    const raw = denseToCsr([[1, 2], [3, 4], [0, 1]]);
    const sample = Uint32Array.from([0, 1, 2]);
    assert.throws(() => measureDistances(raw, { sample, k: 1, seed: 1, labels: null, baselineNeighbors: null }), RangeError);
    assert.throws(() => measureDistances(X, { sample, k: 1, seed: 1, labels: new Int32Array(2), baselineNeighbors: null }), RangeError);
  });

  it('measureDistances on a sample of two documents returns nulls, not NaN', () => {
    const tiny = denseToCsr([[1, 0], [0.6, 0.8]]);
    const { measures } = measureDistances(tiny, { sample: Uint32Array.from([0, 1]), k: 3, seed: 1, labels: null, baselineNeighbors: null });
    assert.equal(measures.hubness, null);
    assert.equal(measures.intrinsicDimension.twoNN, null);
    assert.equal(measures.intrinsicDimension.mle, null);
    // Hand-checked: one pair with cosine 0.6.
    assert.ok(Math.abs(measures.backgroundSimilarity - 0.6) < 1e-15);
    // JSON turns NaN into null silently, so walk the values instead.
    const walk = (v: unknown): void => {
      if (typeof v === 'number') assert.ok(Number.isFinite(v), JSON.stringify(measures));
      else if (v !== null && typeof v === 'object') Object.values(v).forEach(walk);
    };
    walk(measures);
  });
});
