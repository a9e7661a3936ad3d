// "Open the corpus, run Loudword: Review distances, wait for the panel": the first steps of
// most scenarios. A review already shown for the file in this editor session is reused.
import path from 'node:path';
import { openFile, runCommand, waitForCommand } from './workbench.mjs';
import { panelShowing } from './distance-review-panel.mjs';
import { cliReport } from './cli-report.mjs';

export async function reviewCorpus(ctx, fileName, { fresh = false } = {}) {
  ctx.reviewed ??= new Map();
  if (!fresh && ctx.reviewed.has(fileName)) {
    // A review that failed once fails the scenarios that need it at once, not after a timeout.
    const entry = await ctx.reviewed.get(fileName);
    await openFile(ctx.page, fileName);
    return entry;
  }
  const pending = (async () => {
    await waitForCommand(ctx.page, 'Loudword: Review distances');
    await openFile(ctx.page, fileName);
    await runCommand(ctx.page, 'Loudword: Review distances');
    return { frame: await panelShowing(ctx.page, fileName) };
  })();
  pending.catch(() => {});
  ctx.reviewed.set(fileName, pending);
  return pending;
}

/** The CLI's Report for a workspace corpus with the workspace's loudword.json (cached per file). */
export async function cliReportFor(ctx, fileName) {
  ctx.cliReports ??= new Map();
  if (!ctx.cliReports.has(fileName)) {
    const pending = cliReport(ctx.repo, path.join(ctx.workspace, fileName), path.join(ctx.workspace, 'loudword.json'));
    pending.catch(() => {}); // the scenario awaits it later; a failure then fails that scenario
    ctx.cliReports.set(fileName, pending);
  }
  return ctx.cliReports.get(fileName);
}
