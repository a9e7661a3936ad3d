// A corpus whose columns are not the ones the workspace's loudword.json names ("message",
// "topic"): reviewing it offers the file's columns with a preview of their first values, first
// for the text, then for the label; picking "body" and "category" gives a review whose header
// says so, and a note says which settings to write to keep them.
import { openFile, runCommand, waitForCommand, notificationTexts } from '../lib/workbench.mjs';
import { panelShowing, readFacts } from '../lib/distance-review-panel.mjs';
import { waitUntil } from '../lib/wait-until.mjs';

const CORPUS = 'tickets-other-columns.csv';
const ROWS = '.quick-input-widget .quick-input-list .monaco-list-row';

/** The open column pick: its title and rows; null while none is shown. */
async function openPick(page) {
  const title = await page.textContent('.quick-input-widget .quick-input-title').catch(() => null);
  if (!title || !(await page.isVisible('.quick-input-widget'))) return null;
  const rows = await page.$$eval(ROWS, (els) => els.map((e) => e.getAttribute('aria-label') ?? e.textContent ?? ''));
  return rows.length > 0 ? { title, rows } : null;
}

/** Checks the open pick's rows and picks `column`. */
async function pickColumn(page, pick, column, problems) {
  for (const name of ['ref', 'category', 'body']) if (!pick.rows.some((r) => r.startsWith(name))) problems.push(`the pick "${pick.title}" lacks the column ${name}: ${JSON.stringify(pick.rows)}`);
  // Each column comes with its first values (a ticket's opening words for "body").
  const body = pick.rows.find((r) => r.startsWith('body')) ?? '';
  if (!/Hello/.test(body)) problems.push(`no preview of "body"'s first values: ${JSON.stringify(body.slice(0, 120))}`);
  await page.fill('.quick-input-widget .quick-input-box input', column);
  const row = await waitUntil(`the row "${column}"`, async () => {
    for (const handle of await page.$$(ROWS)) {
      const label = (await handle.getAttribute('aria-label')) ?? '';
      if (label.startsWith(column)) return handle;
    }
    return null;
  }, { timeout: 5000 });
  await row.click();
}

export const columnPicker = {
  name: 'column picker: a corpus without the configured text and label columns offers its columns, with previews; the picked ones are reviewed',
  slug: 'column-picker',
  async run(ctx) {
    const problems = [];
    await waitForCommand(ctx.page, 'Loudword: Review distances');
    await openFile(ctx.page, CORPUS);
    await runCommand(ctx.page, 'Loudword: Review distances');
    // Both configured fields are missing: one pick each, in the order the reader meets them.
    const wanted = { text: 'body', label: 'category' };
    for (let n = 0; n < 2; n++) {
      const pick = await waitUntil(`column pick ${n + 1} of 2`, async () => {
        const p = await openPick(ctx.page);
        return p !== null && Object.keys(wanted).some((role) => p.title.includes(`${role} "`)) ? p : null;
      }, { timeout: 60000, interval: 500 });
      const role = Object.keys(wanted).find((r) => pick.title.includes(`${r} "`));
      if (n === 0) await ctx.screenshot();
      await pickColumn(ctx.page, pick, wanted[role], problems);
      delete wanted[role];
      // The next pick replaces this one only after a review attempt: wait for this one to close.
      await waitUntil('the pick to close', async () => (await openPick(ctx.page))?.title !== pick.title, { timeout: 10000 });
    }
    const frame = await panelShowing(ctx.page, CORPUS);
    const facts = await readFacts(frame);
    if (facts.text !== 'body' || facts.label !== 'category') problems.push(`the header shows text ${facts.text}, label ${facts.label}`);
    if (facts.documents !== '300') problems.push(`the header shows ${facts.documents} documents, not 300`);
    await waitUntil('the note on how to keep the picked columns', async () => {
      const texts = await notificationTexts(ctx.page);
      return texts.some((t) => t.includes('"text": "body"') && t.includes('"label": "category"') && t.includes('loudword.json'));
    }, { timeout: 15000 }).catch((e) => problems.push(e.message));
    if (problems.length > 0) throw new Error(problems.join('; '));
  },
};
