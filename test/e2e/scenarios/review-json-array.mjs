// A corpus as a JSON array of records (pandas' to_json(orient="records"), indented): reviewing
// the .json file gives the format "json", its 300 records, and headline figures equal to the
// CLI's Report for the same file and loudword.json.
import { reviewCorpus, cliReportFor } from '../lib/review-corpus.mjs';
import { headlineMismatches } from '../lib/headline-mismatches.mjs';
import { readFacts } from '../lib/distance-review-panel.mjs';

const CORPUS = 'tickets-array.json';

export const reviewJsonArray = {
  name: 'review a JSON array of records: its records, format json, headline figures equal the CLI JSON',
  slug: 'review-json-array',
  async run(ctx) {
    const cli = cliReportFor(ctx, CORPUS);
    const { frame } = await reviewCorpus(ctx, CORPUS, { fresh: true });
    const report = await cli;
    const problems = await headlineMismatches(frame, report);
    const facts = await readFacts(frame);
    if (facts.format !== 'json') problems.push(`the header shows format ${facts.format}, not json`);
    if (facts.documents !== '300' || report.input.documents !== 300) problems.push(`${facts.documents} documents in the header, ${report.input.documents} in the CLI's Report, not 300`);
    await ctx.screenshot();
    if (problems.length > 0) throw new Error(problems.join('; '));
  },
};
