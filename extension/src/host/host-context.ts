// What the commands, the panel and the listeners share: the reviews, the panel, and the few
// operations more than one of them starts. Lives as long as the extension.
import { promises as fs } from 'node:fs';
import * as path from 'node:path';
import * as vscode from 'vscode';
import type { Report } from '../protocol';
import type { CorpusReview } from './corpus-review';
import type { CorpusDecorations } from './corpus-decorations';
import type { DistanceReviewViewProvider } from './distance-review-view';
import { exportHtmlReport } from './export-html-report';
import { openAtLine, showReviewError } from './review-error-message';
import type { ReviewStore } from './review-store';
import { addTermsToReviewStopList } from './stop-list-edits';
import { isCancelled } from '../worker/review-worker-client';
import { isUserError } from '../engine/user-error';
import type { SettingsOverrides } from '../engine/config/settings-overrides';
import { pickMissingColumn } from './column-picker';
import { offersFilePerDocument } from './pure/file-per-document-offer';

export class HostContext {
  panel: DistanceReviewViewProvider | null = null;
  markers: CorpusDecorations | null = null;

  constructor(
    readonly extensionUri: vscode.Uri,
    readonly store: ReviewStore,
  ) {}

  /**
   * Reviews the corpus at `uri` (its open document's text when unsaved); errors become
   * messages, never exceptions (the host must not crash).
   */
  async review(uri: vscode.Uri, reveal: boolean, overrides: SettingsOverrides = {}): Promise<CorpusReview | null> {
    const doc = vscode.workspace.textDocuments.find((d) => d.uri.toString() === uri.toString());
    const review = this.store.getOrCreate(uri);
    // A second click while the same text is being reviewed (a quick double click on the title
    // button) would only restart the work: the first run carries on.
    if (review.isRunning && review.runningVersion === (doc?.version ?? -1)) return null;
    try {
      await review.run(doc, (stage) => this.panel?.busy(stage), overrides);
      this.store.focus(review);
      this.store.notify(review);
      await vscode.commands.executeCommand('setContext', 'loudword.hasReview', true);
      // The review just asked for keeps the panel, even when the active editor shows another
      // reviewed corpus (a folder reviewed from the explorer is no editor's document).
      await this.updateActiveContext(false);
      if (reveal) await this.panel?.reveal();
      return review;
    } catch (e) {
      if (isCancelled(e)) {
        // Only the user's Cancel is reported; a run replaced by a newer one ends silently.
        if (review.cancelledByUser) void vscode.window.showInformationMessage('Loudword: Review cancelled.');
        return null;
      }
      if (isUserError(e)) {
        // A folder with no table or line files: offer to read each file in it as one document.
        if (offersFilePerDocument(e.message, Object.keys(overrides))) {
          const read = 'Review each file as one document';
          const answer = await vscode.window.showWarningMessage(`Loudword: ${path.basename(uri.fsPath)} holds no table or line files (.csv, .jsonl, .txt…).`, read);
          // A label the settings name (for a table elsewhere in the project) is no field of a
          // folder of files: its subfolders are the labels, where it has any.
          if (answer === read) return this.reviewWith(uri, reveal, overrides, { format: 'files', label: (await hasSubfolders(uri.fsPath)) ? 'folder' : null });
          return null;
        }
        // The text or label field is not in the file: offer its columns rather than only the error.
        // Each field is asked for at most once, so a file missing both gets two picks, then a review.
        const picked = await pickMissingColumn(uri, e.message, Object.keys(overrides));
        if (picked !== null) return this.reviewWith(uri, reveal, overrides, picked);
      }
      void showReviewError(e);
      return null;
    }
  }

