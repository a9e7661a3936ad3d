import { formatCount } from '../../number-format';

/** Documents among `labels` with no label (null: the value was empty, missing or a list); 0 without a label field. */
export function unlabelledCount(labels: readonly (string | null)[] | null): number {
  if (labels === null) return 0;
  let count = 0;
  for (const label of labels) if (label === null) count++;
  return count;
}

/**
 * What a user reading label precision should know when some documents have no label; null when
 * every document has one. Said even for a few: the user may not know the column has gaps, and
 * every gap is a neighbour scored as a miss (engine/measures/label-precision.ts), which is the
 * reading a practitioner would least expect.
 */
export function unlabelledNote(unlabelled: number, documents: number, labelField: string | null): string | null {
  if (labelField === null || unlabelled <= 0 || documents <= 0) return null;
  if (unlabelled >= documents) {
    return `None of the ${formatCount(documents)} document${documents === 1 ? '' : 's'} has a label in "${labelField}" (every value is empty, missing or a list), so no label precision can be measured; name a field that holds classes.`;
  }
  const share = Math.round((100 * unlabelled) / documents);
  const count = `${formatCount(unlabelled)} of ${formatCount(documents)} document${documents === 1 ? '' : 's'} (${share < 1 ? '<1' : share}%)`;
  const verb = unlabelled === 1 ? 'has' : 'have';
  return (
    `${count} ${verb} no label in "${labelField}" (empty, missing or a list): label precision scores only the labelled ones, ` +
    'and a neighbour without a label counts as a miss, so the more documents lack one, the lower the figure reads. ' +
    'To measure among the labelled documents alone, review them as a corpus of their own.'
  );
}
