import type { Csr } from '../matrix/csr';
import { corpusNeighbors, neighborSearchWork } from '../measures/corpus-neighbors';
import { labelChances, labelPrecision, type LabelChance } from '../measures/label-precision';
import { selectRows } from '../matrix/select-rows';
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

/**
 * The fewest sampled documents the verdict is measured on when the corpus is searched whole for
 * fewer of them: with q documents the bootstrap interval is about √(2,000/q) times as wide as
 * with the default sample, so 500 keep it within twice that width. A round number chosen for that
 * width, not on any corpus.
 */
export const MIN_QUERIES = 500;

/**
 * Whose neighbours are sought, and among which documents: the first is the sampled documents
 * (all m, or `queries` of them drawn with `seed`), the second the corpus's n documents (all, or
 * `among` of them drawn with `seed`).
 */
export interface CorpusSearch {
  documents: number;
  among: number;
  queries: number;
  seed: number;
}

/** Runs a search for the sampled documents; one process's is searchInProcess, a review in shards sums the shards'. */
export interface CorpusSearcher {
  /** Per sampled document, label precision over its k neighbours (measures/label-precision.ts); NaN where it has no label or was not searched for. */
  precision(removed: Uint8Array, search: CorpusSearch): Float64Array;
}

/** Label precision@k of the sampled documents with neighbours from the corpus, for both settings. */
export interface CorpusPrecision {
  before: Float64Array;
  after: Float64Array;
  /** How many documents the neighbours were sought among (the corpus, or the part that fits), of how many. */
  among: number;
  documents: number;
  /** How many sampled documents were searched for (the others are NaN in before and after). */
  queries: number;
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
  /** MIN_QUERIES unless a test sets it. */
  minQueries?: number;
}

/**
 * The verdict's label precision when the sample is a small part of the corpus: each sampled
 * document's k nearest neighbours are sought in the corpus rather than in the sample, under the
 * current list and the suggested one. In a sample a tenth of the corpus the neighbours are
 * farther apart, and a list can look better there than it does on the corpus (docs/methods.md
 * §9). The work grows with the corpus times the sampled documents searched for; when the whole
 * search does not fit the budget, fewer sampled documents are searched for (a seeded subset, at
 * least MIN_QUERIES: an estimate of the corpus's figure with a wider interval, rather than a
 * narrower one of something else); below that, all of them among a seeded random part of the
 * corpus. Null when the sample is the corpus, or when that part would be under twice the sample
 * (the sample's own figure is then about as good).
 */
export function corpusPrecision(input: CorpusPrecisionInput): CorpusPrecision | null {
  const { sampleRows, documents: n, df, before, after, seed, budget = SEARCH_WORK, minQueries = MIN_QUERIES } = input;
  const m = sampleRows.rows;
  if (n <= m) return null;
  const work = neighborSearchWork(sampleRows, df, before) + neighborSearchWork(sampleRows, df, after) + 2 * n * m;
  const plan = searchPlan(work, n, m, budget, minQueries);
  if (plan === null) return null;
  const search = { documents: n, ...plan, seed };
  return { before: input.searcher.precision(before, search), after: input.searcher.precision(after, search), among: plan.among, documents: n, queries: plan.queries };
}

/**
 * How many of the m sampled documents to search for and among how many of the n documents, for
 * a search over all of them that would cost `work` steps (it scales with both).
 */
export function searchPlan(work: number, n: number, m: number, budget: number, minQueries = MIN_QUERIES): { queries: number; among: number } | null {
  if (work <= budget) return { queries: m, among: n };
  const queries = Math.floor((m * budget) / work);
  if (queries >= minQueries) return { queries, among: n };
  // Every sampled document among a part of the corpus, when the part is worth it. (Fewer of them
  // among a larger part was tried: on the 100,000-document bench corpus it searched for 500 among
  // 12,500 at ~2 s more per review, docs/performance.md.)
  const among = Math.floor((n * budget) / work);
  return among >= 2 * m ? { queries: m, among } : null;
}

/** The positions in the sample (0 … m − 1) whose neighbours `search` seeks, ascending. */
export function searchedQueries(search: CorpusSearch, m: number): Uint32Array {
  return sampleIndices(m, Math.min(search.queries, m), search.seed ^ 0x9e37);
}

/** The rows and documents of the sampled documents `search` seeks the neighbours of, with their positions in the sample. */
export function searchedRows(sampleRows: Csr, sampleDocs: Uint32Array, search: CorpusSearch): { positions: Uint32Array; rows: Csr; docs: Uint32Array } {
  const m = sampleRows.rows;
  const positions = searchedQueries(search, m);
  if (positions.length === m) return { positions, rows: sampleRows, docs: sampleDocs };
  return { positions, rows: selectRows(sampleRows, positions), docs: positions.map((q) => sampleDocs[q]!) };
}

/** Per-query figures of the searched positions spread to all m, NaN for the others. */
export function spreadToSample(values: Float64Array, positions: Uint32Array, m: number): Float64Array {
  if (positions.length === m) return values;
  const out = new Float64Array(m).fill(Number.NaN);
  positions.forEach((q, i) => (out[q] = values[i]!));
  return out;
}

/** The documents of first, first + 1, …, first + count − 1 that `search` seeks among, ascending. */
export function searchCandidates(search: CorpusSearch, first: number, count: number): Uint32Array {
  if (search.among >= search.documents) return new Uint32Array(count).map((_, i) => first + i);
  const drawn = sampleIndices(search.documents, search.among, search.seed ^ 0x5eed);
  return drawn.filter((d) => d >= first && d < first + count);
}

/** One process's search: the whole weight matrix is here. */
export function searchInProcess(weights: Csr, sampleRows: Csr, sample: Uint32Array, labels: readonly (string | null)[], k: number): CorpusSearcher {
  // The sample's labels do not change between the review's two or three searches: counted once.
  const chance = sampleLabelChance(Array.from(sample, (d) => labels[d]));
  return {
    precision(removed, search) {
      const { positions, rows, docs } = searchedRows(sampleRows, sample, search);
      const lists = corpusNeighbors(rows, docs, weights, 0, removed, k, searchCandidates(search, 0, weights.rows));
      const precision = labelPrecision(lists.docs, lists.sims, k, (q) => isLabel(labels[docs[q]!]), (q, r) => labels[lists.docs[q * k + r]!] === labels[docs[q]!], (q) => chance(labels[docs[q]!]!));
      return spreadToSample(precision, positions, sampleRows.rows);
    },
  };
}

/**
 * The chance a missing neighbour counts (measures/label-precision.ts) when the neighbours are
 * sought in the corpus: from the sampled documents' labels, a uniform sample of the corpus's, so
 * that one process and a review in shards (which holds only the sample's labels) count the same.
 */
export function sampleLabelChance(sampleLabels: readonly (string | null | undefined)[]): LabelChance<string> {
  return labelChances(sampleLabels.map((l) => (isLabel(l) ? l : null)));
}

/** A label that counts: not missing, not empty. */
export function isLabel(label: string | null | undefined): label is string {
  return label !== null && label !== undefined && label !== '';
}
