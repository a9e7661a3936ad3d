import type { EffectiveSettings } from '../../protocol';
import { countFile } from '../matrix/count-each-file';
import { placesAmong } from '../matrix/compare-code-points';
import { renumberFirstTerms, type CountMatrix, type Csr } from '../matrix/csr';
import { rowsWithWeight } from '../matrix/rows-with-weight';
import { sketchRows } from '../matrix/duplicate-sketch';
import { weighWithIdf } from '../matrix/weigh';
import { maskedTermSums, type MaskedTermSums } from '../measures/masked-term-sums';
import { termSums } from '../measures/term-sums';
import { termCountStats, type TermCountStats } from '../terms/term-count-stats';
import { openCorpusFile } from '../read/open-corpus-file';
import { UserError } from '../user-error';
import type { ShardRef } from './count-shard';
import type { ShardCounts } from './shard-counts';
import { decodeFloat64, encodeDuplicateSketch, encodeFloat64, encodeUint32, header, type EncodedDuplicateSketch, settingsKey, type EncodedCountStats, type EncodedNeighbors, type EncodedSums, type NeighborRequest, type PlanPartial, type SumsPartial } from './partials';
import { corpusNeighbors } from '../measures/corpus-neighbors';
import { NO_NEIGHBOR } from '../measures/knn';
import { searchCandidates, searchedRows } from '../terms/corpus-precision';
import { planSampleRows } from './sample-rows';

/**
 * Round 2 of a distributed review, for one shard: takes the counts round 1 kept (`kept`, see
 * shard-counts.ts) or else reads and tokenises the shard again, weighs them with
 * the merged vocabulary and idf, and adds up the exact term sums (docs/methods.md §3) under each
 * mask the plan asks for, in one pass per mask over the shard's non-zeros. Each row is weighted
 * and renormalised exactly as the one-process review weighs it, so the sums differ from its sums
 * only in the order the shards' subtotals are added.
 */
export async function sumShard(shard: ShardRef, plan: PlanPartial, settings: EffectiveSettings, kept: ShardCounts | null = null): Promise<SumsPartial> {
  if (plan.settingsKey !== settingsKey(settings)) {
    throw new UserError('the plan was made with other settings: every shard step must use the same loudword.json and options', shard.file, null);
  }
  const known = plan.shards.find((s) => s.key === shard.key);
  if (known === undefined) throw new UserError(`shard "${shard.key}" is not in the plan (${plan.shards.length} shards)`, shard.file, null);
  const built = kept ?? (await countFile(await openCorpusFile(shard.file, { format: settings.format, textField: settings.text, labelField: settings.label, maxBytes: settings.limits.maxBytes }), settings.tokens));
  if (built.counts.rows !== known.documents) {
    throw new UserError(`the shard changed since round 1: ${built.counts.rows} documents now, ${known.documents} then`, shard.file, null);
  }
  const counts = inPlanColumns(built.counts, plan.terms);
  const weights = weighWithIdf(counts, decodeFloat64(plan.idf), { ...settings.weighting, norm: 'l2' });
  const masks = plan.masks.map((m) => {
    const removed = new Uint8Array(plan.terms.length);
    for (const c of m.columns) removed[c] = 1;
    return { id: m.id, ...encodeSums(maskedTermSums(weights, removed, true)) };
  });
  const requests = plan.neighbors ?? [];
  const queries = requests.length > 0 ? { rows: planSampleRows(plan, settings), docs: Uint32Array.from(plan.sample.docs) } : null;
  const neighbors = requests.map((r) => shardNeighbors(r, plan.terms.length, queries!, weights, known.offset, built.labels));
  let full: EncodedSums | null = null;
  let countStats: EncodedCountStats | null = null;
  let duplicates: EncodedDuplicateSketch | null = null;
  const previews: Array<{ doc: number; preview: string }> = [];
  if (plan.full) {
    countStats = encodeCountStats(termCountStats(counts, counts.firstTerms));
    for (const doc of plan.previewDocs) {
      const row = doc - known.offset;
      if (row >= 0 && row < known.documents) previews.push({ doc, preview: built.previews[row] ?? '' });
    }
    full = encodeSums({ sums: termSums(weights), rowsWithWeight: rowsWithWeight(weights) });
    duplicates = encodeDuplicateSketch(sketchRows(weights));
  }
  return { ...header('sums', settings), step: 'sums', planId: plan.planId, shard: { key: shard.key, documents: known.documents }, masks, neighbors, full, counts: countStats, previews, duplicates };
}

