// A full pass of the what-if's exact sums made elsewhere (maskedTermSums with its row norms, on
// another thread) and adopted must leave IncrementalTermSums exactly as its own full pass does:
// the same sums, and the same state for every toggle after it. The reference is the state's own
// full pass, which test/what-if-incremental.test.ts and test/measures-masked-term-sums.test.ts
// tie to scikit-learn's TfidfVectorizer without those terms (docs/methods.md §1, §3); here the
// comparison is to the bit.
import { strict as assert } from 'node:assert';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { maskedTermSums, type MaskedTermSums } from '../extension/src/engine/measures/masked-term-sums';
import { startMaskedTermSums } from '../extension/src/engine/measures/start-masked-term-sums';
import { DistanceLab } from '../extension/src/engine/what-if/distance-lab';
import { IncrementalTermSums } from '../extension/src/engine/what-if/incremental-term-sums';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { textLikeRows } from './support/text-like-rows';

function sameBits(got: MaskedTermSums, want: MaskedTermSums, step: string): void {
  assert.equal(got.rowsWithWeight, want.rowsWithWeight, `${step}: rowsWithWeight`);
  for (const key of ['s1', 's2', 'df', 'sxlogx'] as const) assert.deepEqual(Array.from(got.sums[key]), Array.from(want.sums[key]), `${step}: ${key}`);
}

function passWithNorms(X: Csr, removed: Uint8Array): MaskedTermSums {
  return maskedTermSums(X, removed, false, new Float64Array(X.rows));
}

function randomMask(cols: number, random: () => number, share: number): Uint8Array {
  const mask = new Uint8Array(cols);
  for (let t = 0; t < cols; t++) if (random() < share) mask[t] = 1;
  return mask;
}

/** The same matrix with its indices and data on SharedArrayBuffers (as the review's threads assemble it). */
function shared(X: Csr): Csr {
  const indices = new Uint32Array(new SharedArrayBuffer(4 * X.indices.length));
  indices.set(X.indices);
  const data = new Float64Array(new SharedArrayBuffer(8 * X.data.length));
  data.set(X.data);
  return { ...X, indices, data };
}

describe('IncrementalTermSums.adopt', function () {
  this.timeout(60_000);
  const random = mulberry32(41);
  const cols = 120;
  const X = textLikeRows(1500, cols, random);

  it('leaves the state its own full pass leaves: the same sums, then the same bits at every toggle and checkpoint', () => {
    const own = new IncrementalTermSums(X);
    const adopting = new IncrementalTermSums(X);
    const base = randomMask(cols, random, 0.05);
    sameBits(adopting.adopt(base, passWithNorms(X, base)), own.at(base, false), 'baseline');
    assert.deepEqual(adopting.lastStep, own.lastStep);
    // Toggles walk from the adopted state: any difference in row norms, mask or counters shows.
    const mask = base.slice();
    for (let step = 0; step < 40; step++) {
      const t = Math.floor(random() * cols);
      mask[t] = mask[t] ? 0 : 1;
      sameBits(adopting.at(mask, true), own.at(mask, true), `toggle ${step}`);
      assert.deepEqual(adopting.lastStep, own.lastStep, `toggle ${step}: the same kind of step`);
    }
    // A second full pass adopted, then both checkpoints restored.
    const suggested = randomMask(cols, random, 0.1);
    sameBits(adopting.adopt(suggested, passWithNorms(X, suggested)), own.at(suggested, false), 'second pass');
    sameBits(adopting.at(base, false), own.at(base, false), 'baseline restored');
    assert.equal(adopting.lastStep.kind, 'restored');
    sameBits(adopting.at(suggested, true), own.at(suggested, true), 'second restored');
  });

  it('reads no pass where at() would make none (unchanged or a checkpoint)', () => {
    const state = new IncrementalTermSums(X);
    const base = randomMask(cols, random, 0.05);
    assert.ok(state.needsFullPass(base));
    state.at(base, false);
    assert.equal(state.needsFullPass(base), false);
    const wrong = passWithNorms(X, new Uint8Array(cols));
    sameBits(state.adopt(base, wrong), maskedTermSums(X, base, false), 'unchanged');
    assert.equal(state.lastStep.kind, 'unchanged');
    assert.throws(() => new IncrementalTermSums(X).adopt(base, maskedTermSums(X, base, false)), /row norms/);
  });
});

describe('DistanceLab.measure with its full passes on another thread', function () {
  this.timeout(60_000);
  it('gives the measures of the passes made here, to the bit, and the same state for toggles after', () => {
    const random = mulberry32(43);
    const cols = 150;
    const X = textLikeRows(4000, cols, random);
    const sample = new Uint32Array(300).map((_, i) => i * 13);
    const labels = new Int32Array(300).map((_, i) => i % 4);
    const here = new DistanceLab(X, sample, 5, 1, labels);
    const threaded = new DistanceLab(shared(X), sample, 5, 1, labels);
    const base = randomMask(cols, random, 0.04);
    const baseline = here.measure(base, null);
    assert.deepEqual(threaded.measure(base, null), baseline);
    const suggested = DistanceLab.union(base, [0, 1, 2]);
    assert.deepEqual(threaded.measure(suggested, baseline.neighbors), here.measure(suggested, baseline.neighbors));
    const toggled = DistanceLab.union(suggested, [7]);
    assert.deepEqual(threaded.whatIf(toggled, baseline.neighbors), here.whatIf(toggled, baseline.neighbors));
  });

  it('adopts a pass begun by the caller, the spread included (as the term review begins it), to the same bits', () => {
    const random = mulberry32(47);
    const cols = 150;
    const X = shared(textLikeRows(3000, cols, random));
    const sample = new Uint32Array(250).map((_, i) => i * 11);
    const base = randomMask(cols, random, 0.04);
    const plain = new DistanceLab(X, sample, 5, 1, null);
    const adopting = new DistanceLab(X, sample, 5, 1, null);
    const pending = startMaskedTermSums(X, base, true, undefined, true);
    const baseline = plain.measure(base, null);
    assert.deepEqual(adopting.measure(base, null, { removed: base, pending }), baseline);
    assert.ok(pending.fromThread, 'the pass came from its thread');
    // The caller reads the same pass's spread afterwards: taken once, the same answer.
    assert.equal(pending.take(), pending.take());
    const next = DistanceLab.union(base, [3]);
    assert.deepEqual(adopting.whatIf(next, baseline.neighbors), plain.whatIf(next, baseline.neighbors));
    const other = new DistanceLab(X, sample, 5, 1, null);
    assert.throws(() => other.measure(next, null, { removed: base, pending: startMaskedTermSums(X, base, true, undefined, true) }), /another mask/);
  });
});
