import type { Csr } from '../matrix/csr';
import { corpusNeighbors, neighborSearchWork } from '../measures/corpus-neighbors';
import { NO_NEIGHBOR } from '../measures/knn';
import { sampleIndices } from '../random/seeded-random';

/**
 * The verdict's search may cost this many steps for the two settings together: a step is a
 * multiply-add of the scatter (neighborSearchWork) or a look at one (candidate, query) pair,
 * counted as every pair, so the figure is an upper bound. Measured at 15–25 ns a step on a busy
 * machine (2026-12-03, load ~3: fortunes, 4,301 documents, 0.8 s for 3.6e7 steps), so about
 * 2 s there and less on a quiet one; above it the neighbours are sought among a seeded random
 * part of the corpus that fits.
 */
export const SEARCH_WORK = 1e8;

/** Which documents the neighbours are sought among: all n, or `among` of them drawn with `seed`. */
export interface CorpusSearch {
  documents: number;
  among: number;
  seed: number;
}

/** Runs a search for the sampled documents; one process's is searchInProcess, a review in shards sums the shards'. */
export interface CorpusSearcher {
  /** Per sampled document, the share of its k neighbours with its label; NaN where it has no label or no neighbour. */
  precision(removed: Uint8Array, search: CorpusSearch): Float64Array;
}

/** Label precision@k of the sampled documents with neighbours from the corpus, for both settings. */
export interface CorpusPrecision {
  before: Float64Array;
  after: Float64Array;
  /** How many documents the neighbours were sought among (the corpus, or the part that fits), of how many. */
  among: number;
  documents: number;
}

export interface CorpusPrecisionInput {
  searcher: CorpusSearcher;
  /** The sampled rows (their number and terms set the work). */
  sampleRows: Csr;
  documents: number;
  df: ArrayLike<number>;
  before: Uint8Array;
  after: Uint8Array;
  seed: number;
  /** The work allowed (SEARCH_WORK unless a test sets it). */
  budget?: number;
}

/**
 * The verdict's label precision when the sample is a small part of the corpus: each sampled
 * document's k nearest neighbours are sought in the corpus rather than in the sample, under the
 * current list and the suggested one. In a sample a tenth of the corpus the neighbours are
 * farther apart, and a list can look better there than it does on the corpus (docs/methods.md
 * §9). The corpus is searched whole when the work fits the budget, else among a seeded random
 * part of it; null when the sample is the corpus, or when that part would be under twice the
 * sample (the sample's own figure is then about as good).
 */
export function corpusPrecision(input: CorpusPrecisionInput): CorpusPrecision | null {
  const { sampleRows, documents: n, df, before, after, seed, budget = SEARCH_WORK } = input;
  const m = sampleRows.rows;
  if (n <= m) return null;
  const work = neighborSearchWork(sampleRows, df, before) + neighborSearchWork(sampleRows, df, after) + 2 * n * m;
  const among = work <= budget ? n : Math.floor((n * budget) / work);
  if (among < n && among < 2 * m) return null;
  const search = { documents: n, among, seed };
  return { before: input.searcher.precision(before, search), after: input.searcher.precision(after, search), among, documents: n };
}

/** The documents of first, first + 1, …, first + count − 1 that `search` seeks among, ascending. */
export function searchCandidates(search: CorpusSearch, first: number, count: number): Uint32Array {
  if (search.among >= search.documents) return new Uint32Array(count).map((_, i) => first + i);
  const drawn = sampleIndices(search.documents, search.among, search.seed ^ 0x5eed);
  return drawn.filter((d) => d >= first && d < first + count);
}

/** One process's search: the whole weight matrix is here. */
export function searchInProcess(weights: Csr, sampleRows: Csr, sample: Uint32Array, labels: readonly (string | null)[], k: number): CorpusSearcher {
  return {
    precision(removed, search) {
      const lists = corpusNeighbors(sampleRows, sample, weights, 0, removed, k, searchCandidates(search, 0, weights.rows));
      return labelPrecision(lists.docs, k, (q) => isLabel(labels[sample[q]!]), (q, r) => labels[lists.docs[q * k + r]!] === labels[sample[q]!]);
    },
  };
}

/**
 * Per query, the share of its listed neighbours (m×k, NO_NEIGHBOR where none) that share its
 * label; NaN for a query with no label or no neighbour. `hasLabel(q)` and `sameLabel(q, r)`
 * (the r-th neighbour of q has q's label) let the sample's label ids and the corpus's label
 * strings share the rule.
 */
export function labelPrecision(neighbors: Uint32Array, k: number, hasLabel: (q: number) => boolean, sameLabel: (q: number, r: number) => boolean): Float64Array {
  const m = neighbors.length / k;
  const out = new Float64Array(m).fill(Number.NaN);
  for (let q = 0; q < m; q++) {
    if (!hasLabel(q)) continue;
    let hits = 0;
    let present = 0;
    for (let r = 0; r < k; r++) {
      if (neighbors[q * k + r] === NO_NEIGHBOR) continue;
      present++;
      if (sameLabel(q, r)) hits++;
    }
    if (present > 0) out[q] = hits / present;
  }
  return out;
}

/** A label that counts: not missing, not empty. */
export function isLabel(label: string | null | undefined): label is string {
  return label !== null && label !== undefined && label !== '';
}
