// The extension's VS Code settings, read per resource at each call (a folder may override a
// user setting; nothing is cached, so a change applies to the next review).
//
// Adding a setting: declare it under contributes.configuration in package.json (typed, with a
// description and default; if it stands in for a loudword.json key, with the schema's bounds),
// add a getter here, and use it at the call site. A stand-in for a loudword.json key goes
// through editorSettingsLayer() so the project's config keeps precedence.
import * as vscode from 'vscode';
import type { EditorDefaults } from './pure/config-location';

const SECTION = 'loudword';

function section(scope: vscode.Uri | undefined): vscode.WorkspaceConfiguration {
  return vscode.workspace.getConfiguration(SECTION, scope);
}

/**
 * The value the user set (folder, workspace or user settings), or undefined at the default, so
 * the engine's default rule applies and the Report can say "default". A restricted setting
 * (package.json capabilities) is read from user settings only in an untrusted workspace, as
 * WorkspaceConfiguration.get does.
 */
function explicit<T>(scope: vscode.Uri | undefined, key: string, restricted = false): T | undefined {
  const i = section(scope).inspect<T>(key);
  if (i === undefined) return undefined;
  if (restricted && !vscode.workspace.isTrusted) return i.globalValue;
  return i.workspaceFolderValue ?? i.workspaceValue ?? i.globalValue;
}

export function editorDefaults(scope: vscode.Uri | undefined): EditorDefaults {
  return {
    sampleSize: explicit<number>(scope, 'sampleSize'),
    neighbors: explicit<number>(scope, 'neighbors'),
    stopListFile: explicit<string>(scope, 'stopListFile', true),
  };
}

export function reviewOnSave(scope: vscode.Uri | undefined): boolean {
  return section(scope).get<boolean>('reviewOnSave', false);
}
