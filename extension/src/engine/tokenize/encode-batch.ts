import { documentPreview } from './document-preview';
import { IdList } from './id-list';
import type { TermCoder } from './term-coder';
import type { PartCounts } from './rows-in-rank-order';

/**
 * A batch of tokenised documents, already counted, in a form that crosses a thread boundary
 * cheaply (typed arrays, transferred): document d's distinct terms are
 * cols[rowEnds[d-1] .. rowEnds[d]) (rowEnds[-1] = 0) with their counts, in first-use order.
 * Column ids are the coder's own term ids, which stay valid from batch to batch, so a batch
 * carries only the terms its coder met for the first time (`newTerms`, ids `firstNewId`, …).
 */
export interface EncodedBatch {
  /** Which coder made it: the ids are that coder's (set by the BatchEncoder). */
  stream: number;
  firstNewId: number;
  newTerms: string[];
  rowEnds: Uint32Array;
  cols: Uint32Array;
  /** 16-bit unless a count in the batch is above 65,535 (packedCounts). */
  counts: PartCounts;
  /** Terms per document, repeats included. */
  tokens: Uint32Array;
  /**
   * Each document's preview (document-preview.ts), made here rather than where the corpus is
   * read: with the pattern tokenizer the reading thread is the one the others wait for.
   */
  previews: string[];
  /** Batch-local indices of the documents that had an over-long run cut (long-runs.ts). */
  longRunDocs: number[];
  /** How many runs were cut in the batch. */
  longRuns: number;
}

/**
 * The batch step of a coder (in-process and in the worker alike): encode each text, count its
 * terms, and name the terms that are new since the previous batch. Keeps its scratch between
 * batches.
 */
export function batchEncoding(coder: TermCoder): (texts: readonly string[]) => EncodedBatch {
  const ids = new IdList(1 << 16);
  let countOf = new Uint32Array(1024); // by term id; all zero between documents
  // A batch's distinct terms per document and their counts, before they are copied out at their
  // size. Plain arrays as long as the batch's tokens (a document has no more distinct terms than
  // tokens) and a local length: growing lists cost about twice as much in this loop.
  let distinct = new Uint32Array(0);
  let counted = new Uint32Array(0);
  let termsSent = 0;
  return (texts) => {
    const rowEnds = new Uint32Array(texts.length);
    const tokens = new Uint32Array(texts.length);
    const docEnds = new Uint32Array(texts.length);
    const longRunDocs: number[] = [];
    const runsBefore = coder.longRunsCut;
    ids.length = 0;
    coder.encodeAll(texts, ids, docEnds, longRunDocs);
    if (countOf.length < coder.terms.length) {
      const grown = new Uint32Array(Math.max(coder.terms.length, countOf.length * 2));
      grown.set(countOf);
      countOf = grown;
    }
    if (distinct.length < ids.length) {
      distinct = new Uint32Array(ids.length);
      counted = new Uint32Array(ids.length);
    }
    const a = ids.array;
    let start = 0;
    let m = 0;
    let largest = 0;
    for (let d = 0; d < texts.length; d++) {
      const end = docEnds[d]!;
      const first = m;
      for (let k = start; k < end; k++) {
        const id = a[k]!;
        if (countOf[id]++ === 0) distinct[m++] = id;
      }
      for (let j = first; j < m; j++) {
        const id = distinct[j]!;
        const c = countOf[id]!;
        counted[j] = c;
        if (c > largest) largest = c;
        countOf[id] = 0;
      }
      rowEnds[d] = m;
      tokens[d] = end - start;
      start = end;
    }
    const previews = new Array<string>(texts.length);
    for (let d = 0; d < texts.length; d++) previews[d] = documentPreview(texts[d]!);
    const newTerms = coder.terms.slice(termsSent);
    const firstNewId = termsSent;
    termsSent = coder.terms.length;
    return { stream: 0, firstNewId, newTerms, rowEnds, cols: distinct.slice(0, m), counts: packedCounts(counted, m, largest), tokens, previews, longRunDocs, longRuns: coder.longRunsCut - runsBefore };
  };
}

/**
 * The first `m` counts in an array of their own: 16-bit when the largest fits, as it nearly always
 * does (88% of the bench corpus's counts are 1; a term would need 65,536 occurrences in one
 * document), else 32-bit. The parts are held until the rows are written, and every page of them is
 * fresh memory, which costs ~13 µs of CPU a page here (docs/performance.md, "The 100k reviews' CPU
 * and page faults by thread"): 16-bit counts take 15 MB less of it at 100k documents (~3.7k pages),
 * ~150 MB less at a million. Readers take either array as it is (PartCounts); the numbers are the same.
 */
export function packedCounts(counted: Uint32Array, m: number, largest: number): PartCounts {
  if (largest > 0xffff) return counted.slice(0, m);
  const out = new Uint16Array(m);
  out.set(counted.subarray(0, m));
  return out;
}
