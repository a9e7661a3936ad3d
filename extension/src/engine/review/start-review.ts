import * as path from 'node:path';
import type { Report } from '../../protocol';
import { blameSetting } from '../config/blame-setting';
import { openCorpusFromText } from '../read/open-corpus';
import { isManyFilesInput } from '../read/corpus-files';
import { openCorpusInput, withPlaces } from '../read/many-files-corpus';
import { createTokenizer } from '../tokenize/create-tokenizer';
import { DistanceLab } from '../what-if/distance-lab';
import { afterIdleDelay } from '../what-if/idle-delay';
import { ParallelWhatIf } from '../what-if/parallel-what-if';
import { FileSnapshot } from './file-snapshot';
import { loadReviewSettings, provenanceOf } from './review-settings';
import { prepareWeights, prestartTokenizing, startTokenizing, unusedEntries } from './prepare-weights';
import { entriesOfThisTokenizer } from '../terms/contraction-pieces';
import { loadStopList, withSplit } from './load-stop-list';
import { chooseSample } from './choose-sample';
import { searchInProcess } from '../terms/corpus-precision';
import { reviewTerms, startOpinionCheck, startTermReview } from '../terms/review-terms';
import type { PendingOpinionShare } from '../terms/start-opinion-share';
import { assembleReport } from './assemble-report';
import { unlabelledCount } from './unlabelled-note';
import { TermIndex } from '../what-if/term-index';
import type { ReviewHooks, ReviewInput, ReviewSession, ReviewStage } from './review-api';

/**
 * Runs a whole review (docs/architecture.md "Data flow"): read → tokens → counts → weights → measures →
 * term review → suggestions → Report, and keeps the weights for later what-if questions.
 */
