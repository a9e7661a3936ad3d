// "Open config": opens the project's loudword.json, creating it (after asking).
import * as path from 'node:path';
import * as vscode from 'vscode';
import { CONFIG_FILE_NAME } from './pure/config-location';
import { findConfig, workspaceRootOf } from './review-input';

/**
 * No "$schema" line: the extension applies loudword.schema.json to every loudword.json by file
 * name (package.json jsonValidation), and a path or URL the user's folder lacks would make
 * VS Code report "Unable to load schema" and turn validation off.
 */
function newConfigText(): string {
  return `${JSON.stringify({ stopList: 'stoplist.txt' }, null, 2)}\n`;
}

export async function openConfig(_extensionUri: vscode.Uri): Promise<void> {
  const active = vscode.window.activeTextEditor?.document.uri;
  const root = active !== undefined ? workspaceRootOf(active) : vscode.workspace.workspaceFolders?.[0]?.uri.fsPath ?? null;
  const existing = active?.scheme === 'file' ? await findConfig(active.fsPath, root) : root !== null ? await findConfig(path.join(root, CONFIG_FILE_NAME), root) : null;
  if (existing !== null) {
    await vscode.window.showTextDocument(vscode.Uri.file(existing));
    return;
  }
  if (root === null) {
    void vscode.window.showInformationMessage('Loudword: open a folder first; loudword.json lives at the root of the project.');
    return;
  }
  const target = vscode.Uri.file(path.join(root, CONFIG_FILE_NAME));
  const create = 'Create loudword.json';
  const choice = await vscode.window.showInformationMessage(`Loudword: there is no ${CONFIG_FILE_NAME} in ${path.basename(root)}. Create one?`, { modal: true }, create);
  if (choice !== create) return;
  const edit = new vscode.WorkspaceEdit();
  edit.createFile(target, { ignoreIfExists: true, contents: Buffer.from(newConfigText(), 'utf8') });
  await vscode.workspace.applyEdit(edit);
  await vscode.window.showTextDocument(target);
}
