/** One physical line of a stop list file, with the line break that ends it ('' on the last line). */
export interface StopListLine {
  text: string;
  eol: string;
}

/** Splits at CRLF, CR and LF (the breaks an editor counts), keeping each line's own break. */
export function splitStopListLines(text: string): StopListLine[] {
  const lines: StopListLine[] = [];
  const re = /\r\n|\r|\n/g;
  let start = 0;
  for (let m = re.exec(text); m !== null; m = re.exec(text)) {
    lines.push({ text: text.slice(start, m.index), eol: m[0] });
    start = m.index + m[0].length;
  }
  lines.push({ text: text.slice(start), eol: '' });
  return lines;
}

/**
 * The term a line holds, or null for blank and comment lines. A comment starts with '#'
 * followed by a non-word character or nothing ("# why", "#", "#---"), so hashtags such as
 * "#ad" can be listed as terms. Inline comments are not supported: a term may contain '#'.
 */
export function stopListTerm(line: string): string | null {
  const term = line.trim();
  if (term === '') return null;
  if (term.charCodeAt(0) === 0x23 /* # */ && !WORD_START.test(term.slice(1, 3))) return null;
  return term;
}

const WORD_START = /^[\p{L}\p{N}_]/u;

/** The line break the file already uses (first one found), LF for a file with none. */
export function dominantEol(text: string): string {
  const m = /\r\n|\r|\n/.exec(text);
  return m === null ? '\n' : m[0];
}
