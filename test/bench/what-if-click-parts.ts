// A what-if click's two update parts timed alone, on the bench's clicks replayed from a dump, with
// their outputs hashed: the exact term sums (IncrementalTermSums.at, the whole corpus) and the
// sample's dot products (IncrementalGram.scaled). For A/B runs of either part that need no review
// per run; pin them with `taskset -c N` and alternate builds (docs/performance.md says why).
//
//   node --import tsx test/bench/what-if-click-parts.ts dump FILE.csv DIR   # one review, then the
//        bench's clicks (what-if-latency.ts: 9 toggles, every other one undone) in one thread;
//        the weights, the sampled rows, the opening mask and every click's mask written to DIR
//   taskset -c 1 node --import tsx test/bench/what-if-click-parts.ts time DIR exact|gram|sample [rounds] [--js]
//        # CPU ms per click of that part in one thread (each round from the opening state, the
//        # idle-time drift resets between clicks untimed, as in the editor), median and least
//        # after the first round, and a hash of every click's output in the first round (equal
//        # hashes: the same bits); --js: the TypeScript loops instead of the WebAssembly ones;
//        # `sample`: the what-if thread's whole half (SampleSide.measures: the dot products,
//        # the sweep in its shared memory with no helper, the fields), its Measures hashed
import { createHash } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { Csr } from '../../extension/src/engine/matrix/csr';

const engine = (path: string) => resolve(__dirname, '../../extension/src/engine', path);

function writeCsr(dir: string, name: string, m: Csr): void {
  writeFileSync(join(dir, `${name}.json`), JSON.stringify({ rows: m.rows, cols: m.cols }));
  writeFileSync(join(dir, `${name}.indptr`), Buffer.from(m.indptr.buffer, m.indptr.byteOffset, m.indptr.byteLength));
  writeFileSync(join(dir, `${name}.indices`), Buffer.from(m.indices.buffer, m.indices.byteOffset, m.indices.byteLength));
  writeFileSync(join(dir, `${name}.data`), Buffer.from(m.data.buffer, m.data.byteOffset, m.data.byteLength));
}

function readCsr(dir: string, name: string): Csr {
  const { rows, cols } = JSON.parse(readFileSync(join(dir, `${name}.json`), 'utf8')) as { rows: number; cols: number };
  const bytes = (ext: string) => {
    const b = readFileSync(join(dir, `${name}.${ext}`));
    return b.buffer.slice(b.byteOffset, b.byteOffset + b.length);
  };
  return { rows, cols, indptr: new Uint32Array(bytes('indptr')), indices: new Uint32Array(bytes('indices')), data: new Float64Array(bytes('data')) } as Csr;
}

async function dump(file: string, dir: string): Promise<void> {
  const { IncrementalGram } = (await import(engine('what-if/incremental-gram.ts'))) as typeof import('../../extension/src/engine/what-if/incremental-gram');
  const { IncrementalTermSums } = (await import(engine('what-if/incremental-term-sums.ts'))) as typeof import('../../extension/src/engine/what-if/incremental-term-sums');
  const { startReview } = (await import(engine('review/start-review.ts'))) as typeof import('../../extension/src/engine/review/start-review');
  let capture = false;
  const masks: Uint8Array[] = [];
  let opening: Uint8Array | null = null;
  let weights: Csr | null = null;
  let sampleRows: Csr | null = null;
  const at = IncrementalTermSums.prototype.at;
  IncrementalTermSums.prototype.at = function (this: InstanceType<typeof IncrementalTermSums>, ...args: Parameters<typeof at>) {
    if (capture) {
      if (opening === null) opening = (this as unknown as { mask: Uint8Array }).mask.slice();
      weights = this.weights;
      masks.push(args[0].slice());
    }
    return at.apply(this, args);
  };
  const scaled = IncrementalGram.prototype.scaled;
  IncrementalGram.prototype.scaled = function (this: InstanceType<typeof IncrementalGram>, ...args: Parameters<typeof scaled>) {
    if (capture) sampleRows = this.rows;
    return scaled.apply(this, args);
  };
  // No prepareWhatIf: the session answers in this thread, so both states are this one's.
  const session = await startReview({ file: resolve(file), configPath: null, overrides: { text: 'text', label: 'topic' } }, {});
  const candidates = [...session.report.suggestions];
  for (const row of session.report.terms) if (!candidates.includes(row.term)) candidates.push(row.term);
  const flip = (terms: string[], term: string) => (terms.includes(term) ? terms.filter((t) => t !== term) : [...terms, term]);
  let selection = [...session.report.suggestions];
  capture = true;
  for (let i = 0; i < 9; i++) {
    const next = flip(selection, candidates[i % candidates.length]!);
    await session.whatIf(next);
    if (i % 2 === 0) selection = next;
    else await session.whatIf(selection);
  }
  capture = false;
  if (weights === null || sampleRows === null || opening === null) throw new Error('no click reached the states');
  writeCsr(dir, 'weights', weights);
  writeCsr(dir, 'sample', sampleRows);
  writeFileSync(join(dir, 'masks'), Buffer.concat([opening, ...masks]));
  console.log(JSON.stringify({ clicks: masks.length, cols: (weights as Csr).cols, nnz: (weights as Csr).indptr[(weights as Csr).rows], sampled: (sampleRows as Csr).rows }));
  await session.close?.();
}

