import type { Verdict } from '../protocol';

const OUTCOME_WORDS: Record<Verdict['outcome'], string> = {
  helps: 'the suggested list helps',
  'no clear change': 'no clear change',
  hurts: 'the suggested list hurts',
  'nothing suggested': 'nothing to suggest',
};

/** The verdict as plain lines, first of every summary: outcome, headline, then the caveats. */
export function verdictLines(verdict: Verdict | undefined): { title: string; headline: string; caveats: string[] } | null {
  // A Report saved by an older version has no verdict.
  if (verdict === undefined) return null;
  return {
    title: `Verdict: ${OUTCOME_WORDS[verdict.outcome]}`,
    headline: verdict.headline,
    caveats: verdict.caveats.map((c) => c.sentence),
  };
}
