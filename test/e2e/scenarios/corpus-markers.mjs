// The corpus view after a review: a quiet marker after only the few loudest suggested terms in
// view ("◂ loud: 18% of similarity · lift 0.41"), never on the CSV header; "Loudword: Show or
// hide loud-term markers" takes them all away and brings them back.
import { reviewCorpus } from '../lib/review-corpus.mjs';
import { goToLine, openFile, runCommand } from '../lib/workbench.mjs';
import { waitUntil } from '../lib/wait-until.mjs';
import { SAMPLE } from './review-from-palette.mjs';

/** Markers by visible line: the decoration's text is an ::after pseudo-element (or injected text) of a span. */
async function markersInView(page) {
  return page.$$eval('.editor-group-container.active .monaco-editor .view-lines .view-line', (lines) =>
    lines
      .map((line) => {
        const marks = [...line.querySelectorAll('span')].filter((s) => {
          const after = getComputedStyle(s, '::after').content ?? '';
          return after.includes('loud:') || (s.children.length === 0 && (s.textContent ?? '').startsWith('◂ loud:'));
        }).length;
        return { text: (line.textContent ?? '').slice(0, 40), marks };
      })
      .filter((l) => l.marks > 0));
}

export const corpusMarkers = {
  name: 'corpus markers: at most 3 quiet loud-term markers in view, none on the header; the show/hide command removes and restores them',
  slug: 'corpus-markers',
  async run(ctx) {
    const problems = [];
    await reviewCorpus(ctx, SAMPLE);
    await openFile(ctx.page, SAMPLE);
    await goToLine(ctx.page, 1, 1);
    const shown = await waitUntil('loud-term markers in the corpus view', async () => {
      const m = await markersInView(ctx.page);
      return m.length > 0 ? m : null;
    }, { timeout: 20000, interval: 500 });
    const total = shown.reduce((n, l) => n + l.marks, 0);
    if (total > 3) problems.push(`${total} markers in view, more than the 3 loudest terms: ${JSON.stringify(shown)}`);
    if (shown.some((l) => l.text.startsWith('id,received'))) problems.push('a marker on the CSV header line');
    await ctx.screenshot();

    await runCommand(ctx.page, 'Loudword: Show or hide loud-term markers');
    await waitUntil('the markers to go', async () => (await markersInView(ctx.page)).length === 0, { timeout: 10000 }).catch((e) => problems.push(e.message));
    const status = await ctx.page.textContent('.statusbar').catch(() => '');
    if (!status?.includes('loud-term markers hidden')) problems.push(`the status bar does not say the markers are hidden: ${JSON.stringify(status?.slice(0, 200))}`);

    await runCommand(ctx.page, 'Loudword: Show or hide loud-term markers');
    await waitUntil('the markers to come back', async () => (await markersInView(ctx.page)).length > 0, { timeout: 10000 }).catch((e) => problems.push(e.message));
    if (problems.length > 0) throw new Error(problems.join('; '));
  },
};
