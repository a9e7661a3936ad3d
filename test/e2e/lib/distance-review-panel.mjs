// The Distance Review panel as the user sees it. It is a webview, so its DOM lives in a frame
// nested two deep; these helpers find that frame and read what it shows. Selectors are the
// panel's own (webview/src): .lw-file, .lw-tile[data-measure], .lw-v__num[data-role],
// tr[data-term][data-status], .lw-strip[data-pending], .lw-error.
import { findFrame, errorNotificationTexts } from './workbench.mjs';
import { waitUntil } from './wait-until.mjs';

/**
 * The frame showing a finished review of `fileName` (no spinner, tiles drawn). Fails at once
 * when the editor shows a Loudword error instead, rather than waiting out the timeout.
 */
export async function panelShowing(page, fileName, timeout = 120000) {
  let frame = null;
  const outcome = await waitUntil(`the Distance Review panel to show the review of ${fileName}`, async () => {
    const errors = await errorNotificationTexts(page);
    const failure = errors.find((t) => t.startsWith('Loudword'));
    if (failure) return { error: failure };
    for (const f of page.frames()) {
      if (f.isDetached()) continue;
      const file = await f.$eval('.lw-header .lw-file', (e) => e.textContent ?? '').catch(() => null);
      if (file === null || !(file === fileName || file.endsWith('/' + fileName))) continue;
      const busy = await f.$('.lw-spinner').catch(() => null);
      const tiles = await f.$$('.lw-tile[data-measure]').catch(() => []);
      if (!busy && tiles.length > 0) {
        frame = f;
        return { frame: f };
      }
    }
    return null;
  }, { timeout, interval: 1000 });
  if (outcome.error) throw new Error(`the review of ${fileName} failed in the editor: ${outcome.error}`);
  return frame;
}

/** The panel frame whatever it shows (waiting text, error, report). */
export async function panelFrame(page, timeout = 30000) {
  return findFrame(page, '.lw-main', 'the Distance Review panel', timeout);
}

/** {measureId: {baseline, suggested, selection}} as the strip's tiles print them. */
export async function readTiles(frame) {
  return frame.$$eval('.lw-tile[data-measure]', (tiles) => {
    const out = {};
    for (const tile of tiles) {
      const read = (role) => tile.querySelector(`.lw-v__num[data-role="${role}"]`)?.textContent ?? null;
      out[tile.getAttribute('data-measure')] = { baseline: read('baseline'), suggested: read('suggested'), selection: read('selection') };
    }
    return out;
  });
}

/** The header facts ("documents" → "3,000"). */
export async function readFacts(frame) {
  return frame.$$eval('.lw-facts .lw-fact', (facts) =>
    Object.fromEntries(facts.map((f) => [f.querySelector('dt')?.textContent ?? '', f.querySelector('dd')?.textContent ?? ''])));
}

/** How the headline tiles map onto the Report's Measures (extension/src/measure-catalog.ts ids). */
export const headlineMeasures = {
  backgroundSimilarity: (m) => m.backgroundSimilarity,
  neighborStandout: (m) => m.neighborStandout,
  hubnessSkewness: (m) => m.hubness?.skewness ?? null,
  labelPrecisionAtK: (m) => m.labelPrecisionAtK,
};
