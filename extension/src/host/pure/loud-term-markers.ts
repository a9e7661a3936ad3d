// Which loud terms get a marker in the visible part of a corpus: only the few loudest suggested
// terms found there, each once (its first occurrence in view), never on a CSV/TSV header row.
// Pure (no editor types), so it is tested in plain Node.
import { flaggedTermSpans, type TermSpan } from './flagged-term-spans';

export interface LoudTermMarker extends TermSpan {
  /** 0-based line. */
  line: number;
}

export interface MarkerOptions {
  lowercase: boolean;
  /** How many terms get a marker at most. */
  maxTerms: number;
  /** A header row to leave alone (0 for CSV/TSV), or null. */
  headerLine: number | null;
}

/**
 * `lines`: the visible lines in order; `loudness`: the Report's pull share per flagged term (the
 * ranking); terms without a value are not marked. Returns the markers ordered by line.
 */
export function pickLoudTermMarkers(
  lines: ReadonlyArray<{ line: number; text: string }>,
  loudness: ReadonlyMap<string, number>,
  options: MarkerOptions,
): LoudTermMarker[] {
  if (options.maxTerms <= 0 || loudness.size === 0) return [];
  const flagged = new Set(loudness.keys());
  const first = new Map<string, LoudTermMarker>();
  for (const { line, text } of lines) {
    if (line === options.headerLine) continue;
    for (const span of flaggedTermSpans(text, flagged, { lowercase: options.lowercase })) {
      if (!first.has(span.term)) first.set(span.term, { ...span, line });
    }
    // Every flagged term already found: the rest of the view adds nothing.
    if (first.size === flagged.size) break;
  }
  return [...first.values()]
    .sort((a, b) => loudness.get(b.term)! - loudness.get(a.term)! || a.line - b.line)
    .slice(0, options.maxTerms)
    .sort((a, b) => a.line - b.line || a.start - b.start);
}
