// Which quick fixes to offer on a corpus line, from the Report alone (no editor types).

export type CorpusAction =
  | { kind: 'addOne'; title: string; term: string }
  | { kind: 'addAll'; title: string; terms: string[] };

/**
 * Offers "Add '<term>' to stop list" for each distinct flagged term in the range, then
 * "Add all N suggested terms" when more than one suggestion is still open. `alreadyStopped`
 * holds terms added since the review ran, so a fix is never offered twice.
 */
export function planCorpusActions(termsInRange: readonly string[], suggestions: readonly string[], alreadyStopped: ReadonlySet<string>, maxSingle = 5): CorpusAction[] {
  const open = suggestions.filter((t) => !alreadyStopped.has(t));
  const openSet = new Set(open);
  const actions: CorpusAction[] = [];
  const seen = new Set<string>();
  for (const term of termsInRange) {
    if (seen.has(term) || !openSet.has(term)) continue;
    seen.add(term);
    actions.push({ kind: 'addOne', title: `Add '${term}' to stop list`, term });
    if (seen.size >= maxSingle) break;
  }
  if (actions.length > 0 && open.length > 1) {
    actions.push({ kind: 'addAll', title: `Add all ${open.length} suggested terms`, terms: open });
  }
  return actions;
}
