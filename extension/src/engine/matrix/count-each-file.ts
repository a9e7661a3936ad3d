import type { CorpusSource } from '../read/corpus-source';
import type { FileByFileSource } from '../read/many-files-corpus';
import { coderEncoder, type BatchEncoder } from '../tokenize/batch-encoder';
import { createTermCoder, type TokenSettings } from '../tokenize/create-tokenizer';
import { freshWinkInstance } from '../tokenize/wink-instance';
import { buildCountMatrix, type BuiltCorpus } from './build-count-matrix';
import { compareCodePoints } from './compare-code-points';
import { renumberFirstTerms } from './csr';

/**
 * A tokeniser that has seen nothing before this file, in this thread. wink-nlp's output depends
 * on what its instance has tokenised before (see tokenize/chunk-cached-unigrams.ts, point 2), so a
 * file's terms are a function of the file alone only when each file starts from a fresh
 * instance and its documents go through it in order. That is what makes a corpus of many files
 * count the same whether one process reads them all or each shard step reads one.
 */
export function freshFileEncoder(tokens: TokenSettings): BatchEncoder {
  // The pattern tokenizer keeps no state between documents and never calls wink: loading a model
  // for it (~0.5 s a file) would only cost time.
  if (tokens.tokenizer === 'pattern') return coderEncoder(createTermCoder(tokens));
  return coderEncoder(createTermCoder(tokens, { nlp: freshWinkInstance(tokens.ngrams === 2 ? 'sentences' : 'tokens') }));
}

/** Counts one file of a many-file corpus (one shard) with a fresh tokeniser. */
export function countFile(source: CorpusSource, tokens: TokenSettings, signal?: AbortSignal): Promise<BuiltCorpus> {
  return buildCountMatrix(source, tokens, signal === undefined ? { encoder: freshFileEncoder(tokens) } : { encoder: freshFileEncoder(tokens), signal });
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
  return { counts: { rows, cols: terms.length, indptr, indices, data, terms, tokensPerDoc, firstTerms }, lines, labels, previews, notes: parts.flatMap((p) => p.notes), countSums: null, weighedWith: null };
}

/** Counts a many-file corpus file by file, each with a fresh tokeniser, as its shards would be. */
export async function countEachFile(source: FileByFileSource, tokens: TokenSettings, signal?: AbortSignal): Promise<BuiltCorpus> {
  const parts: BuiltCorpus[] = [];
  const keys: string[] = [];
  for await (const file of source.eachFile()) {
    parts.push(await countFile(file.source, tokens, signal));
    keys.push(file.key);
  }
  // A tokeniser's note names lines of its file: with more than one file, it names the file too.
  if (parts.length > 1) parts.forEach((p, i) => (p.notes = p.notes.map((note) => `${keys[i]}: ${note}`)));
  return concatCounts(parts);
}
