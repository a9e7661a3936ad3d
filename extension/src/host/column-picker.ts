// When a review fails because the text or label field named by the settings is not in the file,
// offer the file's columns (with a preview of their first values) instead of only the error.
import * as fs from 'node:fs/promises';
import * as path from 'node:path';
import * as vscode from 'vscode';
import { columnPreviews, missingFieldRole } from './pure/column-previews';

/** Bytes read from the start of the file for the previews. */
const HEAD_BYTES = 64 * 1024;

function formatOf(file: string): 'csv' | 'tsv' | 'jsonl' | 'json' | null {
  const ext = path.extname(file).toLowerCase();
  if (ext === '.csv') return 'csv';
  if (ext === '.tsv' || ext === '.tab') return 'tsv';
  if (ext === '.jsonl' || ext === '.ndjson') return 'jsonl';
  if (ext === '.json') return 'json';
  return null;
}

async function headOf(uri: vscode.Uri): Promise<string> {
  const open = vscode.workspace.textDocuments.find((d) => d.uri.toString() === uri.toString());
  if (open !== undefined) return open.getText(new vscode.Range(0, 0, Math.min(open.lineCount, 200), 0));
  const handle = await fs.open(uri.fsPath, 'r');
  try {
    const buffer = Buffer.alloc(HEAD_BYTES);
    const { bytesRead } = await handle.read(buffer, 0, HEAD_BYTES, 0);
    return buffer.subarray(0, bytesRead).toString('utf8');
  } finally {
    await handle.close();
  }
}

/**
 * For an error naming a missing text/label field: a quick pick of the file's columns, each with
 * its first values. Returns the override to review again with, or null (other error, no columns,
 * a field in `alreadyPicked` — the user chose it a moment ago — or the user dismissed the pick).
 */
export async function pickMissingColumn(uri: vscode.Uri, message: string, alreadyPicked: readonly string[] = []): Promise<{ text?: string; label?: string | null } | null> {
  const role = missingFieldRole(message);
  const format = formatOf(uri.fsPath || uri.path);
  if (role === null || format === null || alreadyPicked.includes(role)) return null;
  let columns;
  try {
    columns = columnPreviews(await headOf(uri), format);
  } catch {
    return null;
  }
  if (columns.length === 0) return null;
  type Item = vscode.QuickPickItem & { field: string | null };
  const items: Item[] = columns.map((c) => ({ label: c.name, detail: c.samples.length > 0 ? c.samples.join('  ·  ') : '(empty in the first rows)', field: c.name }));
  if (role === 'label') items.push({ label: '(no label)', detail: 'Review without labels: label precision is not measured', field: null });
  const picked = await vscode.window.showQuickPick(items, {
    title: `Loudword: ${message}`,
    placeHolder: `Pick the ${role === 'text' ? 'column with the document text' : 'column with the labels'} (${path.basename(uri.fsPath || uri.path)})`,
    matchOnDetail: true,
    ignoreFocusOut: true,
  });
  if (picked === undefined) return null;
  return role === 'text' ? { text: picked.field ?? '' } : { label: picked.field };
}
