import type { Csr } from '../matrix/csr';
import { clearlyAbove, NO_NEIGHBOR } from './knn';

/** Each query's k nearest documents, most similar first: m×k document indices (NO_NEIGHBOR where none) and their cosines (NaN). */
export interface NeighborLists {
  docs: Uint32Array;
  sims: Float64Array;
}

/**
 * The k nearest documents of each query among `candidates`, with the columns of `removed`
 * stopped: the cosine of the rows renormalised without those columns (which equals weighting
 * without them: idf depends only on a term's own df), the query's own document excluded, most
 * similar first, ties (within TIE_TOLERANCE, as knn.ts) to the lower document index. Only
 * documents that share a kept term with the query are its neighbours (the rest are at cosine 0,
 * where a brute-force search's order is arbitrary).
 *
 * Unlike the sample's k-NN the neighbours are sought in the corpus, or a large part of it, so
 * that a figure read off them is what a search over the corpus would see: in a 2,000-document
 * sample of a 20,000-document corpus the neighbours are farther apart, and a stop list that
 * helps there need not help the corpus (docs/methods.md §9, the verdict).
 *
 * `rows` hold documents firstDoc, firstDoc + 1, … (the corpus, or one shard of it);
 * `candidates` are document indices among them, ascending (the tie rule needs it);
 * `queryDocs[q]` is the document of `queries` row q. Each candidate's row is scattered into the
 * queries that share its terms (an index of the queries' postings), so the work is Σ over kept
 * terms of df(t)·qdf(t) (`neighborSearchWork`) and a look at each query the candidate touched.
 */
export function corpusNeighbors(queries: Csr, queryDocs: Uint32Array, rows: Csr, firstDoc: number, removed: Uint8Array, k: number, candidates: Uint32Array): NeighborLists {
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`k must be a positive integer, got ${k}`);
  const m = queries.rows;
  const index = queryPostings(queries, removed);
  const lists = emptyLists(m, k);
  const filled = new Uint32Array(m);
  // What a candidate must beat to enter query q's list: −∞ until the list is full (insert keeps it).
  const bar = new Float64Array(m).fill(-Infinity);
  const acc = new Float64Array(m);
  const touched = new Uint32Array(m);
  for (const d of candidates) {
    const row = d - firstDoc;
    const n2 = keptNorm2(rows, row, removed);
    if (n2 === 0) continue;
    const count = scatterRow(rows, row, removed, index, acc, touched);
    const dNorm = Math.sqrt(n2);
    // EVERY_QUERY: a dense column was added, so every query is looked at, in query order.
    const looked = count === EVERY_QUERY ? m : count;
    for (let t = 0; t < looked; t++) {
      const q = count === EVERY_QUERY ? t : touched[t]!;
      const dot = acc[q]!;
      // dot === 0: the query shares no kept term (or its products underflowed; a query listed
      // twice for that reason has its second listing spent).
      if (dot === 0) continue;
      acc[q] = 0;
      if (queryDocs[q] === d) continue;
      const s = dot / (index.norm[q]! * dNorm);
      if (s > bar[q]!) insert(lists, q, s, d, k, filled, bar);
    }
  }
  return lists;
}

/**
 * The lists of corpusNeighbors over the whole corpus from its lists over consecutive parts of it
 * (shards, in document order): every candidate of a part's list offered again in document order,
 * which keeps the same k under the same rule (a document outside its part's k is outside the
 * corpus's too).
 */
export function mergeNeighborLists(parts: readonly NeighborLists[], m: number, k: number): NeighborLists {
  const lists = emptyLists(m, k);
  const filled = new Uint32Array(m);
  const bar = new Float64Array(m).fill(-Infinity);
  const offered: Array<{ d: number; s: number }> = [];
  for (let q = 0; q < m; q++) {
    offered.length = 0;
    for (const part of parts) {
      for (let r = 0; r < k; r++) {
        const d = part.docs[q * k + r]!;
        if (d !== NO_NEIGHBOR) offered.push({ d, s: part.sims[q * k + r]! });
      }
    }
    offered.sort((a, b) => a.d - b.d);
    for (const { d, s } of offered) if (s > bar[q]!) insert(lists, q, s, d, k, filled, bar);
  }
  return lists;
}

