// A lab's full measures (the Report's baseline and suggested figures) sweep the sample's products
// in WebAssembly where IncrementalGram built them (DistanceLab's one-block sweep memory). They must
// be what measureDistances gives from the same products swept by the TypeScript in one block of
// all rows, byte for byte: every Measure (−0 included; a NaN as a NaN), the neighbour lists and
// similarities, the standout z-scores, N_k, the hub list and the per-term k-NN mass. A sweep in
// blocks of fewer rows sums the iid dimension's pairs in another order, which this test tells.
import { strict as assert } from 'node:assert';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { maskedTermSums } from '../extension/src/engine/measures/masked-term-sums';
import { measureDistances, type MeasureDistancesResult } from '../extension/src/engine/measures/measure-distances';
import { sweepRowsModule } from '../extension/src/engine/measures/sweep-rows-wasm';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { DistanceLab } from '../extension/src/engine/what-if/distance-lab';
import { IncrementalGram } from '../extension/src/engine/what-if/incremental-gram';
import { textLikeRows } from './support/text-like-rows';

/** Bit-for-bit equality of plain values, arrays and objects; any NaN equals any NaN (its bits are fixed by neither side). */
function assertSameBits(got: unknown, want: unknown, path: string): void {
  if (typeof want === 'number') {
    assert.equal(typeof got, 'number', path);
    if (Number.isNaN(want) && Number.isNaN(got)) return;
    assert.ok(Object.is(got, want), `${path}: ${String(got)} vs ${want}`);
  } else if (ArrayBuffer.isView(want) || Array.isArray(want)) {
    const w = want as ArrayLike<unknown>;
    const g = got as ArrayLike<unknown>;
    assert.equal(g.length, w.length, `${path}.length`);
    for (let i = 0; i < w.length; i++) assertSameBits(g[i], w[i], `${path}[${i}]`);
  } else if (want !== null && typeof want === 'object') {
    assert.deepEqual(Object.keys(got as object).sort(), Object.keys(want).sort(), `${path} keys`);
    for (const key of Object.keys(want)) assertSameBits((got as Record<string, unknown>)[key], (want as Record<string, unknown>)[key], `${path}.${key}`);
  } else {
    assert.equal(got, want, path);
  }
}

/** The full measures of `mask` as before the lab swept in WebAssembly: the same products, the TypeScript's one-block sweep. */
function reference(X: Csr, lab: DistanceLab, mask: Uint8Array, baselineNeighbors: Uint32Array | null): MeasureDistancesResult {
  const { dots, scale } = new IncrementalGram(lab.sampleRows, undefined, false).scaled(mask, false);
  const { sums, rowsWithWeight } = maskedTermSums(X, mask, false);
  return measureDistances(lab.maskedSample(mask), { sample: lab.positions, k: lab.k, seed: lab.seed, labels: lab.sampleLabels, baselineNeighbors, sums, rowsWithWeight, gram: dots, rowScale: scale });
}

/** A mask of the commonest columns (the suggestions of a review), at least one. */
function loudMask(X: Csr, share: number): Uint8Array {
  const df = new Uint32Array(X.cols);
  for (let p = 0; p < X.indptr[X.rows]!; p++) df[X.indices[p]!]++;
  const mask = new Uint8Array(X.cols);
  const order = [...df.keys()].sort((a, b) => df[b]! - df[a]! || a - b);
  for (let i = 0; i < Math.max(1, Math.floor(share * X.cols)); i++) mask[order[i]!] = 1;
  return mask;
}

describe('what-if/distance-lab: the full measures swept in WebAssembly', () => {
  it('baseline then suggested, on text-like rows with duplicates and rows that empty out, k from 1 to past the sample: the TypeScript sweep’s bits', () => {
    assert.ok(sweepRowsModule() !== null, 'the WebAssembly sweep did not load');
    let checked = 0;
    for (const [seed, rows, cols, every, k, whatIf] of [
      [1, 400, 60, 3, 5, false],
      [2, 500, 40, 4, 10, false],
      [3, 300, 25, 2, 1, false],
      [4, 90, 30, 3, 40, false],
    ] as const) {
      const random = mulberry32(3000 + seed);
      const X = textLikeRows(rows, cols, random);
      const sample = Uint32Array.from({ length: Math.floor(rows / every) }, (_, i) => i * every);
      const labels = Int32Array.from(sample, () => (random() < 0.1 ? -1 : Math.floor(random() * 3)));
      const lab = new DistanceLab(X, sample, k, seed, labels, { whatIf });
      // Otherwise this test compares the TypeScript with itself.
      assert.ok((lab as unknown as { sweep: unknown }).sweep !== null, 'the lab has no WebAssembly sweep');
      const none = new Uint8Array(X.cols);
      const baseline = lab.measure(none, null);
      assertSameBits(baseline, reference(X, lab, none, null), `seed ${seed} baseline`);
      for (const share of [0.05, 0.3]) {
        const mask = loudMask(X, share);
        const got = lab.measure(mask, baseline.neighbors);
        const want = reference(X, lab, mask, baseline.neighbors);
        assert.ok(got.measures.iidEquivalentDimension !== null, 'no iid dimension to compare');
        assertSameBits(got, want, `seed ${seed} share ${share}`);
        checked++;
      }
    }
    assert.equal(checked, 8);
  });

  it('a lab that answers what-ifs on its own thread keeps its products out of the sweep memory (its clicks swept slower there)', () => {
    const X = textLikeRows(200, 30, mulberry32(3100));
    const sample = Uint32Array.from({ length: 50 }, (_, i) => i * 4);
    const whatIf = new DistanceLab(X, sample, 5, 1, null, { whatIf: true });
    const reportOnly = new DistanceLab(X, sample, 5, 1, null, { whatIf: false });
    assert.equal((whatIf as unknown as { sweep: unknown }).sweep, null);
    assert.notEqual((reportOnly as unknown as { sweep: unknown }).sweep, null);
  });
});
