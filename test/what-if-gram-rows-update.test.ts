// The what-if's dot-product update run row by row as the sweep reaches each block (IncrementalGram.
// scaledPending, GramRowsUpdate, SharedRowSweep's `prepare`) must leave what the whole update run
// before the sweep leaves, byte for byte: every dot product, count and row scale, whichever order
// the blocks come in and whichever thread's view runs them, and the sweep's answer with it. The
// whole update is held to the TypeScript in test/what-if-gram-update-wasm.test.ts and that to a
// full recompute in test/what-if-incremental.test.ts.
import { strict as assert } from 'node:assert';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { validRowsFromGram } from '../extension/src/engine/measures/gram-distances';
import { SharedRowSweep } from '../extension/src/engine/measures/shared-row-sweep';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { GramRowsUpdate } from '../extension/src/engine/what-if/gram-rows-update';
import { IncrementalGram } from '../extension/src/engine/what-if/incremental-gram';
import { textLikeRows } from './support/text-like-rows';

/** The bytes to compare, every NaN written as the canonical one (as test/what-if-gram-update-wasm.test.ts says why). */
function bytes(a: ArrayBufferView): Buffer {
  const view = a instanceof Float64Array ? a.map((x) => (Number.isNaN(x) ? Number.NaN : x)) : a;
  return Buffer.from(view.buffer, view.byteOffset, view.byteLength);
}

/** `rows` after `empty` rows with no entries (the first valid row then lies past the first blocks). */
function afterEmptyRows(X: Csr, empty: number): Csr {
  const indptr = new Uint32Array(X.rows + empty + 1);
  indptr.set(X.indptr, empty);
  return { rows: X.rows + empty, cols: X.cols, indptr, indices: X.indices, data: X.data };
}

/** A state in a sweep's shared memory as the what-if's thread keeps it (two states, room for their updates). */
function sharedState(rows: Csr, k: number, blockRows: number): { sweep: SharedRowSweep; gram: IncrementalGram } {
  const sweep = SharedRowSweep.create(rows.rows, k, blockRows, 2, IncrementalGram.storageNeeds(rows));
  const gram = new IncrementalGram(rows, sweep.state(0));
  assert.ok(gram.inWebAssembly, 'the state updates in WebAssembly');
  return { sweep, gram };
}

/** Block b's rows. */
function blockRowsOf(b: number, blockRows: number, m: number): [number, number] {
  return [b * blockRows, Math.min(m, (b + 1) * blockRows)];
}

