import type { EffectiveSettings, TermRow, Verdict } from '../../protocol';
import type { Csr } from '../matrix/csr';
import { knnTermMass } from '../measures/knn-term-mass';
import { pairMass, termSpread } from '../measures/term-sums';
import { selectRank } from '../measures/select-rank';
import { startMaskedTermSums, startMaskedTermSumsInSeries, type PendingTermSums } from '../measures/start-masked-term-sums';
import { DistanceLab, type DistanceResult } from '../what-if/distance-lab';
import type { TermIndex } from '../what-if/term-index';
import { chooseSuggestions, plannedShareAsks, type Decision, type ShareAsk } from './choose-suggestions';
import { corpusPrecision, type CorpusSearcher } from './corpus-precision';
import { formulaHeads, judgeSuggestions, readsAsNotEnglish, type LightGroups } from './judge-suggestions';
import { chooseWithLabels, decisionsAfterChoice, grammarGroup } from './label-choice';
import { explainTerm } from './explain-term';
import { OPINION_SHARE, SHORT_DOCUMENT_TOKENS } from './opinion-check';
import { startOpinionShare, type PendingOpinionShare } from './start-opinion-share';
import { grammarTokenShare, priorColumns, protectedColumns, type PriorClass } from './prior-columns';
import { stopListSpellings } from './stop-list-spelling';
import { contractionPieces, piecesCompleted } from './contraction-pieces';
import type { TermCountStats } from './term-count-stats';
import { pullShares, termScores, type TermScores } from './term-scores';

/** What the term review needs before the baseline is measured (startTermReview). */
export interface TermReviewStart {
  lab: DistanceLab;
  baseMask: Uint8Array;
  index: TermIndex;
  tokenize: (text: string) => string[];
  settings: EffectiveSettings;
  /** Exact raw-count sums of the whole corpus (term-count-stats.ts). */
  counts: TermCountStats;
  /** The opening text of every document, for the opinion check. */
  previews: readonly string[];
  /** The opinion check begun earlier (startOpinionCheck), so that it overlaps other work; else run here. */
  opinion?: PendingOpinionShare;
  /** With labels, how the verdict seeks the sampled documents' neighbours in the corpus (corpus-precision.ts); else null. */
  corpusSearch?: CorpusSearcher | null;
}

export interface TermReviewInput extends TermReviewStart {
  baseline: DistanceResult;
  documents: number;
  idf: Float64Array;
}

/**
 * What startTermReview needs: TermReviewStart before the sample is chosen and the lab made, with the
 * weights and whether the passes may run on threads over them (false for a lab that answers its
 * sums its own way, a review in shards).
 */
export interface TermReviewBegin extends Omit<TermReviewStart, 'lab' | 'corpusSearch'> {
  weights: Csr;
  passThreads: boolean;
}

/** The part of the term review that does not need the baseline, begun by startTermReview. */
export interface BegunTermReview {
  prior: ReadonlyMap<number, PriorClass>;
  protect: Set<number>;
  /** The opinion check, begun (startOpinionCheck) and read by reviewTerms. */
  opinion: PendingOpinionShare;
  /** The suggestion rule's joint-share passes, begun on a thread of their own, with their asks. */
  shares: Array<{ ask: ShareAsk; pending: PendingTermSums }>;
  /**
   * The baseline's sums with the spread and row norms, begun on a thread: the baseline's
   * measure adopts it (pass it to DistanceLab.measure) and the term table reads it.
   */
  baseSpread: PendingTermSums | null;
}

export interface TermReview {
  rows: TermRow[];
  suggestions: string[];
  /** Plain spellings for the stop list file, where the tokenizer's differ (stop-list-spelling.ts). */
  spellings: Record<string, string>;
  /** Pieces of contractions the suggestions complete, for other pipelines' tokens (contraction-pieces.ts). */
  pieces: Record<string, string[]>;
  /** The measures with the suggestions removed (turnover against the baseline). */
  suggested: DistanceResult;
  /** Share of sampled documents with a clear opinion, and whether that made it opinion text. */
  opinion: { share: number; opinionText: boolean };
  /** The mask with the project's list and the suggestions. */
  suggestedMask: Uint8Array;
  verdict: Verdict;
  /** Share of the word tokens that are the English grammar words the rule knows (prior-columns.ts grammarTokenShare). */
  englishGrammarShare: number;
}

