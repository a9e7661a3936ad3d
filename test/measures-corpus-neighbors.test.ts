import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { buildCountMatrix } from '../extension/src/engine/matrix/build-count-matrix';
import type { Csr } from '../extension/src/engine/matrix/csr';
import { weigh } from '../extension/src/engine/matrix/weigh';
import { corpusNeighbors, mergeNeighborLists, neighborSearchWork } from '../extension/src/engine/measures/corpus-neighbors';
import { selectRows } from '../extension/src/engine/matrix/select-rows';
import { NO_NEIGHBOR } from '../extension/src/engine/measures/knn';
import { corpusPrecision, searchedQueries, searchedRows, searchInProcess } from '../extension/src/engine/terms/corpus-precision';
import { createTokenizer, type TokenSettings } from '../extension/src/engine/tokenize/create-tokenizer';
import { arrayCorpusSource } from './reference/array-corpus-source';
import { readFortunes } from './reference/read-fortunes';
import { PYTHON, requireSklearn } from './reference/run-sklearn';

// Source of the expected neighbours: scikit-learn (Debian python3-sklearn) NearestNeighbors,
// brute-force cosine over TfidfVectorizer's defaults, run by test/reference/sklearn-neighbors.py
// on OUR tokens of the first 300 fortunes of Debian's `fortunes` package.
const tokens: TokenSettings = { lowercase: true, minLength: 2, kinds: ['word', 'number', 'hashtag', 'emoji'], stem: false, ngrams: 1 };
const STOP = ['the', 'of', 'and', 'to', 'you', 'is', 'it'];
const K = 10;

/** Cosine of rows a and b of `w` with the columns of `removed` left out (the test's own, dense). */
function maskedCosine(w: Csr, a: number, b: number, removed: Uint8Array): number {
  const row = (d: number): Map<number, number> => {
    const m = new Map<number, number>();
    for (let p = w.indptr[d]!; p < w.indptr[d + 1]!; p++) if (removed[w.indices[p]!] === 0) m.set(w.indices[p]!, w.data[p]!);
    return m;
  };
  const x = row(a);
  const y = row(b);
  let dot = 0;
  let nx = 0;
  let ny = 0;
  for (const [c, v] of x) {
    nx += v * v;
    dot += v * (y.get(c) ?? 0);
  }
  for (const v of y.values()) ny += v * v;
  return nx === 0 || ny === 0 ? 0 : dot / Math.sqrt(nx * ny);
}

