/** How many rows the field and format detection look at. */
export const DETECT_ROWS = 200;

/**
 * Picks the text field: the one with the longest mean text over the sampled rows, among fields
 * that hold text (mostly non-numeric strings). Documents are the long free-text column; ids,
 * dates, labels and scores are short or numeric (common practice, no source).
 */
export function detectTextField(
  fields: readonly string[],
  sample: ReadonlyArray<ReadonlyMap<string, unknown>>,
  exclude: string | null,
): string | null {
  let best: string | null = null;
  let bestMean = -1;
  for (const field of fields) {
    if (field === exclude) continue;
    let total = 0;
    let strings = 0;
    let numeric = 0;
    let present = 0;
    for (const row of sample) {
      const v = row.get(field);
      if (v === undefined || v === null || v === '') continue;
      present++;
      if (typeof v !== 'string') continue;
      strings++;
      total += v.length;
      if (NUMBER_LIKE.test(v)) numeric++;
    }
    if (present === 0 || strings * 2 < present || numeric * 10 > strings * 9) continue;
    const mean = total / sample.length;
    if (mean > bestMean) {
      bestMean = mean;
      best = field;
    }
  }
  return best;
}

const NUMBER_LIKE = /^\s*[-+]?(\d[\d,_]*)?(\.\d+)?([eE][-+]?\d+)?\s*$/;
