// A light dotted underline on flagged terms in the visible lines of a reviewed corpus, with the
// Report's "why" on hover. Bounded: at most MAX_DECORATIONS per editor, recomputed on scroll.
import * as vscode from 'vscode';
import { flaggedTermSpans } from './pure/flagged-term-spans';
import { KeyedDebounce } from './pure/keyed-debounce';
import type { ReviewStore } from './review-store';

const MAX_DECORATIONS = 300;

export class CorpusDecorations implements vscode.Disposable {
  private readonly type = vscode.window.createTextEditorDecorationType({
    textDecoration: 'underline dotted',
    overviewRulerColor: new vscode.ThemeColor('editorInfo.foreground'),
    overviewRulerLane: vscode.OverviewRulerLane.Right,
  });
  private readonly debounce = new KeyedDebounce<vscode.TextEditor>(120);
  private readonly disposables: vscode.Disposable[] = [];

  constructor(private readonly store: ReviewStore) {
    this.disposables.push(
      vscode.window.onDidChangeTextEditorVisibleRanges((e) => this.debounce.schedule(e.textEditor, () => this.update(e.textEditor))),
      vscode.window.onDidChangeVisibleTextEditors((editors) => editors.forEach((e) => this.update(e))),
      store.onDidChange(() => this.refreshAll()),
    );
  }

  refreshAll(): void {
    for (const e of vscode.window.visibleTextEditors) this.update(e);
  }

  private update(editor: vscode.TextEditor): void {
    const review = this.store.get(editor.document.uri);
    const report = review?.report;
    if (review === undefined || report == null) {
      editor.setDecorations(this.type, []);
      return;
    }
    const flagged = new Set(review.openSuggestions());
    const why = new Map(report.terms.map((t) => [t.term, t.why]));
    const options: vscode.DecorationOptions[] = [];
    for (const visible of editor.visibleRanges) {
      for (let line = visible.start.line; line <= visible.end.line && options.length < MAX_DECORATIONS; line++) {
        const text = editor.document.lineAt(line).text;
        for (const span of flaggedTermSpans(text, flagged, { lowercase: report.settings.tokens.lowercase, max: MAX_DECORATIONS - options.length })) {
          const hover = new vscode.MarkdownString();
          hover.appendText(`Loudword suggests stopping '${span.term}': ${why.get(span.term) ?? ''}`);
          options.push({ range: new vscode.Range(line, span.start, line, span.end), hoverMessage: hover });
        }
      }
    }
    editor.setDecorations(this.type, options);
  }

  dispose(): void {
    this.debounce.dispose();
    for (const d of this.disposables.splice(0)) d.dispose();
    this.type.dispose();
  }
}
