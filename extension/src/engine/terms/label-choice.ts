import type { LabelChoiceFigures } from '../../protocol';
import { sampleIndices } from '../random/seeded-random';
import { DistanceLab, type DistanceResult } from '../what-if/distance-lab';
import type { Decision } from './choose-suggestions';
import type { CorpusPrecision } from './corpus-precision';
import { pairedBootstrap } from './paired-bootstrap';
import { perQueryQuality } from './per-query-quality';

/** Bootstrap draws behind the choice (as many as the verdict's, judge-suggestions.ts VERDICT_DRAWS). */
const CHOICE_DRAWS = 400;

/**
 * With labels and `suggest.useLabels`: whether rule 2's grammar words (the prior's words below half
 * the documents, spread evenly) are suggested or kept, decided by the labels of half the sampled
 * documents. The grammar words are the one group whose right answer depends on what the labels
 * are about: they blur topics, but they can carry kinds of document (a part of speech, a kind of
 * definition), and no statistic of the texts alone tells which (docs/methods.md §9, "With labels,
 * a held-out choice"). The verdict is then measured on the other half only (heldOut), so that the
 * figure it shows was not used to choose the list.
 */
export interface LabelChoice extends LabelChoiceFigures {
  /** The grammar words asked about (columns). */
  group: number[];
  /** Per sampled position: 1 where the document decided, 0 where it is held out for the verdict. */
  deciding: Uint8Array;
  /** The list the choice leaves: what was accepted, less the group when the labels kept it. */
  accepted: number[];
  mask: Uint8Array;
  measured: DistanceResult;
}

export interface LabelChoiceInput {
  lab: DistanceLab;
  baseMask: Uint8Array;
  /** The rule's suggestions (columns), and its decisions. */
  accepted: readonly number[];
  decisions: ReadonlyMap<number, Decision>;
  /** The mask with `accepted` removed, and its measures; the baseline's neighbours for turnover. */
  suggestedMask: Uint8Array;
  suggested: DistanceResult;
  baseline: DistanceResult;
  /**
   * With labels on a corpus larger than the sample: each sampled document's precision with
   * neighbours from the corpus under two masks (corpus-precision.ts), as the verdict measures it;
   * null where the corpus is not searched (the sample's own neighbours are then used).
   */
  corpus?: ((before: Uint8Array, after: Uint8Array) => CorpusPrecision | null) | null;
}

/**
 * The choice, or null when there is nothing to choose (no labels, or no grammar word suggested).
 * The group is kept only when keeping it raises label precision@k on the deciding half with a
 * 95% paired-bootstrap interval above zero: the rule's list is the default, and the labels move
 * it only when they clearly say so (a noise guard, not a tuned bound). Neighbours are the
 * verdict's (from the corpus where it searches the corpus, else the sample's): one more search,
 * or one more measure of the sample.
 */
export function chooseWithLabels(input: LabelChoiceInput): LabelChoice | null {
  const { lab, baseMask, accepted, decisions, suggestedMask, suggested } = input;
  const labels = lab.sampleLabels;
  if (labels === null) return null;
  const group = grammarGroup(accepted, decisions);
  if (group.length === 0) return null;
  const m = lab.sampleRows.rows;
  const deciding = new Uint8Array(m);
  for (const q of sampleIndices(m, m >> 1, lab.seed ^ 0x1abe1)) deciding[q] = 1;
  const inGroup = new Set(group);
  const without = accepted.filter((c) => !inGroup.has(c));
  const keptMask = DistanceLab.union(baseMask, without);
  const onDeciding = (p: Float64Array | null): Float64Array => onlyWhere(p ?? new Float64Array(m).fill(Number.NaN), deciding, 1);
  // Neighbours from the corpus where the verdict seeks them there (inside a sample they are
  // farther apart, docs/methods.md §9), else from the sample.
  const searched = input.corpus?.(suggestedMask, keptMask) ?? null;
  let kept: DistanceResult | null = null;
  const measureKept = (): DistanceResult => (kept ??= lab.measure(keptMask, input.baseline.neighbors));
  const suggesting = onDeciding(searched?.before ?? perQueryQuality(suggested, lab.k, labels).precision);
  const keeping = onDeciding(searched?.after ?? perQueryQuality(measureKept(), lab.k, labels).precision);
  const boot = pairedBootstrap(suggesting, keeping, 'mean', CHOICE_DRAWS, lab.seed ^ 0x1abe1);
  const keep = boot !== null && boot.low > 0;
  const figures: LabelChoiceFigures = {
    words: group.length,
    kept: keep,
    change: boot?.change ?? Number.NaN,
    low: boot?.low ?? Number.NaN,
    high: boot?.high ?? Number.NaN,
    decidedBy: boot?.queries ?? 0,
  };
  return keep
    ? { ...figures, group, deciding, accepted: without, mask: keptMask, measured: measureKept() }
    : { ...figures, group, deciding, accepted: [...accepted], mask: suggestedMask, measured: suggested };
}

/** The suggested columns the labels are asked about: rule 2's grammar words below half the documents. */
export function grammarGroup(accepted: readonly number[], decisions: ReadonlyMap<number, Decision>): number[] {
  return accepted.filter((c) => decisions.get(c)?.reason === 'grammar');
}

/** Per-query values where `deciding` is `side` (1: the deciding documents, 0: the held-out ones), NaN (left out) elsewhere. */
export function onlyWhere(values: Float64Array, deciding: Uint8Array, side: 0 | 1): Float64Array {
  return values.map((v, q) => (deciding[q] === side ? v : Number.NaN));
}

/** The rule's decisions with the group's turned into the labels' decision to keep them. */
export function decisionsAfterChoice(decisions: ReadonlyMap<number, Decision>, choice: LabelChoice): Map<number, Decision> {
  const out = new Map(decisions);
  if (!choice.kept) return out;
  for (const c of choice.group) {
    const d = decisions.get(c)!;
    out.set(c, { suggested: false, reason: 'labels', signal: d.signal, cls: d.cls, change: choice.change, decidedBy: choice.decidedBy });
  }
  return out;
}
