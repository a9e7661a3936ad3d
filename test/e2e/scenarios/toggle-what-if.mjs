// Untick a suggested term in the table: the strip gains a "your selection" value for each
// headline measure, equal to the engine's what-if for the remaining ticked terms.
import path from 'node:path';
import { reviewCorpus, cliReportFor } from '../lib/review-corpus.mjs';
import { readTiles, headlineMeasures } from '../lib/distance-review-panel.mjs';
import { engineWhatIf } from '../lib/engine-what-if.mjs';
import { assertShows } from '../lib/shown-number.mjs';
import { waitUntil, named } from '../lib/wait-until.mjs';
import { SAMPLE } from './review-from-palette.mjs';

export const toggleWhatIf = {
  name: 'untick a suggested term: the strip shows the engine\'s what-if values',
  slug: 'toggle-what-if',
  async run(ctx) {
    const { frame } = await reviewCorpus(ctx, SAMPLE);
    const report = await cliReportFor(ctx, SAMPLE);
    const row = await named('a suggested term row in the table', frame.waitForSelector('tr[data-status="suggested"]', { timeout: 10000 }));
    const term = await row.getAttribute('data-term');
    const box = await row.$('input.lw-check');
    if (!box || !(await box.isChecked())) throw new Error(`the suggested term "${term}" is not ticked to begin with`);
    // What the panel will ask for: every ticked, not-yet-stopped term, i.e. the suggestions minus this one.
    const removed = report.terms.filter((t) => t.status !== 'stopped' && report.suggestions.includes(t.term) && t.term !== term).map((t) => t.term);
    const expected = engineWhatIf(ctx.repo, path.join(ctx.workspace, SAMPLE), path.join(ctx.workspace, 'loudword.json'), removed);
    expected.catch(() => {}); // awaited below; until then a failure must not count as unhandled
    await box.scrollIntoViewIfNeeded();
    await box.click();
    const tiles = await waitUntil(`the strip to show "your selection" values after unticking "${term}"`, async () => {
      if (await frame.$('.lw-strip .lw-pending')) return null;
      const t = await readTiles(frame);
      return Object.values(t).every((v) => v.selection !== null) ? t : null;
    }, { timeout: 120000, interval: 500 });
    const measures = await expected;
    const problems = [];
    for (const [id, value] of Object.entries(headlineMeasures)) {
      try {
        assertShows(tiles[id].selection, value(measures), `${id} with "${term}" kept`);
      } catch (e) {
        problems.push(e.message);
      }
    }
    const legend = await frame.$eval('.lw-strip__legend', (e) => e.textContent ?? '');
    if (!legend.includes(`your selection (${removed.length.toLocaleString('en-US')} term`)) problems.push(`legend "${legend}" does not say ${removed.length} terms`);
    if (problems.length > 0) throw new Error(problems.join('; '));
    await ctx.screenshot();
    // Put the suggestions back so later scenarios see the panel as the review left it.
    await box.click();
    await waitUntil('the selection column to go away after re-ticking', async () => !(await frame.$('.lw-v__num[data-role="selection"]')), { timeout: 30000 });
  },
};
