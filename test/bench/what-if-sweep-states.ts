// The what-if's sweep over the sample's products (measureSampleRows), timed alone on states
// written from real clicks, with its outputs hashed: for A/B runs of the sweep that need no
// editor and no review per run (the sweep is the largest part of a click's CPU).
//
//   node --import tsx test/bench/what-if-sweep-states.ts dump FILE.csv DIR   # one review, then the
//        e2e's clicks (the first suggestion unticked, then the second toggled) in one thread; each
//        click's dot products and row scales written to DIR/stateN.{dots,scale}
//   taskset -c 1 node --import tsx test/bench/what-if-sweep-states.ts time DIR [rounds] [--js]
//        # CPU ms per sweep (blocks of 16, as the what-if; its rows in WebAssembly as SharedRowSweep
//        # runs them, or with --js in the TypeScript), median and least after the first round,
//        # and a hash of every output of the first round (equal hashes: the same bits)
//   taskset -c 1 node --import tsx test/bench/what-if-sweep-states.ts tail DIR [rounds]
//        # what the what-if's thread does after a sweep while the review's thread waits for it:
//        # reduceSweep on the sweep's own outputs and the fields read off them (sampledFieldsOf),
//        # each state swept once beforehand; ms per state (median and least after the first
//        # round) and a hash of the fields. The dump holds no labels: labels are position mod 20,
//        # and the baseline's neighbours the first state's
//   taskset -c 1 node --import tsx test/bench/what-if-sweep-states.ts ab DIR A.wat B.wat [rounds]
//        # two builds of sweep-rows.wat in one process, each state swept by both, which goes first
//        # alternating round by round: CPU ms per sweep of each (median and least after the first
//        # round) and each one's hash. The host's clock moves by a quarter or more between runs
//        # minutes apart (docs/performance.md), and within a minute while another process runs,
//        # so a change of 2–3% shows only when both builds run side by side like this
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

const engine = (path: string) => resolve(__dirname, '../../extension/src/engine', path);

/** The dumped states in `dir` (their .dots files, in order), a reader of their arrays, and the what-if's sweep shape. */
function dumpedStates(dir: string) {
  const read = (name: string): Float64Array => {
    const bytes = readFileSync(join(dir, name));
    return new Float64Array(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.length));
  };
  const names = readdirSync(dir).filter((n) => /^state\d+\.dots$/.test(n)).sort();
  const m = read(names[0]!.replace('.dots', '.scale')).length;
  const [k, blockRows] = [10, 16]; // the what-if's (WHAT_IF_BLOCK_ROWS)
  return { read, names, m, k, blockRows, blocks: Math.ceil(m / blockRows) };
}

async function dump(file: string, dir: string): Promise<void> {
  const { IncrementalGram } = (await import(engine('what-if/incremental-gram.ts'))) as typeof import('../../extension/src/engine/what-if/incremental-gram');
  const { startReview } = (await import(engine('review/start-review.ts'))) as typeof import('../../extension/src/engine/review/start-review');
  let capture = false;
  const states: Array<{ dots: Float64Array; scale: Float64Array }> = [];
  const scaled = IncrementalGram.prototype.scaled;
  IncrementalGram.prototype.scaled = function (this: InstanceType<typeof IncrementalGram>, ...args: Parameters<typeof scaled>) {
    const out = scaled.apply(this, args);
    if (capture) states.push({ dots: out.dots.slice(), scale: out.scale.slice() });
    return out;
  };
  // No prepareWhatIf: the session answers in this thread, so the sample's state is this one's.
  const session = await startReview({ file: resolve(file), configPath: null, overrides: { text: 'text', label: 'topic' } }, {});
  const [first, second] = session.report.suggestions;
  const without = session.report.suggestions.filter((t) => t !== first);
  const withoutBoth = without.filter((t) => t !== second);
  capture = true;
  for (const selection of [without, withoutBoth, without, withoutBoth]) await session.whatIf(selection);
  capture = false;
  states.forEach((s, i) => {
    writeFileSync(join(dir, `state${i}.dots`), Buffer.from(s.dots.buffer));
    writeFileSync(join(dir, `state${i}.scale`), Buffer.from(s.scale.buffer));
  });
  console.log(JSON.stringify({ states: states.length, m: states[0]?.scale.length, k: session.report.baseline.sample.k }));
  await session.close?.();
}