export async function startReview(input: ReviewInput, hooks: ReviewHooks = {}): Promise<ReviewSession> {
  const timings: Record<string, number> = {};
  let stageStart = performance.now();
  let currentStage: ReviewStage | null = null;
  const stage = (name: ReviewStage, fraction = 0): void => {
    hooks.signal?.throwIfAborted();
    const now = performance.now();
    if (currentStage !== null) timings[currentStage] = Math.round(now - stageStart);
    if (currentStage !== name) stageStart = now;
    currentStage = name;
    hooks.onStage?.(name, fraction);
  };

  stage('reading');
  // A corpus file large enough for tokenising threads has them started first, so that they load
  // their bundle while this thread reads and checks the settings; they get the settings below.
  const early = input.text === undefined ? await prestartTokenizing(input.file) : null;
  let loaded;
  let manyFiles;
  let snapshot;
  let started;
  let size;
  try {
    loaded = await loadReviewSettings(input);
    // A glob or a folder is many files (each shard is read as it comes; no one snapshot covers them).
    manyFiles = input.text === undefined && (await isManyFilesInput(input.file));
    snapshot = input.text === undefined && !manyFiles ? await FileSnapshot.take(input.file) : null;
    size = input.text?.length ?? snapshot?.size ?? null;
    // The tokenising threads start now (unless started above) and load while this thread opens
    // the corpus and the stop list.
    started = startTokenizing(loaded.settings.tokens, manyFiles ? null : size, early);
  } catch (e) {
    await early?.close();
    throw e;
  }
  const { settings } = loaded;
  const readOptions = {
    format: settings.format,
    textField: settings.text,
    labelField: settings.label,
    maxBytes: settings.limits.maxBytes,
  };
  let source;
  let stopList;
  let tokenize;
  try {
    try {
      source =
        input.text !== undefined
          ? withPlaces(openCorpusFromText(input.file, input.text, readOptions), path.basename(input.file))
          : await openCorpusInput(input.file, readOptions);
    } catch (e) {
      throw blameSetting(e, settings, loaded.sources);
    }
    tokenize = createTokenizer(settings.tokens);
    stopList = await loadStopList(loaded.stopListPath, path.dirname(path.resolve(input.file)), input.stopListText, tokenize, settings.tokens.lowercase);
    stage('tokenizing');
  } catch (e) {
    await started?.close();
    throw e;
  }
  // The opinion check reads only the previews: on a corpus large enough for tokenising threads
  // it runs on a thread of its own, begun as soon as counting is done, while this one weighs
  // and measures the baseline.
  let opinion: PendingOpinionShare | undefined;
  const prepared = await prepareWeights(
    source,
    settings,
    snapshot,
    (previews) => {
      stage('weighting');
      opinion = startOpinionCheck(previews, started !== null);
    },
    hooks.signal,
    size,
    started,
  );
  const { weights } = prepared;
  const index = new TermIndex(prepared.terms);
  const baseMask = index.mask(stopList.terms);

  stage('measuring');
  // The suggestion rule's passes over the corpus need no measure nor sample: begun on other threads
  // first (the baseline's spread pass among them, which is also the baseline's exact sums: its
  // measure adopts it), they run while this thread chooses the sample and measures the baseline.
  const termStart = { baseMask, index, tokenize, settings, counts: prepared.counts, previews: prepared.previews, opinion };
  const begun = startTermReview({ ...termStart, weights, passThreads: true });
  const places = { keys: source.places.keys, documents: source.places.documents, lines: prepared.lines };
  const sample = chooseSample(weights, settings.sample.documents, settings.sample.seed, prepared.labels, places);
  // A review asked no what-if keeps no copy of the sample's baseline build for restoring it (40 MB
  // at 2,000 sampled documents, copied when the suggestions' build replaced it: ~10k page faults,
  // ~0.1 s of this thread's CPU) and counts no shared terms for updates that never come.
  const lab = new DistanceLab(weights, sample.positions, settings.sample.k, settings.sample.seed, sample.labels, { whatIf: hooks.reportOnly !== true });
  const corpusSearch = prepared.labels === null ? null : searchInProcess(weights, lab.sampleRows, sample.positions, prepared.labels, settings.sample.k);
  const termInput = { ...termStart, lab, corpusSearch };
  const baseline = lab.measure(baseMask, null, begun.baseSpread !== null ? { removed: baseMask, pending: begun.baseSpread } : null);

  stage('reviewing terms');
  const termReview = reviewTerms({ ...termInput, baseline, documents: prepared.documents, idf: prepared.idf }, begun);

  stage('writing report');
  const report: Report = assembleReport({
    settings,
    source,
    prepared,
    stopList: withSplit({ ...stopList, unused: unusedEntries(entriesOfThisTokenizer(stopList.entries, tokenize), prepared.seenTerms) }, tokenize),
    baseline,
    termReview,
    sample,
    unlabelled: unlabelledCount(prepared.labels),
  });
  if (source.places.keys.length > 1) nameHubFiles(report, source.places);
  timings[currentStage ?? 'writing report'] = Math.round(performance.now() - stageStart);
  report.timings = timings;
  report.provenance = provenanceOf(input, loaded.sources);

  let parallel: ParallelWhatIf | null = null;
  return {
    report,
    async whatIf(removed: readonly string[]) {
      const mask = DistanceLab.union(baseMask, index.columnsOf(removed));
      const measures = await (parallel !== null ? parallel.whatIf(mask) : lab.whatIf(mask, baseline.neighbors));
      // Once the caller's answer has been drawn: the drift resets that have come due.
      afterIdleDelay(() => lab.settle());
      return measures;
    },
    async speculate(removed: readonly string[], clicks?: Int32Array) {
      if (parallel === null) return null;
      const measures = await parallel.speculate(DistanceLab.union(baseMask, index.columnsOf(removed)), clicks);
      afterIdleDelay(() => lab.settle());
      return measures;
    },
    async prepareWhatIf(options) {
      if (parallel !== null) return;
      lab.prepareToggles();
      // The panel opens with the suggestions ticked: the thread builds that state while idle.
      const opening = DistanceLab.union(baseMask, index.columnsOf(report.suggestions));
      parallel = ParallelWhatIf.open(lab, baseline.neighbors, opening);
      if (parallel !== null) await (options?.warmUp === false ? parallel.opened : parallel.warmUp(opening));
    },
    async close() {
      await parallel?.close();
    },
  };
}



/** In a corpus of many files, a hub's line means nothing without its file. */
function nameHubFiles(report: Report, places: { keys: readonly string[]; documents: readonly number[] }): void {
  const ends: number[] = [];
  let end = 0;
  for (const n of places.documents) ends.push((end += n));
  for (const hub of report.hubs) hub.file = places.keys[ends.findIndex((e) => hub.doc < e)];
}
