import { createHash } from 'node:crypto';
import * as path from 'node:path';
import type { EffectiveSettings } from '../../protocol';
import { compareCodePoints } from '../matrix/compare-code-points';
import { documentCount } from '../matrix/prune-terms';
import { idfOf } from '../matrix/weigh';
import { compareRanked } from '../random/bottom-k';
import { MAX_SKIPPED_EXAMPLES } from '../read/row-stream';
import { loadStopList } from '../review/load-stop-list';
import { OPINION_SAMPLE } from '../terms/review-terms';
import { createTokenizer } from '../tokenize/create-tokenizer';
import { UserError } from '../user-error';
import { TermIndex } from '../what-if/term-index';
import { checkSameSettings, encodeFloat64, header, maskColumns, maskId, settingsKey, type CountPartial, type PlanPartial } from './partials';

export interface PlanInput {
  /** The corpus as the user named it (glob or folder): the Report's input.file. */
  corpus: string;
  settings: EffectiveSettings;
  /** The folder loudword.json was found in (the stop list is relative to it), or null. */
  configDir: string | null;
  partials: ReadonlyArray<{ partial: CountPartial; file: string }>;
}

/**
 * The merge after round 1: the vocabulary (union of the shards' terms, code point order), df
 * summed, pruned by the df bounds, idf; the sample (the documents with the smallest place keys
 * among all candidates that keep a term); the stop list's columns. O(vocabulary + shards ×
 * candidates): no document is touched that is not a sample candidate.
 */
export async function planReview(input: PlanInput): Promise<PlanPartial> {
  const { settings } = input;
  if (input.partials.length === 0) throw new UserError('no round-1 partials to merge');
  checkSameSettings(input.partials.map((p) => ({ header: p.partial, file: p.file })), settingsKey(settings));
  const parts = [...input.partials].sort((a, b) => compareCodePoints(a.partial.shard.key, b.partial.shard.key));
  for (let i = 1; i < parts.length; i++) {
    if (parts[i]!.partial.shard.key === parts[i - 1]!.partial.shard.key) {
      throw new UserError(`two round-1 partials for shard "${parts[i]!.partial.shard.key}" (${parts[i - 1]!.file} and this one)`, parts[i]!.file, null);
    }
  }

  // Vocabulary and df: every shard's terms, summed.
  const dfOf = new Map<string, number>();
  let documents = 0;
  let tokens = 0;
  const shards: PlanPartial['shards'] = [];
  for (const { partial } of parts) {
    shards.push({ key: partial.shard.key, documents: partial.documents, offset: documents });
    documents += partial.documents;
    tokens += partial.tokens;
    for (let j = 0; j < partial.terms.length; j++) dfOf.set(partial.terms[j]!, (dfOf.get(partial.terms[j]!) ?? 0) + partial.df[j]!);
  }
  if (documents === 0) throw new UserError('no documents with text were found', input.corpus);
  const allTerms = [...dfOf.keys()].sort(compareCodePoints);
  const minCount = documentCount('prune.minDf', settings.prune.minDf, documents, false);
  const maxCount = documentCount('prune.maxDf', settings.prune.maxDf, documents, true);
  if (maxCount < minCount) throw new UserError(`prune.maxDf (${settings.prune.maxDf}) allows fewer documents than prune.minDf (${settings.prune.minDf}).`);
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
  if (terms.length === 0) throw new UserError('no terms are left after tokenising and pruning; check the text field and the prune settings', input.corpus);
  const index = new TermIndex(terms);

  const sample = mergeSample(parts, shards, index, Float64Array.from(idf), settings.sample.documents);

  const projectDir = input.configDir ?? path.dirname(path.resolve(input.corpus));
  const tokenize = createTokenizer(settings.tokens);
  const stopList = await loadStopList(settings.stopList, projectDir, undefined, tokenize, settings.tokens.lowercase);
  const base = maskColumns(index.mask(stopList.terms));

  const planId = createHash('sha256')
    .update(JSON.stringify({ key: settingsKey(settings), shards, terms }))
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
    input: mergedInput(input.corpus, parts.map((p) => p.partial)),
    stopList: { file: stopList.file, terms: stopList.terms, unused: stopList.entries.filter((e) => !dfOf.has(e.term)).map((e) => e.written) },
  };
}