async function time(dir: string, rounds: number, js: boolean): Promise<void> {
  const { pairShift, reduceSweep, SweepRows } = (await import(engine('measures/measure-sample-rows.ts'))) as typeof import('../../extension/src/engine/measures/measure-sample-rows');
  const W = (await import(engine('measures/sweep-rows-wasm.ts'))) as typeof import('../../extension/src/engine/measures/sweep-rows-wasm');
  const { validRowsFromGram } = (await import(engine('measures/gram-distances.ts'))) as typeof import('../../extension/src/engine/measures/gram-distances');
  const module = W.sweepRowsModule();
  if (!js && module === null) throw new Error('the WebAssembly sweep did not load');
  const { read, names, m, k, blockRows, blocks } = dumpedStates(dir);
  // Every state in one memory laid out as SharedRowSweep's (sweep-rows-wasm.ts), filled before the clock starts.
  const layout = W.sweepLayout(m, k, blocks, names.length, 1);
  const memory = W.sweepMemory(layout);
  const buffer = memory.buffer;
  const out = W.outputsAt(buffer, layout);
  const valid = new Uint8Array(buffer, layout.valid, m);
  const states = names.map((n, i) => {
    const at = layout.states[i]!;
    const dots = new Float64Array(buffer, at.dots, m * m);
    const scale = new Float64Array(buffer, at.scale, m);
    dots.set(read(n));
    scale.set(read(n.replace('.dots', '.scale')));
    return { at, dots, scale, valid: validRowsFromGram(dots, m) };
  });
  const wasm = js ? null : new W.WasmSweepRows(module!, memory, layout, blockRows, 0);
  const hash = createHash('sha256');
  const ms: number[] = [];
  for (let r = 0; r < rounds; r++) {
    for (const s of states) {
      // A what-if's sweep as SharedRowSweep.sweep runs it on one thread: the shift, the blocks, the sums.
      const cpu = process.cpuUsage();
      valid.set(s.valid);
      const shift = pairShift(s.dots, m, valid, s.scale);
      const rows = new SweepRows(s.dots, m, k, valid, s.scale, shift, out, blockRows);
      if (wasm === null) for (let b = 0; b < blocks; b++) rows.block(b);
      else {
        wasm.state(s.at.dots, s.at.scale, shift);
        for (let b = 0; b < blocks; b++) wasm.block(b);
      }
      const result = reduceSweep(rows, out, blocks);
      const d = process.cpuUsage(cpu);
      if (r > 0) ms.push((d.user + d.system) / 1000);
      if (r === 0) {
        const { knn, kOccurrence, standoutPerQuery, nnDist, ...rest } = result;
        for (const a of [knn.neighbors, knn.sims, kOccurrence, standoutPerQuery, nnDist]) hash.update(Buffer.from(a.buffer, a.byteOffset, a.byteLength));
        hash.update(JSON.stringify(rest));
      }
    }
  }
  ms.sort((a, b) => a - b);
  console.log(JSON.stringify({ rows: js ? 'JavaScript' : 'WebAssembly', hash: hash.digest('hex').slice(0, 16), sweeps: ms.length, medianMs: ms[ms.length >> 1], leastMs: ms[0] }));
}

