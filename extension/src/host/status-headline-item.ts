// The status-bar item: the active corpus's headline measure; a click opens the panel.
import * as vscode from 'vscode';
import { DistanceReviewViewProvider } from './distance-review-view';
import { statusHeadline, statusTooltip } from './pure/status-headline';
import type { ReviewStore } from './review-store';

export class StatusHeadlineItem implements vscode.Disposable {
  private readonly item = vscode.window.createStatusBarItem('loudword.headline', vscode.StatusBarAlignment.Right, 100);
  private readonly disposables: vscode.Disposable[] = [];

  constructor(private readonly store: ReviewStore) {
    this.item.name = 'Loudword';
    this.item.command = `${DistanceReviewViewProvider.viewType}.focus`;
    this.disposables.push(
      vscode.window.onDidChangeActiveTextEditor(() => this.update()),
      store.onDidChange(() => this.update()),
    );
  }

  update(): void {
    const editor = vscode.window.activeTextEditor;
    const review = editor === undefined ? undefined : this.store.get(editor.document.uri) ?? this.store.usingStopList(editor.document.uri)[0];
    const report = review?.report;
    if (report == null) {
      this.item.hide();
      return;
    }
    this.item.text = statusHeadline(report);
    this.item.tooltip = statusTooltip(report);
    this.item.show();
  }

  dispose(): void {
    for (const d of this.disposables.splice(0)) d.dispose();
    this.item.dispose();
  }
}
