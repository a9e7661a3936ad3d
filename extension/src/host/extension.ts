// Entry point (dist/extension.js). Activation only wires things up: no engine, no file reads,
// no worker — the engine loads in the worker on the first review.
import * as path from 'node:path';
import * as vscode from 'vscode';
import { COMMANDS } from './commands';
import { CorpusCodeActions } from './corpus-code-actions';
import { CorpusDecorations } from './corpus-decorations';
import { DistanceReviewViewProvider } from './distance-review-view';
import { HostContext } from './host-context';
import { reviewOnSave } from './loudword-settings';
import { CONFIG_FILE_NAME } from './pure/config-location';
import { KeyedDebounce } from './pure/keyed-debounce';
import { disposeLoudwordOutput } from './review-error-message';
import { ReviewStore } from './review-store';
import { StatusHeadlineItem } from './status-headline-item';
import { StopListCodeActions, StopListDiagnostics } from './stop-list-diagnostics';

/** Saves within this window start one re-review. */
const REVIEW_ON_SAVE_DELAY_MS = 400;

export function activate(context: vscode.ExtensionContext): void {
  const store = new ReviewStore(vscode.Uri.joinPath(context.extensionUri, 'dist', 'review-worker.js').fsPath);
  const ctx = new HostContext(context.extensionUri, store);
  const panel = new DistanceReviewViewProvider(context.extensionUri, store, {
    revealLine: (r, line) => ctx.revealLine(r, line),
    addTerms: async (r, terms) => void (await ctx.addTerms(r, terms)),
    exportHtml: (r, report) => ctx.exportHtml(r, report),
    reviewAgain: async (r) => void (await ctx.review(r.uri, false)),
  });
  ctx.panel = panel;
  const markers = new CorpusDecorations(store, context.workspaceState);
  ctx.markers = markers;
  const onSave = new KeyedDebounce<string>(REVIEW_ON_SAVE_DELAY_MS);
  const fileOrUntitled: vscode.DocumentSelector = [{ scheme: 'file' }, { scheme: 'untitled' }];

  context.subscriptions.push(
    store,
    panel,
    { dispose: () => onSave.dispose() },
    { dispose: disposeLoudwordOutput },
    vscode.window.registerWebviewViewProvider(DistanceReviewViewProvider.viewType, panel, { webviewOptions: { retainContextWhenHidden: true } }),
    vscode.languages.registerCodeActionsProvider(fileOrUntitled, new CorpusCodeActions(store), { providedCodeActionKinds: CorpusCodeActions.providedCodeActionKinds }),
    vscode.languages.registerCodeActionsProvider({ scheme: 'file' }, new StopListCodeActions(), { providedCodeActionKinds: StopListCodeActions.providedCodeActionKinds }),
    new StopListDiagnostics(store),
    markers,
    new StatusHeadlineItem(store),
    vscode.window.onDidChangeActiveTextEditor(() => void ctx.updateActiveContext()),
    vscode.workspace.onDidCloseTextDocument((doc) => store.get(doc.uri)?.stopWorker()),
    // The panel says when its Report no longer describes the files, and offers to review again.
    vscode.workspace.onDidChangeTextDocument((event) => {
      if (event.contentChanges.length === 0) return;
      const name = path.basename(event.document.uri.fsPath || event.document.uri.path);
      for (const review of reviewsTouchedBySave(store, event.document)) {
        if (review.staleReason !== null) continue;
        review.markStale(`${name} changed`);
        store.notify(review);
      }
    }),
    vscode.workspace.onDidSaveTextDocument((doc) => {
      for (const review of reviewsTouchedBySave(store, doc)) {
        if (!reviewOnSave(review.uri)) continue;
        // Closed corpora (worker stopped) are not re-read behind the user's back.
        if (review.closed) continue;
        onSave.schedule(review.uri.toString(), () => void ctx.review(review.uri, false));
      }
    }),
  );
  for (const [id, factory] of Object.entries(COMMANDS)) {
    context.subscriptions.push(vscode.commands.registerCommand(id, factory(ctx)));
  }
}

/** The saved file is a reviewed corpus, its stop list, or a loudword.json above it. */
function reviewsTouchedBySave(store: ReviewStore, doc: vscode.TextDocument): ReturnType<ReviewStore['all']> {
  const direct = store.get(doc.uri);
  if (direct !== undefined) return [direct];
  const byStopList = store.usingStopList(doc.uri);
  if (byStopList.length > 0) return byStopList;
  if (doc.uri.scheme === 'file' && path.basename(doc.uri.fsPath) === CONFIG_FILE_NAME) {
    const dir = path.dirname(doc.uri.fsPath);
    return store.all().filter((r) => r.report !== null && r.uri.scheme === 'file' && !path.relative(dir, r.uri.fsPath).startsWith('..'));
  }
  return [];
}

export function deactivate(): void {
  // Everything is in context.subscriptions; workers are stopped by the store's dispose.
}
