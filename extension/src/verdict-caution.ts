// The one caution every place that acts on the suggested list repeats when the review judged that
// list harmful: the CLI's closing line and `apply`, the editor's "stop all" action and its command.
// The verdict comes first in every summary, but a user who reaches for apply may not have read it.
// Pure: no Node and no DOM, so both bundles import it.
import type { Verdict } from './protocol';
import { formatSignedChange } from './number-format';

/** Digits a change of `measure` is written with: label precision to 0.001, standout to 0.01. */
export function changeDigits(measure: string): number {
  return measure.startsWith('label precision') ? 3 : 2;
}

/**
 * "the review judged this list to lower neighbour standout (−0.03)" when the verdict is that the
 * list hurts; null otherwise (helps, no clear change, nothing suggested, or an older Report).
 */
export function verdictCaution(verdict: Verdict | undefined): string | null {
  if (verdict?.outcome !== 'hurts' || verdict.estimate === null) return null;
  const { measure, change } = verdict.estimate;
  return `the review judged this list to lower ${measure} (${formatSignedChange(change, changeDigits(measure))})`;
}
