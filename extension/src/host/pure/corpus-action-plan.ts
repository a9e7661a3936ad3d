// Which quick fixes to offer on a corpus line, from the Report alone (no editor types). Each
// carries its evidence in the title, so the choice is made on the figures, not on faith.

export type CorpusAction =
  | { kind: 'addOne'; title: string; term: string }
  | { kind: 'addAll'; title: string; terms: string[] };

/** What the Report says about a term: its share of all-pair similarity and its neighbour lift. */
export interface TermEvidence {
  pullShare: number;
  neighborLift: number | null;
}

/** "30%", "4.2%", "0.31%": enough digits to compare terms, few enough to read in a menu. */
export function shareText(share: number): string {
  const pct = share * 100;
  if (!Number.isFinite(pct)) return '?%';
  return `${pct >= 10 ? pct.toFixed(0) : pct >= 1 ? pct.toFixed(1) : pct.toFixed(2)}%`;
}

/** "Stop 'the' — 30% of all-pair similarity, lift 0.24" (the lift only when measured). */
export function stopTitle(term: string, evidence: TermEvidence | undefined): string {
  if (evidence === undefined) return `Stop '${term}'`;
  const lift = evidence.neighborLift === null ? '' : `, lift ${evidence.neighborLift.toFixed(2)}`;
  return `Stop '${term}' — ${shareText(evidence.pullShare)} of all-pair similarity${lift}`;
}

/**
 * Offers "Stop '<term>' — …" for each distinct flagged term in the range, then "Stop all N
 * suggested terms — …" when more than one suggestion is still open. `alreadyStopped` holds terms
 * added since the review ran, so a fix is never offered twice. Pull shares add up (each is a
 * share of one total), so the group's share is their sum. `caution` (verdict-wording.ts) is
 * appended to the group's title when the review judged the whole list harmful: that action is
 * one keystroke away from the corpus, far from the verdict at the top of the panel.
 */
export function planCorpusActions(
  termsInRange: readonly string[],
  suggestions: readonly string[],
  alreadyStopped: ReadonlySet<string>,
  evidence: ReadonlyMap<string, TermEvidence> = new Map(),
  { maxSingle = 5, caution = null }: { maxSingle?: number; caution?: string | null } = {},
): CorpusAction[] {
  const open = suggestions.filter((t) => !alreadyStopped.has(t));
  const openSet = new Set(open);
  const actions: CorpusAction[] = [];
  const seen = new Set<string>();
  for (const term of termsInRange) {
    if (seen.has(term) || !openSet.has(term)) continue;
    seen.add(term);
    actions.push({ kind: 'addOne', title: stopTitle(term, evidence.get(term)), term });
    if (seen.size >= maxSingle) break;
  }
  if (actions.length > 0 && open.length > 1) {
    const known = open.filter((t) => evidence.has(t));
    const together = known.length === open.length ? ` — ${shareText(open.reduce((s, t) => s + evidence.get(t)!.pullShare, 0))} of all-pair similarity together` : '';
    const warning = caution === null ? '' : ` (${caution})`;
    actions.push({ kind: 'addAll', title: `Stop all ${open.length} suggested terms${together}${warning}`, terms: open });
  }
  return actions;
}
