import { formatCount } from '../../number-format';
import type { RepeatedLines } from '../matrix/repeated-lines';

/**
 * From this share of the checked documents holding one line, the Report names the line: the
 * same round value as the HTML note's (markup-note.ts), common practice, no source. In the bundled
 * sample (our own invented tickets) the signatures and disclaimers are each in 5–7% of the
 * tickets; a greeting ("Good morning,") is too short to count (matrix/repeated-lines.ts).
 */
export const BOILERPLATE_NOTE_SHARE = 0.05;

/** Fewest documents a named line must be in, so that a small corpus's chance repeats go unnamed. */
const MIN_DOCUMENTS = 10;

/** Lines shown in the note, most widespread first. */
const LINES_SHOWN = 3;

/** The note on lines repeated across documents, or null when no line is in enough of them. It changes nothing that is suggested. */
export function boilerplateNote(repeated: RepeatedLines, documents: number): string | null {
  const { checked } = repeated;
  if (checked <= 0) return null;
  const found = repeated.lines.filter(([, n]) => n >= MIN_DOCUMENTS && n / checked >= BOILERPLATE_NOTE_SHARE);
  if (found.length === 0) return null;
  found.sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1));
  const shown = found.slice(0, LINES_SHOWN).map(([line, n], i) => `"${shorten(line)}" (${Math.round((100 * n) / checked)}%${i === 0 ? ' of the documents' : ''})`);
  const more = found.length > LINES_SHOWN ? ` and ${found.length - LINES_SHOWN} more` : '';
  const sampled = checked < documents ? ` (counted on ${formatCount(checked)} documents drawn from the ${formatCount(documents)})` : '';
  return (
    `The same lines recur across documents — boilerplate such as signatures, disclaimers or form footers: ${shown.join(', ')}${more}${sampled}. ` +
    'A repeated line adds the same similarity to every pair of documents that holds it, whatever they say, and a stop list cannot remove it (it stops words everywhere, not a line). ' +
    'Unless these lines are what you study, strip them before vectorising (and before reviewing).'
  );
}

function shorten(line: string): string {
  return line.length > 70 ? `${line.slice(0, 69)}…` : line;
}
