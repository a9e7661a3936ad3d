import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import type { CorpusSource } from '../read/corpus-source';
import { inProcessEncoder, workerEncoder, type BatchEncoder } from '../tokenize/batch-encoder';
import type { TokenSettings } from '../tokenize/create-tokenizer';
import type { EncodedBatch } from '../tokenize/encode-batch';
import { longRunNote } from '../tokenize/long-runs';
import { compareCodePoints } from './compare-code-points';
import type { CountMatrix } from './csr';
import { documentPreview } from './document-preview';

export interface BuiltCorpus {
  counts: CountMatrix;
  /** 1-based source line of each document (row). */
  lines: Uint32Array;
  /** Each document's label; null when the source has no label field. */
  labels: (string | null)[] | null;
  /** First 120 characters of each document, whitespace collapsed. */
  previews: string[];
  /** What the Report's input notes should say about tokenising (over-long runs cut). */
  notes: string[];
}

export interface BuildOptions {
  /** Tokenising threads: 0 = in this thread. Default min(2, available cores). */
  workers?: number;
  signal?: AbortSignal;
  /** Called after each batch with the number of documents counted so far. */
  onProgress?(documents: number): void;
  /** The worker bundle; default tokenize-worker.js beside the running bundle (dist/). */
  workerScript?: string;
  /** Documents per batch handed to a tokeniser. */
  batchSize?: number;
  /** Who tokenises, instead of the default pool (count-each-file.ts passes a fresh one per file). */
  encoder?: BatchEncoder;
}

const DEFAULT_BATCH = 1000;

/**
 * Streams `source`, tokenises every document and counts terms into a CSR matrix (rows =
 * documents in source order, columns = terms in code point order, like scikit-learn's
 * CountVectorizer with a pass-through analyzer). Workers only change who tokenises: batches are
 * counted in source order, so the result is the same whatever `workers` is.
 */
export async function buildCountMatrix(source: CorpusSource, tokens: TokenSettings, options: BuildOptions = {}): Promise<BuiltCorpus> {
  const { signal, onProgress } = options;
  signal?.throwIfAborted();
  const workers = options.workers ?? Math.min(2, availableParallelism());
  const encoder: BatchEncoder =
    options.encoder ??
    workerEncoder(tokens, workers, options.workerScript ?? join(__dirname, 'tokenize-worker.js')) ?? inProcessEncoder(tokens);
  const counter = new CountAccumulator();
  const lines = new GrowingUint32();
  const labels: (string | null)[] | null = source.labelField === null ? null : [];
  const previews: string[] = [];
  const inFlight: Promise<EncodedBatch>[] = [];
  let longRuns = 0;
  let longRunDocs = 0;
  const longRunLines: number[] = [];
  const take = (batch: EncodedBatch): void => {
    const firstRow = counter.rows;
    counter.add(batch);
    longRuns += batch.longRuns;
    longRunDocs += batch.longRunDocs.length;
    for (const d of batch.longRunDocs) if (longRunLines.length < LINES_NAMED) longRunLines.push(lines.at(firstRow + d));
  };
  try {
    for await (const rows of source.batches(options.batchSize ?? DEFAULT_BATCH)) {
      signal?.throwIfAborted();
      if (rows.length === 0) continue;
      const texts: string[] = new Array<string>(rows.length);
      for (let i = 0; i < rows.length; i++) {
        const row = rows[i]!;
        texts[i] = row.text;
        lines.push(row.line);
        labels?.push(row.label);
        previews.push(documentPreview(row.text));
      }
      const p = encoder.encode(texts);
      p.catch(() => undefined); // awaited below in order; this only silences an early rejection
      inFlight.push(p);
      while (inFlight.length >= encoder.parallelism) {
        take(await inFlight.shift()!);
        onProgress?.(counter.rows);
        signal?.throwIfAborted();
      }
    }
    while (inFlight.length > 0) {
      take(await inFlight.shift()!);
      onProgress?.(counter.rows);
      signal?.throwIfAborted();
    }
  } finally {
    await encoder.close();
  }
  const notes = longRuns > 0 ? [longRunNote(longRuns, longRunDocs, longRunLines)] : [];
  return { counts: counter.finish(), lines: lines.toArray(), labels, previews, notes };
}

/** Source lines named in a note before "…". */
const LINES_NAMED = 5;

