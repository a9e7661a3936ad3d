// The sampled measures' row sweep in WebAssembly (measures/sweep-rows.wat) must write what the
// TypeScript's SweepRows writes, byte for byte (−0 included; a NaN as a NaN, whatever its bits): every output of every
// row and every block's sums, on random rows, on rows with ties at the k-th place, with invalid
// (empty) rows, with rows too short for k neighbours or for the radius slack's 10k-th distance,
// with rows whose distances are all equal, with rows whose radius bound falls short (the row's
// distances gathered again), with NaN, infinite, huge and −0 products where the .wat sweeps two
// rows side by side (rowPair: invalid rows between the two, a pair at a block's start and end, an
// odd row left alone), and with scores tied within the k-NN list's tolerance (the .wat passes over
// the scores below its listFloor once the list is full). The TypeScript is held to each measure's own function in
// test/measures-measure-sample-rows.test.ts.
import { strict as assert } from 'node:assert';
import { validRowsFromGram } from '../extension/src/engine/measures/gram-distances';
import { pairShift, sweepOutputs, SweepRows, type SweepOutputs } from '../extension/src/engine/measures/measure-sample-rows';
import { sampleSimilarities } from '../extension/src/engine/measures/sample-similarity';
import { outputsAt, sweepLayout, sweepMemory, sweepRowsModule, WasmSweepRows } from '../extension/src/engine/measures/sweep-rows-wasm';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { denseToCsr, randomUnitRows } from './measures-fixtures';

/** Kept dot products and row scales of unit rows (as the what-if keeps them: dots·scale_i·scale_j are the cosines). */
function products(seed: number, n: number, cols: number, density: number, emptyEvery: number, duplicateEvery = 0): { gram: Float64Array; scale: Float64Array } {
  const random = mulberry32(seed);
  const rows = randomUnitRows(random, n, cols, density, emptyEvery);
  if (duplicateEvery > 0) for (let r = 5; r < n; r += duplicateEvery) rows[r] = rows[r - 3]!.slice();
  const scale = Float64Array.from({ length: n }, () => 0.5 + random());
  const scaled = rows.map((row, i) => row.map((v) => v / scale[i]!));
  return { gram: sampleSimilarities(denseToCsr(scaled, cols), Uint32Array.from({ length: n }, (_, i) => i)), scale };
}

const FIELDS: Array<keyof Omit<SweepOutputs, 'knn'>> = ['nnDist', 'zScores', 'contrast', 'slack', 'rowMean', 'rowMin', 'nearBin', 'tieGroup', 'blockPairs', 'blockBins'];

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

/** Both sweeps' outputs; the WebAssembly's blocks in reverse order, into memory filled with 0xa5 first. */
function bothSweeps(gram: Float64Array, m: number, k: number, scale: Float64Array, blockRows: number): { js: SweepOutputs; wasm: SweepOutputs } {
  const valid = validRowsFromGram(gram, m);
  const blocks = Math.ceil(m / blockRows);
  const shift = pairShift(gram, m, valid, scale);
  const js = sweepOutputs(m, k, blocks);
  const rows = new SweepRows(gram, m, k, valid, scale, shift, js, blockRows);
  for (let b = 0; b < blocks; b++) rows.block(b);

  const module = sweepRowsModule();
  assert.ok(module !== null, 'the WebAssembly sweep did not load');
  const layout = sweepLayout(m, k, blocks, 2, 2);
  const memory = sweepMemory(layout);
  new Uint8Array(memory.buffer).fill(0xa5);
  const state = layout.states[1]!;
  new Float64Array(memory.buffer, state.dots, m * m).set(gram);
  new Float64Array(memory.buffer, state.scale, m).set(scale);
  new Uint8Array(memory.buffer, layout.valid, m).set(valid);
  const wasm = new WasmSweepRows(module, memory, layout, blockRows, 1);
  wasm.state(state.dots, state.scale, shift);
  for (let b = blocks - 1; b >= 0; b--) wasm.block(b);
  return { js, wasm: outputsAt(memory.buffer, layout) };
}

function assertSameBytes(js: SweepOutputs, wasm: SweepOutputs, what: string): void {
  assert.ok(bytes(js.knn.neighbors).equals(bytes(wasm.knn.neighbors)), `${what}: knn.neighbors`);
  assert.ok(bytes(js.knn.sims).equals(bytes(wasm.knn.sims)), `${what}: knn.sims`);
  for (const f of FIELDS) assert.ok(bytes(js[f]).equals(bytes(wasm[f])), `${what}: ${f}`);
}

