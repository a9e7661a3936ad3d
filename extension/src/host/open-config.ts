// "Open config": opens the project's loudword.json, creating it (after asking) with a $schema
// line so completion works even where the extension's jsonValidation does not reach.
import * as path from 'node:path';
import * as vscode from 'vscode';
import { CONFIG_FILE_NAME } from './pure/config-location';
import { findConfig, workspaceRootOf } from './review-input';

/** Where the schema lives relative to a config at the workspace root, as in samples/. */
const SCHEMA_REF = './loudword.schema.json';

function newConfigText(schemaRef: string): string {
  return `${JSON.stringify({ $schema: schemaRef, stopList: 'stoplist.txt' }, null, 2)}\n`;
}

/**
 * A workspace's own copy of the schema, by relative path, when it has one; else the schema's
 * published $id. Never the extension's install path: the file is committed and shared.
 */
async function schemaReference(extensionUri: vscode.Uri, root: string): Promise<string> {
  try {
    await vscode.workspace.fs.stat(vscode.Uri.file(path.join(root, 'loudword.schema.json')));
    return SCHEMA_REF;
  } catch {
    // no local copy
  }
  try {
    const schema = JSON.parse(Buffer.from(await vscode.workspace.fs.readFile(vscode.Uri.joinPath(extensionUri, 'loudword.schema.json'))).toString('utf8')) as { $id?: unknown };
    if (typeof schema.$id === 'string') return schema.$id;
  } catch {
    // fall through
  }
  return SCHEMA_REF;
}

export async function openConfig(extensionUri: vscode.Uri): Promise<void> {
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
  const schemaRef = await schemaReference(extensionUri, root);
  const edit = new vscode.WorkspaceEdit();
  edit.createFile(target, { ignoreIfExists: true, contents: Buffer.from(newConfigText(schemaRef), 'utf8') });
  await vscode.workspace.applyEdit(edit);
  await vscode.window.showTextDocument(target);
}
