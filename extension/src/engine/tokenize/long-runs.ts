import { WINK_SPLITTER } from './wink-splitter';

/**
 * Bounding the cost of one run without spaces (a base64 blob, a minified line, a hex dump).
 *
 * wink-nlp tokenises each whitespace-delimited piece recursively, and on a long piece with few
 * split points that costs time quadratic in its length (measured with wink-nlp 2.4 on random
 * base64: 2,048 characters ~87 ms, 20 KB ~2.5 s, 1 MB past 300 s). No word of any language is a
 * thousand characters long, so a run longer than MAX_RUN is cut into pieces of at most
 * MAX_PIECE characters (as if a space stood at each cut) before wink sees it: the cost becomes
 * linear in the run's length, and every run up to MAX_RUN — every word, number, e-mail address
 * and nearly every URL — is tokenised exactly as before. The terms of a cut run are fragments;
 * the review says so in the Report's input notes.
 */
export const MAX_RUN = 1000;
/** Largest piece a cut run is split into (wink's cost per character is flat up to ~256). */
export const MAX_PIECE = 256;

/** True for a character code after which a cut leaves words whole: ASCII that is not a letter or digit. */
function isAsciiBreak(c: number): boolean {
  return c < 0x80 && !((c >= 0x30 && c <= 0x39) || (c >= 0x41 && c <= 0x5a) || (c >= 0x61 && c <= 0x7a));
}

/**
 * Cuts `run` (longer than MAX_RUN, without spacing) into pieces of at most MAX_PIECE UTF-16 code
 * units: each cut goes after the last ASCII punctuation or symbol in the second half of the
 * window when there is one (so "a=b;c=d" keeps its identifiers), else at the window's end, and
 * never between the two halves of a surrogate pair.
 */
export function cutRun(run: string): string[] {
  const pieces: string[] = [];
  let start = 0;
  while (run.length - start > MAX_PIECE) {
    let end = start + MAX_PIECE;
    let cut = -1;
    for (let i = end; i > start + MAX_PIECE / 2; i--) {
      if (isAsciiBreak(run.charCodeAt(i - 1))) {
        cut = i;
        break;
      }
    }
    if (cut < 0) {
      const c = run.charCodeAt(end - 1);
      if (c >= 0xd800 && c <= 0xdbff) end--; // a high surrogate: keep the pair together
      cut = end;
    }
    pieces.push(run.slice(start, cut));
    start = cut;
  }
  pieces.push(run.slice(start));
  return pieces;
}

/**
 * True when `piece`, one element of `text.split(WINK_SPLITTER)` that wink would tokenise, must
 * be cut. Runs of \n \r \t are split pieces too, but wink treats them as one line-break token
 * cheaply; only pieces without them (the non-captured parts of the split) are cut.
 */
export function isOverlongRun(piece: string): boolean {
  if (piece.length <= MAX_RUN) return false;
  const c = piece.charCodeAt(0);
  return c !== 0x0a && c !== 0x0d && c !== 0x09;
}

/**
 * `text` with every over-long run cut by single spaces, and how many runs were cut (0: `text`
 * itself is returned). For the paths that hand whole documents to wink; the chunk-cached path
 * cuts its chunks itself, to the same pieces.
 */
export function cutLongRuns(text: string): { text: string; runs: number } {
  if (text.length <= MAX_RUN) return { text, runs: 0 };
  const pieces = text.split(WINK_SPLITTER);
  let runs = 0;
  for (let p = 0; p < pieces.length; p++) {
    if (isOverlongRun(pieces[p]!)) {
      pieces[p] = cutRun(pieces[p]!).join(' ');
      runs++;
    }
  }
  return runs === 0 ? { text, runs: 0 } : { text: pieces.join(''), runs };
}

/** The Report's input note for the runs cut in a review; `lines` are the first few 1-based source lines. */
export function longRunNote(runs: number, documents: number, lines: readonly number[]): string {
  const where = lines.length === 0 ? '' : ` (line${lines.length > 1 ? 's' : ''} ${lines.join(', ')}${documents > lines.length ? ', …' : ''})`;
  return (
    `${runs} run${runs === 1 ? '' : 's'} of text without spaces longer than ${MAX_RUN.toLocaleString('en-US')} characters ` +
    `in ${documents} document${documents === 1 ? '' : 's'}${where} ${runs === 1 ? 'was' : 'were'} cut into pieces of at most ${MAX_PIECE} ` +
    `characters before tokenising (a blob or minified line would otherwise take minutes); their terms are fragments`
  );
}
