// Where flagged terms (the Report's suggestions) sit in one line of the corpus. A plain
// word-boundary match of the lowercased text: close enough to the tokenizer for pointing at
// words, and cheap enough to run over the visible lines on every scroll.

export interface TermSpan {
  term: string;
  /** 0-based UTF-16 offsets in the line, end exclusive (the editor's character positions). */
  start: number;
  end: number;
}

export interface SpanOptions {
  /** The review's tokens.lowercase: compare lowercased text. */
  lowercase: boolean;
  /** Stop after this many spans (a long line must not flood the editor). */
  max?: number;
}

// Letters, combining marks, digits and underscore, with an optional leading # (hashtags are a
// token kind); apostrophes and hyphens split words, as the tokenizer splits them.
const WORD = /#?[\p{L}\p{M}\p{N}_]+/gu;

/** Every flagged unigram or bigram in `line`, in order, at most `max`. */
export function flaggedTermSpans(line: string, flagged: ReadonlySet<string>, options: SpanOptions): TermSpan[] {
  const max = options.max ?? Number.POSITIVE_INFINITY;
  const spans: TermSpan[] = [];
  if (flagged.size === 0 || max <= 0) return spans;
  const hasBigrams = [...flagged].some((t) => t.includes(' '));
  let previous: TermSpan | null = null;
  for (const match of line.matchAll(WORD)) {
    const start = match.index ?? 0;
    const raw = match[0];
    const word = options.lowercase ? raw.toLowerCase() : raw;
    const current: TermSpan = { term: word, start, end: start + raw.length };
    if (hasBigrams && previous !== null && /^\s+$/.test(line.slice(previous.end, start))) {
      const bigram = `${previous.term} ${word}`;
      if (flagged.has(bigram)) {
        spans.push({ term: bigram, start: previous.start, end: current.end });
        if (spans.length >= max) break;
      }
    }
    if (flagged.has(word)) {
      spans.push(current);
      if (spans.length >= max) break;
    } else if (word.startsWith('#') && flagged.has(word.slice(1))) {
      spans.push({ term: word.slice(1), start: start + 1, end: current.end });
      if (spans.length >= max) break;
    }
    previous = current;
  }
  return spans;
}

/** The flagged term under `character` (inclusive of the end, as a cursor right after a word). */
export function flaggedTermAt(line: string, character: number, flagged: ReadonlySet<string>, options: SpanOptions): TermSpan | null {
  let best: TermSpan | null = null;
  for (const span of flaggedTermSpans(line, flagged, { lowercase: options.lowercase })) {
    if (span.start <= character && character <= span.end) {
      // Prefer the shorter (unigram) span under the cursor: it is the one the user pointed at.
      if (best === null || span.end - span.start < best.end - best.start) best = span;
    }
  }
  return best;
}
