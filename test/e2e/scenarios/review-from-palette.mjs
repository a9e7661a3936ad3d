// Review the sample from the command palette: the panel's headline figures equal the CLI's
// Report for the same file and loudword.json.
import { reviewCorpus, cliReportFor } from '../lib/review-corpus.mjs';
import { headlineMismatches } from '../lib/headline-mismatches.mjs';

export const SAMPLE = 'support-tickets.csv';

export const reviewFromPalette = {
  name: 'review the sample from the palette: headline figures equal the CLI JSON',
  slug: 'review-sample',
  async run(ctx) {
    const cli = cliReportFor(ctx, SAMPLE); // runs beside the editor's review
    const { frame } = await reviewCorpus(ctx, SAMPLE, { fresh: true });
    const report = await cli;
    const problems = await headlineMismatches(frame, report);
    const legend = await frame.$eval('.lw-strip__legend', (e) => e.textContent ?? '');
    const open = report.suggestions.filter((t) => report.terms.find((r) => r.term === t)?.status !== 'stopped').length;
    if (!legend.includes(`with ${open.toLocaleString('en-US')} suggested term`)) {
      problems.push(`legend "${legend}" does not name the CLI's ${open} suggested terms`);
    }
    if (problems.length > 0) throw new Error(problems.join('; '));
  },
};