async function tail(dir: string, rounds: number): Promise<void> {
  const { pairShift, reduceSweep, SweepRows } = (await import(engine('measures/measure-sample-rows.ts'))) as typeof import('../../extension/src/engine/measures/measure-sample-rows');
  const { sampledFieldsOf } = (await import(engine('measures/measure-distances.ts'))) as typeof import('../../extension/src/engine/measures/measure-distances');
  const W = (await import(engine('measures/sweep-rows-wasm.ts'))) as typeof import('../../extension/src/engine/measures/sweep-rows-wasm');
  const { validRowsFromGram } = (await import(engine('measures/gram-distances.ts'))) as typeof import('../../extension/src/engine/measures/gram-distances');
  const module = W.sweepRowsModule();
  if (module === null) throw new Error('the WebAssembly sweep did not load');
  const { read, names, m, k, blockRows, blocks } = dumpedStates(dir);
  const layout = W.sweepLayout(m, k, blocks, 1, 1);
  const memory = W.sweepMemory(layout);
  const buffer = memory.buffer;
  const out = W.outputsAt(buffer, layout);
  const valid = new Uint8Array(buffer, layout.valid, m);
  const at = layout.states[0]!;
  const wasm = new W.WasmSweepRows(module, memory, layout, blockRows, 0);
  // Each state swept once, in its own memory's outputs; those kept and put back before its timed tail.
  const outputs = (): Array<Float64Array | Uint32Array | Int32Array> => [out.knn.neighbors, out.knn.sims, out.nnDist, out.zScores, out.contrast, out.slack, out.rowMean, out.rowMin, out.nearBin, out.tieGroup, out.blockPairs, out.blockBins];
  const swept = names.map((n) => {
    const dots = read(n);
    const scale = read(n.replace('.dots', '.scale'));
    new Float64Array(buffer, at.dots, m * m).set(dots);
    new Float64Array(buffer, at.scale, m).set(scale);
    const v = validRowsFromGram(dots, m);
    valid.set(v);
    const shift = pairShift(dots, m, valid, scale);
    wasm.state(at.dots, at.scale, shift);
    for (let b = 0; b < blocks; b++) wasm.block(b);
    return { dots, scale, valid: v, shift, saved: outputs().map((a) => a.slice()) };
  });
  const labels = Int32Array.from({ length: m }, (_, i) => i % 20);
  const baselineNeighbors = (swept[0]!.saved[0] as Uint32Array).slice();
  const hash = createHash('sha256');
  const ms: number[] = [];
  for (let r = 0; r < rounds; r++) {
    for (const s of swept) {
      new Float64Array(buffer, at.dots, m * m).set(s.dots);
      new Float64Array(buffer, at.scale, m).set(s.scale);
      valid.set(s.valid);
      outputs().forEach((a, i) => a.set(s.saved[i]! as never));
      const rows = new SweepRows(new Float64Array(buffer, at.dots, m * m), m, k, valid, new Float64Array(buffer, at.scale, m), s.shift, out, blockRows);
      // From here as SharedRowSweep.sweep (its answer in views) and sampledMeasures run it.
      const t = performance.now();
      const { measures } = sampledFieldsOf(reduceSweep(rows, out, blocks, false), valid, { k, seed: 1, labels, baselineNeighbors });
      const elapsed = performance.now() - t;
      if (r > 0) ms.push(elapsed);
      if (r === 0) hash.update(JSON.stringify(measures));
    }
  }
  ms.sort((a, b) => a - b);
  console.log(JSON.stringify({ part: 'tail', hash: hash.digest('hex').slice(0, 16), tails: ms.length, medianMs: ms[ms.length >> 1], leastMs: ms[0] }));
}

