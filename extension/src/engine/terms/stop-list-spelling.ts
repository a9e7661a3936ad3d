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
    if (word !== undefined && word !== term) out[term] = word;
  }
  return out;
}

/** The line a term gets in a stop list: its plain spelling when it has one. */
export function stopListLine(report: Pick<Report, 'suggestionSpellings'>, term: string): string {
  return report.suggestionSpellings?.[term] ?? term;
}

/** The suggestions as a stop list writes them, in the Report's order. */
export function suggestionLines(report: Pick<Report, 'suggestions' | 'suggestionSpellings'>): string[] {
  return report.suggestions.map((t) => stopListLine(report, t));
}
