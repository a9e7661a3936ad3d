// Export the HTML report from the palette, then open the file in a browser with the network
// off: it renders the same headline figures, loads nothing from outside, throws no error.
import path from 'node:path';
import { existsSync, rmSync } from 'node:fs';
import { reviewCorpus, cliReportFor } from '../lib/review-corpus.mjs';
import { readTiles, headlineMeasures } from '../lib/distance-review-panel.mjs';
import { assertShows } from '../lib/shown-number.mjs';
import { runCommand, notificationTexts } from '../lib/workbench.mjs';
import { waitUntil, named } from '../lib/wait-until.mjs';
import { SAMPLE } from './review-from-palette.mjs';

export const exportHtmlReport = {
  name: 'export the HTML report; it renders offline from file://',
  slug: 'export-html',
  async run(ctx) {
    const target = path.join(ctx.workspace, `${path.basename(SAMPLE, '.csv')}.loudword.html`);
    rmSync(target, { force: true });
    await reviewCorpus(ctx, SAMPLE);
    const report = await cliReportFor(ctx, SAMPLE);
    await runCommand(ctx.page, 'Loudword: Export HTML report');
    // code-server's save dialog is a quick input holding the suggested path: accept it.
    const box = '.quick-input-widget .quick-input-box input';
    await named('the save dialog', ctx.page.waitForSelector(box, { state: 'visible', timeout: 15000 }));
    // The dialog types the folder first and the file name a moment later.
    let proposed = '';
    await waitUntil(`the save dialog to propose …/${path.basename(target)}`, async () => {
      proposed = await ctx.page.inputValue(box);
      return proposed.endsWith(path.basename(target));
    }, { timeout: 15000 }).catch((e) => {
      throw new Error(`${e.message}; it shows "${proposed}"`);
    });
    await ctx.page.keyboard.press('Enter');
    await waitUntil(`${path.basename(target)} on disk`, () => existsSync(target), { timeout: 30000 });
    await waitUntil('the "report written" notification', async () => (await notificationTexts(ctx.page)).some((t) => t.includes('report written')), { timeout: 15000 });

    const context = await ctx.browser.newContext({ offline: true, viewport: { width: 1400, height: 1000 } });
    const outside = [];
    const errors = [];
    try {
      await context.route('**/*', (route) => {
        const url = route.request().url();
        if (url.startsWith('file:') || url.startsWith('data:') || url.startsWith('blob:')) return route.continue();
        outside.push(url);
        return route.abort();
      });
      const page = await context.newPage();
      page.on('pageerror', (e) => errors.push(e.message));
      await named(`opening file://${target}`, page.goto(`file://${target}`, { waitUntil: 'load', timeout: 30000 }));
      await named('the report\'s headline tiles', page.waitForSelector('.lw-tile[data-measure]', { timeout: 30000 }));
      await page.waitForTimeout(500); // charts draw on the next frame
      const tiles = await readTiles(page);
      const problems = [];
      for (const [id, value] of Object.entries(headlineMeasures)) {
        try {
          assertShows(tiles[id]?.baseline ?? '', value(report.baseline), `${id} baseline in the HTML report`);
          assertShows(tiles[id]?.suggested ?? '', value(report.suggested), `${id} with suggestions in the HTML report`);
        } catch (e) {
          problems.push(e.message);
        }
      }
      const charts = await page.$$eval('canvas', (cs) => cs.filter((c) => c.width > 0 && c.height > 0).length);
      if (charts === 0) problems.push('no chart canvas drawn');
      if (outside.length > 0) problems.push(`the report asked the network for ${JSON.stringify(outside.slice(0, 3))}`);
      if (errors.length > 0) problems.push(`script errors: ${JSON.stringify(errors.slice(0, 3))}`);
      await page.screenshot({ path: path.join(ctx.screenshotsDir, 'export-html-file.png'), fullPage: false });
      console.log(`  report screenshot: ${path.join(ctx.screenshotsDir, 'export-html-file.png')}`);
      if (problems.length > 0) throw new Error(problems.join('; '));
    } finally {
      await context.close();
    }
  },
};
