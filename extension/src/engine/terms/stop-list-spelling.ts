import type { Report } from '../../protocol';
import { priorForms } from './prior-columns';

/**
 * How each suggested term is written in a stop list when the plain word differs from the
 * tokenizer's spelling of it: with stemming on the term is a stem ("becaus"). A stop list line
 * "because" still stops it here (every entry goes through the tokenizer, review/load-stop-list.ts),
 * and it is the word other pipelines match — scikit-learn compares its `stop_words` with its own
 * tokens (docs/methods.md §9, "Spelling"). Only words of the prior have a known plain spelling;
 * every other term is written as it is.
 */
export function stopListSpellings(suggestions: readonly string[], tokenize: (text: string) => string[]): Record<string, string> {
  const forms = priorForms(tokenize);
  const out: Record<string, string> = {};
  for (const term of suggestions) {
    const word = forms.get(term)?.word;
    // Not a contraction's part: with the pattern tokenizer the prior's "'ll" is the term "ll",
    // which is what scikit-learn's tokens are too; "'ll" would match none of them.
    if (word !== undefined && word !== term && !word.includes("'")) out[term] = word;
  }
  return out;
}

/** The line a term gets in a stop list: its plain spelling when it has one. */
export function stopListLine(report: Pick<Report, 'suggestionSpellings'>, term: string): string {
  return report.suggestionSpellings?.[term] ?? term;
}

/**
 * The suggestions as a stop list writes them, in the Report's order, then the pieces of
 * contractions they complete for other pipelines' tokens ("don" with "do" and "not",
 * contraction-pieces.ts).
 */
export function suggestionLines(report: Pick<Report, 'suggestions' | 'suggestionSpellings' | 'suggestionPieces'>): string[] {
  return [...suggestedTermLines(report), ...Object.keys(report.suggestionPieces ?? {})];
}

/** The suggested terms as a stop list writes them, without the pieces of contractions. */
export function suggestedTermLines(report: Pick<Report, 'suggestions' | 'suggestionSpellings'>): string[] {
  return report.suggestions.map((t) => stopListLine(report, t));
}

/** One sentence on the pieces of contractions the stop list also gets, or null when there are none. */
export function piecesSentence(report: Pick<Report, 'suggestionPieces'>): string | null {
  const pieces = Object.entries(report.suggestionPieces ?? {});
  if (pieces.length === 0) return null;
  const [piece, parts] = pieces[0]!;
  return `With them a stop list also gets ${pieces.length === 1 ? 'one piece' : `${pieces.length} pieces`} of contractions ` +
    `that scikit-learn's default tokens keep ("${piece}" for ${parts.map((t) => `"${t}"`).join(' + ')}): ${pieces.map(([p]) => p).join(', ')}.`;
}

/**
 * The pieces to write with `terms` (a part of the suggestions, or all): those whose suggested
 * terms are all among `terms` or `addedBefore` (stopped since the review).
 */
export function piecesWith(report: Pick<Report, 'suggestionPieces'>, terms: readonly string[], addedBefore: ReadonlySet<string> = new Set()): string[] {
  const adding = new Set(terms);
  return Object.entries(report.suggestionPieces ?? {})
    .filter(([, parts]) => parts.some((t) => adding.has(t)) && parts.every((t) => adding.has(t) || addedBefore.has(t)))
    .map(([piece]) => piece);
}
