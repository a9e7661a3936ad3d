// A corpus whose texts (and file name) carry HTML and script payloads: the panel shows them as
// text, creates no element from them, and no script runs (no dialog, no flag set on any window).
import { reviewCorpus } from '../lib/review-corpus.mjs';
import { waitUntil } from '../lib/wait-until.mjs';

export const PAYLOAD = 'payload-<img src=x onerror=alert(1)>.csv';

export const htmlPayloadCorpus = {
  name: 'a corpus with HTML/script payloads renders them as text and runs no script',
  slug: 'html-payload',
  async run(ctx) {
    const dialogs = [];
    const onDialog = (d) => {
      dialogs.push(d.message());
      void d.dismiss().catch(() => {});
    };
    ctx.page.on('dialog', onDialog);
    try {
      const { frame } = await reviewCorpus(ctx, PAYLOAD, { fresh: true });
      const found = await waitUntil('hub previews in the panel', async () => {
        const previews = await frame.$$eval('.lw-hub__preview', (els) => els.map((e) => e.textContent ?? ''));
        return previews.length > 0 ? previews : null;
      }, { timeout: 20000 });
      await frame.$eval('.lw-hubs', (e) => e.scrollIntoView({ block: 'center' })).catch(() => {});
      await ctx.screenshot();
      const problems = [];
      if (!found.some((p) => p.includes('<script>') || p.includes('<img') || p.includes('<svg'))) {
        problems.push(`no hub preview shows the markup as text: ${JSON.stringify(found.slice(0, 2))}`);
      }
      const file = await frame.$eval('.lw-header .lw-file', (e) => e.textContent ?? '');
      if (!file.endsWith(PAYLOAD)) problems.push(`file name shown as "${file}"`);
      // Nothing in the panel's own content may be an element the corpus asked for.
      const injected = await frame.$$eval('.lw-main img, .lw-main script, .lw-main svg, .lw-main iframe, .lw-main a[href^="javascript:"], .lw-main [onerror], .lw-main [onload]',
        (els) => els.map((e) => e.outerHTML.slice(0, 80)));
      if (injected.length > 0) problems.push(`elements from the corpus in the panel: ${JSON.stringify(injected)}`);
      for (const f of ctx.page.frames()) {
        if (f.isDetached()) continue;
        const flag = await f.evaluate(() => window.__lwPwned).catch(() => undefined);
        if (flag !== undefined) problems.push(`a payload ran in ${f.url().slice(0, 60)} (flag ${flag})`);
      }
      if (dialogs.length > 0) problems.push(`dialogs opened: ${JSON.stringify(dialogs)}`);
      if (problems.length > 0) throw new Error(problems.join('; '));
    } finally {
      ctx.page.off('dialog', onDialog);
    }
  },
};