/** Documents read for the opinion check: enough for a share to ±0.05. */
export const OPINION_SAMPLE = 400;
/** Rows in the Report's term table beyond the suggested, stopped and protected ones. */
const REPORT_ROWS = 2000;

/**
 * Chooses the suggestions from exact per-term statistics (choose-suggestions.ts), measures what
 * they do, and writes the term table. Neighbour lift is measured against the neighbours of the
 * *suggested* setting: on the raw corpus the neighbours are themselves picked by the loud terms,
 * which flatters them (docs/methods.md §8).
 */
export function reviewTerms(input: TermReviewInput, begun: BegunTermReview = startTermReview({ ...input, weights: input.lab.weights, passThreads: input.lab.sums === DistanceLab.prototype.sums })): TermReview {
  const { lab, baseMask, baseline, documents, idf, index, tokenize, settings, counts } = input;
  const { prior, protect } = begun;
  const cols = lab.weights.cols;
  // The baseline's sums with the spread are one more pass over every non-zero, needed only for
  // the table at the end: begun by startTermReview, or now, on a second thread where the matrix
  // is shared, unless the lab answers sums its own way (a review in shards).
  const baseSpreadSums = begun.baseSpread ?? (lab.sums === DistanceLab.prototype.sums ? startMaskedTermSums(lab.weights, baseMask, true) : null);
  const share = begun.opinion.take();
  const opinionText = share >= OPINION_SHARE && shortDocuments(counts);
  const basePairMass = baseline.pairMass.perTerm;
  // The unmasked sums give the stopped terms' scores and the rule's pull shares without any stop
  // list; df comes from the raw-count statistics (the same non-zeros), so with nothing stopped
  // the matrix is not read again.
  const full = baseMask.includes(1) ? lab.fullSums() : null;
  const fullPairMass = full === null ? basePairMass : pairMass(full.sums, full.rowsWithWeight).perTerm;
  // One document has no pairs: no distance to distort, so nothing to suggest (the verdict says so).
  const ruleDecisions = documents < 2 ? new Map<number, Decision>() : chooseSuggestions({
    ...choiceInput(input, cols, prior, protect, opinionText),
    jointShares: (asks) => {
      // The passes startTermReview began (the same asks: the same decisions from the same
      // inputs); an ask it did not foresee is computed here. The same function either way, so
      // the same bits.
      const pending = asks.map((a) => begun.shares.find((b) => sameAsk(a, b.ask))?.pending ?? null);
      const here = asks.map((a, i) => (pending[i] === null ? lab.sums(a.removed) : null));
      return asks.map((a, i) => {
        const { sums, rowsWithWeight } = pending[i]?.take() ?? here[i]!;
        const shares = pullShares(pairMass(sums, rowsWithWeight).perTerm);
        let total = 0;
        for (const c of a.group) total += shares[c]!;
        return total;
      });
    },
  });
  // A begun pass the rule did not ask for (opinion text asks others) is read by nobody: dropped,
  // so that its thread stops (or skips it) instead of holding the second core.
  for (const { pending } of begun.shares) pending.drop();

  // Heaviest first, so that `suggest.max` keeps the terms that pull the most.
  const ruleAccepted = [...ruleDecisions].filter(([c, d]) => d.suggested && baseMask[c] === 0).map(([c]) => c);
  ruleAccepted.sort((a, b) => basePairMass[b]! - basePairMass[a]! || a - b);
  ruleAccepted.length = Math.min(ruleAccepted.length, settings.suggest.max);
  const ruleMask = DistanceLab.union(baseMask, ruleAccepted);
  const ruleMeasured = lab.measure(ruleMask, baseline.neighbors);
  // With labels and suggest.useLabels, half the sample decides whether the grammar words stay.
  const searchCorpus = input.corpusSearch != null
    ? (before: Uint8Array, after: Uint8Array) => corpusPrecision({ searcher: input.corpusSearch!, sampleRows: lab.sampleRows, documents, df: counts.df, before, after, seed: lab.seed })
    : null;
  const choice = settings.suggest.useLabels
    ? chooseWithLabels({ lab, baseMask, accepted: ruleAccepted, decisions: ruleDecisions, suggestedMask: ruleMask, suggested: ruleMeasured, baseline, corpus: searchCorpus })
    : null;
  const decisions = choice === null ? ruleDecisions : decisionsAfterChoice(ruleDecisions, choice);
  const accepted = choice?.accepted ?? ruleAccepted;
  const suggestedMask = choice?.mask ?? ruleMask;
  const suggested = choice?.measured ?? ruleMeasured;

  // Scores for the table: kept terms on the baseline weights; stopped terms as if un-stopped.
  const baseSums = (baseSpreadSums !== null ? baseSpreadSums.take() : lab.sums(baseMask, true)).sums;
  const baseScores = termScores(basePairMass, knnTermMass(lab.maskedSample(baseMask), lab.positions, suggested.neighbors, lab.k));
  const baseSpread = termSpread(baseSums, documents);
  let fullScores: TermScores | null = null;
  let fullSpread: Float64Array | null = null;
  if (full !== null) {
    fullScores = termScores(fullPairMass, knnTermMass(lab.sampleRows, lab.positions, suggested.neighbors, lab.k));
    fullSpread = termSpread(full.sums, documents);
  }

  const suggestedSet = new Set(accepted);
  const chosen = chooseRows(cols, baseMask, suggestedSet, protect, decisions, baseScores);
  const rows: TermRow[] = chosen.map((c) => {
    const stopped = baseMask[c] === 1;
    const scores = stopped && fullScores !== null ? fullScores : baseScores;
    const lift = scores.neighborLift[c]!;
    const status = stopped ? 'stopped' : suggestedSet.has(c) ? 'suggested' : protect.has(c) ? 'protected' : 'kept';
    const row: TermRow = {
      term: index.terms[c]!,
      df: counts.df[c]!,
      idf: idf[c]!,
      pullShare: scores.pullShare[c]!,
      neighborLift: Number.isFinite(lift) ? lift : null,
      spread: (stopped && fullSpread !== null ? fullSpread : baseSpread)[c]!,
      loudness: scores.loudness[c]!,
      status,
      why: '',
    };
    const decision = decisions.get(c) ?? null;
    if (stopped) row.ruleWouldSuggest = decision?.suggested === true;
    row.why = explainTerm(row, documents, decision);
    return row;
  });
  rows.sort((a, b) => b.loudness - a.loudness || b.pullShare - a.pullShare);
  const suggestions = accepted.map((c) => index.terms[c]!);
  const opinion = { share, opinionText };
  let agreedStopped = 0;
  for (const [c, d] of decisions) if (d.suggested && baseMask[c] === 1) agreedStopped++;
  const light: LightGroups = {};
  for (const d of decisions.values()) if (d.reason === 'light') light[d.group] = d.groupShare;
  const formula = formulaHeads(decisions, baseMask, counts.opens, index.terms);
  const englishGrammarShare = grammarTokenShare(prior, counts.cf, index.terms, settings.tokens.ngrams === 2);
  const language = readsAsNotEnglish(englishGrammarShare, counts.totalTokens) && settings.suggest.functionWordPrior ? widestTerms(counts.df, index.terms, documents, 3) : null;
  // With labels, the verdict's precision is measured with neighbours from the corpus, not the sample.
  const corpus = searchCorpus !== null && accepted.length > 0 ? searchCorpus(baseMask, suggestedMask) : null;
  const verdict = judgeSuggestions({ lab, suggestions, baseline, suggested, opinion, agreedStopped, light, corpus, documents, formula, labelChoice: choice, useLabels: settings.suggest.useLabels, grammarWords: grammarGroup(accepted, decisions).length, notEnglish: language === null ? null : { share: englishGrammarShare, widest: language } });
  const spellings = stopListSpellings(suggestions, tokenize);
  const pieces = piecesCompleted(
    contractionPieces(tokenize),
    new Set(suggestions),
    (term) => {
      const c = index.column(term);
      return c !== undefined && baseMask[c] === 1;
    },
    (piece) => index.has(piece),
  );
  return { rows, suggestions, spellings, pieces, suggested, opinion, suggestedMask, verdict, englishGrammarShare };
}

