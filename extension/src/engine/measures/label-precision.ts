import { NO_NEIGHBOR } from './knn';

/**
 * Label precision@k (docs/methods.md §7), one definition for the sample's figure, the verdict's
 * per-document figures and the corpus search's.
 *
 * A document has fewer than k true neighbours when fewer than k others share a term with it (short
 * texts, or a stop list that removes most of a document). A k-NN pipeline still returns k: the
 * rest are documents at similarity 0 in whatever order the library breaks ties, so each carries
 * the query's label about as often as a document drawn at random. Counting only the neighbours
 * found made a list that strips documents of their neighbours look harmless (on the Webster
 * definitions the English list read +0.047 over no list where scikit-learn's leave-one-out figure
 * is +0.013), and counting the similarity-0 documents in position order made the figure depend on
 * the order of the file (in a file sorted by label they carry the first label). So a slot without
 * a neighbour of similarity above 0 counts the chance that a random other document of the pool
 * carries the query's label, (count − 1)/(pool − 1); a document with no such neighbour counts that
 * chance alone (docs/methods.md §7).
 */

/** The chance that a document drawn at random from the others carries a given label. */
export type LabelChance<L> = (label: L) => number;

/**
 * From the labels of a pool (null where a document has none), the chance for each label that
 * another document of the pool, drawn at random, carries it: (count − 1) / (pool − 1).
 */
export function labelChances<L>(labels: Iterable<L | null>): LabelChance<L> {
  const counts = new Map<L, number>();
  let pool = 0;
  for (const label of labels) {
    pool++;
    if (label !== null) counts.set(label, (counts.get(label) ?? 0) + 1);
  }
  return (label) => (pool < 2 ? 0 : ((counts.get(label) ?? 1) - 1) / (pool - 1));
}

/**
 * Per query, its neighbours' share with its label over k slots, a missing neighbour
 * (NO_NEIGHBOR, or a similarity not above 0 in `sims`, m×k like `neighbors`) counting `chance(q)`;
 * NaN for a query without a label. `hasLabel(q)` and
 * `sameLabel(q, r)` (the r-th neighbour of q has q's label) let the sample's label ids and the
 * corpus's label strings share the rule. A neighbour without a label counts as a miss: it is not
 * evidence of the same class.
 */
export function labelPrecision(
  neighbors: Uint32Array,
  sims: Float64Array,
  k: number,
  hasLabel: (q: number) => boolean,
  sameLabel: (q: number, r: number) => boolean,
  chance: (q: number) => number,
): Float64Array {
  const m = neighbors.length / k;
  const out = new Float64Array(m).fill(Number.NaN);
  // Read once into a local: a module loader may reach an import through a getter (tsx's does),
  // a call per neighbour here (the what-if computes this on every click).
  const none = NO_NEIGHBOR;
  for (let q = 0; q < m; q++) {
    if (!hasLabel(q)) continue;
    let hits = 0;
    let missing = 0;
    for (let r = 0; r < k; r++) {
      if (neighbors[q * k + r] === none || !(sims[q * k + r]! > 0)) missing++;
      else if (sameLabel(q, r)) hits++;
    }
    out[q] = (hits + (missing > 0 ? missing * chance(q) : 0)) / k;
  }
  return out;
}

/**
 * Leave-one-out k-NN precision@k of the sample: `knn` the sample's lists (m×k sample positions
 * and their similarities), `labels` per sample position (−1 for none); the pool a missing
 * neighbour is drawn from is the sample. The mean over labelled queries; null when there is none.
 */
export function labelPrecisionAtK(knn: SampleKnn, labels: Int32Array, k: number): number | null {
  const m = labels.length;
  if (knn.neighbors.length !== m * k || knn.sims.length !== m * k) throw new RangeError(`labelPrecisionAtK: expected ${m}×${k} neighbours, got ${knn.neighbors.length}`);
  const per = samplePrecision(knn, labels, k);
  let sum = 0;
  let queries = 0;
  for (let q = 0; q < m; q++) {
    if (Number.isNaN(per[q]!)) continue;
    sum += per[q]!;
    queries++;
  }
  return queries === 0 ? null : sum / queries;
}

/** A sample's k-NN lists: m×k sample positions (NO_NEIGHBOR where none) and their similarities. */
export interface SampleKnn {
  neighbors: Uint32Array;
  sims: Float64Array;
}

/**
 * Each sample's label chances, counted once: the labels of a review's sample do not change, and
 * the what-if asks for its precision on every click.
 */
const sampleChances = new WeakMap<Int32Array, LabelChance<number>>();

/** Per sampled query, its precision among the sample's documents (NaN without a label). */
export function samplePrecision(knn: SampleKnn, labels: Int32Array, k: number): Float64Array {
  const { neighbors, sims } = knn;
  let chanceOf = sampleChances.get(labels);
  if (chanceOf === undefined) {
    chanceOf = labelChances(Array.from(labels, (l) => (l < 0 ? null : l)));
    sampleChances.set(labels, chanceOf);
  }
  const chance = chanceOf;
  return labelPrecision(neighbors, sims, k, (q) => labels[q]! >= 0, (q, r) => labels[neighbors[q * k + r]!] === labels[q], (q) => chance(labels[q]!));
}
