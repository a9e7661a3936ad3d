// The what-if's column gather in WebAssembly (what-if/column-gather.wat) must write what the
// TypeScript's gatherColumnChanges writes, byte for byte (NaN's bits and −0 included): each kept
// column's two sums, and nothing for a stopped column or the toggled one. Compared on random
// columns with empty, one-entry and full ones, columns equal to each other, weights and factors of
// every sign with zeros, −0, tiny and huge values, infinities and NaN, in one block and in many;
// then on a corpus's clicks through IncrementalTermSums (the gather on and off the WebAssembly).
// Either side also adds the sums straight into S1 and S2 when they live in the gather's memory
// (SharedColumnGather.claimSums): the same bytes as the sums added after the gather.
// The TypeScript is held to a full pass in test/what-if-shared-column-gather.test.ts.
import { strict as assert } from 'node:assert';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { IncrementalTermSums } from '../extension/src/engine/what-if/incremental-term-sums';
import { columnGatherModule, gatherLayout, SharedColumnGather } from '../extension/src/engine/what-if/shared-column-gather';
import { textLikeRows } from './support/text-like-rows';

function bytes(a: ArrayBufferView): Buffer {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength);
}

/** A value drawn from plain numbers of both signs, mostly, and from the edge cases now and then. */
function edgy(random: () => number, special: number): number {
  const u = random();
  if (u < special) {
    const edges = [0, -0, 1e-300, -1e-300, 5e-324, 1e300, -1e300, Infinity, -Infinity, NaN, 1, -1, 0.1];
    return edges[Math.floor(random() * edges.length)]!;
  }
  return (random() - 0.3) * 4;
}

/** Column postings (rows ascending per column), weights and per-row factors, drawn at random. */
function randomColumns(seed: number, rows: number, cols: number, special: number) {
  const random = mulberry32(seed);
  const start = new Uint32Array(cols + 1);
  const rowIds: number[] = [];
  const values: number[] = [];
  let previous: { rows: number[]; values: number[] } = { rows: [], values: [] };
  for (let u = 0; u < cols; u++) {
    const kind = random();
    let colRows: number[];
    let colValues: number[];
    if (kind < 0.1) {
      colRows = [];
      colValues = [];
    } else if (kind < 0.2) {
      colRows = [Math.floor(random() * rows)];
      colValues = [edgy(random, special)];
    } else if (kind < 0.3) {
      // The column before, again: equal sums.
      colRows = previous.rows.slice();
      colValues = previous.values.slice();
    } else {
      const density = kind < 0.4 ? 1 : random();
      colRows = [];
      for (let r = 0; r < rows; r++) if (random() < density) colRows.push(r);
      colValues = colRows.map(() => edgy(random, special));
    }
    previous = { rows: colRows, values: colValues };
    rowIds.push(...colRows);
    values.push(...colValues);
    start[u + 1] = rowIds.length;
  }
  const rowChange = Float64Array.from({ length: 2 * rows }, () => (random() < 0.15 ? 0 : edgy(random, special)));
  const mask = Uint8Array.from({ length: cols }, () => (random() < 0.2 ? 1 : 0));
  return { start, rowIds: Uint32Array.from(rowIds), values: Float64Array.from(values), rowChange, mask, random };
}

/** Both gathers of column t's click over the same columns: the sums added to S1 and S2 and every slot of out. */
function bothGathers(seed: number, rows: number, cols: number, special: number, t: number, stopAll = false) {
  const input = randomColumns(seed, rows, cols, special);
  if (stopAll) input.mask.fill(1);
  const nnz = input.rowIds.length;
  const run = (webAssembly: boolean) => {
    const gather = SharedColumnGather.create(rows, cols, nnz, webAssembly);
    assert.equal(gather.inWebAssembly, webAssembly, 'the gather runs where it was asked to');
    const { buffers } = gather;
    const layout = gatherLayout(rows, cols, nnz, buffers.blocks);
    // Every slot of out filled with a pattern first: a column not gathered keeps it.
    new Uint8Array(buffers.buffer, layout.out, 16 * cols).fill(0xa5);
    gather.start.set(input.start);
    gather.rowIds.set(input.rowIds);
    gather.values.set(input.values);
    gather.divide();
    gather.rowChange.set(input.rowChange);
    // −0 to start from: −0 + x is x for every x, so the sums keep out's bits.
    const s1 = new Float64Array(cols).fill(-0);
    const s2 = new Float64Array(cols).fill(-0);
    gather.gather(t, input.mask, s1, s2);
    const out = Buffer.from(bytes(new Float64Array(buffers.buffer, layout.out, 2 * cols)));
    // The same click into sums in the gather's memory, added to as each column ends.
    const place = gather.claimSums();
    assert.ok(place !== null, 'a place for sums');
    place.s1.fill(-0);
    place.s2.fill(-0);
    gather.gather(t, input.mask, place.s1, place.s2);
    return { out, s1, s2, direct: { s1: place.s1.slice(), s2: place.s2.slice() }, blocks: buffers.blocks };
  };
  return { js: run(false), wasm: run(true), input };
}

