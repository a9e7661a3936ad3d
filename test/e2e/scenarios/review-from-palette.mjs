// Review the sample from the command palette: the panel's headline figures equal the CLI's
// Report for the same file and loudword.json.
import { reviewCorpus, cliReportFor } from '../lib/review-corpus.mjs';
import { readTiles, readFacts, headlineMeasures } from '../lib/distance-review-panel.mjs';
import { assertShows } from '../lib/shown-number.mjs';

export const SAMPLE = 'support-tickets.csv';

export const reviewFromPalette = {
  name: 'review the sample from the palette: headline figures equal the CLI JSON',
  slug: 'review-sample',
  async run(ctx) {
    const cli = cliReportFor(ctx, SAMPLE); // runs beside the editor's review
    const { frame } = await reviewCorpus(ctx, SAMPLE, { fresh: true });
    const report = await cli;
    const tiles = await readTiles(frame);
    const facts = await readFacts(frame);
    const problems = [];
    const check = (fn) => {
      try {
        fn();
      } catch (e) {
        problems.push(e.message);
      }
    };
    check(() => assertShows(facts.documents ?? '', report.input.documents, 'documents'));
    check(() => assertShows(facts.terms ?? '', report.vocabulary.terms, 'terms'));
    for (const [id, value] of Object.entries(headlineMeasures)) {
      const tile = tiles[id];
      if (!tile) {
        problems.push(`no tile for ${id}`);
        continue;
      }
      check(() => assertShows(tile.baseline ?? '', value(report.baseline), `${id} baseline`));
      check(() => assertShows(tile.suggested ?? '', value(report.suggested), `${id} with suggestions`));
    }
    const legend = await frame.$eval('.lw-strip__legend', (e) => e.textContent ?? '');
    const open = report.suggestions.filter((t) => report.terms.find((r) => r.term === t)?.status !== 'stopped').length;
    if (!legend.includes(`with ${open.toLocaleString('en-US')} suggested term`)) {
      problems.push(`legend "${legend}" does not name the CLI's ${open} suggested terms`);
    }
    if (problems.length > 0) throw new Error(problems.join('; '));
  },
};