describe('measures/sweep-rows-wasm', () => {
  it('random rows with empty ones, in blocks and in one block: the same bytes as SweepRows', () => {
    const n = 301;
    const { gram, scale } = products(11, n, 40, 0.3, 17);
    for (const [k, blockRows] of [[10, 16], [10, n], [3, 7], [1, 50]] as const) {
      const { js, wasm } = bothSweeps(gram, n, k, scale, blockRows);
      assert.ok(js.zScores.some((z) => Number.isNaN(z)) && js.zScores.some((z) => !Number.isNaN(z)), 'both valid and empty rows');
      assertSameBytes(js, wasm, `k ${k}, blocks of ${blockRows}`);
    }
  });

  it('few columns and duplicate rows (ties at the k-th place, equal distances): the same bytes', () => {
    const n = 160;
    const { gram, scale } = products(12, n, 3, 0.6, 11, 13);
    for (const k of [5, 10]) {
      const { js, wasm } = bothSweeps(gram, n, k, scale, 16);
      // Rows whose k-th score is tied beyond the list's own entries: the kept-aside tie scores count.
      assert.ok(js.tieGroup.some((g, i) => g > 1 && !Number.isNaN(js.zScores[i]!)), 'no tie group at a k-th place');
      assertSameBytes(js, wasm, `ties, k ${k}`);
    }
  });

  it('rows too short for k neighbours or 10k distances, all rows equal, and every row empty: the same bytes', () => {
    const short = products(13, 31, 8, 0.4, 7);
    for (const k of [5, 29, 40]) {
      const { js, wasm } = bothSweeps(short.gram, 31, k, short.scale, 4);
      assertSameBytes(js, wasm, `31 rows, k ${k}`);
    }
    // Every row the same point: all distances 0 (countInRanges finds one value), no contrast.
    const same = new Float64Array(20 * 20).fill(1);
    const ones = new Float64Array(20).fill(1);
    const equal = bothSweeps(same, 20, 3, ones, 6);
    assert.ok(Number.isNaN(equal.js.slack[0]!) && Number.isNaN(equal.js.contrast[0]!));
    assertSameBytes(equal.js, equal.wasm, 'equal rows');
    const empty = bothSweeps(new Float64Array(12 * 12), 12, 3, new Float64Array(12).fill(1), 5);
    assertSameBytes(empty.js, empty.wasm, 'empty rows');
  });

  it('products with NaN, ±∞, huge and ±0 values and invalid rows between valid ones, rows paired in every way: the same bytes', () => {
    const n = 97;
    const { gram, scale } = products(15, n, 12, 0.5, 5);
    const random = mulberry32(16);
    const odd = [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, 1e300, -1e300, -0, 0, 5e-324];
    for (let t = 0; t < 300; t++) {
      const i = Math.floor(random() * n);
      const j = Math.floor(random() * n);
      if (i !== j) gram[i * n + j] = odd[t % odd.length]!;
    }
    // Rows 0 and 1 valid (each the other's first column), then runs of invalid rows between valid ones.
    for (const r of [3, 4, 5, 9, 12, 13]) for (let j = 0; j < n; j++) gram[r * n + j] = gram[j * n + r] = 0;
    const valid = validRowsFromGram(gram, n);
    assert.ok(valid[0] && valid[1] && !valid[3] && !valid[4] && !valid[5], 'the rows meant to be valid or not');
    for (const [k, blockRows] of [[3, 1], [3, 2], [4, 5], [10, 16], [5, n]] as const) {
      const { js, wasm } = bothSweeps(gram, n, k, scale, blockRows);
      assert.ok(js.blockBins.some((c) => c > 0) && js.blockPairs.some((x) => Number.isNaN(x)) && js.zScores.some((z) => Number.isFinite(z)), 'NaN pair sums and counted pairs');
      assertSameBytes(js, wasm, `odd values, k ${k}, blocks of ${blockRows}`);
    }
  });

  it('scores tied within the k-NN tolerance at and around the k-th place (the offers after the list fills): the same bytes', () => {
    // A made-up symmetric matrix of unit diagonal: a few levels of score, each entry moved by 0,
    // ±1e-13 or ±3e-12 of itself, so that offers meet scores within (or just outside) the
    // tolerance of the list's entries in every order, and the kept-aside ties count.
    const m = 180;
    const random = mulberry32(17);
    const gram = new Float64Array(m * m);
    const levels = [0.9, 0.6, 0.3, -0.2];
    const moves = [0, 1e-13, -1e-13, 3e-12, -3e-12, 2e-12];
    for (let i = 0; i < m; i++) {
      gram[i * m + i] = 1;
      for (let j = i + 1; j < m; j++) {
        const level = levels[Math.floor(random() * random() * levels.length)]!;
        gram[i * m + j] = gram[j * m + i] = level * (1 + moves[Math.floor(random() * moves.length)]!);
      }
    }
    for (const k of [3, 10, 25]) {
      const { js, wasm } = bothSweeps(gram, m, k, new Float64Array(m).fill(1), 16);
      assert.ok(js.tieGroup.some((g) => g > 1), 'ties at the k-th place');
      assertSameBytes(js, wasm, `near ties, k ${k}`);
    }
  });

  it('rows whose every 16th entry is near and the rest far (the radius bound falls short, the row is read again): the same bytes', () => {
    // A made-up symmetric matrix of unit diagonal, not a Gram matrix: the sweep only reads it.
    const m = 400;
    const random = mulberry32(14);
    const gram = new Float64Array(m * m);
    for (let i = 0; i < m; i++) {
      gram[i * m + i] = 1;
      for (let j = i + 1; j < m; j++) gram[i * m + j] = gram[j * m + i] = (i % 16 === 0) === (j % 16 === 0) ? 0.9 + 0.05 * random() : 0.1 * random();
    }
    const { js, wasm } = bothSweeps(gram, m, 5, new Float64Array(m).fill(1), 16);
    assert.ok(js.slack.every((s) => Number.isFinite(s)), 'every row has a radius slack');
    assertSameBytes(js, wasm, 'a short radius bound');
  });
});
