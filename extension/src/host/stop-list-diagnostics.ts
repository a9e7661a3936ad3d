// Diagnostics in the stop list file, and the quick fix that removes the flagged entry.
// The diagnostic codes below are what tie a diagnostic to its fix.
import * as vscode from 'vscode';
import type { Report } from '../protocol';
import { stopListFindings, type StopListFinding } from './pure/stop-list-findings';
import { KeyedDebounce } from './pure/keyed-debounce';
import type { ReviewStore } from './review-store';
import { removeTermsEdit } from './stop-list-edits';

/** The entry never occurs in the corpus. */
export const UNUSED_STOP_TERM = 'loudword.unusedStopTerm';
/** The entry is stopped but carries neighbour signal (pure/stop-list-findings.ts has the rule). */
export const STOP_TERM_WITH_SIGNAL = 'loudword.stopTermWithSignal';
const CODES: ReadonlySet<string> = new Set([UNUSED_STOP_TERM, STOP_TERM_WITH_SIGNAL]);

function toDiagnostic(f: StopListFinding): vscode.Diagnostic {
  const range = new vscode.Range(f.line, f.start, f.line, f.end);
  const unused = f.kind === 'unused';
  const d = new vscode.Diagnostic(range, f.message, unused ? vscode.DiagnosticSeverity.Information : vscode.DiagnosticSeverity.Warning);
  d.source = 'Loudword';
  d.code = unused ? UNUSED_STOP_TERM : STOP_TERM_WITH_SIGNAL;
  if (unused) d.tags = [vscode.DiagnosticTag.Unnecessary];
  return d;
}

export class StopListDiagnostics implements vscode.Disposable {
  private readonly collection = vscode.languages.createDiagnosticCollection('loudword');
  private readonly debounce = new KeyedDebounce<string>(250);
  private readonly disposables: vscode.Disposable[] = [];

  constructor(private readonly store: ReviewStore) {
    this.disposables.push(
      store.onDidChange(() => void this.refreshAll()),
      // Entries move as the user types: recompute positions from the buffer, same Report.
      vscode.workspace.onDidChangeTextDocument((e) => {
        if (this.store.usingStopList(e.document.uri).length > 0) this.debounce.schedule(e.document.uri.toString(), () => this.refreshDocument(e.document));
      }),
    );
  }

  private reportFor(uri: vscode.Uri): Report | null {
    // The focused review wins when several corpora share one stop list.
    const reviews = this.store.usingStopList(uri);
    const focused = this.store.focused;
    const review = reviews.find((r) => r === focused) ?? reviews[reviews.length - 1];
    return review?.report ?? null;
  }

  private refreshDocument(doc: vscode.TextDocument): void {
    const report = this.reportFor(doc.uri);
    this.collection.set(doc.uri, report === null ? [] : stopListFindings(doc.getText(), report).map(toDiagnostic));
  }

  async refreshAll(): Promise<void> {
    const files = new Set(this.store.all().map((r) => (r.report === null ? null : r.stopListPath)).filter((p): p is string => p !== null));
    const stale: vscode.Uri[] = [];
    this.collection.forEach((uri) => {
      if (!files.has(uri.fsPath)) stale.push(uri);
    });
    for (const uri of stale) this.collection.delete(uri);
    for (const file of files) {
      const uri = vscode.Uri.file(file);
      const open = vscode.workspace.textDocuments.find((d) => d.uri.toString() === uri.toString());
      if (open !== undefined) {
        this.refreshDocument(open);
        continue;
      }
      const report = this.reportFor(uri);
      try {
        const text = Buffer.from(await vscode.workspace.fs.readFile(uri)).toString('utf8');
        this.collection.set(uri, report === null ? [] : stopListFindings(text, report).map(toDiagnostic));
      } catch {
        this.collection.delete(uri); // no stop list file yet
      }
    }
  }

  dispose(): void {
    this.debounce.dispose();
    for (const d of this.disposables.splice(0)) d.dispose();
    this.collection.dispose();
  }
}

/** "Remove '<term>' from stop list" for each of our diagnostics in range. */
export class StopListCodeActions implements vscode.CodeActionProvider {
  static readonly providedCodeActionKinds = [vscode.CodeActionKind.QuickFix];

  provideCodeActions(document: vscode.TextDocument, _range: vscode.Range, context: vscode.CodeActionContext): vscode.CodeAction[] {
    const actions: vscode.CodeAction[] = [];
    for (const d of context.diagnostics) {
      if (typeof d.code !== 'string' || !CODES.has(d.code)) continue;
      const term = document.getText(d.range);
      const edit = removeTermsEdit(document, [term]);
      if (edit === null) continue;
      const action = new vscode.CodeAction(`Remove '${term}' from stop list`, vscode.CodeActionKind.QuickFix);
      action.edit = edit;
      action.diagnostics = [d];
      action.isPreferred = true;
      actions.push(action);
    }
    return actions;
  }
}
