// How a failed review reaches the user: a user error names its file and line with a button
// that opens it; a bug goes to the output channel with its stack. Never rethrows: the
// extension host must outlive any corpus.
import * as vscode from 'vscode';
import { isUserError } from '../engine/user-error';
import { isCancelled } from '../worker/review-worker-client';

let channel: vscode.OutputChannel | undefined;

/** Created on first use, so activation stays light. */
export function loudwordOutput(): vscode.OutputChannel {
  channel ??= vscode.window.createOutputChannel('Loudword');
  return channel;
}

export function disposeLoudwordOutput(): void {
  channel?.dispose();
  channel = undefined;
}

function where(file: string | null, line: number | null): string {
  if (file === null) return '';
  return line === null ? `${file}: ` : `${file}:${line}: `;
}

/** Opens `file` with the cursor at the start of 1-based `line` (or the top). */
export async function openAtLine(file: string, line: number | null): Promise<void> {
  const doc = await vscode.workspace.openTextDocument(vscode.Uri.file(file));
  const at = new vscode.Position(Math.max(0, Math.min((line ?? 1) - 1, doc.lineCount - 1)), 0);
  const editor = await vscode.window.showTextDocument(doc, { selection: new vscode.Range(at, at), preview: false });
  editor.revealRange(new vscode.Range(at, at), vscode.TextEditorRevealType.InCenterIfOutsideViewport);
}

export async function showReviewError(error: unknown): Promise<void> {
  try {
    if (isCancelled(error)) return;
    if (isUserError(error)) {
      const open = error.line === null ? 'Open File' : `Go to Line ${error.line}`;
      const buttons = error.file === null ? [] : [open];
      const choice = await vscode.window.showErrorMessage(`Loudword: ${where(error.file, error.line)}${error.message}`, ...buttons);
      if (choice === open && error.file !== null) await openAtLine(error.file, error.line);
      return;
    }
    const e = error instanceof Error ? error : new Error(String(error));
    loudwordOutput().appendLine(`[${new Date().toISOString()}] ${e.stack ?? e.message}`);
    const show = 'Show Log';
    const choice = await vscode.window.showErrorMessage(`Loudword failed: ${e.message}`, show);
    if (choice === show) loudwordOutput().show(true);
  } catch {
    // Showing the message itself failed (window closing); nothing useful is left to do.
  }
}