/**
 * Begins the term review's work that needs no distance measure, so that it overlaps the
 * baseline's: the prior and protected columns and, where the matrix is shared, the baseline's
 * spread pass on a thread (the baseline's measure adopts it as its exact sums) and the suggestion
 * rule's joint-share passes in series on another (each a pass over every non-zero, ~0.3 s at 100k
 * documents). The rule's asks depend on whether the corpus reads as opinion text,
 * which the opinion check tells only later: the passes begun are those of topic text, what nearly
 * every corpus is and every corpus of long documents must be. reviewTerms uses a pass only where
 * the rule asks for exactly it and computes any other, so the answer never depends on the guess.
 * Pass the result to reviewTerms.
 */
export function startTermReview(input: TermReviewBegin): BegunTermReview {
  const { weights, index, tokenize, settings } = input;
  // The baseline's spread pass, with each row's norm, on a thread of its own, first of all (it
  // needs only the stop list's mask, and the baseline's measure and the rule wait for the passes):
  // its sums are also the baseline's exact sums (the spread adds Σ x ln x and changes no other
  // sum), so the baseline's measure adopts it (DistanceLab.measure) instead of a pass of its own,
  // and the table reads its spread. Not in series with the rule's passes: the baseline needs it first.
  const baseSpread = input.passThreads ? startMaskedTermSums(weights, input.baseMask, true, undefined, true) : null;
  const prior = priorColumns(index, tokenize, settings.tokens.ngrams === 2);
  const protect = protectedColumns(index, tokenize, settings.suggest.protect);
  // Evenly spaced documents, not the seeded sample: the decision must not change with the seed.
  const opinion = input.opinion ?? startOpinionCheck(input.previews, false);
  const shares: BegunTermReview['shares'] = [];
  if (input.passThreads) {
    const asks = plannedShareAsks(choiceInput(input, weights.cols, prior, protect, false));
    const pending = startMaskedTermSumsInSeries(weights, asks.map((a) => ({ removed: a.removed, withSpread: false })));
    asks.forEach((ask, i) => shares.push({ ask, pending: pending[i]! }));
  }
  return { prior, protect, opinion, shares, baseSpread };
}

