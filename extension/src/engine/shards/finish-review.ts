import type { EffectiveSettings, Report } from '../../protocol';
import type { CorpusSource } from '../read/corpus-source';
import { assembleReport } from '../review/assemble-report';
import { sampleLabelIds, type ReviewSample } from '../review/choose-sample';
import type { PreparedWeights } from '../review/prepare-weights';
import { reviewTerms } from '../terms/review-terms';
import { createTokenizer } from '../tokenize/create-tokenizer';
import { TermIndex } from '../what-if/term-index';
import { decodeFloat64, type MaskRequest, type NeighborRequest, type PlanPartial } from './partials';
import { planSampleRows } from './sample-rows';
import { ShardedSearch } from './sharded-search';
import type { SumsTotals } from './sums-totals';
import { ShardedLab } from './sharded-lab';

/** What a finished review keeps to answer what-ifs: the sample's lab, the baseline's neighbours, the stop list's mask. */
export interface FinishedLab {
  lab: ShardedLab;
  index: TermIndex;
  baseMask: Uint8Array;
  baselineNeighbors: Uint32Array;
}

export type FinishResult = { done: true; report: Report; finished: FinishedLab } | { done: false; masks: MaskRequest[]; neighbors: NeighborRequest[] };

/**
 * The last step: from the shards' sums added up (SumsTotals), measures the baseline on the
 * sample, runs the term review and the suggestions through the same entry point as one process
 * (terms/review-terms.ts), and assembles the Report. When the review asked for the sums of a mask
 * no round computed (the suggested stop list, the first time), returns those masks instead.
 */
export function finishReview(plan: PlanPartial, settings: EffectiveSettings, totals: SumsTotals): FinishResult {
  const masked = totals.maskSums();
  const full = totals.fullSums();

  const idf = decodeFloat64(plan.idf);
  const s = plan.sample;
  const sampleRows = planSampleRows(plan, settings);
  const identity = new Uint32Array(s.docs.length).map((_, i) => i);
  const labels = sampleLabelIds(identity, s.labels);
  const lab = new ShardedLab(sampleRows, settings.sample.k, settings.sample.seed, labels, masked, full);

  const index = new TermIndex(plan.terms);
  const tokenize = createTokenizer(settings.tokens);
  const baseMask = index.mask(plan.stopList.terms);
  const baseline = lab.measure(baseMask, null);
  const counts = totals.countStats();
  const previews = totals.documentPreviews();
  const search = s.labels === null ? null : new ShardedSearch(totals.neighborLists(settings.sample.k), s.labels, settings.sample.k);
  const termReview = reviewTerms({ lab, baseMask, baseline, documents: plan.documents, idf, index, tokenize, settings, counts, previews, corpusSearch: search });
  // The searches are asked for only once every sum is known: before that the suggested list,
  // and with it the searches' masks, may still change.
  if (lab.missing.size > 0) return { done: false, masks: [...lab.missing].map(([id, columns]) => ({ id, columns })), neighbors: [] };
  if (search !== null && search.missing.size > 0) return { done: false, masks: [], neighbors: [...search.missing.values()] };

  const source = { ...plan.input, skipped: { count: plan.input.skipped, examples: plan.input.skippedExamples ?? [] }, truncated: plan.input.truncated ?? null, fields: [] } as unknown as CorpusSource;
  const prepared: PreparedWeights = {
    weights: sampleRows,
    idf,
    terms: plan.terms,
    seenTerms: [],
    documents: plan.documents,
    tokens: plan.tokens,
    nonzeros: plan.nonzeros,
    lines: Uint32Array.from(s.lines),
    labels: s.labels,
    previews: s.previews,
    counts,
    notes: plan.tokenizerNotes,
    repeatedLines: plan.repeatedLines ?? { checked: 0, lines: [] },
    duplicates: totals.duplicates(),
  };
  const sample: ReviewSample = { positions: identity, labels, emptyDocuments: 0 };
  const report = assembleReport({
    settings,
    source,
    prepared,
    stopList: { file: plan.stopList.file, exists: plan.stopList.exists, terms: plan.stopList.terms, unused: plan.stopList.unused, split: plan.stopList.split },
    baseline,
    termReview,
    sample,
    unlabelled: plan.input.unlabelled ?? 0,
  });
  // Hub rows were numbered by sample position; the Report numbers documents in the corpus.
  const manyFiles = plan.shards.length > 1;
  for (const hub of report.hubs) {
    if (manyFiles) hub.file = s.files[hub.doc]!;
    hub.doc = s.docs[hub.doc]!;
  }
  return { done: true, report, finished: { lab, index, baseMask, baselineNeighbors: baseline.neighbors } };
}
