// Times the verdict's corpus search (corpusNeighbors) on a JSON Lines corpus: both settings (no
// list, and the no-labels suggestions given as a file of terms), over the whole corpus, and prints
// the work (neighborSearchWork) and ns per step. A development aid for SEARCH_WORK
// (engine/terms/corpus-precision.ts); prints figures, asserts nothing.
// Usage: npx tsx test/bench/corpus-search-timing.ts CORPUS.jsonl STOPTERMS.txt [SAMPLE]
import { readFileSync } from 'node:fs';
import { buildCountMatrix } from '../../extension/src/engine/matrix/build-count-matrix';
import { weigh } from '../../extension/src/engine/matrix/weigh';
import { selectRows } from '../../extension/src/engine/matrix/select-rows';
import { corpusNeighbors, neighborSearchWork } from '../../extension/src/engine/measures/corpus-neighbors';
import { sampleIndices } from '../../extension/src/engine/random/seeded-random';
import { arrayCorpusSource } from '../reference/array-corpus-source';

async function main(): Promise<void> {
  const [file, stopFile, sampleArg] = process.argv.slice(2);
  const rows = readFileSync(file!, 'utf8').trim().split('\n').map((l, i) => ({ text: (JSON.parse(l) as { text: string }).text, label: null, line: i + 1 }));
  const tokens = { lowercase: true, minLength: 2, kinds: ['word', 'number', 'hashtag', 'emoji'] as const, stem: false, ngrams: 1 };
  const counts = (await buildCountMatrix(arrayCorpusSource(rows), { ...tokens, kinds: [...tokens.kinds] }, { workers: 0 })).counts;
  const weights = weigh(counts, { tf: 'raw', idf: 'smooth', norm: 'l2' }).weights;
  const stop = new Set(readFileSync(stopFile!, 'utf8').split('\n').map((s) => s.trim()).filter((s) => s !== ''));
  const none = new Uint8Array(weights.cols);
  const suggested = new Uint8Array(weights.cols);
  counts.terms.forEach((t, c) => (suggested[c] = stop.has(t) ? 1 : 0));
  const m = Number(sampleArg ?? 2000);
  const sample = sampleIndices(weights.rows, m, 1);
  const queries = selectRows(weights, sample);
  const df = new Uint32Array(weights.cols);
  for (let p = 0; p < weights.indptr[weights.rows]!; p++) df[weights.indices[p]!]!++;
  const all = new Uint32Array(weights.rows).map((_, i) => i);
  for (const [name, removed] of [['no list', none], ['suggested', suggested]] as const) {
    const work = neighborSearchWork(queries, df, removed) + weights.rows * m;
    const times: number[] = [];
    let check = 0;
    for (let r = 0; r < 3; r++) {
      const t0 = performance.now();
      const lists = corpusNeighbors(queries, sample, weights, 0, removed, 10, all);
      times.push(performance.now() - t0);
      check = lists.sims.reduce((a, b) => (Number.isNaN(b) ? a : a + b), 0);
    }
    const best = Math.min(...times);
    console.log(`${name}: ${weights.rows} docs, ${m} queries, work ${work.toExponential(2)}, ${times.map((t) => t.toFixed(0)).join('/')} ms, ${((best * 1e6) / work).toFixed(1)} ns/step, checksum ${check}`);
  }
}
void main();
