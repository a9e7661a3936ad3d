import { DistanceLab } from '../what-if/distance-lab';
import type { ProbeResult, SampleProbe } from '../what-if/sample-probe';

/** What the what-if must show before a group of terms joins the suggestions. */
export interface SuggestionPlan {
  /** Columns suggested, in the order they were accepted. */
  accepted: number[];
  /** Columns that were tried and rejected by the what-if. */
  rejected: number[];
  /** Which of the accepted columns came from the function-word prior. */
  fromPrior: Set<number>;
  /** The probe of the setting with the accepted columns removed. */
  result: ProbeResult;
  /** How many what-if evaluations the plan took. */
  evaluations: number;
}

export interface SuggestionInput {
  probe: SampleProbe;
  /** Columns already removed by the project's stop list. */
  baseMask: Uint8Array;
  baseline: ProbeResult;
  /** Function-word columns, already filtered (not stopped, not protected), heaviest first. */
  priorColumns: number[];
  /**
   * Ranks the remaining columns by loudness once the prior is settled: given the neighbours of
   * the setting with the prior removed, returns candidate columns, loudest first.
   */
  rankLoudColumns(neighbors: Uint32Array, accepted: ReadonlySet<number>): number[];
  max: number;
}

const PRIOR_GROUP = 16;
const LOUD_GROUP = 4;
const MAX_REJECTED_GROUPS_IN_A_ROW = 3;

/**
 * Suggests stop terms in two passes, each checked by the what-if (docs/methods.md §8):
 * 1. the function-word prior, in groups, heaviest first — a group is kept unless it makes the
 *    neighbours stand out less or lowers label precision;
 * 2. corpus-specific loud terms ranked against the neighbours of the cleaned setting — a group is
 *    kept only if it makes neighbours stand out more or raises label precision.
 * Relative contrast is deliberately not the objective: on text it falls while neighbour quality
 * rises (docs/methods.md §4). Neighbour standout and label precision are what tracked precision there.
 */
export function suggestTerms(input: SuggestionInput): SuggestionPlan {
  const { probe, baseMask, baseline, max } = input;
  const accepted: number[] = [];
  const rejected: number[] = [];
  const fromPrior = new Set<number>();
  let current = baseline;
  let mask = baseMask;
  let evaluations = 0;

  const tryGroup = (group: number[], mustImprove: boolean): boolean => {
    const trialMask = DistanceLab.union(mask, group);
    const trial = probe.evaluate(trialMask);
    evaluations++;
    if (!isAcceptable(current, trial, mustImprove)) return false;
    current = trial;
    mask = trialMask;
    return true;
  };

  for (let i = 0; i < input.priorColumns.length && accepted.length < max; i += PRIOR_GROUP) {
    const group = input.priorColumns.slice(i, Math.min(i + PRIOR_GROUP, i + max - accepted.length));
    if (tryGroup(group, false)) {
      accepted.push(...group);
      for (const c of group) fromPrior.add(c);
    } else {
      rejected.push(...group);
    }
  }

  const loud = input.rankLoudColumns(current.neighbors, new Set(accepted));
  let rejectedInARow = 0;
  for (let i = 0; i < loud.length && accepted.length < max; i += LOUD_GROUP) {
    const group = loud.slice(i, Math.min(i + LOUD_GROUP, i + max - accepted.length));
    if (tryGroup(group, true)) {
      accepted.push(...group);
      rejectedInARow = 0;
    } else {
      rejected.push(...group);
      if (++rejectedInARow >= MAX_REJECTED_GROUPS_IN_A_ROW) break;
    }
  }
  return { accepted, rejected, fromPrior, result: current, evaluations };
}

/** Tolerances for sampling noise in the paired comparison of two settings on the same sample. */
const STANDOUT_TOLERANCE = 0.02;
const STANDOUT_GAIN = 0;
const PRECISION_TOLERANCE = 0.002;

function isAcceptable(before: ProbeResult, after: ProbeResult, mustImprove: boolean): boolean {
  const s0 = before.neighborStandout;
  const s1 = after.neighborStandout;
  const p0 = before.labelPrecisionAtK;
  const p1 = after.labelPrecisionAtK;
  if (s0 === null || s1 === null) return false;
  if (p0 !== null && p1 !== null && p1 < p0 - PRECISION_TOLERANCE) return false;
  if (!mustImprove) return s1 >= s0 - STANDOUT_TOLERANCE;
  const precisionGain = p0 !== null && p1 !== null && p1 > p0 + PRECISION_TOLERANCE;
  return (s1 > s0 + STANDOUT_GAIN && (p0 === null || p1 === null || p1 >= p0)) || (precisionGain && s1 >= s0 - STANDOUT_TOLERANCE);
}
