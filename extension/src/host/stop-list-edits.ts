// Every change to the stop list goes through here: the engine computes TextEdits that keep
// comments and order and never duplicate an entry; they are checked and applied as one
// WorkspaceEdit, so the user can undo them. The corpus file is never edited.
import * as path from 'node:path';
import * as vscode from 'vscode';
import { ADDED_TERMS_HEADING, addTermsToStopList } from '../engine/stoplist/add-terms-to-stop-list';
import { removeTermsFromStopList } from '../engine/stoplist/remove-terms-from-stop-list';
import { piecesWith, stopListLine } from '../engine/terms/stop-list-spelling';
import type { CorpusReview } from './corpus-review';
import { checkLineEdits, type LineEdit } from './pure/text-edit-ranges';
import { confineForRestrictedMode, workspaceRootOf } from './review-input';
import { confineStopListWrite } from '../engine/config/confine-to-workspace';
import { isUserError, UserError } from '../engine/user-error';

export function toRange(edit: LineEdit): vscode.Range {
  return new vscode.Range(edit.start.line, edit.start.character, edit.end.line, edit.end.character);
}

async function fileExists(uri: vscode.Uri): Promise<boolean> {
  try {
    await vscode.workspace.fs.stat(uri);
    return true;
  } catch {
    return false;
  }
}

function stopListUriOf(review: CorpusReview): vscode.Uri {
  const file = review.stopListPath;
  if (file === null) {
    throw new UserError('This project has no stop list file (loudword.json sets "stopList" to null); set one to add terms.');
  }
  if (!vscode.workspace.isTrusted) confineForRestrictedMode(workspaceRootOf(review.uri), [file], null);
  // Trusted or not, a stop list is only written inside the project (safety hook, issue 13).
  try {
    confineStopListWrite(workspaceRootOf(review.uri) ?? path.dirname(review.uri.fsPath), file);
  } catch (e) {
    // Named without file and line: the stop list path is the problem, not a line in a file.
    if (isUserError(e)) throw new UserError(e.message);
    throw e;
  }
  return vscode.Uri.file(file);
}

/** What was new in the stop list: `added` counts the lines, of which `pieces` are pieces of contractions. */
export interface AddResult { added: string[]; pieces: number; stopList: vscode.Uri }

/** Adds `terms` to the review's stop list (creating the file if missing); returns what was new. */
export async function addTermsToReviewStopList(review: CorpusReview, terms: readonly string[]): Promise<AddResult> {
  const uri = stopListUriOf(review);
  const edit = new vscode.WorkspaceEdit();
  let text = '';
  if (await fileExists(uri)) {
    text = (await vscode.workspace.openTextDocument(uri)).getText();
  } else {
    edit.createFile(uri, { ignoreIfExists: true });
  }
  // Each term in its plain spelling ("because" for the stem "becaus"), as `loudword apply` writes it,
  // then the pieces of contractions the terms complete for scikit-learn's tokens ("don").
  const termOfLine = new Map(terms.map((t) => [review.report === null ? t : stopListLine(review.report, t), t]));
  const pieces = review.report === null ? [] : piecesWith(review.report, terms, review.addedSinceReview);
  const result = addTermsToStopList(text, [...termOfLine.keys(), ...pieces], { heading: ADDED_TERMS_HEADING });
  if (result.edit === null || result.added.length === 0) return { added: [], pieces: 0, stopList: uri };
  const [checked] = checkLineEdits([result.edit], text);
  edit.replace(uri, toRange(checked!), checked!.newText);
  if (!(await vscode.workspace.applyEdit(edit))) throw new Error(`the editor refused the edit to ${path.basename(uri.fsPath)}`);
  const pieceSet = new Set(pieces);
  for (const line of result.added) if (!pieceSet.has(line)) review.addedSinceReview.add(termOfLine.get(line) ?? line);
  return { added: result.added, pieces: result.added.filter((l) => pieceSet.has(l)).length, stopList: uri };
}

/** A WorkspaceEdit removing `terms` from the open stop list `doc`; null when none is listed. */
export function removeTermsEdit(doc: vscode.TextDocument, terms: readonly string[]): vscode.WorkspaceEdit | null {
  const text = doc.getText();
  const result = removeTermsFromStopList(text, [...terms]);
  if (result.edits.length === 0) return null;
  const edit = new vscode.WorkspaceEdit();
  for (const e of checkLineEdits(result.edits, text)) edit.replace(doc.uri, toRange(e), e.newText);
  return edit;
}
