import { availableParallelism } from 'node:os';
import { dirname, join } from 'node:path';
import type { CorpusSource } from '../read/corpus-source';
import { inProcessEncoder, startFileLanes, startTokenizingThreads, type BatchEncoder, type FileLanes, type TokenizingThreads } from '../tokenize/batch-encoder';
import type { TokenSettings } from '../tokenize/create-tokenizer';
import type { EncodedBatch } from '../tokenize/encode-batch';
import { longRunNote } from '../tokenize/long-runs';
import { startRowAssembler, type RowAssembler, type RowWeighing } from '../tokenize/row-assembler';
import { PartCountSums, type RowCountSums } from '../tokenize/row-count-sums';
import { RowWriter, type CountedPart } from '../tokenize/rows-in-rank-order';
import { CodePointSortedTerms } from './code-point-sorted-terms';
import { RepeatedLineCounter, type RepeatedLines } from './repeated-lines';
import type { CountMatrix } from './csr';

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
  /**
   * The raw counts' per-term sums of `counts` (row-count-sums.ts), added up as the batches came
   * in; null where they were not (count-each-file.ts).
   */
  countSums: RowCountSums | null;
  /**
   * The idf `counts.data` was weighed with, row by row as the rows were written (BuildOptions.weighAhead):
   * then `counts.data` holds the weights, not the counts. null: it holds the raw counts.
   */
  weighedWith: Float64Array | null;
  /** Lines that recur across documents of several lines (repeated-lines.ts). */
  repeatedLines: RepeatedLines;
}

export interface BuildOptions {
  /** Tokenising threads: 0 = in this thread. Default min(2, available cores). */
  workers?: number;
  signal?: AbortSignal;
  /** Called after each batch with the number of documents counted so far. */
  onProgress?(documents: number): void;
  /** The worker bundle; default tokenize-worker.js beside the running bundle (dist/). */
  workerScript?: string;
  /** The bundle of the threads that write the matrix's rows; default assemble-worker.js beside workerScript. */
  assembleScript?: string;
  /** Documents per batch handed to a tokeniser. */
  batchSize?: number;
  /** Who tokenises, instead of the default pool (count-each-file.ts passes a fresh one per file). */
  encoder?: BatchEncoder;
  /**
   * Asked once the vocabulary is complete, before threads write the rows, with the counts' sums:
   * how to weigh each row as it is written (then `data` holds the weights, BuiltCorpus.weighedWith),
   * or null to leave the raw counts. Not asked where this thread writes the rows.
   */
  weighAhead?: (sums: RowCountSums, rows: number, columns: number) => RowWeighing | null;
}

const DEFAULT_BATCH = 1000;

/**
 * At most this many characters go to a tokeniser at once (a single longer document goes alone).
 * A batch is DEFAULT_BATCH documents, which for long documents is the whole corpus: 983 files of
 * ~24 kB read one document per file made one batch, and one of the two tokenising threads did all
 * of it. A thousand documents of the 100k bench corpus (~590 kB) stay one batch.
 */
const BATCH_CHARS = 1 << 20;

/** `texts` in order, cut into runs of at most `limit` characters (or one text, when it alone is longer). */
export function partsOfAtMost(texts: string[], limit: number): string[][] {
  const parts: string[][] = [];
  let start = 0;
  let chars = 0;
  for (let i = 0; i < texts.length; i++) {
    const length = texts[i]!.length;
    if (i > start && chars + length > limit) {
      parts.push(texts.slice(start, i));
      start = i;
      chars = 0;
    }
    chars += length;
  }
  if (start === 0) return [texts];
  parts.push(texts.slice(start));
  return parts;
}

/**
 * Streams `source`, tokenises every document and counts terms into a CSR matrix (rows =
 * documents in source order, columns = terms in code point order, like scikit-learn's
 * CountVectorizer with a pass-through analyzer). Workers only change who tokenises: batches are
 * counted in source order, so the result is the same whatever `workers` is.
 */
