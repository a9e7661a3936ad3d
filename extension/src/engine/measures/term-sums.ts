import { selectRank } from './select-rank';
import type { Csr } from '../matrix/csr';

/**
 * Per-term sums over documents, exact in one O(nnz) pass (docs/methods.md §3). Every field is a plain
 * sum over documents, so shards of a corpus merge by adding them.
 */
export interface TermSums {
  /** S1(t) = Σ_d x_dt */
  s1: Float64Array;
  /** S2(t) = Σ_d x_dt² */
  s2: Float64Array;
  /** Documents with a non-zero weight for t. */
  df: Uint32Array;
  /** Σ_d x_dt·ln x_dt (0·ln 0 = 0), for the spread without a second pass. */
  sxlogx: Float64Array;
}

export function termSums(X: Csr): TermSums {
  const s1 = new Float64Array(X.cols);
  const s2 = new Float64Array(X.cols);
  const df = new Uint32Array(X.cols);
  const sxlogx = new Float64Array(X.cols);
  const { indices, data } = X;
  const end = X.indptr[X.rows] ?? 0;
  for (let p = 0; p < end; p++) {
    const x = data[p];
    if (x === 0) continue;
    const t = indices[p];
    s1[t] += x;
    s2[t] += x * x;
    df[t]++;
    if (x > 0) sxlogx[t] += x * Math.log(x);
  }
  return { s1, s2, df, sxlogx };
}

export interface PairMass {
  /** P(t) = (S1² − S2)/2: term t's share of Σ_{a<b} cos(a, b). */
  perTerm: Float64Array;
  /** Σ_t P(t) = Σ_{a<b} cos(a, b). */
  total: number;
  /** total / (n(n−1)/2) with n the rows that have a non-zero weight: the mean pairwise cosine. */
  backgroundSimilarity: number;
}

/**
 * The all-pairs similarity mass per term without a pair loop (docs/methods.md §3): on unit rows
 * cos(a, b) = Σ_t x_at·x_bt, and Σ_{a<b} x_at·x_bt = (S1(t)² − S2(t))/2.
 * Empty rows add nothing to the mass, and they are left out of the pair count so that
 * documents emptied by a stop list do not make the corpus look artificially quiet.
 */
export function pairMass(sums: TermSums, rowsWithWeight: number): PairMass {
  const { s1, s2 } = sums;
  const perTerm = new Float64Array(s1.length);
  let total = 0;
  for (let t = 0; t < s1.length; t++) {
    const a = s1[t];
    const p = (a * a - s2[t]) / 2;
    perTerm[t] = p;
    total += p;
  }
  const pairs = (rowsWithWeight * (rowsWithWeight - 1)) / 2;
  return { perTerm, total, backgroundSimilarity: pairs > 0 ? total / pairs : 0 };
}

/**
 * Normalised entropy of each term's weight over the n documents: 1 = spread evenly over all of
 * them, 0 = in one document. With p_d = x_dt/S1(t),
 *   H = −Σ p_d ln p_d = −Σ (x/S1)(ln x − ln S1) = ln S1 − (Σ x ln x)/S1,
 * so the per-term Σ x ln x gathered in termSums gives H in O(1) per term, no second pass.
 */
export function termSpread(sums: TermSums, n: number): Float64Array {
  const { s1, sxlogx } = sums;
  const spread = new Float64Array(s1.length);
  if (n < 2) return spread;
  const lnN = Math.log(n);
  for (let t = 0; t < s1.length; t++) {
    const a = s1[t];
    if (!(a > 0)) continue;
    const h = Math.log(a) - sxlogx[t] / a;
    // Rounding can push H a hair outside [0, ln n].
    spread[t] = Math.min(1, Math.max(0, h / lnN));
  }
  return spread;
}

/**
 * The `count` largest values of perTerm, largest first (the input is untouched). One pass with a
 * heap of the `count` largest seen so far (most values lose one comparison with its least), then
 * a sort of the top only: the what-if calls this on every click, and sorting the whole
 * vocabulary each time cost more than the rest of the exact part; a copy of the ~115k masses
 * and a selection in it took ~1 ms a click at 100k. The heap keeps the same values as a
 * selection would (equal values are the same bits, but for −0 and +0, which the sums below
 * cannot tell apart: adding either to a sum gives the same sum, and the sum starts at +0); with a
 * NaN among the masses, where "largest" depends on the algorithm, the selection answers as before.
 */
function largestFirst(perTerm: Float64Array, count: number): Float64Array {
  const n = perTerm.length;
  const take = Math.min(count, n);
  if (take === 0) return new Float64Array(0);
  const top = largestByHeap(perTerm, take) ?? largestBySelection(perTerm, take);
  top.sort();
  const out = new Float64Array(take);
  for (let i = 0; i < take; i++) out[i] = top[take - 1 - i];
  return out;
}

/** The `take` largest of perTerm (1 ≤ take ≤ its length) as a min-heap, in no order; null if a NaN is met. */
function largestByHeap(perTerm: Float64Array, take: number): Float64Array | null {
  const heap = perTerm.slice(0, take);
  for (let i = 0; i < take; i++) if (Number.isNaN(heap[i])) return null;
  for (let i = (take >> 1) - 1; i >= 0; i--) siftDown(heap, i, take);
  let least = heap[0];
  for (let t = take, n = perTerm.length; t < n; t++) {
    const x = perTerm[t];
    if (x > least) {
      heap[0] = x;
      siftDown(heap, 0, take);
      least = heap[0];
    } else if (x !== x) return null;
  }
  return heap;
}

/** Restores the min-heap order of heap[0..size) below position i. */
function siftDown(heap: Float64Array, i: number, size: number): void {
  const x = heap[i];
  for (;;) {
    let child = 2 * i + 1;
    if (child >= size) break;
    if (child + 1 < size && heap[child + 1] < heap[child]) child++;
    if (!(heap[child] < x)) break;
    heap[i] = heap[child];
    i = child;
  }
  heap[i] = x;
}

/** The `take` largest of perTerm from a copy and a selection in it (the answer with NaNs among the values). */
function largestBySelection(perTerm: Float64Array, take: number): Float64Array {
  const n = perTerm.length;
  const copy = Float64Array.from(perTerm);
  selectRank(copy, 0, n - 1, n - take);
  return copy.slice(n - take);
}

/** Cumulative share of the total mass of the heaviest 1, 2, …, maxTerms terms. */
export function cumulativeMassShare(perTerm: Float64Array, total: number, maxTerms: number): number[] {
  const top = largestFirst(perTerm, maxTerms);
  const out: number[] = new Array(top.length);
  let sum = 0;
  for (let i = 0; i < top.length; i++) {
    sum += top[i];
    out[i] = total > 0 ? sum / total : 0;
  }
  return out;
}
