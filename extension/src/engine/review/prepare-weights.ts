import type { EffectiveSettings } from '../../protocol';
import { stat } from 'node:fs/promises';
import { buildCountMatrix, countingEncoder, startCountingLanes, startCountingThreads } from '../matrix/build-count-matrix';
import type { BatchEncoder, TokenizingThreads } from '../tokenize/batch-encoder';
import { closeEarlyThreads } from '../tokenize/early-threads';
import { hasGlob } from '../read/corpus-files';
import { countEachFile } from '../matrix/count-each-file';
import { isFileByFile } from '../read/many-files-corpus';
import { nnz, type Csr } from '../matrix/csr';
import { dfBounds, noTermsLeftMessage, pruneTerms } from '../matrix/prune-terms';
import { sketchRows, type DuplicateSketch } from '../matrix/duplicate-sketch';
import type { RepeatedLines } from '../matrix/repeated-lines';
import { idfFromDf, weighInPlace } from '../matrix/weigh';
import type { RowWeighing } from '../tokenize/row-assembler';
import type { RowCountSums } from '../tokenize/row-count-sums';
import type { CorpusSource } from '../read/corpus-source';
import { UserError } from '../user-error';
import type { FileSnapshot } from './file-snapshot';
import { termCountStats, withOpenings, type TermCountStats } from '../terms/term-count-stats';

/** What the rest of a review needs from the counting step, and nothing bigger. */
export interface PreparedWeights {
  /** l2-normalised tf·idf of every term kept by the df bounds (stop list not applied). */
  weights: Csr;
  idf: Float64Array;
  /** Column j's term. */
  terms: readonly string[];
  /** Every term seen before pruning, to tell which stop-list entries never occur (unusedEntries). */
  seenTerms: readonly string[];
  documents: number;
  tokens: number;
  nonzeros: number;
  lines: Uint32Array;
  labels: (string | null)[] | null;
  previews: string[];
  /** Exact raw-count sums per kept term (stop list not applied), for the suggestion rule. */
  counts: TermCountStats;
  /** Notes from tokenising for the Report's input notes (over-long runs cut). */
  notes?: string[];
  /** Which documents repeat another exactly, under this weighting (matrix/duplicate-sketch.ts). */
  duplicates: DuplicateSketch;
  /** Lines that recur across documents (matrix/repeated-lines.ts), for the Report's note on them. */
  repeatedLines: RepeatedLines;
}

/**
 * Corpora smaller than this are tokenised without threads. Measured on the 3,000-document demo
 * corpus (0.96 MB, wink): tokenising took 1.6-1.8 s in the main thread against 3.0-4.3 s with two
 * threads on a busy 2-core machine, with the same Report; the threads pay off from a few MB.
 */
export const IN_THREAD_BYTES = 4 * 1024 * 1024;

/**
 * Starts the tokenising threads for one corpus of `size` bytes (characters for an editor
 * buffer), or null when it will be tokenised in this thread (small, or size unknown). Called
 * before the corpus is opened and the stop list loaded: each thread loads the bundle and, for
 * wink, its model (~0.5 s at 100k documents, when the main thread sat idle waiting for them),
 * and that now overlaps the main thread's own start. `early` are threads prestartTokenizing
 * started before the settings were read: they are given the settings (or closed, when the
 * corpus turns out to be tokenised here). Hand the result to prepareWeights, which closes it.
 */
export function startTokenizing(tokens: EffectiveSettings['tokens'], size: number | null, early: TokenizingThreads | null = null): BatchEncoder | null {
  if (size === null || size < IN_THREAD_BYTES) {
    void early?.close();
    return null;
  }
  return early !== null ? early.encoder(tokens) : countingEncoder(tokens);
}

/**
 * The tokenising threads for a corpus file, started before the settings are read and checked
 * (~0.1-0.15 s of loading the configuration files and validating them against the schema), so
 * that the threads load their bundle meanwhile; null when the file will be tokenised in this
 * thread (smaller than IN_THREAD_BYTES) or is not one plain file (a glob, a folder, missing).
 * Pass them to startTokenizing, which gives them the settings or closes them.
 */
export async function prestartTokenizing(file: string, options: { workerScript?: string } = {}): Promise<TokenizingThreads | null> {
  const threads = await threadsFor(file) ? startCountingThreads(options) : null;
  // Threads the launcher started for this review and nobody took (bin/loudword.js).
  closeEarlyThreads();
  return threads;
}

/** Whether `file` is one plain file large enough for tokenising threads. */
async function threadsFor(file: string): Promise<boolean> {
  if (hasGlob(file)) return false;
  try {
    const s = await stat(file);
    return s.isFile() && s.size >= IN_THREAD_BYTES;
  } catch {
    return false;
  }
}

/**
 * Counts, prunes and weighs. The weights are written over the raw counts (one float per
 * non-zero, ~600 MB at a million documents), so the two never take memory side by side.
 */