async function time(dir: string, part: string, rounds: number, js: boolean): Promise<void> {
  const weights = readCsr(dir, part === 'exact' ? 'weights' : 'sample');
  const all = readFileSync(join(dir, 'masks'));
  const cols = weights.cols;
  const masks = Array.from({ length: all.length / cols }, (_, i) => Uint8Array.from(all.subarray(i * cols, (i + 1) * cols)));
  const opening = masks.shift()!;
  let step: (mask: Uint8Array, incremental: boolean) => ArrayBufferView[];
  let settle: () => void;
  if (part === 'exact') {
    const { IncrementalTermSums } = (await import(engine('what-if/incremental-term-sums.ts'))) as typeof import('../../extension/src/engine/what-if/incremental-term-sums');
    const Sums = IncrementalTermSums as unknown as new (...a: unknown[]) => InstanceType<typeof IncrementalTermSums>;
    const sums = js ? new Sums(weights, undefined, undefined, false) : new Sums(weights);
    sums.prepare();
    step = (mask, incremental) => {
      const { sums: s, rowsWithWeight } = sums.at(mask, incremental);
      return [s.s1, s.s2, s.df, Float64Array.of(rowsWithWeight)];
    };
    settle = () => sums.settle();
  } else if (part === 'gram') {
    const { IncrementalGram } = (await import(engine('what-if/incremental-gram.ts'))) as typeof import('../../extension/src/engine/what-if/incremental-gram');
    const { SharedRowSweep } = (await import(engine('measures/shared-row-sweep.ts'))) as typeof import('../../extension/src/engine/measures/shared-row-sweep');
    const Gram = IncrementalGram as unknown as new (...a: unknown[]) => InstanceType<typeof IncrementalGram>;
    // The state in shared memory as the what-if's thread keeps it (SampleSide), with room for its update.
    const needs = (IncrementalGram as unknown as { storageNeeds?: (rows: Csr) => unknown }).storageNeeds?.(weights);
    const sweep = (SharedRowSweep.create as (...a: unknown[]) => InstanceType<typeof SharedRowSweep>)(weights.rows, 10, 16, 1, needs);
    const gram = new Gram(weights, sweep.state(0), true, !js);
    step = (mask, incremental) => {
      const { dots, scale } = gram.scaled(mask, incremental);
      return [dots, scale];
    };
    settle = () => gram.settle();
  } else if (part === 'sample') {
    const { SampleSide } = (await import(engine('what-if/sample-side.ts'))) as typeof import('../../extension/src/engine/what-if/sample-side');
    const { IncrementalGram } = (await import(engine('what-if/incremental-gram.ts'))) as typeof import('../../extension/src/engine/what-if/incremental-gram');
    const { SharedRowSweep } = (await import(engine('measures/shared-row-sweep.ts'))) as typeof import('../../extension/src/engine/measures/shared-row-sweep');
    // The what-if thread's whole half (SampleSide: the dot products' update, the sweep opened
    // under a ticket as the thread opens it, with no helper, and the fields read off it), in
    // the thread's shared memory. The dump holds no labels: position mod 20, as
    // what-if-sweep-states.ts tail does; no baseline neighbours.
    const m = weights.rows;
    const labels = Int32Array.from({ length: m }, (_, i) => i % 20);
    const sweep = SharedRowSweep.create(m, 10, 16, 2, IncrementalGram.storageNeeds(weights));
    // With the shared list of a click's terms where this build has one (GramRowsUpdate): the update row by row in the sweep.
    const rowsUpdate = (await import(engine('what-if/gram-rows-update.ts')).catch(() => null)) as { GramRowsUpdate?: { buffer(): SharedArrayBuffer } } | null;
    const list = rowsUpdate?.GramRowsUpdate?.buffer();
    const side = new SampleSide({ rows: weights, k: 10, seed: 1, labels, baselineNeighbors: null, sweep: sweep.buffers, ...(list === undefined ? {} : { rowsUpdate: list }) });
    let ticket = 0;
    step = (mask, incremental) => [Buffer.from(JSON.stringify(side.measures(mask, incremental, ++ticket)))];
    settle = () => side.settle();
  } else throw new Error(`no part ${part}`);
  const hash = createHash('sha256');
  const ms: number[] = [];
  for (let r = 0; r < rounds; r++) {
    step(opening, false);
    for (const mask of masks) {
      const cpu = process.cpuUsage();
      const out = step(mask, true);
      const d = process.cpuUsage(cpu);
      if (r > 0) ms.push((d.user + d.system) / 1000);
      if (r === 0) for (const a of out) hash.update(Buffer.from(a.buffer, a.byteOffset, a.byteLength));
      settle();
    }
  }
  ms.sort((a, b) => a - b);
  console.log(JSON.stringify({ part, loops: js ? 'JavaScript' : 'WebAssembly', hash: hash.digest('hex').slice(0, 16), clicks: ms.length, medianMs: ms[ms.length >> 1], leastMs: ms[0] }));
}

const [mode, a, b, c, d] = process.argv.slice(2);
const rest = [c, d].filter((x) => x !== undefined);
const run =
  mode === 'dump' && a && b
    ? dump(a, b)
    : mode === 'time' && a && b
      ? time(a, b, Number(rest.find((x) => x !== '--js') ?? '4'), rest.includes('--js'))
      : Promise.reject(new Error('usage: what-if-click-parts.ts dump FILE.csv DIR | time DIR exact|gram|sample [rounds] [--js]'));
run.then(
  () => process.exit(0),
  (e: unknown) => {
    console.error(e instanceof Error ? e.stack ?? e.message : String(e));
    process.exit(1);
  },
);
