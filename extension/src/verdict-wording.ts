// How the verdict is put into words wherever it is shown or acted on: the CLI and Markdown
// summaries, the panel, the editor's "stop all" action and `apply`. One place, so that the
// judgement reads the same everywhere. Pure: no Node and no DOM, so both bundles import it.
import type { Verdict } from './protocol';
import { formatSignedChange } from './number-format';

/** True when the verdict rests on label precision; false for neighbour standout, the label-free proxy. */
function measuresPrecision(measure: string): boolean {
  return /precision/i.test(measure);
}

/** Digits a change of `measure` is written with: label precision to 0.001, standout to 0.01. */
export function changeDigits(measure: string): number {
  return measuresPrecision(measure) ? 3 : 2;
}

/**
 * Digits for a change and its interval read together: changeDigits(measure), or more while a
 * bound other than zero would be written as zero (at most 5). "+0.003 (interval +0.000 to
 * +0.007)" reads as an interval that touches zero when it does not (it is why the verdict says
 * "helps"); "+0.0031 (+0.0003 to +0.0066)" does not.
 */
export function estimateDigits(measure: string, ...bounds: number[]): number {
  let digits = changeDigits(measure);
  const roundsToZero = (x: number): boolean => x !== 0 && Number.isFinite(x) && Math.abs(x) < 0.5 * 10 ** -digits;
  while (digits < 5 && bounds.some(roundsToZero)) digits++;
  return digits;
}

/**
 * The judgement in a few words, lower case ("the suggested list helps"). Without labels the
 * verdict rests on neighbour standout, which rises whenever common words are removed, also where
 * label precision falls (docs/methods.md §9): the words then say what was measured, not "helps".
 */
export function outcomeWords(verdict: Verdict): string {
  const proxy = verdict.estimate !== null && !measuresPrecision(verdict.estimate.measure);
  switch (verdict.outcome) {
    case 'helps':
      return proxy ? 'neighbours stand out more with the suggested list (without labels, a proxy)' : 'the suggested list helps';
    case 'hurts':
      return proxy ? 'neighbours stand out less with the suggested list (without labels, a proxy)' : 'the suggested list hurts';
    case 'no clear change':
      return 'no clear change';
    case 'nothing suggested':
      return 'nothing to suggest';
  }
}

/**
 * "the review judged this list to lower neighbour standout (−0.03)" when the verdict is that the
 * list hurts; null otherwise (helps, no clear change, nothing suggested, or an older Report).
 * The verdict comes first in every summary, but a user who reaches for apply may not have read it.
 */
export function verdictCaution(verdict: Verdict | undefined): string | null {
  if (verdict?.outcome !== 'hurts' || verdict.estimate === null) return null;
  const { measure, change } = verdict.estimate;
  return `the review judged this list to lower ${measure} (${formatSignedChange(change, changeDigits(measure))})`;
}