export async function prepareWeights(
  source: CorpusSource,
  settings: EffectiveSettings,
  snapshot: FileSnapshot | null,
  /** Called once counting is done, with every document's preview (the opinion check can begin). */
  onWeighting: (previews: readonly string[]) => void,
  signal: AbortSignal | undefined,
  /** The corpus's size in bytes (characters for an editor buffer), when known. */
  size: number | null = snapshot?.size ?? null,
  /** Tokenising threads started early (startTokenizing); closed here whatever happens. */
  started: BatchEncoder | null = null,
): Promise<PreparedWeights> {
  // A small corpus is tokenised in this thread: starting the tokenising threads (each loads the
  // bundle, and wink's model for the wink tokenizer) costs more than they save. The terms are the
  // same either way (build-count-matrix.ts).
  const workers = size !== null && size < IN_THREAD_BYTES ? 0 : undefined;
  let built;
  if (isFileByFile(source)) {
    // Many files: each with a fresh tokeniser, so the terms equal those of a review in shards.
    await started?.close();
    const lanes = startCountingLanes(workers === undefined ? {} : { workers });
    try {
      built = await countEachFile(source, settings.tokens, signal, lanes);
    } finally {
      await lanes?.close();
    }
  } else {
    built = await buildCountMatrix(source, settings.tokens, {
      weighAhead: (sums, rows) => weighingAhead(settings, sums, rows),
      ...(signal === undefined ? {} : { signal }),
      ...(started !== null ? { encoder: started } : workers === undefined ? {} : { workers }),
    });
  }
  await snapshot?.assertUnchanged();
  if (built.counts.rows === 0) throw new UserError('no documents with text were found', source.file);

  onWeighting(built.previews);
  let weights: Csr;
  let idf: Float64Array;
  let terms: readonly string[];
  let countStats: TermCountStats;
  if (built.weighedWith !== null && built.countSums !== null) {
    // Weighed as the rows were written (weighingAhead: pruning keeps every column, so this is the
    // matrix pruneTerms would give and weighInPlace would weigh, to the bit).
    const { rows, cols, indptr, indices, data } = built.counts;
    weights = { rows, cols, indptr, indices, data };
    idf = built.weighedWith;
    terms = built.counts.terms;
    countStats = withOpenings(built.countSums, built.counts.firstTerms);
  } else {
    // The stop list is applied later as a column mask, not here, so that the review can still say
    // how much a stopped term would pull and whether it carries neighbour signal.
    const { counts } = pruneTerms(built.counts, {
      minDf: settings.prune.minDf,
      maxDf: settings.prune.maxDf,
      stopTerms: new Set(),
      // The counted batches' sums hold df (every stored count is ≥ 1, so a column's entries are its documents).
      ...(built.countSums !== null ? { df: built.countSums.df } : {}),
    });
    if (counts.cols === 0) {
      throw new UserError(noTermsLeftMessage(source.textField, source.fields, built.counts.cols), source.file);
    }
    // The raw-count statistics first: the weights are then written over the counts. Their df is
    // the idf's (every stored count is ≥ 1, so a column's entries are its documents).
    // Counting summed them already (row-count-sums.ts): used when nothing was pruned (the same matrix).
    countStats = counts === built.counts && built.countSums !== null ? withOpenings(built.countSums, counts.firstTerms) : termCountStats(counts, counts.firstTerms);
    // Distances are cosine: rows are l2-normalised for measuring whatever `norm` says.
    ({ weights, idf } = weighInPlace(counts, { ...settings.weighting, norm: 'l2' }, countStats.df));
    terms = counts.terms;
  }
  let tokens = 0;
  for (let r = 0; r < built.counts.rows; r++) tokens += built.counts.tokensPerDoc[r]!;
  return {
    weights,
    idf,
    terms,
    seenTerms: built.counts.terms,
    documents: weights.rows,
    tokens,
    nonzeros: nnz(weights),
    lines: built.lines,
    labels: built.labels,
    previews: built.previews,
    counts: countStats,
    notes: built.notes,
    repeatedLines: built.repeatedLines,
    duplicates: sketchRows(weights),
  };
}

/**
 * How the threads that write the count matrix's rows weigh them as they write (BuildOptions.weighAhead),
 * when that gives the weights prepareWeights would: when the prune bounds keep every column at
 * these df (pruneTerms' test; the stop list is a mask applied later), so the matrix is the one
 * weighInPlace would weigh, with the idf from the same df and the same row arithmetic (weighRow).
 * null otherwise (and when the bounds are invalid, so that pruneTerms says so as before). The
 * review's thread then makes no weighing pass over the matrix while one core is idle.
 */
export function weighingAhead(settings: Pick<EffectiveSettings, 'prune' | 'weighting'>, sums: RowCountSums, rows: number): RowWeighing | null {
  let bounds;
  try {
    bounds = dfBounds(settings.prune, rows);
  } catch {
    return null;
  }
  const { minCount, maxCount } = bounds;
  const { df } = sums;
  if (df.length === 0) return null;
  for (let j = 0; j < df.length; j++) if (df[j]! < minCount || df[j]! > maxCount) return null;
  return { idf: idfFromDf(settings.weighting.idf, rows, df), tf: settings.weighting.tf, norm: 'l2' };
}

/**
 * The entries of a stop list whose term is not among `seen` (the terms met before pruning), as
 * written: one pass over the terms with a look-up in the list, rather than a set of every term
 * (~70 ms for the 100k bench corpus's terms) for a list that is often empty or short.
 */
export function unusedEntries(entries: ReadonlyArray<{ term: string; written: string }>, seen: readonly string[]): string[] {
  if (entries.length === 0) return [];
  const missing = new Set(entries.map((e) => e.term));
  for (const term of seen) if (missing.delete(term) && missing.size === 0) break;
  return entries.filter((e) => missing.has(e.term)).map((e) => e.written);
}