class GrowingUint32 {
  private a = new Uint32Array(1024);
  length = 0;
  push(v: number): void {
    if (this.length === this.a.length) {
      const grown = new Uint32Array(this.a.length * 2);
      grown.set(this.a);
      this.a = grown;
    }
    this.a[this.length++] = v;
  }
  at(i: number): number {
    return this.a[i]!;
  }
  toArray(): Uint32Array {
    return this.a.slice(0, this.length);
  }
}

/** Turns encoded batches into CSR rows with provisional (first-seen) term ids. */
class CountAccumulator {
  private readonly idOf = new Map<string, number>();
  private readonly terms: string[] = [];
  private indptr = new Uint32Array(1025);
  private indices = new Uint32Array(4096);
  private data = new Float64Array(4096);
  private tokensPerDoc = new Uint32Array(1024);
  private countOf = new Uint32Array(1024); // scratch, indexed by term id, all zero between rows
  private touched = new Uint32Array(256);
  rows = 0;

  add(batch: EncodedBatch): void {
    const globalOf = new Uint32Array(batch.terms.length);
    for (let i = 0; i < batch.terms.length; i++) {
      const t = batch.terms[i]!;
      let id = this.idOf.get(t);
      if (id === undefined) {
        id = this.terms.length;
        this.idOf.set(t, id);
        this.terms.push(t);
      }
      globalOf[i] = id;
    }
    if (this.countOf.length < this.terms.length) this.countOf = grownTo(this.countOf, this.terms.length);
    const { docEnds, ids } = batch;
    let start = 0;
    for (let d = 0; d < docEnds.length; d++) {
      const end = docEnds[d];
      this.addRow(ids, start, end, globalOf);
      start = end;
    }
  }

  private addRow(ids: Uint32Array, start: number, end: number, globalOf: Uint32Array): void {
    const countOf = this.countOf;
    if (this.touched.length < end - start) this.touched = grownTo(this.touched, end - start);
    const touched = this.touched;
    let distinct = 0;
    for (let k = start; k < end; k++) {
      const g = globalOf[ids[k]];
      if (countOf[g] === 0) touched[distinct++] = g;
      countOf[g]++;
    }
    const r = this.rows;
    if (r + 2 > this.indptr.length) this.indptr = grownTo(this.indptr, r + 2);
    if (r + 1 > this.tokensPerDoc.length) this.tokensPerDoc = grownTo(this.tokensPerDoc, r + 1);
    let at = this.indptr[r];
    if (at + distinct > this.indices.length) {
      this.indices = grownTo(this.indices, at + distinct);
      this.data = grownTo(this.data, at + distinct);
    }
    for (let i = 0; i < distinct; i++) {
      const g = touched[i];
      this.indices[at] = g;
      this.data[at++] = countOf[g];
      countOf[g] = 0;
    }
    this.indptr[r + 1] = at;
    this.tokensPerDoc[r] = end - start;
    this.rows = r + 1;
  }

  /** Renumbers columns in code point order and sorts each row's column ids. */
  finish(): CountMatrix {
    const cols = this.terms.length;
    const order = new Uint32Array(cols);
    for (let i = 0; i < cols; i++) order[i] = i;
    const terms = this.terms;
    order.sort((a, b) => compareCodePoints(terms[a]!, terms[b]!));
    const rank = new Uint32Array(cols);
    const sortedTerms = new Array<string>(cols);
    for (let j = 0; j < cols; j++) {
      rank[order[j]] = j;
      sortedTerms[j] = terms[order[j]]!;
    }
    const rows = this.rows;
    const total = this.indptr[rows];
    const indptr = this.indptr.slice(0, rows + 1);
    const indices = this.indices.slice(0, total);
    const data = this.data.slice(0, total);
    // Sort each row in place: scatter counts by new column id, sort the ids natively, gather.
    const scratch = new Float64Array(cols);
    for (let r = 0; r < rows; r++) {
      const s = indptr[r];
      const e = indptr[r + 1];
      for (let k = s; k < e; k++) {
        const c = rank[indices[k]];
        indices[k] = c;
        scratch[c] = data[k];
      }
      indices.subarray(s, e).sort();
      for (let k = s; k < e; k++) data[k] = scratch[indices[k]];
    }
    return { rows, cols, indptr, indices, data, terms: sortedTerms, tokensPerDoc: this.tokensPerDoc.slice(0, rows) };
  }
}

function grownTo<T extends Uint32Array | Float64Array>(a: T, needed: number): T {
  let size = Math.max(1, a.length);
  while (size < needed) size *= 2;
  const grown = new (a.constructor as new (n: number) => T)(size);
  grown.set(a);
  return grown;
}