export async function buildCountMatrix(source: CorpusSource, tokens: TokenSettings, options: BuildOptions = {}): Promise<BuiltCorpus> {
  const { signal, onProgress } = options;
  signal?.throwIfAborted();
  const encoder: BatchEncoder = options.encoder ?? countingEncoder(tokens, options);
  const counter = new CountAccumulator();
  const lines = new GrowingUint32();
  const labels: (string | null)[] | null = source.labelField === null ? null : [];
  const previews: string[] = [];
  const repeated = new RepeatedLineCounter();
  let documents = 0;
  const inFlight: Promise<EncodedBatch>[] = [];
  let longRuns = 0;
  let longRunDocs = 0;
  const longRunLines: number[] = [];
  const take = (batch: EncodedBatch): void => {
    const firstRow = counter.rows;
    counter.add(batch);
    for (const p of batch.previews) previews.push(p);
    longRuns += batch.longRuns;
    longRunDocs += batch.longRunDocs.length;
    for (const d of batch.longRunDocs) if (longRunLines.length < LINES_NAMED) longRunLines.push(lines.at(firstRow + d));
  };
  let assembler: RowAssembler | null = null;
  let assemblerAsked = false;
  try {
    for await (const rows of source.batches(options.batchSize ?? DEFAULT_BATCH)) {
      signal?.throwIfAborted();
      if (rows.length === 0) continue;
      const texts: string[] = new Array<string>(rows.length);
      for (let i = 0; i < rows.length; i++) {
        const row = rows[i]!;
        texts[i] = row.text;
        repeated.add(documents++, row.text);
        lines.push(row.line);
        labels?.push(row.label);
      }
      for (const part of partsOfAtMost(texts, BATCH_CHARS)) {
        const p = encoder.encode(part);
        p.catch(() => undefined); // awaited below in order; this only silences an early rejection
        inFlight.push(p);
        while (inFlight.length >= encoder.parallelism) {
          take(await inFlight.shift()!);
          onProgress?.(counter.rows);
          signal?.throwIfAborted();
        }
      }
      // The threads that will write the matrix's rows start once the first batches are counted
      // (the tokenising threads' own start is over by then), so that they have loaded and
      // warmed up long before the vocabulary is complete.
      if (!assemblerAsked && counter.rows > 0) {
        assemblerAsked = true;
        assembler = startAssembling(encoder, options);
      }
    }
    // Everything is read and the last batches are being tokenised (a corpus of few batches
    // starts the writing threads only now).
    if (!assemblerAsked) assembler = startAssembling(encoder, options);
    while (inFlight.length > 0) {
      take(await inFlight.shift()!);
      onProgress?.(counter.rows);
      signal?.throwIfAborted();
    }
    // The tokenising threads end before the matrix is allocated, and their heaps with them.
    await encoder.close();
    const notes = longRuns > 0 ? [longRunNote(longRuns, longRunDocs, longRunLines)] : [];
    const { counts, countSums, weighedWith } = await counter.finish(assembler, options.weighAhead);
    return { counts, lines: lines.toArray(), labels, previews, notes, countSums, weighedWith, repeatedLines: repeated.result() };
  } finally {
    await encoder.close();
    await assembler?.close();
  }
}

/** The threads that write the matrix's rows for `encoder`'s batches; null where this thread writes them. */
function startAssembling(encoder: BatchEncoder, options: BuildOptions): RowAssembler | null {
  if (encoder.threads === 0) return null;
  const script = options.assembleScript ?? join(options.workerScript === undefined ? __dirname : dirname(options.workerScript), 'assemble-worker.js');
  return startRowAssembler(encoder.threads, script);
}

/**
 * The default tokeniser for buildCountMatrix: a pool of `workers` threads (default min(2,
 * available cores)), or this thread when there are none or the worker bundle is missing. A
 * caller may start it early (the threads load the bundle and wink's model while the caller
 * reads settings and opens the corpus) and pass it as `encoder`; buildCountMatrix closes it.
 */
export function countingEncoder(tokens: TokenSettings, options: Pick<BuildOptions, 'workers' | 'workerScript'> = {}): BatchEncoder {
  return startCountingThreads(options)?.encoder(tokens) ?? inProcessEncoder(tokens);
}