/**
 * The multiply-adds corpusNeighbors does over the whole corpus: Σ over kept terms of
 * df(t)·qdf(t), with df(t) the term's document frequency and qdf(t) the queries holding it.
 * A search among a fraction f of the documents costs about f times this, plus up to one look at
 * each (candidate, query) pair.
 */
export function neighborSearchWork(queries: Csr, df: ArrayLike<number>, removed: Uint8Array): number {
  const qdf = new Uint32Array(queries.cols);
  for (let p = 0; p < queries.indptr[queries.rows]!; p++) qdf[queries.indices[p]!]!++;
  let work = 0;
  for (let c = 0; c < queries.cols; c++) if (removed[c] === 0) work += df[c]! * qdf[c]!;
  return work;
}

function emptyLists(m: number, k: number): NeighborLists {
  return { docs: new Uint32Array(m * k).fill(NO_NEIGHBOR), sims: new Float64Array(m * k).fill(Number.NaN) };
}

interface QueryPostings {
  /** Per column, the range of `query`/`weight` holding it. */
  start: Uint32Array;
  query: Uint32Array;
  weight: Float64Array;
  /** Each query's norm over the kept columns (0: the query has no weight left). */
  norm: Float64Array;
  /** Per column, its slot in `dense` (NOT_DENSE: the column is scattered from its postings). */
  denseSlot: Int32Array;
  /** The dense columns: slot s holds every query's weight in the column (0 where it lacks it) at s·m … s·m + m − 1. */
  dense: Float64Array;
}

/** scatterRow's count when a dense column was added: every query must be looked at. */
const EVERY_QUERY = -1;
const NOT_DENSE = -1;

/**
 * A column held by at least this share of the queries is added as a dense run of every query's
 * weight rather than through its postings: a run of m multiply-adds over consecutive memory
 * costs less than qdf scattered ones with a branch each once qdf is a quarter of m or more
 * (measured on 20,000 package descriptions, docs/performance.md). Adding w·0 to a query that
 * lacks the column leaves its sum unchanged to the bit, and each query's products are still added
 * in the row's column order, so the cosines are the same bits either way.
 */
const DENSE_SHARE = 0.25;
/** At most this many bytes of dense columns (a sample of 50,000 queries keeps the commonest 80). */
const DENSE_BYTES = 32 * 1024 * 1024;

/** The queries' kept entries grouped by column: for each term, the queries holding it. */
function queryPostings(queries: Csr, removed: Uint8Array): QueryPostings {
  const { indptr, indices, data, cols } = queries;
  const m = queries.rows;
  const start = new Uint32Array(cols + 1);
  const norm = new Float64Array(m);
  for (let q = 0; q < m; q++) {
    let n2 = 0;
    for (let p = indptr[q]!; p < indptr[q + 1]!; p++) {
      const c = indices[p]!;
      if (removed[c] === 1) continue;
      start[c + 1]!++;
      n2 += data[p]! * data[p]!;
    }
    norm[q] = Math.sqrt(n2);
  }
  for (let c = 0; c < cols; c++) start[c + 1]! += start[c]!;
  const next = start.slice(0, cols);
  const query = new Uint32Array(start[cols]!);
  const weight = new Float64Array(start[cols]!);
  for (let q = 0; q < m; q++) {
    for (let p = indptr[q]!; p < indptr[q + 1]!; p++) {
      const c = indices[p]!;
      if (removed[c] === 1) continue;
      const at = next[c]!++;
      query[at] = q;
      weight[at] = data[p]!;
    }
  }
  const { denseSlot, dense } = denseColumns(start, query, weight, m, cols);
  return { start, query, weight, norm, denseSlot, dense };
}