describe('corpusNeighbors against scikit-learn (Debian fortunes)', function () {
  this.timeout(120000);
  let weights: Csr;
  let terms: readonly string[];
  let removed: Uint8Array;
  let theirs: { neighbors: number[][]; similarities: number[][] };
  const queries = new Uint32Array(40).map((_, i) => i * 7 + 3);

  before(async () => {
    requireSklearn();
    const rows = readFortunes(300);
    const counts = (await buildCountMatrix(arrayCorpusSource(rows), tokens, { workers: 0 })).counts;
    terms = counts.terms;
    weights = weigh(counts, { tf: 'raw', idf: 'smooth', norm: 'l2' }).weights;
    removed = new Uint8Array(weights.cols);
    terms.forEach((t, c) => (removed[c] = STOP.includes(t) ? 1 : 0));
    const tokenize = createTokenizer(tokens);
    const r = spawnSync(PYTHON, [join(__dirname, 'reference', 'sklearn-neighbors.py')], {
      input: JSON.stringify({ docs: rows.map((row) => tokenize(row.text)), stop: STOP, queries: [...queries], k: K }),
      encoding: 'utf8',
      maxBuffer: 64 * 1024 * 1024,
    });
    if (r.status !== 0) throw new Error(`sklearn-neighbors.py failed: ${r.stderr}`);
    theirs = JSON.parse(r.stdout);
  });

  it('finds the neighbours scikit-learn finds, at the same similarities, with a stop list', () => {
    const all = new Uint32Array(weights.rows).map((_, i) => i);
    const ours = corpusNeighbors(selectRows(weights, queries), queries, weights, 0, removed, K, all);
    let sameIds = 0;
    let compared = 0;
    for (let q = 0; q < queries.length; q++) {
      for (let r = 0; r < K; r++) {
        const expected = theirs.similarities[q]![r]!;
        const d = ours.docs[q * K + r]!;
        // Only documents sharing a term are neighbours; scikit-learn fills up at cosine 0.
        if (expected === 0) {
          assert.equal(d, NO_NEIGHBOR, `query ${queries[q]} rank ${r}: a neighbour at cosine 0`);
          continue;
        }
        assert.notEqual(d, NO_NEIGHBOR, `query ${queries[q]} rank ${r}: no neighbour`);
        assert.notEqual(d, queries[q], 'the query itself is excluded');
        const s = maskedCosine(weights, queries[q]!, d, removed);
        assert.ok(Math.abs(s - expected) <= 1e-9, `query ${queries[q]} rank ${r}: similarity ${s} vs scikit-learn's ${expected}`);
        assert.ok(Math.abs(ours.sims[q * K + r]! - s) <= 1e-12, 'the listed cosine is the cosine');
        compared++;
        if (d === theirs.neighbors[q]![r]) sameIds++;
      }
    }
    // Equal similarities may come in another order (scikit-learn's order among ties is its
    // partition's); all but those ties name the same documents.
    assert.ok(compared >= 0.8 * queries.length * K, `${compared} ranks compared`);
    assert.ok(sameIds >= 0.9 * compared, `same documents at ${sameIds} of ${compared} ranks`);
  });

  it('with no stop list (the commonest terms added as dense runs) lists the brute-force nearest, to the bit', () => {
    const sampleRows = selectRows(weights, queries);
    const none = new Uint8Array(weights.cols);
    // Terms held by a quarter of the queries or more are added as dense runs (corpus-neighbors.ts).
    const qdf = new Uint32Array(weights.cols);
    for (const c of sampleRows.indices) qdf[c]!++;
    assert.ok(qdf.some((n) => n >= 0.25 * queries.length), 'some term is dense');
    const ours = corpusNeighbors(sampleRows, queries, weights, 0, none, K, new Uint32Array(weights.rows).map((_, i) => i));
    for (let q = 0; q < queries.length; q++) {
      // The test's own brute force: every document's cosine, highest first, ties to the lower index.
      const ranked = Array.from({ length: weights.rows }, (_, d) => ({ d, s: d === queries[q] ? 0 : maskedCosine(weights, queries[q]!, d, none) }))
        .filter((x) => x.s > 0)
        .sort((a, b) => b.s - a.s || a.d - b.d);
      for (let r = 0; r < K; r++) {
        if (r >= ranked.length) {
          assert.equal(ours.docs[q * K + r], NO_NEIGHBOR, `query ${queries[q]} rank ${r}: only ${ranked.length} documents share a term`);
          continue;
        }
        assert.ok(Math.abs(ours.sims[q * K + r]! - ranked[r]!.s) <= 1e-12, `query ${queries[q]} rank ${r}: ${ours.sims[q * K + r]} vs ${ranked[r]!.s}`);
      }
    }
  });

  it('searches only the candidates, and lists over consecutive parts merge to the whole corpus\'s', () => {
    const sampleRows = selectRows(weights, queries);
    const all = new Uint32Array(weights.rows).map((_, i) => i);
    const even = all.filter((d) => d % 2 === 0);
    for (const d of corpusNeighbors(sampleRows, queries, weights, 0, removed, K, even).docs) assert.ok(d === NO_NEIGHBOR || d % 2 === 0, `candidate ${d} is not in the subset`);
    const whole = corpusNeighbors(sampleRows, queries, weights, 0, removed, K, all);
    // Three "shards": rows 0–99, 100–219, 220–299, each searched on its own rows only.
    const bounds = [0, 100, 220, weights.rows];
    const parts = bounds.slice(0, -1).map((first, i) => {
      const count = bounds[i + 1]! - first;
      const rows = selectRows(weights, new Uint32Array(count).map((_, j) => first + j));
      return corpusNeighbors(sampleRows, queries, rows, first, removed, K, all.slice(first, first + count));
    });
    const merged = mergeNeighborLists(parts, queries.length, K);
    assert.deepEqual([...merged.docs], [...whole.docs]);
    assert.deepEqual([...merged.sims], [...whole.sims]);
    const df = new Float64Array(weights.cols);
    for (const c of weights.indices) df[c]!++;
    assert.ok(neighborSearchWork(sampleRows, df, removed) < neighborSearchWork(sampleRows, df, new Uint8Array(weights.cols)), 'stopping terms lowers the work');
  });

  it('corpusPrecision: per-query label precision, the whole corpus within budget, a seeded part above it', () => {
    const labels = Array.from({ length: weights.rows }, (_, d) => (d % 5 === 4 ? null : `kind ${d % 3}`));
    const sampleRows = selectRows(weights, queries);
    const df = new Float64Array(weights.cols);
    for (const c of weights.indices) df[c]!++;
    const none = new Uint8Array(weights.cols);
    const searcher = searchInProcess(weights, sampleRows, queries, labels, K);
    const input = { searcher, sampleRows, documents: weights.rows, df, before: none, after: removed, seed: 1 };
    const whole = corpusPrecision(input)!;
    assert.equal(whole.among, weights.rows);
    const ours = corpusNeighbors(sampleRows, queries, weights, 0, removed, K, new Uint32Array(weights.rows).map((_, i) => i));
    for (let q = 0; q < queries.length; q++) {
      const own = labels[queries[q]!];
      if (own === null) {
        assert.ok(Number.isNaN(whole.after[q]!), 'no label: no precision');
        continue;
      }
      // A missing neighbour counts the chance that another sampled document carries the label
      // (docs/methods.md §7): (count in the sample − 1)/(sample − 1).
      const sampleLabels = Array.from(queries, (d) => labels[d]);
      const chance = (sampleLabels.filter((l) => l === own).length - 1) / (queries.length - 1);
      let hits = 0;
      let missing = 0;
      for (let r = 0; r < K; r++) {
        const d = ours.docs[q * K + r]!;
        if (d === NO_NEIGHBOR) missing++;
        else if (labels[d] === own) hits++;
      }
      assert.ok(Math.abs(whole.after[q]! - (hits + missing * chance) / K) < 1e-12, `query ${q}`);
    }
    // corpusPrecision's count: the scatter's multiply-adds of both settings and every (candidate, query) pair twice.
    const work = neighborSearchWork(sampleRows, df, none) + neighborSearchWork(sampleRows, df, removed) + 2 * weights.rows * queries.length;
    const part = corpusPrecision({ ...input, budget: work / 2 })!;
    assert.equal(part.among, Math.floor(weights.rows / 2));
    assert.deepEqual(corpusPrecision({ ...input, budget: work / 2 }), part, 'seeded: the same part every time');
    assert.equal(corpusPrecision({ ...input, budget: work / 4 }), null, 'a part under twice the sample is not worth it');
    assert.equal(corpusPrecision({ ...input, documents: queries.length }), null, 'the sample is the corpus');
  });

  it('corpusPrecision above the budget: fewer sampled documents searched for in the whole corpus, down to the floor, then all of them in a part', () => {
    const labels = Array.from({ length: weights.rows }, (_, d) => `kind ${d % 3}`);
    const sampleRows = selectRows(weights, queries);
    const df = new Float64Array(weights.cols);
    for (const c of weights.indices) df[c]!++;
    const none = new Uint8Array(weights.cols);
    const input = { searcher: searchInProcess(weights, sampleRows, queries, labels, K), sampleRows, documents: weights.rows, df, before: none, after: removed, seed: 1, minQueries: 10 };
    const whole = corpusPrecision(input)!;
    const work = neighborSearchWork(sampleRows, df, none) + neighborSearchWork(sampleRows, df, removed) + 2 * weights.rows * queries.length;
    const fewer = corpusPrecision({ ...input, budget: work / 2 })!;
    assert.equal(fewer.among, weights.rows, 'the whole corpus is searched');
    assert.equal(fewer.queries, queries.length / 2);
    // Each query's neighbours do not depend on the others searched with it: the subset's figures
    // are the whole search's, to the bit, and the rest are NaN (left out of the bootstrap).
    const searched = searchedQueries({ documents: weights.rows, among: weights.rows, queries: fewer.queries, seed: 1 }, queries.length);
    assert.equal(searched.length, fewer.queries);
    for (let q = 0; q < queries.length; q++) {
      const inSubset = searched.includes(q);
      for (const [got, want] of [[fewer.before, whole.before], [fewer.after, whole.after]] as const) {
        if (inSubset) assert.equal(got[q], want[q], `query ${q}`);
        else assert.ok(Number.isNaN(got[q]!), `query ${q} was not searched for`);
      }
    }
    // Below the floor: every sampled document, among a part of the corpus.
    const part = corpusPrecision({ ...input, minQueries: 30, budget: work / 2 })!;
    assert.equal(part.queries, queries.length);
    assert.equal(part.among, Math.floor(weights.rows / 2));
    // The searched rows are the sample's own rows (what a shard step searches for, sum-shard.ts).
    const rows = searchedRows(sampleRows, queries, { documents: weights.rows, among: weights.rows, queries: 10, seed: 1 });
    assert.deepEqual([...rows.docs], [...rows.positions].map((q) => queries[q]));
    assert.equal(rows.rows.rows, 10);
  });
});
