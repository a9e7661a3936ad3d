// A folder of documents, one per file, reviewed from the explorer's context menu: the folder
// holds .md files (no table or line files), so the review offers to read each file as one
// document; taking the offer reviews it with format "files" and the subfolders as labels, and
// the panel's figures must equal the CLI's Report with --input-format files --label folder.
// Corpus: the first 400 tickets of the e2e shards (the project's own generated data), written as
// ticket-notes/<topic>/<n>.md by lib/write-ticket-notes.mjs before the editor starts.
import path from 'node:path';
import { cliReport } from '../lib/cli-report.mjs';
import { panelShowing } from '../lib/distance-review-panel.mjs';
import { headlineMismatches } from '../lib/headline-mismatches.mjs';
import { notificationTexts, reviewFolderFromExplorer, waitForCommand } from '../lib/workbench.mjs';
import { waitUntil } from '../lib/wait-until.mjs';
import { NOTES_FOLDER as FOLDER } from '../lib/write-ticket-notes.mjs';
const OFFER = 'Review each file as one document';

export const reviewDocumentsFolder = {
  name: 'review a folder of .md documents from the explorer: the offer to read one document per file, figures equal the CLI JSON',
  slug: 'review-documents-folder',
  async run(ctx) {
    const { page } = ctx;
    const cli = cliReport(ctx.repo, path.join(ctx.workspace, FOLDER), path.join(ctx.workspace, 'loudword.json'), ['--input-format', 'files', '--label', 'folder']);
    cli.catch(() => {});
    await waitForCommand(page, 'Loudword: Review distances');
    await reviewFolderFromExplorer(page, FOLDER);
    const button = await waitUntil(`the offer "${OFFER}"`, async () => {
      for (const handle of await page.$$('.notifications-toasts .notification-toast .monaco-button')) {
        if (((await handle.textContent()) ?? '').trim() === OFFER) return handle;
      }
      return null;
    }, { timeout: 60000 });
    await button.click();
    const frame = await panelShowing(page, FOLDER, 240000);
    const report = await cli;
    const problems = await headlineMismatches(frame, report);
    if (problems.length > 0) throw new Error(problems.join('; '));
    await waitUntil('the note saying how to keep the choice', async () => (await notificationTexts(page)).find((t) => t.includes('"format": "files"') && t.includes('"label": "folder"')) ?? null, { timeout: 30000 });
  },
};