/** The columns held by DENSE_SHARE of the queries or more, commonest first within DENSE_BYTES, as dense runs. */
function denseColumns(start: Uint32Array, query: Uint32Array, weight: Float64Array, m: number, cols: number): { denseSlot: Int32Array; dense: Float64Array } {
  const denseSlot = new Int32Array(cols).fill(NOT_DENSE);
  const common: number[] = [];
  for (let c = 0; c < cols; c++) if (start[c + 1]! - start[c]! >= DENSE_SHARE * m && m > 0) common.push(c);
  common.sort((a, b) => start[b + 1]! - start[b]! - (start[a + 1]! - start[a]!) || a - b);
  common.length = Math.min(common.length, Math.floor(DENSE_BYTES / (8 * Math.max(m, 1))));
  const dense = new Float64Array(common.length * m);
  common.forEach((c, slot) => {
    denseSlot[c] = slot;
    for (let e = start[c]!; e < start[c + 1]!; e++) dense[slot * m + query[e]!] = weight[e]!;
  });
  return { denseSlot, dense };
}

function keptNorm2(rows: Csr, row: number, removed: Uint8Array): number {
  let n2 = 0;
  for (let p = rows.indptr[row]!; p < rows.indptr[row + 1]!; p++) {
    if (removed[rows.indices[p]!] === 0) n2 += rows.data[p]! * rows.data[p]!;
  }
  return n2;
}

/**
 * Adds the row's dot product into acc[q] for every query q sharing a kept term, term by term in
 * the row's column order. Returns how many queries were touched (listed in `touched`), or
 * EVERY_QUERY once a dense column was added (then any query may have been).
 */
function scatterRow(rows: Csr, row: number, removed: Uint8Array, index: QueryPostings, acc: Float64Array, touched: Uint32Array): number {
  const { start, query, weight, denseSlot, dense } = index;
  const m = acc.length;
  let count = 0;
  for (let p = rows.indptr[row]!; p < rows.indptr[row + 1]!; p++) {
    const c = rows.indices[p]!;
    if (removed[c] === 1) continue;
    const w = rows.data[p]!;
    const slot = denseSlot[c]!;
    if (slot !== NOT_DENSE) {
      addDense(acc, dense, slot * m, w);
      count = EVERY_QUERY;
    } else if (count === EVERY_QUERY) {
      addPostings(acc, query, weight, start[c]!, start[c + 1]!, w);
    } else {
      for (let e = start[c]!; e < start[c + 1]!; e++) {
        const q = query[e]!;
        // A product is positive, so an untouched query is one whose sum is still exactly 0.
        if (acc[q] === 0) touched[count++] = q;
        acc[q] += w * weight[e]!;
      }
    }
  }
  return count;
}

function addDense(acc: Float64Array, dense: Float64Array, base: number, w: number): void {
  for (let q = 0; q < acc.length; q++) acc[q] += w * dense[base + q]!;
}

function addPostings(acc: Float64Array, query: Uint32Array, weight: Float64Array, from: number, to: number, w: number): void {
  for (let e = from; e < to; e++) acc[query[e]!] += w * weight[e]!;
}

/**
 * Puts document d at similarity s into query q's list (the insertion rule of knn.ts
 * nearestOfRow); the caller has checked s > bar[q], which this keeps as the least score that
 * enters a full list.
 */
function insert(lists: NeighborLists, q: number, s: number, d: number, k: number, filled: Uint32Array, bar: Float64Array): void {
  const base = q * k;
  const n = filled[q]!;
  let slot = n < k ? n : k - 1;
  if (n < k) filled[q] = n + 1;
  while (slot > 0 && s > clearlyAbove(lists.sims[base + slot - 1]!)) {
    lists.sims[base + slot] = lists.sims[base + slot - 1]!;
    lists.docs[base + slot] = lists.docs[base + slot - 1]!;
    slot--;
  }
  lists.sims[base + slot] = s;
  lists.docs[base + slot] = d;
  if (filled[q] === k) bar[q] = clearlyAbove(lists.sims[base + k - 1]!);
}
