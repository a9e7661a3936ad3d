import { dominantEol, splitStopListLines, stopListTerm } from './stop-list-lines';
import type { TextEdit } from './text-edit';

/**
 * Appends terms not yet listed, one a line, in the file's own line breaks; comments and order
 * stay as they are and the original text stays a prefix of the result. A file without a final
 * line break keeps having none, so removing the same terms again gives the original back.
 * Terms that could not be read back as the same entry (empty, containing a line break, or
 * looking like a comment) are left out.
 *
 * With `heading`, new terms go under a comment line of their own ("# <heading>", after a blank
 * line), so they never land under the user's last comment; when the file's last comment already
 * is that heading, they are appended below it without another.
 */
export function addTermsToStopList(text: string, terms: readonly string[], options: { heading?: string } = {}): { text: string; added: string[]; edit: TextEdit | null } {
  const lines = splitStopListLines(text);
  const present = new Set<string>();
  for (const line of lines) {
    const term = stopListTerm(line.text);
    if (term !== null) present.add(term);
  }
  const added: string[] = [];
  for (const raw of terms) {
    const term = raw.trim();
    if (/[\r\n]/.test(term) || stopListTerm(term) !== term || present.has(term)) continue;
    present.add(term);
    added.push(term);
  }
  if (added.length === 0) return { text, added, edit: null };

  const eol = dominantEol(text);
  const last = lines[lines.length - 1] as { text: string };
  const endsOpen = last.text.length > 0; // text after the last line break
  const block = [...added];
  if (options.heading !== undefined) {
    const headingLine = `# ${options.heading}`;
    const comments = lines.filter((l) => l.text.trim() !== '' && stopListTerm(l.text) === null);
    const underHeading = comments.length > 0 && comments[comments.length - 1]!.text.trim() === headingLine;
    if (!underHeading) {
      const lastFilled = [...lines].reverse().find((l) => l.text.trim() !== '');
      block.unshift(...(lastFilled === undefined ? [] : ['']), headingLine);
    }
  }
  const newText = endsOpen ? eol + block.join(eol) : block.join(eol) + eol;
  const end = { line: lines.length - 1, character: last.text.length };
  return { text: text + newText, added, edit: { start: end, end: { ...end }, newText } };
}

/** The comment line Loudword writes above the terms it adds (see addTermsToStopList). */
export const ADDED_TERMS_HEADING = 'added by Loudword';