/** The suggestion rule's input less its joint shares. */
function choiceInput(input: Pick<TermReviewStart, 'counts' | 'settings'>, cols: number, prior: ReadonlyMap<number, PriorClass>, protect: Set<number>, opinion: boolean) {
  return {
    stats: input.counts,
    prior,
    // Decisions do not depend on the stop list: a stopped term is judged like any other, so its
    // row can say whether the rule agrees with the list.
    stopped: new Uint8Array(cols),
    protect,
    opinion,
    usePrior: input.settings.suggest.functionWordPrior,
  };
}

/** Only documents this short can read as opinion text (opinion-check.ts SHORT_DOCUMENT_TOKENS). */
function shortDocuments(counts: TermCountStats): boolean {
  const meanLength = counts.documents > 0 ? counts.totalTokens / counts.documents : 0;
  return meanLength <= SHORT_DOCUMENT_TOKENS;
}

/** Whether two asks are the same pass: the same group and the same removed columns. */
function sameAsk(a: ShareAsk, b: ShareAsk): boolean {
  if (a.group.length !== b.group.length || a.removed.length !== b.removed.length) return false;
  for (let i = 0; i < a.group.length; i++) if (a.group[i] !== b.group[i]) return false;
  for (let i = 0; i < a.removed.length; i++) if (a.removed[i] !== b.removed[i]) return false;
  return true;
}

