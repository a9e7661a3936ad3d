// The what-if's dot-product update in WebAssembly (what-if/gram-update.wat) must leave what the
// TypeScript's IncrementalGram.update leaves, byte for byte: every dot product (an exact +0 where a
// pair's count of shared terms reaches 0, infinities and NaN as they come, a NaN compared as a
// NaN) and every count, after each click. Compared on text-like rows (duplicates: tied pairs;
// rows of one or two terms that empty out), with single toggles, several terms at once, a term in every row and one in a single row,
// weights of both signs with zeros, huge and tiny values, and a row long enough for 32-bit counts.
// The TypeScript is held to a full recompute in test/what-if-incremental.test.ts.
import { strict as assert } from 'node:assert';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { SharedRowSweep } from '../extension/src/engine/measures/shared-row-sweep';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { gramUpdateModule, IncrementalGram } from '../extension/src/engine/what-if/incremental-gram';
import { textLikeRows } from './support/text-like-rows';

/**
 * The bytes to compare, every NaN of a float array written as the one canonical NaN: a NaN's sign
 * and payload are fixed by neither side (WebAssembly leaves arithmetic NaNs' bits open; V8 gives
 * the CPU's default NaN in optimised code and the canonical one elsewhere), so they can differ from
 * run to run. Every other value, −0 included, is compared bit for bit.
 */
function bytes(a: ArrayBufferView): Buffer {
  const view = a instanceof Float64Array || a instanceof Float32Array ? a.map((x) => (Number.isNaN(x) ? Number.NaN : x)) : a;
  return Buffer.from(view.buffer, view.byteOffset, view.byteLength);
}

/** Two states over `rows`, each in shared memory as the what-if's thread keeps it: the update in WebAssembly and in TypeScript. */
function twoStates(rows: Csr): { wasm: IncrementalGram; js: IncrementalGram; counts: [Uint16Array | Uint32Array, Uint16Array | Uint32Array] } {
  const room = IncrementalGram.storageNeeds(rows);
  const a = SharedRowSweep.create(rows.rows, 3, 16, 1, room).state(0);
  const b = SharedRowSweep.create(rows.rows, 3, 16, 1, room).state(0);
  const wasm = new IncrementalGram(rows, a);
  const js = new IncrementalGram(rows, b, true, false);
  assert.ok(wasm.inWebAssembly, 'the state updates in WebAssembly');
  assert.ok(!js.inWebAssembly, 'the other state updates in JavaScript');
  return { wasm, js, counts: [a.counts!, b.counts!] };
}

/** Toggles the masks' columns click by click (each a list of columns flipped together) and compares both states after each. */
function clickBoth(rows: Csr, clicks: number[][], what: string, start?: Uint8Array): void {
  const { wasm, js, counts } = twoStates(rows);
  const mask = start?.slice() ?? new Uint8Array(rows.cols);
  wasm.scaled(mask, false);
  js.scaled(mask, false);
  let updates = 0;
  clicks.forEach((columns, i) => {
    for (const t of columns) mask[t] = mask[t] === 0 ? 1 : 0;
    const a = wasm.scaled(mask);
    const b = js.scaled(mask);
    assert.equal(wasm.lastStep.kind, js.lastStep.kind);
    if (wasm.lastStep.kind === 'incremental') updates++;
    assert.ok(bytes(a.dots).equals(bytes(b.dots)), `${what}, click ${i} (${columns}): dots`);
    assert.ok(bytes(a.scale).equals(bytes(b.scale)), `${what}, click ${i}: scale`);
    assert.ok(bytes(counts[0]).equals(bytes(counts[1])), `${what}, click ${i}: counts`);
  });
  assert.ok(updates >= clicks.length / 2, `${what}: only ${updates} of ${clicks.length} clicks updated`);
}