/**
 * The sampled documents' k nearest among this shard's candidates (corpusNeighbors, the search one
 * process runs over the whole corpus, here over documents offset … offset + rows − 1), with the
 * label of each document listed: the finish merges the shards' lists (sharded-search.ts).
 */
function shardNeighbors(request: NeighborRequest, cols: number, queries: { rows: Csr; docs: Uint32Array }, weights: Csr, offset: number, labels: readonly (string | null)[] | null): EncodedNeighbors {
  const removed = new Uint8Array(cols);
  for (const c of request.columns) removed[c] = 1;
  const candidates = searchCandidates(request, offset, weights.rows);
  const searched = searchedRows(queries.rows, queries.docs, request);
  const lists = corpusNeighbors(searched.rows, searched.docs, weights, offset, removed, request.k, candidates);
  const listed = Array.from(lists.docs, (d) => (d === NO_NEIGHBOR || labels === null ? null : (labels[d - offset] ?? null)));
  return { id: request.id, docs: encodeUint32(lists.docs), sims: encodeFloat64(lists.sims), labels: listed };
}

/**
 * The shard's counts re-indexed to the plan's columns, with each document's first column; terms
 * the merge pruned are dropped (a first term so dropped becomes −1).
 */
function inPlanColumns(counts: CountMatrix, planTerms: readonly string[]): Csr & { firstTerms: Int32Array } {
  const local = placesAmong(counts.terms, planTerms);
  const total = counts.indptr[counts.rows]!;
  let kept = 0;
  for (let p = 0; p < total; p++) if (local[counts.indices[p]!]! >= 0) kept++;
  const indptr = new Uint32Array(counts.rows + 1);
  const indices = new Uint32Array(kept);
  const data = new Float64Array(kept);
  let at = 0;
  for (let r = 0; r < counts.rows; r++) {
    // Both vocabularies are in code point order, so the mapped columns stay ascending.
    for (let p = counts.indptr[r]!; p < counts.indptr[r + 1]!; p++) {
      const c = local[counts.indices[p]!]!;
      if (c < 0) continue;
      indices[at] = c;
      data[at++] = counts.data[p]!;
    }
    indptr[r + 1] = at;
  }
  return { rows: counts.rows, cols: planTerms.length, indptr, indices, data, firstTerms: renumberFirstTerms(counts.firstTerms, local) };
}

/** Sparse: only the columns this shard touches. */
function encodeSums({ sums, rowsWithWeight: rows }: MaskedTermSums): EncodedSums {
  const cols: number[] = [];
  for (let c = 0; c < sums.df.length; c++) if (sums.df[c] !== 0 || sums.s1[c] !== 0) cols.push(c);
  const pick = (a: Float64Array): Float64Array => Float64Array.from(cols, (c) => a[c]!);
  return {
    rowsWithWeight: rows,
    cols: encodeUint32(Uint32Array.from(cols)),
    s1: encodeFloat64(pick(sums.s1)),
    s2: encodeFloat64(pick(sums.s2)),
    sxlogx: encodeFloat64(pick(sums.sxlogx)),
    df: encodeUint32(Uint32Array.from(cols, (c) => sums.df[c]!)),
  };
}

/** Sparse, like the sums: only the columns with documents in this shard. */
function encodeCountStats(stats: TermCountStats): EncodedCountStats {
  const cols: number[] = [];
  for (let c = 0; c < stats.df.length; c++) if (stats.df[c] !== 0) cols.push(c);
  const pick = (a: Float64Array): string => encodeFloat64(Float64Array.from(cols, (c) => a[c]!));
  return {
    documents: stats.documents,
    totalTokens: stats.totalTokens,
    sumLengthSq: stats.sumLengthSq,
    cols: encodeUint32(Uint32Array.from(cols)),
    df: pick(stats.df),
    cf: pick(stats.cf),
    sumCountSq: pick(stats.sumCountSq),
    sumCountLength: pick(stats.sumCountLength),
    opens: pick(stats.opens),
  };
}
