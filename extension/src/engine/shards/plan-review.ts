import { createHash } from 'node:crypto';
import * as path from 'node:path';
import type { EffectiveSettings } from '../../protocol';
import { compareCodePoints } from '../matrix/compare-code-points';
import { dfBounds, noTermsLeftMessage } from '../matrix/prune-terms';
import { idfOf } from '../matrix/weigh';
import { BottomK, compareRanked, type Ranked } from '../random/bottom-k';
import { MAX_SKIPPED_EXAMPLES } from '../read/row-stream';
import { loadStopList, withSplit } from '../review/load-stop-list';
import { OPINION_SAMPLE } from '../terms/review-terms';
import { createTokenizer } from '../tokenize/create-tokenizer';
import { entriesOfThisTokenizer } from '../terms/contraction-pieces';
import { UserError } from '../user-error';
import { TermIndex } from '../what-if/term-index';
import { placesAmong } from '../matrix/compare-code-points';
import { candidateLimit } from './count-shard';
import { checkSameSettings, encodeFloat64, header, maskColumns, maskId, settingsKey, type CountPartial, type PlanPartial } from './partials';
import { mergeRepeatedLines, type RepeatedLines } from '../matrix/repeated-lines';

export interface PlanInput {
  /** The corpus as the user named it (glob or folder): the Report's input.file. */
  corpus: string;
  settings: EffectiveSettings;
  /** The folder loudword.json was found in (the stop list is relative to it), or null. */
  configDir: string | null;
  /** Round-1 partials, read one at a time: each is folded in and let go. */
  partials: AsyncIterable<{ partial: CountPartial; file: string }> | Iterable<{ partial: CountPartial; file: string }>;
  /** The stop list's text instead of its file (the editor's unsaved buffer). */
  stopListText?: string;
}

/** What the merge keeps of a shard once its partial is folded in: a few numbers, not its vocabulary. */
interface ShardSummary {
  key: string;
  file: string;
  documents: number;
  tokens: number;
  input: CountPartial['input'];
  tokenizerNotes: string[];
  repeatedLines: RepeatedLines;
  shardFile: string;
  /** The shard had more candidates than it kept; the highest it kept bounds what it left out. */
  truncatedAbove: Ranked | null;
  candidateLimit: number;
}

/** A candidate after its partial is let go: its terms by name. */
interface HeldCandidate extends Ranked {
  row: number;
  label: string | null;
  preview: string;
  terms: string[];
  counts: number[];
}

/**
 * The merge after round 1: the vocabulary (union of the shards' terms, code point order), df
 * summed, pruned by the df bounds, idf; the sample (the documents with the smallest place keys
 * among all candidates that keep a weighted term); the stop list's columns. Partials are folded
 * in one at a time, keeping the df of each term and the smallest candidates overall (a bottom-k
 * of twice the sample), so memory is O(vocabulary + sample), whatever the number of shards.
 */
