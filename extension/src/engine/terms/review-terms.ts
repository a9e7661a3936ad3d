import type { EffectiveSettings, TermRow } from '../../protocol';
import { rowsWithWeight } from '../matrix/rows-with-weight';
import { knnTermMass } from '../measures/knn-term-mass';
import { pairMass, termSpread, termSums } from '../measures/term-sums';
import { DistanceLab, type DistanceResult } from '../what-if/distance-lab';
import { SampleProbe } from '../what-if/sample-probe';
import type { TermIndex } from '../what-if/term-index';
import { explainTerm } from './explain-term';
import { lightWordColumns, priorColumns, protectedColumns } from './prior-columns';
import { suggestTerms } from './suggest-terms';
import { termScores, type TermScores } from './term-scores';

export interface TermReviewInput {
  lab: DistanceLab;
  baseMask: Uint8Array;
  baseline: DistanceResult;
  documents: number;
  idf: Float64Array;
  index: TermIndex;
  tokenize: (text: string) => string[];
  settings: EffectiveSettings;
}

export interface TermReview {
  rows: TermRow[];
  suggestions: string[];
  /** The measures with the suggestions removed (turnover against the baseline). */
  suggested: DistanceResult;
  evaluations: number;
}

/** How many loud candidates the what-if looks at after the prior. */
const LOUD_CANDIDATES = 64;
/** Rows in the Report's term table beyond the suggested, stopped and protected ones. */
const REPORT_ROWS = 2000;

/**
 * Scores every term, picks the suggestions (checked by the what-if) and writes the term table.
 * Neighbour lift is measured against the neighbours of the *suggested* setting: on the raw
 * corpus the neighbours are themselves picked by the loud terms, which flatters them
 * (docs/methods.md §8).
 */
export function reviewTerms(input: TermReviewInput): TermReview {
  const { lab, baseMask, baseline, documents, idf, index, tokenize, settings } = input;
  const cols = lab.weights.cols;
  const basePairMass = baseline.pairMass.perTerm;
  const functionWords = settings.suggest.functionWordPrior ? priorColumns(index, tokenize, settings.tokens.ngrams === 2) : new Set<number>();
  const lightWords = settings.suggest.functionWordPrior ? lightWordColumns(index, tokenize, functionWords) : new Set<number>();
  const prior = new Set([...functionWords, ...lightWords]);
  const protect = protectedColumns(index, tokenize, settings.suggest.protect);
  const open = (c: number): boolean => baseMask[c] === 0 && !protect.has(c) && basePairMass[c]! > 0;

  // Closed-class words first, heaviest first; the light words after them.
  const heaviestFirst = (cols: Set<number>): number[] => [...cols].filter(open).sort((a, b) => basePairMass[b]! - basePairMass[a]!);
  const priorOrder = [...heaviestFirst(functionWords), ...heaviestFirst(lightWords)];
  const probe = new SampleProbe(lab.sampleRows, lab.k, lab.sampleLabels);
  const plan = suggestTerms({
    probe,
    baseMask,
    baseline: probe.evaluate(baseMask),
    priorColumns: priorOrder,
    max: settings.suggest.max,
    rankLoudColumns(neighbors, accepted) {
      const scores = termScores(basePairMass, knnTermMass(probe.maskedRows(baseMask), probe.identity, neighbors, lab.k));
      const loud: number[] = [];
      for (let c = 0; c < cols; c++) {
        if (!open(c) || accepted.has(c) || prior.has(c)) continue;
        if (scores.neighborLift[c]! < 1) loud.push(c);
      }
      // Heaviest first: a term that pulls little cannot change the distances much either way.
      loud.sort((a, b) => scores.pullShare[b]! - scores.pullShare[a]!);
      return loud.slice(0, LOUD_CANDIDATES);
    },
  });
  const suggested = lab.measure(DistanceLab.union(baseMask, plan.accepted), baseline.neighbors);

  // Scores for the table: kept terms on the baseline weights; stopped terms as if un-stopped.
  const baseSums = lab.sums(baseMask, true).sums;
  const baseScores = termScores(basePairMass, knnTermMass(lab.maskedSample(baseMask), lab.positions, suggested.neighbors, lab.k));
  const baseSpread = termSpread(baseSums, documents);
  const fullSums = termSums(lab.weights);
  let fullScores: TermScores | null = null;
  let fullSpread: Float64Array | null = null;
  if (baseMask.includes(1)) {
    fullScores = termScores(pairMass(fullSums, rowsWithWeight(lab.weights)).perTerm, knnTermMass(lab.sampleRows, lab.positions, suggested.neighbors, lab.k));
    fullSpread = termSpread(fullSums, documents);
  }

  const suggestedSet = new Set(plan.accepted);
  const rejectedSet = new Set(plan.rejected);
  const chosen = chooseRows(cols, baseMask, suggestedSet, protect, baseScores);
  const rows: TermRow[] = chosen.map((c) => {
    const stopped = baseMask[c] === 1;
    const scores = stopped && fullScores !== null ? fullScores : baseScores;
    const lift = scores.neighborLift[c]!;
    const status = stopped ? 'stopped' : suggestedSet.has(c) ? 'suggested' : protect.has(c) ? 'protected' : 'kept';
    const row: TermRow = {
      term: index.terms[c]!,
      df: fullSums.df[c]!,
      idf: idf[c]!,
      pullShare: scores.pullShare[c]!,
      neighborLift: Number.isFinite(lift) ? lift : null,
      spread: (stopped && fullSpread !== null ? fullSpread : baseSpread)[c]!,
      loudness: scores.loudness[c]!,
      status,
      why: '',
    };
    row.why = explainTerm(row, documents, { fromPrior: plan.fromPrior.has(c), rejected: rejectedSet.has(c) });
    return row;
  });
  rows.sort((a, b) => b.loudness - a.loudness || b.pullShare - a.pullShare);
  const suggestions = plan.accepted.map((c) => index.terms[c]!);
  return { rows, suggestions, suggested, evaluations: plan.evaluations };
}

/** Every suggested, stopped and protected term, then the loudest and the heaviest of the rest. */
function chooseRows(cols: number, baseMask: Uint8Array, suggested: Set<number>, protect: Set<number>, scores: TermScores): number[] {
  const chosen = new Set<number>();
  for (let c = 0; c < cols; c++) if (baseMask[c] === 1 || suggested.has(c) || protect.has(c)) chosen.add(c);
  const rest: number[] = [];
  for (let c = 0; c < cols; c++) if (!chosen.has(c) && scores.pullShare[c]! > 0) rest.push(c);
  const byLoudness = [...rest].sort((a, b) => scores.loudness[b]! - scores.loudness[a]!);
  const byPull = [...rest].sort((a, b) => scores.pullShare[b]! - scores.pullShare[a]!);
  for (let i = 0; chosen.size < REPORT_ROWS && i < rest.length; i++) {
    chosen.add(byLoudness[i]!);
    if (chosen.size < REPORT_ROWS) chosen.add(byPull[i]!);
  }
  return [...chosen];
}