/** The positions terms/review-terms.ts's evenlySpaced picks from n documents. */
function evenlySpacedDocuments(n: number, max: number): number[] {
  if (n <= max) return Array.from({ length: n }, (_, i) => i);
  return Array.from({ length: max }, (_, i) => Math.floor((i * n) / max));
}

/**
 * The m candidates with the smallest keys that keep a weighted term after pruning, in corpus order.
 * Exact when every shard that had more candidates than it kept kept at least the ones below the
 * m-th chosen key — checked, because pruning may empty more candidates than the margin allows.
 */
function mergeSample(
  parts: ReadonlyArray<{ partial: CountPartial; file: string }>,
  shards: PlanPartial['shards'],
  index: TermIndex,
  idf: Float64Array,
  size: number,
): PlanPartial['sample'] {
  interface Pick {
    key: number;
    file: string;
    line: number;
    doc: number;
    label: string | null;
    preview: string;
    cols: number[];
    counts: number[];
  }
  const picks: Pick[] = [];
  for (let s = 0; s < parts.length; s++) {
    const { partial } = parts[s]!;
    const columnOf = partial.terms.map((t) => index.column(t) ?? -1);
    for (const c of partial.candidates) {
      const cols: number[] = [];
      const counts: number[] = [];
      for (let i = 0; i < c.terms.length; i++) {
        const col = columnOf[c.terms[i]!]!;
        if (col < 0) continue;
        cols.push(col);
        counts.push(c.counts[i]!);
      }
      // A document with a direction: some kept term with a non-zero weight (idf ln(n/df) is 0
      // for a term in every document), as matrix/rows-with-weight.ts decides for one process.
      if (!cols.some((col) => idf[col] !== 0)) continue;
      picks.push({ key: c.key, file: partial.shard.key, line: c.line, doc: shards[s]!.offset + c.row, label: c.label, preview: c.preview, cols, counts });
    }
  }
  picks.sort(compareRanked);
  const chosen = picks.slice(0, size);
  const last = chosen[chosen.length - 1];
  for (const { partial, file } of parts) {
    const truncated = partial.nonEmptyDocuments > partial.candidates.length;
    if (!truncated) continue;
    const highest = partial.candidates[partial.candidates.length - 1]!;
    if (chosen.length < size || (last !== undefined && compareRanked(last, { key: highest.key, file: partial.shard.key, line: highest.line }) >= 0)) {
      throw new UserError(
        `pruning emptied too many of this shard's ${partial.candidateLimit} sample candidates to choose the sample exactly; ` +
          `lower sample.documents or loosen prune.minDf/maxDf`,
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
    counts.push(...p.counts);
    indptr.push(indices.length);
  }
  const labelled = parts[0]!.partial.input.labelField !== null;
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
function mergedInput(corpus: string, partials: readonly CountPartial[]): PlanPartial['input'] {
  const first = partials[0]!;
  const notes = partials.length > 1 ? [`${partials.length} files read as one corpus`] : [];
  const skippedExamples: Array<{ line: number; reason: string }> = [];
  let skipped = 0;
  let truncated: { bytesRead: number; limitBytes: number } | null = null;
  const formats = new Set<string>();
  for (const p of partials) {
    if (p.input.textField !== first.input.textField || p.input.labelField !== first.input.labelField) {
      throw new UserError(
        `its text/label fields (${p.input.textField ?? 'none'}/${p.input.labelField ?? 'none'}) differ from shard ${first.shard.key}'s ` +
          `(${first.input.textField ?? 'none'}/${first.input.labelField ?? 'none'})`,
        p.shard.file,
        null,
      );
    }
    formats.add(p.input.format);
    skipped += p.input.skipped;
    for (const e of p.input.skippedExamples) {
      if (skippedExamples.length < MAX_SKIPPED_EXAMPLES) skippedExamples.push(partials.length > 1 ? { line: e.line, reason: `${p.shard.key}: ${e.reason}` } : e);
    }
    for (const note of p.input.notes) notes.push(partials.length > 1 ? `${p.shard.key}: ${note}` : note);
    if (p.input.truncated !== null) truncated = p.input.truncated;
  }
  if (formats.size > 1) notes.push(`the files hold different formats (${[...formats].join(', ')}); each was read as its own`);
  return {
    file: corpus,
    format: first.input.format,
    textField: first.input.textField,
    labelField: first.input.labelField,
    skipped,
    truncated: truncated ?? undefined,
    skippedExamples: skippedExamples.slice(0, 5),
    notes: notes.length > 0 ? notes : undefined,
  };
}
