// A CSV with a quote that never closes: the user gets a clear error naming the file and line,
// and the editor keeps working (the palette opens, another corpus still reviews).
import { openFile, runCommand, errorNotificationTexts, notificationTexts, workbenchResponds } from '../lib/workbench.mjs';
import { waitUntil } from '../lib/wait-until.mjs';

const BROKEN = 'broken-quote.csv';

export const malformedCorpus = {
  name: 'a malformed corpus shows a clear error and the editor keeps working',
  slug: 'malformed-corpus',
  async run(ctx) {
    await openFile(ctx.page, BROKEN);
    await runCommand(ctx.page, 'Loudword: Review distances');
    const message = await waitUntil('an error notification about the broken CSV', async () => {
      const texts = await errorNotificationTexts(ctx.page);
      return texts.find((t) => t.includes(BROKEN)) ?? null;
    }, { timeout: 60000 });
    await ctx.screenshot();
    const problems = [];
    // Source: RFC 4180 §2 (a quoted field must close); the fixture opens one on line 5.
    if (!/:5\b/.test(message)) problems.push(`the message does not name line 5: "${message}"`);
    if (!/quote/i.test(message)) problems.push(`the message does not say what is wrong: "${message}"`);
    if (/\bat \S+:\d+:\d+\)|TypeError|ReferenceError/.test(message)) problems.push(`the message looks like a crash: "${message}"`);
    // The progress toast must end with the failure, not linger as if the review still ran.
    await waitUntil('the "reviewing broken-quote.csv" progress to end', async () => {
      const texts = await notificationTexts(ctx.page);
      return !texts.some((t) => t.includes(`reviewing ${BROKEN}`));
    }, { timeout: 15000 }).catch((e) => problems.push(e.message));
    await workbenchResponds(ctx.page);
    await openFile(ctx.page, 'loudword.json');
    if (problems.length > 0) throw new Error(problems.join('; '));
  },
};
