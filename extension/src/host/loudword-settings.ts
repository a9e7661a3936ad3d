// The extension's VS Code settings, read per resource at each call (a folder may override a
// user setting; nothing is cached, so a change applies to the next review).
//
// Adding a setting: declare it under contributes.configuration in package.json (typed, with a
// description and default), add a getter here with the same default, and use it at the call
// site. If it stands in for a loudword.json key, route it through editorOverrides() so the
// project's config keeps precedence.
import * as vscode from 'vscode';
import type { EditorDefaults } from './pure/config-location';

const SECTION = 'loudword';

function section(scope: vscode.Uri | undefined): vscode.WorkspaceConfiguration {
  return vscode.workspace.getConfiguration(SECTION, scope);
}

export function editorDefaults(scope: vscode.Uri | undefined): EditorDefaults {
  const s = section(scope);
  return {
    sampleSize: s.get<number>('sampleSize', 2000),
    neighbors: s.get<number>('neighbors', 10),
    stopListFile: s.get<string>('stopListFile', 'stoplist.txt'),
  };
}

export function reviewOnSave(scope: vscode.Uri | undefined): boolean {
  return section(scope).get<boolean>('reviewOnSave', false);
}