/**
 * The opinion check's share (opinion-check.ts) of OPINION_SAMPLE evenly spaced previews, begun
 * now: `onThread`, on a thread of its own (start-opinion-share.ts), which pays off when the caller
 * has a few hundred milliseconds of other work before reviewTerms reads it (a large corpus).
 */
export function startOpinionCheck(previews: readonly string[], onThread: boolean): PendingOpinionShare {
  const texts = evenlySpaced(previews, OPINION_SAMPLE);
  return onThread ? startOpinionShare(texts) : startOpinionShare(texts, null);
}

/** `max` texts at evenly spaced positions (positions ⌊i·n/max⌋; engine/shards/ fetches the same ones). */
function evenlySpaced(texts: readonly string[], max: number): string[] {
  if (texts.length <= max) return [...texts];
  return Array.from({ length: max }, (_, i) => texts[Math.floor((i * texts.length) / max)]!);
}

/** The `count` terms in the most documents, most first (ties: column order), with their document shares. */
function widestTerms(df: Float64Array, terms: readonly string[], documents: number, count: number): Array<{ term: string; share: number }> {
  const cols = Array.from({ length: df.length }, (_, c) => c);
  return largestFirst(cols, df, count)
    .slice(0, count)
    .map((c) => ({ term: terms[c]!, share: documents > 0 ? df[c]! / documents : 0 }));
}

/** Every suggested, stopped, protected and ruled-on term, then the loudest and heaviest of the rest. */
function chooseRows(
  cols: number,
  baseMask: Uint8Array,
  suggested: Set<number>,
  protect: Set<number>,
  decisions: ReadonlyMap<number, Decision>,
  scores: TermScores,
): number[] {
  const chosen = new Set<number>();
  for (let c = 0; c < cols; c++) if (baseMask[c] === 1 || suggested.has(c) || protect.has(c) || decisions.has(c)) chosen.add(c);
  const rest: number[] = [];
  for (let c = 0; c < cols; c++) if (!chosen.has(c) && scores.pullShare[c]! > 0) rest.push(c);
  // The loop below reads the two orders only as far as it needs, which is seldom past twice
  // the table's rows: their heads are taken by selection, the whole orders only if it goes on.
  let head = Math.min(rest.length, 2 * REPORT_ROWS);
  let byLoudness = largestFirst(rest, scores.loudness, head);
  let byPull = largestFirst(rest, scores.pullShare, head);
  for (let i = 0; chosen.size < REPORT_ROWS && i < rest.length; i++) {
    if (i >= byLoudness.length || i >= byPull.length) {
      head = rest.length;
      byLoudness = largestFirst(rest, scores.loudness, head);
      byPull = largestFirst(rest, scores.pullShare, head);
    }
    chosen.add(byLoudness[i]!);
    if (chosen.size < REPORT_ROWS) chosen.add(byPull[i]!);
  }
  return [...chosen];
}

/**
 * A head of at least `count` items (all of them when count ≥ their number) of the order that a
 * stable sort of `items` by `value` descending gives, ties in the items' order: the count-th
 * largest value by selection, then a stable sort of the items at or above it, which are exactly
 * the head of the full order (ties at that value included), so the head is the same to the item.
 */
function largestFirst(items: readonly number[], value: Float64Array, count: number): number[] {
  const byValue = (a: number, b: number): number => value[b]! - value[a]!;
  const n = items.length;
  if (count >= n) return [...items].sort(byValue);
  // Plain loops: Float64Array.from with a map and `some` with a callback went through an
  // iterator and a call per item (~115k terms, twice a review).
  const values = new Float64Array(n);
  let nan = false;
  for (let i = 0; i < n; i++) {
    const v = value[items[i]!]!;
    values[i] = v;
    if (v !== v) nan = true;
  }
  // A NaN would make the selection meaningless: sort everything, as before.
  if (nan) return [...items].sort(byValue);
  const threshold = selectRank(values, 0, n - 1, n - count);
  const head: number[] = [];
  for (let i = 0; i < n; i++) if (value[items[i]!]! >= threshold) head.push(items[i]!);
  return head.sort(byValue);
}