/**
 * countingEncoder's threads, started before the token settings are known (they load the bundle
 * meanwhile; `encoder(tokens)` sends the settings); null where countingEncoder would tokenise
 * in this thread.
 */
export function startCountingThreads(options: Pick<BuildOptions, 'workers' | 'workerScript'> = {}): TokenizingThreads | null {
  const workers = options.workers ?? Math.min(2, availableParallelism());
  return startTokenizingThreads(workers, options.workerScript ?? join(__dirname, 'tokenize-worker.js'));
}

/**
 * The same threads for a corpus of many files, each taking one file at a time with a tokeniser
 * fresh for it (count-each-file.ts); null where countingEncoder would tokenise in this thread.
 */
export function startCountingLanes(options: Pick<BuildOptions, 'workers' | 'workerScript'> = {}): FileLanes | null {
  const workers = options.workers ?? Math.min(2, availableParallelism());
  return startFileLanes(workers, options.workerScript ?? join(__dirname, 'tokenize-worker.js'));
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
  pushAll(values: Uint32Array): void {
    for (let i = 0; i < values.length; i++) this.push(values[i]!);
  }
  at(i: number): number {
    return this.a[i]!;
  }
  toArray(): Uint32Array {
    return this.a.slice(0, this.length);
  }
  /** The filled part, without a copy (valid until the next push). */
  view(): Uint32Array {
    return this.a.subarray(0, this.length);
  }
}

/**
 * Turns encoded batches into CSR rows. Each batch's columns are its coder's ids; one table per
 * coder (stream) maps them to provisional (first-seen) global ids. The batches' own arrays are
 * kept as they came until `finish` writes the matrix once at its final size (no doubling
 * copies, and a part is let go as soon as it is written); their ids are mapped to columns only
 * there, through one rank table per stream, so the main thread never rewrites the non-zeros
 * while the tokenising threads work (a pass over all of them: ~0.3 s at 100k documents).
 */
class CountAccumulator {
  private readonly idOf = new Map<string, number>();
  private readonly inOrder = new CodePointSortedTerms();
  /** Per stream, in order of first batch: the stream's number and its ids' global ids. */
  private readonly streams = new Map<number, { index: number; globalOf: GrowingUint32 }>();
  private parts: CountedPart[] = [];
  private readonly sums = new PartCountSums();
  private readonly tokensPerDoc = new GrowingUint32();
  private nonzeros = 0;
  rows = 0;

  add(batch: EncodedBatch): void {
    let stream = this.streams.get(batch.stream);
    if (stream === undefined) {
      stream = { index: this.streams.size, globalOf: new GrowingUint32() };
      this.streams.set(batch.stream, stream);
    }
    const { globalOf } = stream;
    if (globalOf.length !== batch.firstNewId) throw new Error(`count matrix: batch of stream ${batch.stream} starts at term ${batch.firstNewId}, expected ${globalOf.length}`);
    // Each loop over the batch in a function of its own: with the loops here, V8 compiled this
    // function on-stack in the first batch's long loop and bailed out of that code on entry at
    // most later batches (--trace-deopt, 100k review: 13 times), which left whole batches'
    // loops to unoptimised code.
    this.globalIds(batch.newTerms, globalOf);
    this.inOrder.tidy();
    const part: CountedPart = { stream: stream.index, rowEnds: batch.rowEnds, cols: batch.cols, counts: batch.counts };
    this.sums.add(part, globalOf.length);
    this.parts.push(part);
    this.tokensPerDoc.pushAll(batch.tokens);
    this.rows += batch.rowEnds.length;
    this.nonzeros += batch.cols.length;
  }

  /** Each new term's global id (a new one for a term no stream has met), after the stream's others. */
  private globalIds(newTerms: readonly string[], globalOf: GrowingUint32): void {
    for (let i = 0; i < newTerms.length; i++) {
      const t = newTerms[i]!;
      let id = this.idOf.get(t);
      if (id === undefined) {
        id = this.idOf.size;
        this.idOf.set(t, id);
        this.inOrder.add(t);
      }
      globalOf.push(id);
    }
  }

