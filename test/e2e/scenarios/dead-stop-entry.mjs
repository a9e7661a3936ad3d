// A stop-list entry that never occurs in the corpus gets a Loudword diagnostic, listed in the
// Problems view; its quick fix removes that entry and nothing else. Undo puts it back.
import path from 'node:path';
import { readFileSync } from 'node:fs';
import { reviewCorpus, cliReportFor } from '../lib/review-corpus.mjs';
import { firstWordPosition } from '../lib/text-position.mjs';
import { goToLine, applyQuickFix, openFile, saveActiveEditor, focusActiveEditor, runCommand } from '../lib/workbench.mjs';
import { waitUntil } from '../lib/wait-until.mjs';
import { SAMPLE } from './review-from-palette.mjs';

const STOP_LIST = 'stoplist.txt';

export const deadStopEntry = {
  name: 'a stop-list entry that never occurs is flagged, and its fix removes it',
  slug: 'dead-stop-entry',
  async run(ctx) {
    const stopList = path.join(ctx.workspace, STOP_LIST);
    const before = readFileSync(stopList, 'utf8');
    await reviewCorpus(ctx, SAMPLE);
    const report = await cliReportFor(ctx, SAMPLE);
    const dead = report.stopList.unused[0];
    if (!dead) throw new Error(`the CLI finds no unused entry in ${STOP_LIST}; the sample should hold one`);
    const at = firstWordPosition(stopList, dead);
    if (!at) throw new Error(`"${dead}" is not in ${STOP_LIST}`);

    await openFile(ctx.page, STOP_LIST);
    await runCommand(ctx.page, 'View: Focus Problems (Errors, Warnings, Infos)');
    await waitUntil(`a Problems entry from Loudword naming "${dead}"`, async () => {
      const rows = await ctx.page.$$eval('.markers-panel .monaco-list-row', (els) => els.map((e) => e.textContent ?? ''));
      return rows.some((r) => r.includes(dead) && r.includes('Loudword'));
    }, { timeout: 30000 });

    await openFile(ctx.page, STOP_LIST);
    await goToLine(ctx.page, at.line, at.column);
    await ctx.screenshot();
    await applyQuickFix(ctx.page, `Remove '${dead}' from stop list`);
    await saveActiveEditor(ctx.page, STOP_LIST);
    const after = readFileSync(stopList, 'utf8');
    const problems = [];
    const lines = (t) => t.split(/\r?\n/);
    if (lines(after).some((l) => l.trim() === dead)) problems.push(`"${dead}" is still in ${STOP_LIST}`);
    const expected = lines(before).filter((l) => l.trim() !== dead);
    if (lines(after).join('\n') !== expected.join('\n')) problems.push(`${STOP_LIST} lost more than the entry: ${JSON.stringify(after)}`);

    await focusActiveEditor(ctx.page);
    await ctx.page.keyboard.press('Control+Z');
    await waitUntil(`Undo to mark ${STOP_LIST} changed`, () => ctx.page.$('.tabs-container .tab.active.dirty'), { timeout: 10000 });
    await saveActiveEditor(ctx.page, STOP_LIST);
    if (readFileSync(stopList, 'utf8') !== before) problems.push(`Undo did not restore ${STOP_LIST}`);
    if (problems.length > 0) throw new Error(problems.join('; '));
  },
};
