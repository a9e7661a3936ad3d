// A folder of documents, one per file, reviewed from the explorer's context menu: the folder
// holds .md files (no table or line files), so the review offers to read each file as one
// document; taking the offer reviews it with format "files" and the subfolders as labels, and
// the panel's figures must equal the CLI's Report with --input-format files --label folder.
// Corpus: the first 400 tickets of the e2e shards (the project's own generated data), written as
// ticket-notes/<topic>/<n>.md by lib/write-ticket-notes.mjs before the editor starts.
import path from 'node:path';
import { execFile } from 'node:child_process';
import { panelShowing } from '../lib/distance-review-panel.mjs';
import { headlineMismatches } from '../lib/headline-mismatches.mjs';
import { notificationTexts, waitForCommand } from '../lib/workbench.mjs';
import { waitUntil } from '../lib/wait-until.mjs';

import { NOTES_FOLDER as FOLDER } from '../lib/write-ticket-notes.mjs';
const OFFER = 'Review each file as one document';

function cliFilesReport(repo, folder, config) {
  const bin = process.env.E2E_CLI || path.join(repo, 'bin', 'loudword.js');
  return new Promise((resolve, reject) => {
    execFile(process.execPath, [bin, 'review', folder, '--input-format', 'files', '--label', 'folder', '--config', config, '--format', 'json', '-q'],
      { maxBuffer: 64 * 1024 * 1024, timeout: 180000 },
      (error, stdout, stderr) => (error ? reject(new Error(`loudword review ${FOLDER} failed: ${stderr.trim() || error.message}`)) : resolve(JSON.parse(stdout))));
  });
}

export const reviewDocumentsFolder = {
  name: 'review a folder of .md documents from the explorer: the offer to read one document per file, figures equal the CLI JSON',
  slug: 'review-documents-folder',
  async run(ctx) {
    const { page } = ctx;
    const cli = cliFilesReport(ctx.repo, path.join(ctx.workspace, FOLDER), path.join(ctx.workspace, 'loudword.json'));
    cli.catch(() => {});
    await waitForCommand(page, 'Loudword: Review distances');
    const row = await waitUntil(`the folder ${FOLDER} in the explorer`, () => page.$(`.explorer-folders-view .monaco-list-row[aria-label^="${FOLDER}"]`), { timeout: 30000 });
    await row.click({ button: 'right' });
    const item = await waitUntil('"Review distances" in the explorer context menu', async () => {
      for (const handle of await page.$$('.monaco-menu .action-item .action-label')) {
        if (((await handle.textContent()) ?? '').trim() === 'Review distances') return handle;
      }
      return null;
    }, { timeout: 15000 });
    await item.click();
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