  /**
   * Numbers columns in code point order and writes each row with its column ids ascending
   * (rows-in-rank-order.ts). With assembling threads the parts are written there, in
   * parallel, into arrays on SharedArrayBuffers (at a million documents this step was ~11 s of
   * the main thread's CPU after the tokenising threads had finished); else here, one part after
   * another.
   */
  async finish(
    assembler: RowAssembler | null = null,
    weighAhead?: BuildOptions['weighAhead'],
  ): Promise<{ counts: CountMatrix; countSums: RowCountSums; weighedWith: Float64Array | null }> {
    const cols = this.idOf.size;
    const sortedTerms = this.inOrder.sorted();
    const rank = new Uint32Array(cols);
    for (let j = 0; j < cols; j++) rank[this.idOf.get(sortedTerms[j]!)!] = j;
    // Each stream's own ids straight to columns.
    const ranks: Uint32Array[] = [];
    for (const { index, globalOf } of this.streams.values()) {
      const global = globalOf.view();
      const own = new Uint32Array(global.length);
      for (let id = 0; id < own.length; id++) own[id] = rank[global[id]!]!;
      ranks[index] = own;
    }
    const rows = this.rows;
    const nonzeros = this.nonzeros;
    const parts = this.parts;
    this.parts = [];
    const firstTerms = firstColumns(parts, ranks, rows);
    const indptr = new Uint32Array(rows + 1);
    const starts: number[] = new Array<number>(parts.length);
    let r = 0;
    for (let p = 0; p < parts.length; p++) {
      const { rowEnds } = parts[p]!;
      const base = indptr[r]!;
      starts[p] = base;
      for (let d = 0; d < rowEnds.length; d++) indptr[++r] = base + rowEnds[d]!;
    }
    const shared = assembler !== null && parts.length > 1;
    const indices = new Uint32Array(shared ? new SharedArrayBuffer(4 * nonzeros) : new ArrayBuffer(4 * nonzeros));
    const data = new Float64Array(shared ? new SharedArrayBuffer(8 * nonzeros) : new ArrayBuffer(8 * nonzeros));
    let countSums: RowCountSums;
    let weighedWith: Float64Array | null = null;
    if (shared) {
      let weigh: RowWeighing | null = null;
      if (weighAhead !== undefined) {
        // The sums by column first (a few ms): the idf the threads weigh each row with comes from their df.
        countSums = this.sums.result(ranks, cols);
        weigh = weighAhead(countSums, rows, cols);
        weighedWith = weigh?.idf ?? null;
        await assembler.assemble({ ranks, columns: cols, indptr, indices, data, parts, starts, weigh });
      } else {
        // The parts are posted at once; their sums move to columns here while the threads write.
        const writing = assembler.assemble({ ranks, columns: cols, indptr, indices, data, parts, starts, weigh });
        countSums = this.sums.result(ranks, cols);
        await writing;
      }
    } else {
      countSums = this.sums.result(ranks, cols);
      const writer = new RowWriter(ranks, cols, indices, data);
      for (let p = 0; p < parts.length; p++) {
        writer.write(parts[p]!, starts[p]!);
        parts[p] = EMPTY_PART; // let each part go as soon as it is written
      }
    }
    return { counts: { rows, cols, indptr, indices, data, terms: sortedTerms, tokensPerDoc: this.tokensPerDoc.toArray(), firstTerms }, countSums, weighedWith };
  }
}

/**
 * Each row's first entry's column: a counted part lists a document's distinct terms in order of
 * first use (encode-batch.ts), so its first entry is the document's first token.
 */
function firstColumns(parts: readonly CountedPart[], ranks: readonly Uint32Array[], rows: number): Int32Array {
  const out = new Int32Array(rows).fill(-1);
  let r = 0;
  for (const { stream, rowEnds, cols } of parts) {
    const rank = ranks[stream]!;
    let start = 0;
    for (let d = 0; d < rowEnds.length; d++, r++) {
      if (rowEnds[d]! > start) out[r] = rank[cols[start]!]!;
      start = rowEnds[d]!;
    }
  }
  return out;
}

const EMPTY_PART: CountedPart = { stream: 0, rowEnds: new Uint32Array(0), cols: new Uint32Array(0), counts: new Uint16Array(0) };