export async function planReview(input: PlanInput): Promise<PlanPartial> {
  const { settings } = input;
  const expectedKey = settingsKey(settings);
  const dfOf = new Map<string, number>();
  const summaries = new Map<string, ShardSummary>();
  const held = new BottomK<HeldCandidate>(candidateLimit(settings));
  let candidatesSeen = 0;
  for await (const { partial, file } of input.partials) {
    checkSameSettings([{ header: partial, file }], expectedKey);
    const earlier = summaries.get(partial.shard.key);
    if (earlier !== undefined) throw new UserError(`two round-1 partials for shard "${partial.shard.key}" (${earlier.file} and this one)`, file, null);
    for (let j = 0; j < partial.terms.length; j++) dfOf.set(partial.terms[j]!, (dfOf.get(partial.terms[j]!) ?? 0) + partial.df[j]!);
    const last = partial.candidates[partial.candidates.length - 1];
    summaries.set(partial.shard.key, {
      key: partial.shard.key,
      file,
      documents: partial.documents,
      tokens: partial.tokens,
      input: partial.input,
      tokenizerNotes: partial.tokenizerNotes ?? [],
      repeatedLines: partial.repeatedLines ?? { checked: 0, lines: [] },
      shardFile: partial.shard.file,
      truncatedAbove: partial.nonEmptyDocuments > partial.candidates.length && last !== undefined ? { key: last.key, file: partial.shard.key, line: last.line } : null,
      candidateLimit: partial.candidateLimit,
    });
    for (const c of partial.candidates) {
      candidatesSeen++;
      const item = { key: c.key, file: partial.shard.key, line: c.line };
      if (!held.admits(item)) continue;
      held.push({ ...item, row: c.row, label: c.label, preview: c.preview, terms: c.terms.map((t) => partial.terms[t]!), counts: c.counts });
    }
  }
  if (summaries.size === 0) throw new UserError('no round-1 partials to merge');
  const parts = [...summaries.values()].sort((a, b) => compareCodePoints(a.key, b.key));

  let documents = 0;
  let tokens = 0;
  const shards: PlanPartial['shards'] = [];
  for (const part of parts) {
    shards.push({ key: part.key, documents: part.documents, offset: documents });
    documents += part.documents;
    tokens += part.tokens;
  }
  if (documents === 0) throw new UserError('no documents with text were found', input.corpus);
  const allTerms = [...dfOf.keys()].sort(compareCodePoints);
  const { minCount, maxCount } = dfBounds(settings.prune, documents);
  const terms: string[] = [];
  const idf: number[] = [];
  let nonzeros = 0;
  for (const term of allTerms) {
    const df = dfOf.get(term)!;
    if (df < minCount || df > maxCount) continue;
    terms.push(term);
    idf.push(idfOf(settings.weighting.idf, documents, df));
    nonzeros += df;
  }
  if (terms.length === 0) throw new UserError(noTermsLeftMessage(parts[0]?.input.textField ?? null, [], allTerms.length), input.corpus);
  const index = new TermIndex(terms);

  const overall = candidatesSeen > held.size ? held.items()[held.size - 1]! : null;
  const sample = mergeSample(held.items(), overall, parts, shards, index, Float64Array.from(idf), settings.sample.documents);

  const projectDir = input.configDir ?? path.dirname(path.resolve(input.corpus));
  const tokenize = createTokenizer(settings.tokens);
  const stopList = await loadStopList(settings.stopList, projectDir, input.stopListText, tokenize, settings.tokens.lowercase);
  const base = maskColumns(index.mask(stopList.terms));

  const planId = createHash('sha256')
    .update(JSON.stringify({ key: expectedKey, shards, terms }))
    .digest('hex')
    .slice(0, 16);
  return {
    ...header('plan', settings),
    step: 'plan',
    planId,
    corpus: input.corpus,
    shards,
    documents,
    tokens,
    nonzeros,
    terms,
    idf: encodeFloat64(Float64Array.from(idf)),
    sample,
    masks: [{ id: maskId(base), columns: base }],
    full: true,
    previewDocs: evenlySpacedDocuments(documents, OPINION_SAMPLE),
    input: mergedInput(input.corpus, parts),
    // As one process says them (matrix/count-each-file.ts): with more than one shard, each names its file.
    repeatedLines: mergeRepeatedLines(parts.map((p) => p.repeatedLines)),
    tokenizerNotes: parts.flatMap((p) => (parts.length > 1 ? p.tokenizerNotes.map((note) => `${p.key}: ${note}`) : p.tokenizerNotes)),
    stopList: withSplit({ file: stopList.file, exists: stopList.exists, terms: stopList.terms, unused: entriesOfThisTokenizer(stopList.entries, tokenize).filter((e) => !dfOf.has(e.term)).map((e) => e.written) }, tokenize),
  };
}

/** The positions terms/review-terms.ts's evenlySpaced picks from n documents. */
function evenlySpacedDocuments(n: number, max: number): number[] {
  if (n <= max) return Array.from({ length: n }, (_, i) => i);
  return Array.from({ length: max }, (_, i) => Math.floor((i * n) / max));
}

/**
 * The m held candidates with the smallest keys that keep a weighted term after pruning, in
 * corpus order. Exact when nothing left out could rank below the m-th chosen: neither a
 * candidate the merge let go (`overall`) nor a document a shard did not send (its
 * `truncatedAbove`) — checked, because pruning may empty more candidates than the margin allows.
 */
