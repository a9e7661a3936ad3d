// Writes the standalone HTML report (same bundle as the panel, inlined) where the user picks,
// next to the corpus by default, and offers to open it.
import * as path from 'node:path';
import * as vscode from 'vscode';
import { loadWebviewAssets, renderStandaloneReport } from '../html/standalone-report';
import type { Report } from '../protocol';
import type { CorpusReview } from './corpus-review';

/** Writes `report` — the one the panel shows, which may be older than `review.report`. */
export async function exportHtmlReport(extensionUri: vscode.Uri, review: CorpusReview, report: Report | null): Promise<void> {
  if (report === null) {
    void vscode.window.showInformationMessage('Loudword: run "Review distances" on this corpus before exporting a report.');
    return;
  }
  const corpus = review.uri.scheme === 'file' ? review.uri.fsPath : report.input.file;
  const suggested = path.join(path.dirname(corpus), `${path.basename(corpus, path.extname(corpus))}.loudword.html`);
  const target = await vscode.window.showSaveDialog({
    defaultUri: vscode.Uri.file(suggested),
    filters: { 'HTML report': ['html'] },
    saveLabel: 'Export report',
    title: 'Export Loudword HTML report',
  });
  if (target === undefined) return;
  const assets = loadWebviewAssets(vscode.Uri.joinPath(extensionUri, 'dist').fsPath);
  const html = renderStandaloneReport(report, assets);
  await vscode.workspace.fs.writeFile(target, Buffer.from(html, 'utf8'));
  const open = 'Open in Browser';
  const choice = await vscode.window.showInformationMessage(`Loudword: report written to ${path.basename(target.fsPath)}.`, open);
  if (choice === open) await vscode.env.openExternal(target);
}
