// SharedRowSweep: the what-if's sweep over the sample's products shared by two threads must give
// what one thread sweeping the same blocks gives (measureSampleRows with that blockRows), bit for
// bit, whoever swept which block. measureSampleRows itself is held to each measure's own
// function, and those to scikit-learn and the papers of docs/methods.md §4–§6, in
// test/measures-measure-sample-rows.test.ts. Here the helper is a second view of the same
// shared memory driven from the owner's interrupt (called before each block the owner sweeps),
// so which blocks it takes is fixed, not left to the timing of two threads.
import { strict as assert } from 'node:assert';
import { validRowsFromGram } from '../extension/src/engine/measures/gram-distances';
import { measureSampleRows } from '../extension/src/engine/measures/measure-sample-rows';
import { sampleSimilarities } from '../extension/src/engine/measures/sample-similarity';
import { SharedRowSweep } from '../extension/src/engine/measures/shared-row-sweep';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { denseToCsr, randomUnitRows } from './measures-fixtures';

/** Unit rows with empty rows, exact duplicates and few columns (ties at the k-th place), as kept dot products and row scales. */
function products(seed: number, n: number): { dots: Float64Array; scale: Float64Array } {
  const random = mulberry32(seed);
  const rows = randomUnitRows(random, n, 12, 0.25, 9);
  for (let r = 5; r < n; r += 13) rows[r] = rows[r - 3]!.slice();
  // Scaled rows (as the what-if keeps them): dots·scale_i·scale_j are the cosines.
  const scale = Float64Array.from({ length: n }, () => 0.5 + random());
  const scaled = rows.map((row, i) => row.map((v) => v / scale[i]!));
  return { dots: sampleSimilarities(denseToCsr(scaled), Uint32Array.from({ length: n }, (_, i) => i)), scale };
}

describe('measures/shared-row-sweep', () => {
  const n = 150;
  const k = 5;
  const blockRows = 7; // 22 blocks, the last one short

  it('a helper that takes every block left when the owner has swept c of them leaves the one-thread answer, bit for bit', () => {
    const { dots, scale } = products(3, n);
    const valid = validRowsFromGram(dots, n);
    const want = measureSampleRows(dots, n, k, valid, scale, undefined, blockRows);
    // The ties must be there, or the row-order replay of N_k's shares is not exercised.
    assert.ok(want.kOccurrence.some((c) => c !== Math.round(c)), 'no shared tie at a k-th place');
    const owner = SharedRowSweep.create(n, k, blockRows);
    const helper = SharedRowSweep.from(owner.buffers);
    let ticket = 0;
    for (const [state, c] of [[0, 0], [1, 1], [0, 5], [1, 21], [0, 22]] as const) {
      ticket++;
      owner.state(state).dots.set(dots);
      owner.state(state).scale.set(scale);
      let calls = 0;
      let helped = -1;
      const got = owner.sweep(ticket, owner.state(state).dots, owner.state(state).scale, valid, () => {
        // Called before each of the owner's claims: here c blocks are swept.
        if (calls++ === c) helped = helper.help(ticket);
      });
      assert.deepStrictEqual(got, want, `state ${state}, the helper after the owner's ${c} blocks`);
      assert.equal(helped, owner.blocks - c, 'the helper swept every block left');
      // A helper late for its sweep claims nothing (and so cannot disturb the next one).
      assert.equal(helper.help(ticket), 0);
      assert.equal(helper.help(ticket - 1), 0);
    }
  });

  it('a sweep the owner abandons part way (its interrupt throws) leaves the next sweep its own answer', () => {
    const a = products(4, n);
    const b = products(5, n);
    const validA = validRowsFromGram(a.dots, n);
    const validB = validRowsFromGram(b.dots, n);
    const owner = SharedRowSweep.create(n, k, blockRows, 1);
    const helper = SharedRowSweep.from(owner.buffers);
    const { dots, scale } = owner.state(0);
    dots.set(a.dots);
    scale.set(a.scale);
    let calls = 0;
    assert.throws(
      () =>
        owner.sweep(1, dots, scale, validA, () => {
          // The helper takes every block but the first two; then the owner stops, before its third.
          if (++calls === 3) {
            helper.help(1);
            throw new Error('a click came');
          }
        }),
      /a click came/,
    );
    dots.set(b.dots);
    scale.set(b.scale);
    assert.deepStrictEqual(owner.sweep(2, dots, scale, validB), measureSampleRows(b.dots, n, k, validB, b.scale, undefined, blockRows));
  });

  it('with views, the answer is the same and its per-row arrays are the shared outputs, which the next sweep writes over', () => {
    const a = products(7, n);
    const b = products(8, n);
    const validA = validRowsFromGram(a.dots, n);
    const validB = validRowsFromGram(b.dots, n);
    const owner = SharedRowSweep.create(n, k, blockRows, 1);
    const { dots, scale } = owner.state(0);
    dots.set(a.dots);
    scale.set(a.scale);
    const want = measureSampleRows(a.dots, n, k, validA, a.scale, undefined, blockRows);
    const copied = owner.sweep(1, dots, scale, validA);
    const viewed = owner.sweep(2, dots, scale, validA, undefined, true);
    assert.deepStrictEqual(copied, want);
    assert.deepStrictEqual({ ...viewed, knn: { neighbors: viewed.knn.neighbors.slice(), sims: viewed.knn.sims.slice() }, standoutPerQuery: viewed.standoutPerQuery.slice(), nnDist: viewed.nnDist.slice() }, want);
    assert.ok(viewed.knn.neighbors.buffer === owner.buffers.buffer && viewed.nnDist.buffer === owner.buffers.buffer, 'the views are in the shared memory');
    assert.notEqual(copied.knn.neighbors.buffer, owner.buffers.buffer);
    dots.set(b.dots);
    scale.set(b.scale);
    const next = owner.sweep(3, dots, scale, validB);
    assert.deepStrictEqual(Array.from(viewed.knn.neighbors), Array.from(next.knn.neighbors), 'the views show the latest sweep');
    assert.deepStrictEqual(copied, want, 'the copies kept the first');
  });

  it('refuses products that are not one of its states (the sweep would read the wrong memory)', () => {
    const { dots, scale } = products(6, n);
    const owner = SharedRowSweep.create(n, k, blockRows);
    assert.throws(() => owner.sweep(1, dots, scale, validRowsFromGram(dots, n)), /not one of its states/);
    assert.throws(() => SharedRowSweep.create(70_000, k, 1), RangeError);
  });
});
