// Quick fixes on a reviewed corpus: "Stop '<term>' — <its evidence>" and "Stop all N suggested
// terms". Only inside the visible range and with a bounded count, so a million-line corpus
// costs nothing off screen. The actions run commands; the corpus itself is never edited.
import * as vscode from 'vscode';
import { COMMAND_IDS } from './pure/contribution-ids';
import { planCorpusActions } from './pure/corpus-action-plan';
import { flaggedTermSpans } from './pure/flagged-term-spans';
import type { ReviewStore } from './review-store';
import { verdictCaution } from '../verdict-wording';

/** At most this many lines around the request are scanned (a huge selection stays cheap). */
const MAX_LINES = 200;

export class CorpusCodeActions implements vscode.CodeActionProvider {
  static readonly providedCodeActionKinds = [vscode.CodeActionKind.QuickFix];

  constructor(private readonly store: ReviewStore) {}

  provideCodeActions(document: vscode.TextDocument, range: vscode.Range | vscode.Selection): vscode.CodeAction[] {
    const review = this.store.get(document.uri);
    if (review?.report == null || review.report.suggestions.length === 0) return [];
    const visible = vscode.window.visibleTextEditors
      .filter((e) => e.document === document)
      .flatMap((e) => e.visibleRanges)
      .map((v) => v.intersection(range))
      .filter((v): v is vscode.Range => v !== undefined);
    if (visible.length === 0) return [];

    const flagged = new Set(review.openSuggestions());
    const lowercase = review.report.settings.tokens.lowercase;
    const terms: string[] = [];
    for (const r of visible) {
      const last = Math.min(r.end.line, r.start.line + MAX_LINES - 1);
      for (let line = r.start.line; line <= last; line++) {
        const text = document.lineAt(line).text;
        for (const span of flaggedTermSpans(text, flagged, { lowercase, max: 20 })) {
          // An empty range is the cursor: only the word under it counts.
          const overlaps = r.isEmpty
            ? span.start <= r.start.character && r.start.character <= span.end
            : !(line === r.start.line && span.end < r.start.character) && !(line === r.end.line && span.start > r.end.character);
          if (overlaps) terms.push(span.term);
        }
      }
    }
    const evidence = new Map(review.report.terms.map((t) => [t.term, { pullShare: t.pullShare, neighborLift: t.neighborLift }]));
    return planCorpusActions(terms, review.report.suggestions, review.addedSinceReview, evidence, { caution: verdictCaution(review.report.verdict) }).map((a) => {
      const action = new vscode.CodeAction(a.title, vscode.CodeActionKind.QuickFix);
      if (a.kind === 'addOne') {
        action.command = { command: COMMAND_IDS.addTermToStopList, title: a.title, arguments: [document.uri, a.term] };
        action.isPreferred = true;
      } else {
        action.command = { command: COMMAND_IDS.addAllSuggested, title: a.title, arguments: [document.uri] };
      }
      return action;
    });
  }
}
