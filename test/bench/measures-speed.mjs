// Timings of the distance measures on a generated sparse matrix (not a test: it prints figures).
// Run: npx tsx test/bench/measures-speed.mjs [documents] [nnzPerRow] [sample]
// Columns are drawn from a Zipf law (exponent 1) over a 50,000-term vocabulary, so a few terms
// sit in nearly every document, as function words do in text; rows are l2-normalised.
import { mulberry32, sampleIndices } from '../../extension/src/engine/random/seeded-random.ts';
import { termSums } from '../../extension/src/engine/measures/term-sums.ts';
import { sampleSimilarities } from '../../extension/src/engine/measures/sample-similarity.ts';
import { knnFromSimilarities } from '../../extension/src/engine/measures/knn.ts';
import { measureDistances } from '../../extension/src/engine/measures/measure-distances.ts';
import { measureSampleRows } from '../../extension/src/engine/measures/measure-sample-rows.ts';
import { validRowsFromGram } from '../../extension/src/engine/measures/gram-distances.ts';
import { selectRows } from '../../extension/src/engine/matrix/select-rows.ts';
import { IncrementalGram } from '../../extension/src/engine/what-if/incremental-gram.ts';

const n = Number(process.argv[2] ?? 100_000);
const perRow = Number(process.argv[3] ?? 80);
const m = Number(process.argv[4] ?? 2000);
const vocabulary = 50_000;
const k = 10;

function zipfMatrix() {
  const random = mulberry32(12345);
  const cdf = new Float64Array(vocabulary);
  let acc = 0;
  for (let t = 0; t < vocabulary; t++) cdf[t] = acc += 1 / (t + 1);
  for (let t = 0; t < vocabulary; t++) cdf[t] /= acc;
  const draw = () => {
    const u = random();
    let lo = 0;
    let hi = vocabulary - 1;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (cdf[mid] < u) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  const indptr = new Uint32Array(n + 1);
  const indices = new Uint32Array(n * perRow);
  const data = new Float64Array(n * perRow);
  // Typed scratch instead of a Map: `stamp` marks the terms already in the current row.
  const stamp = new Int32Array(vocabulary).fill(-1);
  const tf = new Uint32Array(vocabulary);
  const rowTerms = new Uint32Array(perRow);
  let p = 0;
  for (let r = 0; r < n; r++) {
    let distinct = 0;
    // Draw until the row has perRow distinct terms; repeats raise the count (tf).
    while (distinct < perRow) {
      const t = draw();
      if (stamp[t] !== r) {
        stamp[t] = r;
        tf[t] = 0;
        rowTerms[distinct++] = t;
      }
      tf[t]++;
    }
    const terms = rowTerms.slice().sort();
    let norm = 0;
    for (const t of terms) {
      const w = tf[t] * Math.log((1 + n) / (1 + Math.min(n, t + 1)));
      norm += w * w;
    }
    norm = Math.sqrt(norm);
    for (const t of terms) {
      indices[p] = t;
      data[p] = (tf[t] * Math.log((1 + n) / (1 + Math.min(n, t + 1)))) / norm;
      p++;
    }
    indptr[r + 1] = p;
  }
  return { rows: n, cols: vocabulary, indptr, indices: indices.subarray(0, p), data: data.subarray(0, p) };
}

// Wall clock and this process's CPU time: on a shared machine the CPU figure is the steadier one.
function time(label, fn) {
  const start = process.hrtime.bigint();
  const cpu = process.cpuUsage();
  const value = fn();
  const ms = Number(process.hrtime.bigint() - start) / 1e6;
  const used = process.cpuUsage(cpu);
  const cpuMs = (used.user + used.system) / 1000;
  console.log(`${label.padEnd(46)} wall ${ms.toFixed(1).padStart(8)} ms   cpu ${cpuMs.toFixed(1).padStart(8)} ms`);
  return value;
}

const X = time(`generate ${n} × ~${perRow} nnz (not measured)`, zipfMatrix);
console.log(`nnz ${X.indptr[n]}, sample ${m}, k ${k}`);
const sample = time('sampleIndices', () => sampleIndices(n, m, 1));
const sums = time('termSums (all rows)', () => termSums(X));
const sims = time('sampleSimilarities (m×m)', () => sampleSimilarities(X, sample));
time('knnFromSimilarities', () => knnFromSimilarities(sims, m, k));
const base = time('measureDistances (cold, computes sums)', () =>
  measureDistances(X, { sample, k, seed: 1, labels: null, baselineNeighbors: null }));
for (let run = 1; run <= 3; run++) {
  time(`measureDistances (what-if run ${run}, sums given)`, () =>
    measureDistances(X, { sample, k, seed: 1, labels: null, baselineNeighbors: base.neighbors, sums }));
}
const { measures } = base;
console.log(
  `background ${measures.backgroundSimilarity.toFixed(4)}, standout ${measures.neighborStandout?.toFixed(2)}, ` +
    `RC median ${measures.contrast?.median.toFixed(3)}, hubness skew ${measures.hubness?.skewness.toFixed(2)}, ` +
    `twoNN ${measures.intrinsicDimension.twoNN?.toFixed(1)}, mle ${measures.intrinsicDimension.mle?.toFixed(1)}`,
);

// The what-if's read-off alone: the sampled measures' sweep over the kept dot products and row
// scales that IncrementalGram hands over after three of the most frequent terms are stopped.
// Besides each whole sweep's median, the sum over 32-row blocks (timed through the sweep's
// interrupt hook) of each block's least time over the runs: a figure that other processes on a
// shared machine inflate much less, as a block (~2 ms) is seldom cut by a time slice.
const gram = new IncrementalGram(selectRows(X, sample));
const removed = new Uint8Array(X.cols);
gram.scaled(removed, false);
removed[0] = removed[2] = removed[5] = 1;
const { dots, scale } = gram.scaled(removed, true);
const valid = validRowsFromGram(dots, m);
const sweeps = 12;
const blockBest = new Float64Array(Math.ceil(m / 32) + 1).fill(Infinity);
const wall = [];
const cpu = [];
for (let run = 0; run < sweeps; run++) {
  let block = 0;
  let last = process.hrtime.bigint();
  const lap = () => {
    const now = process.hrtime.bigint();
    if (run >= 2) blockBest[block] = Math.min(blockBest[block], Number(now - last) / 1e6);
    block++;
    last = now;
  };
  const start = process.hrtime.bigint();
  const used = process.cpuUsage();
  measureSampleRows(dots, m, k, valid, scale, lap);
  lap();
  const spent = process.cpuUsage(used);
  if (run < 2) continue; // warm-up
  wall.push(Number(process.hrtime.bigint() - start) / 1e6);
  cpu.push((spent.user + spent.system) / 1000);
}
const median = (values) => [...values].sort((a, b) => a - b)[values.length >> 1];
let blocks = 0;
for (const t of blockBest) if (Number.isFinite(t)) blocks += t;
console.log(
  `what-if sampled sweep (${m}×${m}, ${sweeps - 2} runs): median wall ${median(wall).toFixed(1)} ms, cpu ${median(cpu).toFixed(1)} ms; ` +
    `sum of 32-row blocks' best ${blocks.toFixed(1)} ms`,
);