/**
 * The bytes with every NaN written as the one canonical NaN. A NaN's sign and payload are not
 * fixed by either side: WebAssembly leaves them open for arithmetic NaNs, and V8's JavaScript
 * gives the CPU's default NaN in optimised code but the canonical one where it folds or
 * interprets, so the same addition's NaN differed from run to run under load. Every other value,
 * −0 included, is compared bit for bit.
 */
function canonicalBytes(a: Float64Array): Buffer {
  return bytes(a.map((x) => (Number.isNaN(x) ? Number.NaN : x)));
}

function assertSame(js: ReturnType<typeof bothGathers>['js'], wasm: ReturnType<typeof bothGathers>['js'], what: string): void {
  const floats = (b: Buffer): Float64Array => new Float64Array(b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength));
  assert.ok(canonicalBytes(floats(js.out)).equals(canonicalBytes(floats(wasm.out))), `${what}: out`);
  assert.ok(canonicalBytes(js.s1).equals(canonicalBytes(wasm.s1)), `${what}: s1`);
  assert.ok(canonicalBytes(js.s2).equals(canonicalBytes(wasm.s2)), `${what}: s2`);
  for (const [side, name] of [[js, 'TypeScript'], [wasm, 'WebAssembly']] as const) {
    assert.ok(canonicalBytes(side.direct.s1).equals(canonicalBytes(side.s1)), `${what}: s1 added as the columns end (${name})`);
    assert.ok(canonicalBytes(side.direct.s2).equals(canonicalBytes(side.s2)), `${what}: s2 added as the columns end (${name})`);
  }
}

describe('what-if/column-gather-wasm', () => {
  it('loads', () => {
    assert.ok(columnGatherModule() !== null, 'the WebAssembly gather did not load');
  });

  it('random columns (empty, one entry, full, repeated), plain values: the same bytes as gatherColumnChanges, in 3 to 64 blocks', () => {
    for (const [seed, rows, cols] of [[31, 200, 150], [32, 57, 3], [33, 400, 40]] as const) {
      for (const t of [0, 1, cols - 1]) {
        const { js, wasm } = bothGathers(seed, rows, cols, 0, t);
        assert.ok(js.s1.some((x) => x !== 0 && Number.isFinite(x)), 'some column gathered');
        assertSame(js, wasm, `seed ${seed}, ${cols} columns in ${js.blocks} blocks, t ${t}`);
      }
    }
  });

  it('zeros, −0, tiny and huge values, infinities and NaN among the weights and factors: the same bytes, −0 included, NaN as NaN', () => {
    for (const seed of [34, 35, 36]) {
      const { js, wasm } = bothGathers(seed, 150, 90, 0.2, 7);
      const out = new Float64Array(js.out.buffer, js.out.byteOffset, js.out.length / 8);
      assert.ok(out.some((x) => Number.isNaN(x)) && out.some((x) => x === Infinity || x === -Infinity), 'NaN and infinite sums');
      assert.ok(out.some((x) => Object.is(x, -0)) || js.s1.some((x) => Object.is(x, -0)), 'a sum of −0');
      assertSame(js, wasm, `seed ${seed}, edge values`);
    }
  });

  it('every column stopped, and no entries at all: nothing gathered, the same bytes', () => {
    const rows = 20;
    const cols = 10;
    for (const webAssembly of [true, false]) {
      const gather = SharedColumnGather.create(rows, cols, 0, webAssembly);
      gather.divide();
      const s1 = new Float64Array(cols).fill(-0);
      const s2 = new Float64Array(cols).fill(-0);
      gather.gather(3, new Uint8Array(cols), s1, s2);
      assert.ok([...s1, ...s2].every((x, i) => Object.is(x, i % cols === 3 ? -0 : 0)), 'empty columns sum to +0; the toggled column is left alone');
    }
    const stopped = bothGathers(37, 30, 25, 0, 2, true);
    assert.ok([...stopped.js.s1, ...stopped.js.s2].every((x) => Object.is(x, -0)), 'no column gathered');
    assertSame(stopped.js, stopped.wasm, 'every column stopped');
  });

  it("a corpus's clicks through IncrementalTermSums: the WebAssembly gather leaves the TypeScript's sums, bit for bit", () => {
    const random = mulberry32(38);
    const X: Csr = textLikeRows(600, 90, random);
    const js = new IncrementalTermSums(X, Infinity, undefined, false);
    const wasm = new IncrementalTermSums(X, Infinity);
    const mask = new Uint8Array(X.cols);
    mask[5] = 1;
    js.at(mask, false);
    wasm.at(mask, false);
    assert.ok(SharedColumnGather.from(wasm.gatherBuffers()!).inWebAssembly, 'the state gathers in WebAssembly');
    assert.ok(!SharedColumnGather.from(js.gatherBuffers()!).inWebAssembly, 'the other state gathers in JavaScript');
    for (const t of [0, 1, 0, 2, 3, 0, 1, 40, 2, 0]) {
      mask[t] = mask[t] === 0 ? 1 : 0;
      const a = js.at(mask);
      const b = wasm.at(mask);
      assert.equal(wasm.lastStep.gathered, true, `term ${t}: no gather`);
      for (const key of ['s1', 's2', 'df'] as const) assert.ok(bytes(a.sums[key]).equals(bytes(b.sums[key])), `term ${t}: ${key}`);
      assert.equal(a.rowsWithWeight, b.rowsWithWeight);
    }
  });
});