/** The rows with column 0 added to every row (a term in every row) and column cols−1 to row 3 alone. */
function withEverywhereAndOnce(X: Csr): Csr {
  const indptr = new Uint32Array(X.rows + 1);
  const indices: number[] = [];
  const data: number[] = [];
  for (let r = 0; r < X.rows; r++) {
    const entries = new Map<number, number>();
    for (let p = X.indptr[r]!; p < X.indptr[r + 1]!; p++) entries.set(X.indices[p]!, X.data[p]!);
    if (!entries.has(0)) entries.set(0, 0.25);
    if (r === 3) entries.set(X.cols, 0.5);
    for (const [t, w] of [...entries.entries()].sort((a, b) => a[0] - b[0])) {
      indices.push(t);
      data.push(w);
    }
    indptr[r + 1] = indices.length;
  }
  return { rows: X.rows, cols: X.cols + 1, indptr, indices: Uint32Array.from(indices), data: Float64Array.from(data) };
}

describe('what-if/gram-update-wasm', () => {
  it('loads', () => {
    assert.ok(gramUpdateModule() !== null, 'the WebAssembly update did not load');
  });

  it('text-like rows (duplicates, rows that empty out), single toggles and the same term again: the same bytes as the TypeScript', () => {
    for (const seed of [41, 42]) {
      const rows = textLikeRows(150, 40, mulberry32(seed));
      clickBoth(rows, [[0], [1], [0], [2], [1], [5], [0], [3], [3], [0], [1], [2]], `seed ${seed}`);
    }
  });

  it('several terms at once, a term in every row, a term in one row only, from a mask with terms already stopped: the same bytes', () => {
    const rows = withEverywhereAndOnce(textLikeRows(120, 30, mulberry32(43)));
    const start = new Uint8Array(rows.cols);
    start[4] = 1;
    start[9] = 1;
    clickBoth(rows, [[0], [rows.cols - 1], [0, 1, 2], [4], [1, 9], [0], [rows.cols - 1, 0], [2]], 'every row and one row', start);
  });

  it('weights of both signs, zeros and −0 (skipped), huge and tiny values: the same bytes, infinities and NaN included', () => {
    const X = textLikeRows(100, 25, mulberry32(44));
    const random = mulberry32(45);
    const edges = [0, -0, 1e-300, -1e-300, 1e200, -1e200, 1e-160, 3];
    const data = X.data.map((w) => (random() < 0.2 ? edges[Math.floor(random() * edges.length)]! : random() < 0.3 ? -w : w));
    const rows = { ...X, data };
    const { wasm } = twoStates(rows);
    const mask = new Uint8Array(rows.cols);
    const dots = wasm.scaled(mask, false).dots;
    assert.ok(dots.some((x) => x === Infinity) && dots.some((x) => x < 0), 'infinite and negative products');
    mask[0] = 1;
    assert.ok(wasm.scaled(mask).dots.some((x) => Number.isNaN(x)), 'an update that makes NaN (∞ − ∞)');
    clickBoth(rows, [[0], [1], [2], [0], [3], [1], [0], [4]], 'edge weights');
  });

  it('a row long enough for 32-bit counts: the same bytes', () => {
    const cols = 0x10000 + 10;
    const long = Array.from({ length: cols }, (_, t) => t);
    const shortRows = [[0, 1, 2], [1, 5], [0, 7, 70_000 % cols], [2, 3, 4, 5], [0]];
    const all = [long, ...shortRows, long.filter((t) => t % 2 === 0)];
    const indptr = new Uint32Array(all.length + 1);
    all.forEach((r, i) => (indptr[i + 1] = indptr[i]! + r.length));
    const random = mulberry32(46);
    const rows: Csr = { rows: all.length, cols, indptr, indices: Uint32Array.from(all.flat()), data: Float64Array.from(all.flat(), () => 0.01 + random()) };
    assert.equal(IncrementalGram.storageNeeds(rows).countBytes, 4);
    clickBoth(rows, [[0], [1], [2], [0], [5], [1], [4]], '32-bit counts');
  });
});
