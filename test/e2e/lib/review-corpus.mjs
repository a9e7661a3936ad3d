// "Open the corpus, run Loudword: Review distances, wait for the panel": the first steps of
// most scenarios. A review already shown for the file in this editor session is reused.
import path from 'node:path';
import { openFile, runCommand, waitForCommand } from './workbench.mjs';
import { panelShowing } from './distance-review-panel.mjs';
import { cliReport } from './cli-report.mjs';

export async function reviewCorpus(ctx, fileName, { fresh = false } = {}) {
  ctx.reviewed ??= new Map();
  if (!fresh && ctx.reviewed.has(fileName)) {
    await openFile(ctx.page, fileName);
    return ctx.reviewed.get(fileName);
  }
  await waitForCommand(ctx.page, 'Loudword: Review distances');
  await openFile(ctx.page, fileName);
  await runCommand(ctx.page, 'Loudword: Review distances');
  const frame = await panelShowing(ctx.page, fileName);
  const entry = { frame };
  ctx.reviewed.set(fileName, entry);
  return entry;
}

/** The CLI's Report for a workspace corpus with the workspace's loudword.json (cached per file). */
export async function cliReportFor(ctx, fileName) {
  ctx.cliReports ??= new Map();
  if (!ctx.cliReports.has(fileName)) {
    ctx.cliReports.set(fileName, cliReport(ctx.repo, path.join(ctx.workspace, fileName), path.join(ctx.workspace, 'loudword.json')));
  }
  return ctx.cliReports.get(fileName);
}