async function ab(dir: string, watA: string, watB: string, rounds: number): Promise<void> {
  const { pairShift, reduceSweep, SweepRows } = (await import(engine('measures/measure-sample-rows.ts'))) as typeof import('../../extension/src/engine/measures/measure-sample-rows');
  const W = (await import(engine('measures/sweep-rows-wasm.ts'))) as typeof import('../../extension/src/engine/measures/sweep-rows-wasm');
  const { validRowsFromGram } = (await import(engine('measures/gram-distances.ts'))) as typeof import('../../extension/src/engine/measures/gram-distances');
  const { assembleWat } = (await import(resolve(__dirname, '../../scripts/assemble-wat.mjs'))) as { assembleWat(path: string): Promise<Uint8Array> };
  const modules = [new WebAssembly.Module(await assembleWat(resolve(watA))), new WebAssembly.Module(await assembleWat(resolve(watB)))];
  const { read, names, m, k, blockRows, blocks } = dumpedStates(dir);
  const layout = W.sweepLayout(m, k, blocks, names.length, 1);
  const memory = W.sweepMemory(layout);
  const out = W.outputsAt(memory.buffer, layout);
  const valid = new Uint8Array(memory.buffer, layout.valid, m);
  const states = names.map((n, i) => {
    const at = layout.states[i]!;
    const dots = new Float64Array(memory.buffer, at.dots, m * m);
    const scale = new Float64Array(memory.buffer, at.scale, m);
    dots.set(read(n));
    scale.set(read(n.replace('.dots', '.scale')));
    return { at, dots, scale, valid: validRowsFromGram(dots, m) };
  });
  // Both builds over the one memory, each with its own instance (as two threads would be).
  const sweeps = modules.map((module) => new W.WasmSweepRows(module, memory, layout, blockRows, 0));
  const hashes = [createHash('sha256'), createHash('sha256')];
  const ms: number[][] = [[], []];
  for (let r = 0; r < rounds; r++) {
    for (const s of states) {
      for (const first of [0, 1]) {
        const side = (r + first) % 2;
        const cpu = process.cpuUsage();
        valid.set(s.valid);
        const shift = pairShift(s.dots, m, valid, s.scale);
        const rows = new SweepRows(s.dots, m, k, valid, s.scale, shift, out, blockRows);
        sweeps[side]!.state(s.at.dots, s.at.scale, shift);
        for (let b = 0; b < blocks; b++) sweeps[side]!.block(b);
        const result = reduceSweep(rows, out, blocks);
        const d = process.cpuUsage(cpu);
        if (r > 0) ms[side]!.push((d.user + d.system) / 1000);
        else {
          const { knn, kOccurrence, standoutPerQuery, nnDist, ...rest } = result;
          for (const a of [knn.neighbors, knn.sims, kOccurrence, standoutPerQuery, nnDist]) hashes[side]!.update(Buffer.from(a.buffer, a.byteOffset, a.byteLength));
          hashes[side]!.update(JSON.stringify(rest));
        }
      }
    }
  }
  const figures = (side: number, wat: string) => {
    const sorted = [...ms[side]!].sort((x, y) => x - y);
    return { wat, hash: hashes[side]!.digest('hex').slice(0, 16), sweeps: sorted.length, medianMs: sorted[sorted.length >> 1], leastMs: sorted[0] };
  };
  console.log(JSON.stringify({ part: 'ab', A: figures(0, watA), B: figures(1, watB) }));
}

const [mode, a, b, c, d] = process.argv.slice(2);
const run =
  mode === 'dump' && a && b
    ? dump(a, b)
    : mode === 'time' && a
      ? time(a, Number(b !== undefined && b !== '--js' ? b : '6'), b === '--js' || c === '--js')
      : mode === 'tail' && a
        ? tail(a, Number(b ?? '40'))
        : mode === 'ab' && a && b && c
          ? ab(a, b, c, Number(d ?? '10'))
          : Promise.reject(new Error('usage: what-if-sweep-states.ts dump FILE.csv DIR | time DIR [rounds] [--js] | tail DIR [rounds] | ab DIR A.wat B.wat [rounds]'));
run.then(
  () => process.exit(0),
  (e: unknown) => {
    console.error(e instanceof Error ? e.stack ?? e.message : String(e));
    process.exit(1);
  },
);