  /** Reviews again with what the user chose after an error, and says how to keep the choice. */
  private async reviewWith(uri: vscode.Uri, reveal: boolean, overrides: SettingsOverrides, chosen: SettingsOverrides): Promise<CorpusReview | null> {
    const again = await this.review(uri, reveal, { ...overrides, ...chosen });
    if (again !== null && Object.keys(overrides).length === 0) {
      const pairs = Object.entries(again.lastOverrides).map(([key, value]) => `"${key}": ${JSON.stringify(value)}`);
      void vscode.window.showInformationMessage(`Loudword: reviewed with ${pairs.join(', ')}. To keep ${pairs.length === 1 ? 'it' : 'them'}, set ${pairs.join(', ')} in loudword.json.`);
    }
    return again;
  }

  /** The review a command without arguments means: the active editor's, else the panel's. */
  reviewFor(uri: vscode.Uri | undefined): CorpusReview | null {
    const target = uri ?? vscode.window.activeTextEditor?.document.uri;
    const direct = target === undefined ? undefined : this.store.get(target) ?? this.store.usingStopList(target)[0];
    return direct ?? this.store.focused;
  }

  async addTerms(review: CorpusReview, terms: readonly string[]): Promise<string[]> {
    try {
      const { added, pieces, stopList } = await addTermsToReviewStopList(review, terms);
      const name = path.basename(stopList.fsPath);
      if (added.length > 0) review.markStale(`${name} changed`);
      this.store.notify(review);
      if (added.length === 0) {
        void vscode.window.showInformationMessage(`Loudword: ${terms.length === 1 ? `'${terms[0]}' is` : 'those terms are'} already in ${name}.`);
        return added;
      }
      const open = 'Open Stop List';
      const words = added.length - pieces;
      const what = (words === 1 ? `'${added[0]}'` : `${words} terms`) +
        (pieces === 0 ? '' : ` and ${pieces === 1 ? 'a piece' : `${pieces} pieces`} of contractions for scikit-learn's tokens ("don")`);
      void vscode.window.showInformationMessage(`Loudword: added ${what} to ${name} (unsaved; Undo in that file reverts it).`, open).then(async (choice) => {
        if (choice === open) await vscode.window.showTextDocument(stopList, { preview: false });
      });
      return added;
    } catch (e) {
      void showReviewError(e);
      return [];
    }
  }

  /** Writes `report` (default: the one the panel shows for `review`, else its latest). */
  async exportHtml(review: CorpusReview, report?: Report): Promise<void> {
    const shown = this.panel?.shownReportOf;
    const chosen = report ?? (shown?.review === review ? shown.report : review.report);
    try {
      await exportHtmlReport(this.extensionUri, review, chosen);
    } catch (e) {
      void showReviewError(e);
    }
  }

  async revealLine(review: CorpusReview, line: number): Promise<void> {
    if (review.uri.scheme === 'file') {
      await openAtLine(review.uri.fsPath, line);
      return;
    }
    const doc = await vscode.workspace.openTextDocument(review.uri);
    const at = new vscode.Position(Math.max(0, Math.min(line - 1, doc.lineCount - 1)), 0);
    await vscode.window.showTextDocument(doc, { selection: new vscode.Range(at, at) });
  }

  /**
   * Keeps `loudword.activeEditorReviewed` (menus) and, with `refocus`, the panel's focus on the
   * active corpus.
   */
  async updateActiveContext(refocus = true): Promise<void> {
    const editor = vscode.window.activeTextEditor;
    const review = editor === undefined ? undefined : this.store.get(editor.document.uri);
    if (refocus && review?.report != null) this.store.focus(review);
    await vscode.commands.executeCommand('setContext', 'loudword.activeEditorReviewed', review?.report != null);
  }
}

/** Whether the folder holds a subfolder that is not hidden (a class, in the layout format "files" reads). */
async function hasSubfolders(folder: string): Promise<boolean> {
  try {
    return (await fs.readdir(folder, { withFileTypes: true })).some((e) => e.isDirectory() && !e.name.startsWith('.'));
  } catch {
    return false;
  }
}
