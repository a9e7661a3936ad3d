// Every command, as a table of factories over the shared HostContext, registered in one loop
// by extension.ts. Ids and titles are in package.json (contributes.commands) and are relied on
// by the end-to-end tests: keep them in step.
import * as vscode from 'vscode';
import type { HostContext } from './host-context';
import { openConfig } from './open-config';
import { COMMAND_IDS } from './pure/contribution-ids';
import { flaggedTermAt } from './pure/flagged-term-spans';
import { verdictCaution } from '../verdict-wording';

type CommandFactory = (ctx: HostContext) => (...args: unknown[]) => unknown;

function asUri(value: unknown): vscode.Uri | undefined {
  return value instanceof vscode.Uri ? value : typeof value === 'string' && value.includes(':') ? vscode.Uri.parse(value) : undefined;
}

/**
 * The active editor's resource; else the active tab's, which also covers a file too large
 * for the editor to hand to extensions (it has a tab but no TextEditor).
 */
function activeResource(): vscode.Uri | undefined {
  const editorUri = vscode.window.activeTextEditor?.document.uri;
  if (editorUri !== undefined) return editorUri;
  const input = vscode.window.tabGroups.activeTabGroup.activeTab?.input;
  return input instanceof vscode.TabInputText ? input.uri : undefined;
}

function noReview(): void {
  void vscode.window.showInformationMessage('Loudword: run "Review distances" on a corpus first.');
}

/** The flagged term (else the plain word) under the cursor, if the editor shows `review`'s corpus. */
function termUnderCursor(ctx: HostContext, uri: vscode.Uri): string | null {
  const editor = vscode.window.activeTextEditor;
  const review = ctx.store.get(uri);
  if (editor === undefined || review?.report == null || editor.document.uri.toString() !== uri.toString()) return null;
  const pos = editor.selection.active;
  const line = editor.document.lineAt(pos.line).text;
  const lowercase = review.report.settings.tokens.lowercase;
  const flagged = flaggedTermAt(line, pos.character, new Set(review.openSuggestions()), { lowercase });
  return flagged?.term ?? null;
}

export const COMMANDS: Readonly<Record<string, CommandFactory>> = {
  [COMMAND_IDS.reviewDistances]: (ctx) => async (arg?: unknown) => {
    const uri = asUri(arg) ?? activeResource();
    if (uri === undefined) {
      void vscode.window.showInformationMessage('Loudword: open a corpus (CSV, TSV, JSON Lines or one document per line) first.');
      return;
    }
    await ctx.review(uri, true);
  },

  [COMMAND_IDS.addTermToStopList]: (ctx) => async (arg?: unknown, termArg?: unknown) => {
    const uri = asUri(arg);
    const review = ctx.reviewFor(uri);
    if (review?.report == null) return noReview();
    let term = typeof termArg === 'string' ? termArg : typeof arg === 'string' && uri === undefined ? arg : termUnderCursor(ctx, review.uri);
    if (term === null) {
      const items = review.openSuggestions().map((t) => ({ label: t, detail: review.report?.terms.find((r) => r.term === t)?.why ?? '' }));
      const picked = await vscode.window.showQuickPick(items, { title: 'Add term to stop list', placeHolder: 'Pick a suggested term', matchOnDetail: true });
      term = picked?.label ?? null;
    }
    if (term === null || term.trim() === '') return;
    await ctx.addTerms(review, [term]);
  },

  [COMMAND_IDS.addAllSuggested]: (ctx) => async (arg?: unknown) => {
    const review = ctx.reviewFor(asUri(arg));
    if (review?.report == null) return noReview();
    const open = review.openSuggestions();
    if (open.length === 0) {
      void vscode.window.showInformationMessage('Loudword: no suggested terms are left to add.');
      return;
    }
    // The quick fix that runs this is one keystroke from the corpus, far from the verdict: when
    // the review judged the list harmful, adding all of it waits for a yes.
    const caution = verdictCaution(review.report.verdict);
    if (caution !== null) {
      const addAnyway = `Add all ${open.length}`;
      const detail = 'Tick terms in the Loudword panel to see what each one does to the measures before adding it.';
      const choice = await vscode.window.showWarningMessage(`Loudword: ${caution}. Add all ${open.length} suggested terms anyway?`, { modal: true, detail }, addAnyway);
      if (choice !== addAnyway) return;
    }
    await ctx.addTerms(review, open);
  },

  [COMMAND_IDS.exportHtmlReport]: (ctx) => async (arg?: unknown) => {
    const review = ctx.reviewFor(asUri(arg));
    if (review?.report == null) return noReview();
    await ctx.exportHtml(review);
  },

  [COMMAND_IDS.openConfig]: (ctx) => () => openConfig(ctx.extensionUri),

  [COMMAND_IDS.toggleCorpusMarkers]: (ctx) => async () => {
    if (ctx.markers === null) return;
    const shown = await ctx.markers.toggle();
    vscode.window.setStatusBarMessage(`Loudword: loud-term markers ${shown ? 'shown' : 'hidden'}`, 3000);
  },
};
