// A folder of shards reviewed from the explorer's context menu (issue 11 point 6): right-click
// the folder, "Review distances"; the review worker runs the shard steps on worker threads and
// the panel shows the merged Report, whose figures must equal the CLI's one-process Report of the
// same folder. Corpus: the first 1,200 tickets of the sample (samples/support-tickets.csv, the
// project's own generated data) as 4 JSON Lines shards (fixtures/ticket-shards/).
import path from 'node:path';
import { cliReport } from '../lib/cli-report.mjs';
import { panelShowing } from '../lib/distance-review-panel.mjs';
import { headlineMismatches } from '../lib/headline-mismatches.mjs';
import { reviewFolderFromExplorer, waitForCommand } from '../lib/workbench.mjs';

const FOLDER = 'ticket-shards';

export const reviewShardsFolder = {
  name: 'review a shards folder from the explorer context menu: figures equal the CLI JSON',
  slug: 'review-shards-folder',
  async run(ctx) {
    const { page } = ctx;
    const cli = cliReport(ctx.repo, path.join(ctx.workspace, FOLDER), path.join(ctx.workspace, 'loudword.json'));
    cli.catch(() => {});
    await waitForCommand(page, 'Loudword: Review distances');
    await reviewFolderFromExplorer(page, FOLDER);
    const frame = await panelShowing(page, FOLDER, 240000);
    const report = await cli;
    const problems = await headlineMismatches(frame, report);
    if (problems.length > 0) throw new Error(problems.join('; '));
  },
};
