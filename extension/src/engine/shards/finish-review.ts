import type { EffectiveSettings, Report } from '../../protocol';
import type { Csr } from '../matrix/csr';
import { weighWithIdf } from '../matrix/weigh';
import type { MaskedTermSums } from '../measures/masked-term-sums';
import type { CorpusSource } from '../read/corpus-source';
import { assembleReport } from '../review/assemble-report';
import { sampleLabelIds, type ReviewSample } from '../review/choose-sample';
import type { PreparedWeights } from '../review/prepare-weights';
import { reviewTerms } from '../terms/review-terms';
import type { TermCountStats } from '../terms/term-count-stats';
import { createTokenizer } from '../tokenize/create-tokenizer';
import { UserError } from '../user-error';
import { TermIndex } from '../what-if/term-index';
import { checkSameSettings, decodeFloat64, decodeUint32, settingsKey, type EncodedSums, type MaskRequest, type PlanPartial, type SumsPartial } from './partials';
import { ShardedLab } from './sharded-lab';

export type FinishResult = { done: true; report: Report } | { done: false; masks: MaskRequest[] };

/**
 * The last step: adds up the shards' sums (in shard key order), measures the baseline on the
 * sample, runs the term review and the suggestions through the same entry point as one process
 * (terms/review-terms.ts), and assembles the Report. When the review asked for the sums of a mask
 * no round computed (the suggested stop list, the first time), returns those masks instead.
 */
export function finishReview(plan: PlanPartial, settings: EffectiveSettings, partials: ReadonlyArray<{ partial: SumsPartial; file: string }>): FinishResult {
  const key = settingsKey(settings);
  if (plan.settingsKey !== key) throw new UserError('the plan was made with other settings: every shard step must use the same loudword.json and options');
  checkSameSettings(partials.map((p) => ({ header: p.partial, file: p.file })), key);
  for (const p of partials) {
    if (p.partial.planId !== plan.planId) throw new UserError(`computed for another plan (${p.partial.planId}, this one is ${plan.planId})`, p.file, null);
  }
  const cols = plan.terms.length;
  const masked = new Map<string, MaskedTermSums>();
  const maskIds = new Set(partials.flatMap((p) => p.partial.masks.map((m) => m.id)));
  for (const id of maskIds) masked.set(id, addUp(plan, partials, id, cols));
  const full = addUp(plan, partials, null, cols);

  const idf = decodeFloat64(plan.idf);
  const s = plan.sample;
  const sampleCounts: Csr = {
    rows: s.docs.length,
    cols,
    indptr: Uint32Array.from(s.indptr),
    indices: Uint32Array.from(s.indices),
    data: Float64Array.from(s.counts),
  };
  const sampleRows = weighWithIdf(sampleCounts, idf, { ...settings.weighting, norm: 'l2' });
  const identity = new Uint32Array(s.docs.length).map((_, i) => i);
  const labels = sampleLabelIds(identity, s.labels);
  const lab = new ShardedLab(sampleRows, settings.sample.k, settings.sample.seed, labels, masked, full);

  const index = new TermIndex(plan.terms);
  const tokenize = createTokenizer(settings.tokens);
  const baseMask = index.mask(plan.stopList.terms);
  const baseline = lab.measure(baseMask, null);
  const counts = addUpCounts(plan, partials, cols);
  const previews = previewsOf(plan, partials);
  const termReview = reviewTerms({ lab, baseMask, baseline, documents: plan.documents, idf, index, tokenize, settings, counts, previews });
  if (lab.missing.size > 0) return { done: false, masks: [...lab.missing].map(([id, columns]) => ({ id, columns })) };

  const source = { ...plan.input, skipped: { count: plan.input.skipped, examples: plan.input.skippedExamples ?? [] }, truncated: plan.input.truncated ?? null, fields: [] } as unknown as CorpusSource;
  const prepared: PreparedWeights = {
    weights: sampleRows,
    idf,
    terms: plan.terms,
    seenTerms: new Set(),
    documents: plan.documents,
    tokens: plan.tokens,
    nonzeros: plan.nonzeros,
    lines: Uint32Array.from(s.lines),
    labels: s.labels,
    previews: s.previews,
    counts,
    notes: plan.tokenizerNotes,
  };
  const sample: ReviewSample = { positions: identity, labels, emptyDocuments: 0 };
  const report = assembleReport({
    settings,
    source,
    prepared,
    stopList: { file: plan.stopList.file, terms: plan.stopList.terms, unused: plan.stopList.unused },
    baseline,
    termReview,
    sample,
  });
  // Hub rows were numbered by sample position; the Report numbers documents in the corpus.
  const manyFiles = plan.shards.length > 1;
  for (const hub of report.hubs) {
    if (manyFiles) hub.file = s.files[hub.doc]!;
    hub.doc = s.docs[hub.doc]!;
  }
  return { done: true, report };
}

