import type { Verdict } from '../protocol';
import { outcomeWords } from '../verdict-wording';

/** The verdict as plain lines, first of every summary: outcome, headline, then the caveats. */
export function verdictLines(verdict: Verdict | undefined): { title: string; headline: string; caveats: string[] } | null {
  // A Report saved by an older version has no verdict.
  if (verdict === undefined) return null;
  return {
    title: `Verdict: ${outcomeWords(verdict)}`,
    headline: verdict.headline,
    caveats: verdict.caveats.map((c) => c.sentence),
  };
}
