// On a flagged term in the corpus, the quick fix adds it to stoplist.txt: the term once, the
// comments kept; the panel says it is out of date; Undo in the stop list takes it out again;
// the corpus's bytes never change.
import path from 'node:path';
import { readFileSync } from 'node:fs';
import { reviewCorpus, cliReportFor } from '../lib/review-corpus.mjs';
import { sha256 } from '../lib/cli-report.mjs';
import { firstWordPosition } from '../lib/text-position.mjs';
import { goToLine, applyQuickFix, openFile, saveActiveEditor, focusActiveEditor } from '../lib/workbench.mjs';
import { waitUntil } from '../lib/wait-until.mjs';
import { panelFrame } from '../lib/distance-review-panel.mjs';
import { SAMPLE } from './review-from-palette.mjs';

const STOP_LIST = 'stoplist.txt';

export const quickFixAddTerm = {
  name: 'quick fix on a flagged corpus term adds it to the stop list once; undo restores; corpus untouched',
  slug: 'quick-fix-add-term',
  async run(ctx) {
    const corpus = path.join(ctx.workspace, SAMPLE);
    const stopList = path.join(ctx.workspace, STOP_LIST);
    const corpusHash = sha256(corpus);
    const originalHash = sha256(path.join(ctx.repo, 'samples', SAMPLE));
    if (corpusHash !== originalHash) throw new Error(`${SAMPLE} in the workspace differs from samples/ before the scenario`);
    const before = readFileSync(stopList, 'utf8');

    await reviewCorpus(ctx, SAMPLE);
    const report = await cliReportFor(ctx, SAMPLE);
    // The first suggested term that occurs as a word in the corpus below the header.
    let term = null;
    let at = null;
    for (const t of report.suggestions) {
      at = firstWordPosition(corpus, t, { fromLine: 2 });
      if (at) {
        term = t;
        break;
      }
    }
    if (!term) throw new Error('no suggested term occurs in the corpus text');

    await openFile(ctx.page, SAMPLE);
    await goToLine(ctx.page, at.line, at.column);
    await applyQuickFix(ctx.page, `Stop '${term}' —`);

    await openFile(ctx.page, STOP_LIST);
    await waitUntil(`the edit adding "${term}" to reach ${STOP_LIST}`, () => ctx.page.$('.tabs-container .tab.active.dirty'), { timeout: 15000 });
    await saveActiveEditor(ctx.page, STOP_LIST);
    const after = readFileSync(stopList, 'utf8');
    const problems = [];
    const entries = after.split(/\r?\n/).map((l) => l.trim());
    const count = entries.filter((l) => l.toLowerCase() === term.toLowerCase()).length;
    if (count !== 1) problems.push(`"${term}" is in ${STOP_LIST} ${count} times`);
    const keptLines = before.split(/\r?\n/).filter((l) => l.trim() !== '');
    let cursor = 0;
    const afterLines = after.split(/\r?\n/);
    for (const l of keptLines) {
      const found = afterLines.indexOf(l, cursor);
      if (found < 0) {
        problems.push(`line "${l}" of ${STOP_LIST} was lost or reordered`);
        break;
      }
      cursor = found + 1;
    }
    // The panel now says its figures predate the stop-list change and offers a re-review.
    const panel = await panelFrame(ctx.page);
    const banner = await waitUntil('the panel to say the review is out of date', async () => {
      const text = await panel.$eval('.lw-stale', (e) => e.textContent ?? '').catch(() => null);
      return text !== null && text.includes(STOP_LIST) && text.includes('Review again') ? text : null;
    }, { timeout: 15000 }).catch((e) => {
      problems.push(e.message);
      return null;
    });
    void banner;
    await ctx.screenshot();

    await focusActiveEditor(ctx.page);
    await ctx.page.keyboard.press('Control+Z');
    await waitUntil(`Undo to mark ${STOP_LIST} changed`, () => ctx.page.$('.tabs-container .tab.active.dirty'), { timeout: 10000 });
    await saveActiveEditor(ctx.page, STOP_LIST);
    const undone = readFileSync(stopList, 'utf8');
    if (undone !== before) problems.push(`after Undo ${STOP_LIST} is not as before: ${JSON.stringify(undone.slice(0, 200))}`);
    if (sha256(corpus) !== corpusHash) problems.push(`${SAMPLE} changed on disk (sha256)`);
    if (problems.length > 0) throw new Error(problems.join('; '));
  },
};