describe('what-if/gram-rows-update', () => {
  const blockRows = 7;

  it('the update run block by block, in a shuffled order and half through another thread\'s view, leaves the whole update\'s bytes', () => {
    for (const [seed, clicks] of [
      [51, [[0], [1], [0], [2], [1], [5], [0], [3], [3], [0], [1], [2]]],
      [52, [[0, 1, 2], [4], [1, 0], [0], [2, 3, 4, 5], [1], [0, 2]]],
    ] as const) {
      const rows = textLikeRows(150, 40, mulberry32(seed));
      const m = rows.rows;
      const whole = sharedState(rows, 3, blockRows);
      const byRows = sharedState(rows, 3, blockRows);
      const list = GramRowsUpdate.buffer();
      const owner = GramRowsUpdate.open(byRows.sweep, list)!;
      const helper = GramRowsUpdate.open(SharedRowSweep.from(byRows.sweep.buffers), list)!;
      assert.ok(owner !== null && helper !== null, 'the row update opened');
      const random = mulberry32(seed + 100);
      const mask = new Uint8Array(rows.cols);
      whole.gram.scaled(mask, false);
      byRows.gram.scaledPending(mask, false, 64);
      let left = 0;
      clicks.forEach((columns, i) => {
        for (const t of columns) mask[t] = mask[t] === 0 ? 1 : 0;
        const want = whole.gram.scaled(mask);
        const got = byRows.gram.scaledPending(mask, true, 64);
        assert.equal(byRows.gram.lastStep.kind, whole.gram.lastStep.kind, `seed ${seed}, click ${i}`);
        if (got.pending !== null) {
          left++;
          assert.equal(got.pending.length, 3 * columns.length);
          owner.set(got.dots, got.pending);
          const blocks = Array.from({ length: Math.ceil(m / blockRows) }, (_, b) => b).sort(() => random() - 0.5);
          blocks.forEach((b, n) => (n % 2 === 0 ? owner : helper).rows(...blockRowsOf(b, blockRows, m)));
          byRows.gram.rowsUpdated();
        }
        assert.ok(bytes(got.dots).equals(bytes(want.dots)), `seed ${seed}, click ${i} (${columns}): dots`);
        assert.ok(bytes(got.scale).equals(bytes(want.scale)), `seed ${seed}, click ${i}: scale`);
        assert.ok(bytes(byRows.sweep.state(0).counts!).equals(bytes(whole.sweep.state(0).counts!)), `seed ${seed}, click ${i}: counts`);
      });
      assert.ok(left >= clicks.length / 2, `seed ${seed}: only ${left} of ${clicks.length} clicks left their pairs to the rows`);
    }
  });

  it('more terms than the list holds, and a state without the WebAssembly update, update whole (nothing left to the rows)', () => {
    const rows = textLikeRows(80, 30, mulberry32(53));
    const { gram } = sharedState(rows, 3, blockRows);
    const mask = new Uint8Array(rows.cols);
    gram.scaledPending(mask, false, 2);
    // Three of the rarer terms at once (an update, not a rebuild).
    const held = new Array<number>(rows.cols).fill(0);
    for (const t of rows.indices) held[t]++;
    const rare = [...held.keys()].filter((t) => held[t]! > 0).sort((a, b) => held[a]! - held[b]! || a - b).slice(0, 3);
    for (const t of rare) mask[t] = 1;
    assert.equal(gram.scaledPending(mask, true, 2).pending, null);
    assert.equal(gram.lastStep.kind, 'incremental');
    const js = new IncrementalGram(rows, SharedRowSweep.create(rows.rows, 3, blockRows, 1, IncrementalGram.storageNeeds(rows)).state(0), true, false);
    js.scaled(mask, false);
    mask[rare[0]!] = 0;
    assert.equal(js.scaledPending(mask, true, 64).pending, null);
    assert.equal(js.lastStep.kind, 'incremental');
  });

  it('a sweep that prepares its blocks answers what the sweep of the whole update answers, with or without a helper, the first valid row past the first blocks', () => {
    const rows = afterEmptyRows(textLikeRows(140, 35, mulberry32(54)), 17);
    const m = rows.rows;
    const k = 4;
    const whole = sharedState(rows, k, blockRows);
    const byRows = sharedState(rows, k, blockRows);
    const list = GramRowsUpdate.buffer();
    const owner = GramRowsUpdate.open(byRows.sweep, list)!;
    const helperSweep = SharedRowSweep.from(byRows.sweep.buffers);
    const helper = GramRowsUpdate.open(helperSweep, list)!;
    const mask = new Uint8Array(rows.cols);
    whole.gram.scaled(mask, false);
    byRows.gram.scaledPending(mask, false, 64);
    let ticket = 0;
    // How the helper takes part: not at all, with its prepare after c of the owner's blocks, or without one (it may not).
    for (const [t, helping, c] of [[0, 'none', 0], [1, 'prepare', 0], [2, 'prepare', 3], [0, 'without', 1], [3, 'prepare', 20], [1, 'prepare', 2]] as const) {
      mask[t] = mask[t] === 0 ? 1 : 0;
      const want = whole.gram.scaled(mask);
      const wantValid = validRowsFromGram(want.dots, m);
      const wanted = whole.sweep.sweep(++ticket, want.dots, want.scale, wantValid);
      const got = byRows.gram.scaledPending(mask, true, 64);
      assert.ok(got.pending !== null, `click on ${t}: the pairs were left to the rows`);
      owner.set(got.dots, got.pending);
      const valid = validRowsFromGram(got.dots, m);
      assert.ok(bytes(valid).equals(bytes(wantValid)) && valid.indexOf(1) >= 2 * blockRows, 'the first valid row is past the first two blocks');
      let calls = 0;
      let helped = -1;
      const swept = byRows.sweep.sweep(
        ++ticket,
        got.dots,
        got.scale,
        valid,
        () => {
          if (calls++ !== c || helping === 'none') return;
          helped = helping === 'prepare' ? helperSweep.help(ticket, helper.rows) : helperSweep.help(ticket);
        },
        false,
        owner.rows,
      );
      byRows.gram.rowsUpdated();
      assert.deepStrictEqual(swept, wanted, `click on ${t}, helper ${helping} after ${c} blocks: the sweep's answer`);
      assert.ok(bytes(got.dots).equals(bytes(want.dots)), `click on ${t}: dots`);
      if (helping === 'without') assert.equal(helped, 0, 'a helper without its own prepare takes no block');
      if (helping === 'prepare') assert.equal(helped, byRows.sweep.blocks - c, 'the helper swept every block left');
    }
  });

  it('a sweep abandoned part way (its interrupt throws) leaves the state to be built afresh by the next call, which answers as the whole update\'s state', () => {
    const rows = textLikeRows(120, 30, mulberry32(55));
    const m = rows.rows;
    const whole = sharedState(rows, 3, blockRows);
    const byRows = sharedState(rows, 3, blockRows);
    const owner = GramRowsUpdate.open(byRows.sweep, GramRowsUpdate.buffer())!;
    const mask = new Uint8Array(rows.cols);
    whole.gram.scaled(mask, false);
    byRows.gram.scaledPending(mask, false, 64);
    mask[0] = 1;
    const got = byRows.gram.scaledPending(mask, true, 64);
    assert.ok(got.pending !== null);
    owner.set(got.dots, got.pending);
    let calls = 0;
    assert.throws(
      () =>
        byRows.sweep.sweep(1, got.dots, got.scale, validRowsFromGram(got.dots, m), () => {
          if (calls++ === 3) throw new Error('stop');
        }, false, owner.rows),
      /stop/,
    );
    mask[1] = 1;
    const next = byRows.gram.scaledPending(mask, true, 64);
    assert.equal(byRows.gram.lastStep.kind, 'full', 'the half-updated state was built afresh');
    assert.equal(next.pending, null);
    const want = whole.gram.scaled(mask, false);
    assert.ok(bytes(next.dots).equals(bytes(want.dots)));
  });
});