function mergeSample(
  candidates: readonly HeldCandidate[],
  overall: Ranked | null,
  parts: readonly ShardSummary[],
  shards: PlanPartial['shards'],
  index: TermIndex,
  idf: Float64Array,
  size: number,
): PlanPartial['sample'] {
  const offsetOf = new Map(shards.map((s) => [s.key, s.offset]));
  const chosen: Array<HeldCandidate & { doc: number; cols: number[]; kept: number[] }> = [];
  for (const c of candidates) {
    if (chosen.length >= size) break;
    const cols: number[] = [];
    const kept: number[] = [];
    // A candidate's terms are its row's, in code point order like the plan's.
    const places = placesAmong(c.terms, index.terms);
    for (let i = 0; i < c.terms.length; i++) {
      const col = places[i]!;
      if (col < 0) continue;
      cols.push(col);
      kept.push(c.counts[i]!);
    }
    // A document with a direction: some kept term with a non-zero weight (idf ln(n/df) is 0
    // for a term in every document), as matrix/rows-with-weight.ts decides for one process.
    if (!cols.some((col) => idf[col] !== 0)) continue;
    chosen.push({ ...c, doc: offsetOf.get(c.file)! + c.row, cols, kept });
  }
  const last = chosen[chosen.length - 1];
  const bounds = [...parts.map((p) => ({ bound: p.truncatedAbove, file: p.file, limit: p.candidateLimit })), { bound: overall, file: null, limit: candidates.length }];
  for (const { bound, file, limit } of bounds) {
    if (bound === null) continue;
    if (chosen.length < size || (last !== undefined && compareRanked(last, bound) >= 0)) {
      throw new UserError(
        `pruning emptied too many of the ${limit} sample candidates to choose the sample exactly; lower sample.documents or loosen prune.minDf/maxDf`,
        file,
        null,
      );
    }
  }
  chosen.sort((a, b) => a.doc - b.doc);
  const indptr = [0];
  const indices: number[] = [];
  const counts: number[] = [];
  for (const p of chosen) {
    // Global columns keep the shard's code point order, so a row's columns stay ascending.
    indices.push(...p.cols);
    counts.push(...p.kept);
    indptr.push(indices.length);
  }
  const labelled = parts[0]!.input.labelField !== null;
  return {
    docs: chosen.map((p) => p.doc),
    files: chosen.map((p) => p.file),
    lines: chosen.map((p) => p.line),
    labels: labelled ? chosen.map((p) => p.label) : null,
    previews: chosen.map((p) => p.preview),
    indptr,
    indices,
    counts,
  };
}

/** The Report's input section, as a one-process review of the same files would write it. */
function mergedInput(corpus: string, partials: readonly ShardSummary[]): PlanPartial['input'] {
  const first = partials[0]!;
  const notes = partials.length > 1 ? [`${partials.length} files read as one corpus`] : [];
  const skippedExamples: Array<{ line: number; reason: string }> = [];
  let skipped = 0;
  let unlabelled = 0;
  let truncated: { bytesRead: number; limitBytes: number } | null = null;
  const formats = new Set<string>();
  for (const p of partials) {
    if (p.input.textField !== first.input.textField || p.input.labelField !== first.input.labelField) {
      throw new UserError(
        `its text/label fields (${p.input.textField ?? 'none'}/${p.input.labelField ?? 'none'}) differ from shard ${first.key}'s ` +
          `(${first.input.textField ?? 'none'}/${first.input.labelField ?? 'none'})`,
        p.shardFile,
        null,
      );
    }
    formats.add(p.input.format);
    skipped += p.input.skipped;
    unlabelled += p.input.unlabelled ?? 0;
    for (const e of p.input.skippedExamples) {
      if (skippedExamples.length < MAX_SKIPPED_EXAMPLES) skippedExamples.push(partials.length > 1 ? { line: e.line, reason: `${p.key}: ${e.reason}` } : e);
    }
    for (const note of p.input.notes) notes.push(partials.length > 1 ? `${p.key}: ${note}` : note);
    if (p.input.truncated !== null) truncated = p.input.truncated;
  }
  if (formats.size > 1) notes.push(`the files hold different formats (${[...formats].join(', ')}); each was read as its own`);
  return {
    file: corpus,
    format: first.input.format,
    textField: first.input.textField,
    labelField: first.input.labelField,
    skipped,
    unlabelled: first.input.labelField === null ? undefined : unlabelled,
    truncated: truncated ?? undefined,
    skippedExamples: skippedExamples.slice(0, 5),
    notes: notes.length > 0 ? notes : undefined,
  };
}
