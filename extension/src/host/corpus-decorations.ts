// The corpus view's loud-term markers: only the few loudest suggested terms in view get one, at
// their first visible occurrence — a quiet note after the word with its evidence, and a mark in
// the overview ruler — instead of an underline on every occurrence. Never on a CSV/TSV header.
// "Loudword: Show or hide loud-term markers" turns them off and on (remembered per workspace).
import * as vscode from 'vscode';
import { KeyedDebounce } from './pure/keyed-debounce';
import { pickLoudTermMarkers } from './pure/loud-term-markers';
import { shareText } from './pure/corpus-action-plan';
import { COMMAND_IDS } from './pure/contribution-ids';
import type { ReviewStore } from './review-store';

/** How many terms get a marker in one editor's view. */
export const MARKED_TERMS = 3;
/** Lines scanned per visible range (a huge viewport stays cheap). */
const MAX_LINES = 400;
const SHOWN_KEY = 'loudword.corpusMarkers.shown';

export class CorpusDecorations implements vscode.Disposable {
  private readonly type = vscode.window.createTextEditorDecorationType({
    overviewRulerColor: new vscode.ThemeColor('editorCodeLens.foreground'),
    overviewRulerLane: vscode.OverviewRulerLane.Right,
    after: { color: new vscode.ThemeColor('editorCodeLens.foreground'), fontStyle: 'italic', margin: '0 0 0 0.6em' },
  });
  private readonly debounce = new KeyedDebounce<vscode.TextEditor>(120);
  private readonly disposables: vscode.Disposable[] = [];

  constructor(
    private readonly store: ReviewStore,
    private readonly memento: vscode.Memento,
  ) {
    this.disposables.push(
      vscode.window.onDidChangeTextEditorVisibleRanges((e) => this.debounce.schedule(e.textEditor, () => this.update(e.textEditor))),
      vscode.window.onDidChangeVisibleTextEditors((editors) => editors.forEach((e) => this.update(e))),
      store.onDidChange(() => this.refreshAll()),
    );
  }

  get shown(): boolean {
    return this.memento.get<boolean>(SHOWN_KEY, true);
  }

  /** Flips the markers on or off for this workspace; returns the new state. */
  async toggle(): Promise<boolean> {
    const next = !this.shown;
    await this.memento.update(SHOWN_KEY, next);
    this.refreshAll();
    return next;
  }

  refreshAll(): void {
    for (const e of vscode.window.visibleTextEditors) this.update(e);
  }

  private update(editor: vscode.TextEditor): void {
    const review = this.store.get(editor.document.uri);
    const report = review?.report;
    if (!this.shown || review === undefined || report == null) {
      editor.setDecorations(this.type, []);
      return;
    }
    const rows = new Map(report.terms.map((t) => [t.term, t]));
    const loudness = new Map<string, number>();
    for (const term of review.openSuggestions()) {
      const row = rows.get(term);
      if (row !== undefined && Number.isFinite(row.pullShare)) loudness.set(term, row.pullShare);
    }
    const lines: Array<{ line: number; text: string }> = [];
    for (const visible of editor.visibleRanges) {
      const last = Math.min(visible.end.line, visible.start.line + MAX_LINES - 1, editor.document.lineCount - 1);
      for (let line = visible.start.line; line <= last; line++) lines.push({ line, text: editor.document.lineAt(line).text });
    }
    const headerLine = report.input.format === 'csv' || report.input.format === 'tsv' ? 0 : null;
    const markers = pickLoudTermMarkers(lines, loudness, { lowercase: report.settings.tokens.lowercase, maxTerms: MARKED_TERMS, headerLine });
    const options = markers.map((m): vscode.DecorationOptions => {
      const row = rows.get(m.term)!;
      const lift = row.neighborLift === null ? '' : ` · lift ${row.neighborLift.toFixed(2)}`;
      const hover = new vscode.MarkdownString();
      hover.appendText(`Loudword: '${m.term}' carries ${shareText(row.pullShare)} of all-pair similarity${lift}. ${row.why}`);
      hover.appendMarkdown(`\n\n[Stop '${escapeMarkdown(m.term)}'](command:${COMMAND_IDS.addTermToStopList}?${encodeURIComponent(JSON.stringify([editor.document.uri.toString(), m.term]))})`);
      hover.appendMarkdown(` · [Hide markers](command:${COMMAND_IDS.toggleCorpusMarkers})`);
      hover.isTrusted = { enabledCommands: [COMMAND_IDS.addTermToStopList, COMMAND_IDS.toggleCorpusMarkers] };
      return {
        range: new vscode.Range(m.line, m.start, m.line, m.end),
        hoverMessage: hover,
        renderOptions: { after: { contentText: `◂ loud: ${shareText(row.pullShare)} of similarity${lift}` } },
      };
    });
    editor.setDecorations(this.type, options);
  }

  dispose(): void {
    this.debounce.dispose();
    for (const d of this.disposables.splice(0)) d.dispose();
    this.type.dispose();
  }
}

/** A term is corpus text: nothing in it may become Markdown syntax in the hover. */
function escapeMarkdown(text: string): string {
  return text.replace(/[\\`*_{}[\]()#+\-.!|<>]/g, (c) => `\\${c}`);
}