/** One mask's sums (null = unmasked) over all shards, each shard exactly once, in shard order. */
function addUp(plan: PlanPartial, partials: ReadonlyArray<{ partial: SumsPartial; file: string }>, id: string | null, cols: number): MaskedTermSums {
  const s1 = new Float64Array(cols);
  const s2 = new Float64Array(cols);
  const sxlogx = new Float64Array(cols);
  const df = new Uint32Array(cols);
  let rowsWithWeight = 0;
  for (const shard of plan.shards) {
    let found: EncodedSums | null = null;
    let from = '';
    for (const { partial, file } of partials) {
      if (partial.shard.key !== shard.key) continue;
      const part = id === null ? partial.full : (partial.masks.find((m) => m.id === id) ?? null);
      if (part === null) continue;
      if (found !== null) throw new UserError(`two sums partials for shard "${shard.key}" (${from} and this one)`, file, null);
      found = part;
      from = file;
    }
    if (found === null) throw new UserError(`no sums partial for shard "${shard.key}"${id === null ? '' : ` and mask ${id}`}: run the sums step on every shard`);
    const c = decodeUint32(found.cols);
    const a1 = decodeFloat64(found.s1);
    const a2 = decodeFloat64(found.s2);
    const ax = decodeFloat64(found.sxlogx);
    const ad = decodeUint32(found.df);
    for (let i = 0; i < c.length; i++) {
      const col = c[i]!;
      s1[col] += a1[i]!;
      s2[col] += a2[i]!;
      sxlogx[col] += ax[i]!;
      df[col] += ad[i]!;
    }
    rowsWithWeight += found.rowsWithWeight;
  }
  return { sums: { s1, s2, df, sxlogx }, rowsWithWeight };
}

/** The raw-count statistics over all shards (sums of whole numbers: exact in any order). */
function addUpCounts(plan: PlanPartial, partials: ReadonlyArray<{ partial: SumsPartial; file: string }>, cols: number): TermCountStats {
  const total: TermCountStats = {
    documents: 0,
    totalTokens: 0,
    sumLengthSq: 0,
    df: new Float64Array(cols),
    cf: new Float64Array(cols),
    sumCountSq: new Float64Array(cols),
    sumCountLength: new Float64Array(cols),
  };
  for (const shard of plan.shards) {
    const part = partials.find((p) => p.partial.shard.key === shard.key && p.partial.counts !== null)?.partial.counts;
    if (part === undefined || part === null) throw new UserError(`no first-round sums partial for shard "${shard.key}": run the sums step on every shard`);
    total.documents += part.documents;
    total.totalTokens += part.totalTokens;
    total.sumLengthSq += part.sumLengthSq;
    const c = decodeUint32(part.cols);
    const fields = [
      [total.df, decodeFloat64(part.df)],
      [total.cf, decodeFloat64(part.cf)],
      [total.sumCountSq, decodeFloat64(part.sumCountSq)],
      [total.sumCountLength, decodeFloat64(part.sumCountLength)],
    ] as const;
    for (const [into, from] of fields) for (let i = 0; i < c.length; i++) into[c[i]!]! += from[i]!;
  }
  return total;
}

/**
 * The documents' previews as the term review reads them: an array as long as the corpus, holding
 * only the evenly spaced documents the opinion check looks at (plan.previewDocs).
 */
function previewsOf(plan: PlanPartial, partials: ReadonlyArray<{ partial: SumsPartial; file: string }>): string[] {
  const previews: string[] = [];
  previews.length = plan.documents;
  for (const { partial } of partials) for (const p of partial.previews) previews[p.doc] = p.preview;
  for (const doc of plan.previewDocs) if (previews[doc] === undefined) throw new UserError(`no preview of document ${doc}: run the sums step on every shard`);
  return previews;
}
