// Gathers what one review needs from the editor: the corpus (buffer text when unsaved), the
// project's loudword.json, the editor defaults, and the stop list's unsaved buffer if open.
// Also enforces restricted mode: in an untrusted workspace nothing outside it is read.
import * as path from 'node:path';
import * as vscode from 'vscode';
import type { ReviewInput } from '../engine/review/review-api';
import { editorDefaults } from './loudword-settings';
import { confineToWorkspace } from '../engine/config/confine-to-workspace';
import { isUserError, UserError } from '../engine/user-error';
import { samePath } from './pure/same-path';
import { editorSettingsLayer } from './pure/config-location';
import { findConfig as findNearestConfig } from '../engine/config/find-config';
import { loadSettings } from '../engine/config/load-settings';

export interface PreparedReview {
  input: ReviewInput;
  configPath: string | null;
  /** Where the stop list will be read from; null when the config turns it off. */
  stopListPath: string | null;
  workspaceRoot: string | null;
}

/** The nearest loudword.json by the engine's rule (the same as the CLI's), or null. */
export async function findConfig(corpusFile: string, workspaceRoot: string | null): Promise<string | null> {
  return findNearestConfig(corpusFile, workspaceRoot);
}

export function workspaceRootOf(uri: vscode.Uri): string | null {
  const folder = vscode.workspace.getWorkspaceFolder(uri) ?? (uri.scheme === 'untitled' ? vscode.workspace.workspaceFolders?.[0] : undefined);
  return folder?.uri.scheme === 'file' ? folder.uri.fsPath : null;
}

/**
 * Restricted mode: every path the config or settings name must stay inside the workspace
 * (symbolic links followed). Throws a UserError.
 */
export function confineForRestrictedMode(workspaceRoot: string | null, paths: ReadonlyArray<string | null>, blame: string | null): void {
  for (const p of paths) {
    if (p === null) continue;
    if (workspaceRoot === null) throw new UserError(`This window is not trusted and has no workspace folder, so Loudword will not read ${p}.`, blame, null);
    try {
      confineToWorkspace(workspaceRoot, p);
    } catch (e) {
      if (isUserError(e)) throw new UserError(`${e.message}. Trust the workspace or move the file.`, blame, null);
      throw e;
    }
  }
}

/**
 * `doc` is the open document when the editor holds one; a file too large for the editor to
 * sync to extensions has none and is read from disk by the worker.
 */
export async function prepareReview(uri: vscode.Uri, doc: vscode.TextDocument | undefined): Promise<PreparedReview> {
  const workspaceRoot = workspaceRootOf(uri);
  const onDisk = uri.scheme === 'file';
  const corpusFile = onDisk ? uri.fsPath : path.join(workspaceRoot ?? process.cwd(), path.basename(uri.path));
  const configPath = onDisk || workspaceRoot !== null
    ? await findConfig(onDisk ? corpusFile : path.join(workspaceRoot ?? '', 'corpus'), workspaceRoot)
    : null;
  if (!vscode.workspace.isTrusted) confineForRestrictedMode(workspaceRoot, [configPath], configPath);
  // The engine reads and checks loudword.json (the host never parses it) and says which stop
  // list the review will use, before it runs, to hand the worker an unsaved buffer.
  const editorSettings = editorSettingsLayer(editorDefaults(uri), workspaceRoot ?? path.dirname(corpusFile));
  const { stopListPath } = await loadSettings(configPath, {}, { corpusFile, editor: editorSettings, projectRoot: workspaceRoot });

  if (!vscode.workspace.isTrusted) confineForRestrictedMode(workspaceRoot, [stopListPath], configPath);

  const input: ReviewInput = { file: corpusFile, configPath, configHow: configPath === null ? 'none' : 'nearest', editorSettings, projectRoot: workspaceRoot };
  if (doc !== undefined && (doc.isDirty || doc.isUntitled || !onDisk)) input.text = doc.getText();
  else if (!onDisk) throw new UserError('This document is neither on disk nor open in the editor; save it to a file first.');
  if (stopListPath !== null) {
    const stopDoc = vscode.workspace.textDocuments.find((d) => d.uri.scheme === 'file' && samePath(d.uri.fsPath, stopListPath));
    if (stopDoc?.isDirty) input.stopListText = stopDoc.getText();
  }
  return { input, configPath, stopListPath, workspaceRoot };
}
