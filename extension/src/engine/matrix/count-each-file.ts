import type { CorpusRow, CorpusSource } from '../read/corpus-source';
import type { FileByFileSource } from '../read/many-files-corpus';
import { coderEncoder, type FileLanes } from '../tokenize/batch-encoder';
import type { TokenSettings } from '../tokenize/create-tokenizer';
import { freshTermCoder } from '../tokenize/fresh-term-coder';
import { buildCountMatrix, type BuiltCorpus } from './build-count-matrix';
import { compareCodePoints } from './compare-code-points';
import { renumberFirstTerms } from './csr';
import { mergeRepeatedLines } from './repeated-lines';

/** Counts one file of a many-file corpus (one shard) in this thread, with a fresh tokeniser (tokenize/fresh-term-coder.ts). */
export function countFile(source: CorpusSource, tokens: TokenSettings, signal?: AbortSignal): Promise<BuiltCorpus> {
  const encoder = coderEncoder(freshTermCoder(tokens));
  return buildCountMatrix(source, tokens, signal === undefined ? { encoder } : { encoder, signal });
}

/** The files' counts as one corpus: rows one file after another, columns the union in code point order. */
export function concatCounts(parts: readonly BuiltCorpus[]): BuiltCorpus {
  const termSet = new Set<string>();
  for (const p of parts) for (const t of p.counts.terms) termSet.add(t);
  const terms = [...termSet].sort(compareCodePoints);
  const columnOf = new Map<string, number>();
  for (let j = 0; j < terms.length; j++) columnOf.set(terms[j]!, j);
  let rows = 0;
  let total = 0;
  for (const p of parts) {
    rows += p.counts.rows;
    total += p.counts.indptr[p.counts.rows]!;
  }
  const indptr = new Uint32Array(rows + 1);
  const indices = new Uint32Array(total);
  const data = new Float64Array(total);
  const tokensPerDoc = new Uint32Array(rows);
  const firstTerms = new Int32Array(rows);
  const lines = new Uint32Array(rows);
  const labelled = parts.some((p) => p.labels !== null);
  const labels: (string | null)[] | null = labelled ? [] : null;
  const previews: string[] = [];
  let r0 = 0;
  let at = 0;
  for (const p of parts) {
    const c = p.counts;
    // Both vocabularies are in code point order, so the mapping keeps each row's columns ascending.
    const map = Uint32Array.from(c.terms, (t) => columnOf.get(t)!);
    const n = c.indptr[c.rows]!;
    for (let k = 0; k < n; k++) {
      indices[at + k] = map[c.indices[k]!]!;
      data[at + k] = c.data[k]!;
    }
    for (let r = 0; r < c.rows; r++) indptr[r0 + r + 1] = at + c.indptr[r + 1]!;
    tokensPerDoc.set(c.tokensPerDoc, r0);
    firstTerms.set(renumberFirstTerms(c.firstTerms, map), r0);
    lines.set(p.lines, r0);
    if (labels !== null) for (let r = 0; r < c.rows; r++) labels.push(p.labels === null ? null : (p.labels[r] ?? null));
    for (const preview of p.previews) previews.push(preview);
    r0 += c.rows;
    at += n;
  }
  return { counts: { rows, cols: terms.length, indptr, indices, data, terms, tokensPerDoc, firstTerms }, lines, labels, previews, notes: parts.flatMap((p) => p.notes), countSums: null, weighedWith: null, repeatedLines: mergeRepeatedLines(parts.map((p) => p.repeatedLines)) };
}

/**
 * Counts a many-file corpus file by file, each with a fresh tokeniser, as its shards would be.
 * With `lanes` (tokenising threads, batch-encoder.ts), each file is tokenised on the first lane
 * free while this thread reads the next files, so both cores work; the counts are the same as in
 * this thread, since each file still goes through a tokeniser of its own, in order.
 */
export async function countEachFile(source: FileByFileSource, tokens: TokenSettings, signal?: AbortSignal, lanes: FileLanes | null = null): Promise<BuiltCorpus> {
  const counting: Promise<BuiltCorpus>[] = [];
  const keys: string[] = [];
  // Lanes counting a file, each with the promise of its number once that file is counted.
  const busy = new Map<number, Promise<number>>();
  try {
    for await (const file of source.eachFile()) {
      keys.push(file.key);
      if (lanes === null) {
        counting.push(Promise.resolve(await countFile(file.source, tokens, signal)));
        continue;
      }
      // The file goes to the first lane that is free, or that becomes free (its file counted).
      let lane = 0;
      while (busy.has(lane)) lane++;
      if (lane === lanes.lanes) {
        lane = await Promise.race(busy.values());
        busy.delete(lane);
      }
      const read = watchedToItsEnd(file.source);
      const encoder = lanes.forFile(lane, tokens);
      const counted = buildCountMatrix(read.source, tokens, signal === undefined ? { encoder } : { encoder, signal });
      counted.catch(() => undefined); // awaited below; this only silences an early rejection
      counting.push(counted);
      const free = counted.then(() => lane);
      free.catch(() => undefined);
      busy.set(lane, free);
      // The next file is read once this one is read to its end (eachFile's rule: its places,
      // skipped rows and notes are complete by then).
      await Promise.race([read.done, counted]);
    }
    const parts = await Promise.all(counting);
    // A tokeniser's note names lines of its file: with more than one file, it names the file too.
    if (parts.length > 1) parts.forEach((p, i) => (p.notes = p.notes.map((note) => `${keys[i]}: ${note}`)));
    return concatCounts(parts);
  } finally {
    // On a failure, no file is left counting after this returns.
    await Promise.allSettled(counting);
  }
}

/** `source`, and a promise kept once its batches have all been read. */
function watchedToItsEnd(source: CorpusSource): { source: CorpusSource; done: Promise<void> } {
  let ended = (): void => undefined;
  const done = new Promise<void>((resolve) => (ended = resolve));
  const watched = Object.create(source, {
    batches: {
      value: async function* (batchSize?: number): AsyncGenerator<CorpusRow[]> {
        yield* source.batches(batchSize);
        ended();
      },
    },
  }) as CorpusSource;
  return { source: watched, done };
}
