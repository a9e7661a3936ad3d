// The panel bundle in headless Chromium: the standalone report (Report embedded in the page)
// and the editor panel (acquireVsCodeApi stubbed, messages posted by hand). Fixture Reports
// are invented UI data (test/fixtures/report-*.json); the expected strings below are the
// fixture's numbers written out by hand with the panel's rounding (about three significant
// digits, shares as percentages — common practice, no source).
import assert from 'node:assert/strict';
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { build } from 'esbuild';
import { chromium, type Browser, type Page } from 'playwright-core';
import { panelHtml } from '../extension/src/html/panel-html';
import { loadWebviewAssets, renderStandaloneReport, type WebviewAssets } from '../extension/src/html/standalone-report';
import type { Measures, Report, TermRow } from '../extension/src/protocol';

// Globals of the page, used only inside evaluate callbacks (they run in Chromium, not in Node).
declare const document: {
  querySelectorAll(s: string): { length: number };
  querySelector(s: string): unknown;
  body: { classList: { add(c: string): void } };
  documentElement: { style: { setProperty(k: string, v: string): void } };
  createRange(): { selectNodeContents(n: unknown): void; getBoundingClientRect(): { right: number } };
};
declare const window: { postMessage(m: unknown, origin: string): void; scrollTo(x: number, y: number): void } & Record<string, unknown>;
declare function getComputedStyle(e: unknown): { backgroundColor: string; overflowX: string };
type InputLike = { checked: boolean; disabled: boolean; closest(s: string): { getAttribute(a: string): string | null } | null };

const root = join(__dirname, '..');
const shots = join(root, 'test', 'e2e', 'screenshots');
// Screenshots cost seconds on a busy machine; take them when asked (LOUDWORD_SCREENSHOTS=1).
const wantShots = process.env.LOUDWORD_SCREENSHOTS === '1';
async function shot(page: Page, name: string, fullPage = true): Promise<void> {
  if (wantShots) await page.screenshot({ path: join(shots, name), fullPage });
}
const fixture = (name: string): Report => JSON.parse(readFileSync(join(__dirname, 'fixtures', name), 'utf8')) as Report;

// VS Code "Dark Modern" theme colours, for screenshots that look like the editor (from memory).
const vscodeDark: Record<string, string> = {
  '--vscode-font-family': 'system-ui, "Ubuntu", "Droid Sans", sans-serif',
  '--vscode-font-size': '13px',
  '--vscode-editor-font-family': '"Droid Sans Mono", "monospace", monospace',
  '--vscode-foreground': '#cccccc',
  '--vscode-editor-background': '#1f1f1f',
  '--vscode-descriptionForeground': '#9d9d9d',
  '--vscode-panel-border': '#2b2b2b',
  '--vscode-editorWidget-background': '#202020',
  '--vscode-list-hoverBackground': '#2a2d2e',
  '--vscode-focusBorder': '#0078d4',
  '--vscode-input-background': '#313131',
  '--vscode-input-foreground': '#cccccc',
  '--vscode-input-border': '#3c3c3c',
  '--vscode-button-background': '#0078d4',
  '--vscode-button-foreground': '#ffffff',
  '--vscode-button-hoverBackground': '#026ec1',
  '--vscode-button-secondaryBackground': '#313131',
  '--vscode-button-secondaryForeground': '#cccccc',
  '--vscode-charts-blue': '#3794ff',
  '--vscode-charts-orange': '#d18616',
  '--vscode-charts-red': '#f14c4c',
  '--vscode-charts-green': '#89d185',
  '--vscode-charts-purple': '#b180d7',
  '--vscode-errorForeground': '#f85149',
  '--vscode-editorWarning-foreground': '#cca700',
};

describe('webview in Chromium', function () {
  this.timeout(30000);
  let browser: Browser;
  let dist: string;
  let assets: WebviewAssets;

  before(async () => {
    dist = mkdtempSync(join(tmpdir(), 'lw-webview-'));
    // Same options as scripts/build.mjs uses for the browser entry.
    await build({ entryPoints: [join(root, 'webview/src/main.ts')], bundle: true, outfile: join(dist, 'webview.js'), platform: 'browser', format: 'iife', target: 'es2022', logLevel: 'warning' });
    copyFileSync(join(root, 'webview/src/panel.css'), join(dist, 'webview.css'));
    assets = loadWebviewAssets(dist);
    mkdirSync(shots, { recursive: true });
    browser = await chromium.launch({
      executablePath: '/usr/bin/chromium',
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
    });
  });

  after(async () => {
    await shared?.page.close();
    await browser?.close();
    if (dist) rmSync(dist, { recursive: true, force: true });
  });

  /** Console lines that mention CSP, and uncaught page errors, for the whole page's life. */
  function watch(page: Page): { csp: string[]; errors: string[]; dialogs: string[] } {
    const seen = { csp: [] as string[], errors: [] as string[], dialogs: [] as string[] };
    page.on('console', (m) => {
      if (/Content Security Policy/i.test(m.text())) seen.csp.push(m.text());
    });
    page.on('pageerror', (e) => seen.errors.push(e.message));
    page.on('dialog', (d) => {
      seen.dialogs.push(d.message());
      void d.dismiss();
    });
    return seen;
  }

  // One page serves every standalone test: setContent replaces the whole document each time.
  let shared: { page: Page; seen: ReturnType<typeof watch> } | null = null;
  async function openStandalone(report: Report, opts: { colorScheme?: 'light' | 'dark' } = {}) {
    if (!shared) {
      const page = await browser.newPage({ viewport: { width: 1200, height: 900 } });
      shared = { page, seen: watch(page) };
    }
    const { page, seen } = shared;
    for (const list of Object.values(seen)) list.length = 0;
    await page.emulateMedia({ colorScheme: opts.colorScheme ?? 'light' });
    // A file:// URL rather than setContent: large reports load much faster than over the protocol.
    const file = join(dist, 'report.html');
    writeFileSync(file, renderStandaloneReport(report, assets));
    await page.goto(pathToFileURL(file).href);
    await page.waitForSelector('.lw-tile');
    return { page, seen };
  }

  const stripValue = (page: Page, measure: string, role: string) =>
    page.locator(`[data-measure="${measure}"] [data-role="${role}"]`).textContent();
  const rowTerms = (page: Page) => page.locator('.lw-table tbody tr').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-term')));

  describe('standalone report', () => {
    it('shows each measure baseline → with suggestions, formatted from the Report', async () => {
      const { page, seen } = await openStandalone(fixture('report-small.json'));
      // Fixture: backgroundSimilarity 0.2143 → 0.0871, neighborStandout 2.61 → 3.94, hubness skewness
      // 1.84 → 1.07, labelPrecisionAtK 0.742 → 0.811, top10 0.512 → 0.236, hubs 37 → 19, iid 212 → 96.4.
      const expected: Array<[string, string, string]> = [
        ['backgroundSimilarity', '0.214', '0.0871'],
        ['neighborStandout', '2.61', '3.94'],
        ['hubnessSkewness', '1.84', '1.07'],
        ['labelPrecisionAtK', '74.2%', '81.1%'],
        ['topTermsMassTop10', '51.2%', '23.6%'],
        ['hubs', '37', '19'],
        ['iidEquivalentDimension', '212', '96.4'],
        ['contrastMedian', '0.645', '0.383'],
        ['neighborTurnover', '—', '28.6%'],
      ];
      for (const [measure, baseline, suggested] of expected) {
        assert.equal(await stripValue(page, measure, 'baseline'), baseline, `${measure} baseline`);
        assert.equal(await stripValue(page, measure, 'suggested'), suggested, `${measure} suggested`);
      }
      // Lower background similarity and higher standout are improvements; relative contrast gets no verdict.
      const verdictOf = (m: string) => page.locator(`[data-measure="${m}"] .lw-v--suggested`).getAttribute('data-verdict');
      assert.equal(await verdictOf('backgroundSimilarity'), 'better');
      assert.equal(await verdictOf('neighborStandout'), 'better');
      assert.equal(await verdictOf('contrastMedian'), 'neutral');
      // Every tile carries its meaning for hover and for assistive technology.
      const tile = page.locator('.lw-tile[data-measure="backgroundSimilarity"]');
      assert.match((await tile.getAttribute('title')) ?? '', /Mean cosine similarity over all document pairs/);
      const describedBy = await tile.getAttribute('aria-describedby');
      assert.match((await page.locator(`#${describedBy}`).textContent()) ?? '', /Mean cosine similarity/);
      assert.deepEqual(seen.csp, []);
      assert.deepEqual(seen.errors, []);
      await shot(page, 'standalone-light.png');
      await shot(page, 'standalone-light-top.png', false);
    });

    it('lists the terms in loudness order, sorts by a header, filters by status and by text', async () => {
      const report = fixture('report-small.json');
      const { page } = await openStandalone(report);
      const byLoudness = [...report.terms].sort((a, b) => b.loudness - a.loudness).map((t) => t.term);
      assert.deepEqual(await rowTerms(page), byLoudness);
      assert.equal(await page.locator('th.lw-col-loudness').getAttribute('aria-sort'), 'descending');

      // df, first click: high to low; Enter on the focused header button: low to high.
      await page.click('button[data-sort="df"]');
      const byDf = [...report.terms].sort((a, b) => b.df - a.df || report.terms.indexOf(a) - report.terms.indexOf(b)).map((t) => t.term);
      assert.deepEqual(await rowTerms(page), byDf);
      assert.equal(await page.locator('th.lw-col-df').getAttribute('aria-sort'), 'descending');
      await page.focus('button[data-sort="df"]');
      await page.keyboard.press('Enter');
      assert.equal(await page.locator('th.lw-col-df').getAttribute('aria-sort'), 'ascending');
      assert.equal((await rowTerms(page))[0], 'warehouse', 'df 22 is the smallest in the fixture');

      await page.selectOption('select.lw-select', 'suggested');
      assert.deepEqual((await rowTerms(page)).sort(), [...report.suggestions].sort());

      await page.selectOption('select.lw-select', 'all');
      await page.fill('input[type=search]', 'PASS');
      await page.waitForFunction(() => document.querySelectorAll('.lw-table tbody tr').length === 1);
      assert.deepEqual(await rowTerms(page), ['password']);
    });

    it('disables the what-if toggles with a note, keeps suggested ones shown as checked, lists hubs as text', async () => {
      const report = fixture('report-small.json');
      const { page } = await openStandalone(report);
      assert.match((await page.locator('.lw-hint--standalone').textContent()) ?? '', /What-if needs the editor/);
      const boxes = await page.locator('.lw-table tbody input[type=checkbox]').evaluateAll((xs) =>
        xs.map((x) => ({ term: (x as unknown as InputLike).closest('tr')!.getAttribute('data-term'), checked: (x as unknown as InputLike).checked, disabled: (x as unknown as InputLike).disabled })),
      );
      assert.ok(boxes.every((b) => b.disabled));
      const checked = boxes.filter((b) => b.checked).map((b) => b.term);
      const expectChecked = report.terms.filter((t) => t.status === 'suggested' || t.status === 'stopped').map((t) => t.term);
      assert.deepEqual(checked.sort(), expectChecked.sort());
      assert.equal(await page.locator('button', { hasText: 'Add checked terms' }).count(), 0);

      const hubs = await page.locator('.lw-hub').evaluateAll((xs) => xs.map((x) => [x.tagName, x.querySelector('.lw-hub__line')!.textContent, x.querySelector('.lw-hub__k')!.textContent]));
      assert.deepEqual(
        hubs,
        report.hubs.map((h) => ['DIV', `line ${h.line}`, `in ${h.kOccurrence} lists`]),
      );
      // Four charts drawn on canvases that chart.js sized.
      const sizes = await page.locator('.lw-chart canvas').evaluateAll((cs) => cs.map((c) => (c as unknown as { width: number }).width));
      assert.equal(sizes.length, 4);
      assert.ok(sizes.every((w) => w > 100), `canvas widths ${sizes.join(',')}`);
    });

    it('renders hostile terms, previews and file names as text and runs none of them', async () => {
      const bad = fixture('report-payloads.json');
      const { page, seen } = await openStandalone(bad);
      await page.waitForTimeout(200); // let any onerror/onload a payload could trigger fire
      assert.equal(await page.evaluate(() => (window as unknown as { __lwPwned?: number }).__lwPwned), undefined);
      assert.deepEqual(seen.dialogs, []);
      assert.equal(await page.locator('img, svg, iframe, object').count(), 0);
      assert.equal(await page.locator('script').count(), 2, 'the JSON element and the bundle, nothing injected');
      assert.equal(await page.locator('style').count(), 1);
      // The strings come back exactly as text.
      const shownTerms = await page.locator('.lw-table tbody .lw-term').allTextContents();
      for (const t of bad.terms.slice(0, 7)) assert.ok(shownTerms.includes(t.term), `term shown as text: ${t.term}`);
      assert.equal(await page.locator('.lw-file').textContent(), bad.input.file);
      const previews = await page.locator('.lw-hub__preview').allTextContents();
      assert.deepEqual(previews, bad.hubs.map((h) => h.preview));
      assert.ok(await page.locator('body').isVisible(), 'a CSS payload did not hide the page');
      assert.deepEqual(seen.csp, []);
      assert.deepEqual(seen.errors, []);
    });

    it('says which config and stop list were used and where each setting came from, one click away', async () => {
      const report: Report = {
        ...fixture('report-small.json'),
        stopList: { file: '/work/project/lists/stoplist.txt', exists: true, terms: 41, unused: [] },
        provenance: {
          config: { file: '/work/project/loudword.json', how: 'nearest' },
          sources: {
            'sample.k': { from: 'command-line flag', where: '--k' },
            label: { from: 'loudword.json', where: '/work/project/loudword.json:3' },
            'sample.documents': { from: 'editor setting', where: 'loudword.sampleSize' },
          },
        },
      };
      const { page, seen } = await openStandalone(report);
      const details = page.locator('.lw-provenance');
      assert.equal(await details.locator('summary').textContent(), 'Settings from loudword.json (nearest to the corpus); stop list stoplist.txt');
      assert.equal(await details.getAttribute('open'), null, 'closed until clicked');
      await details.locator('summary').click();
      const row = (key: string) => details.locator(`tr[data-setting="${key}"] td`).allTextContents();
      // Values from the fixture's settings (sample.k 10, label "topic", sample.documents 2000).
      assert.deepEqual(await row('sample.k'), ['sample.k', String(report.settings.sample.k), 'command-line flag', '--k']);
      assert.deepEqual(await row('label'), ['label', String(report.settings.label), 'loudword.json', '/work/project/loudword.json:3']);
      assert.deepEqual(await row('sample.documents'), ['sample.documents', String(report.settings.sample.documents), 'editor setting', 'loudword.sampleSize']);
      assert.match((await details.textContent()) ?? '', /Stop list: \/work\/project\/lists\/stoplist\.txt \(41 terms\)/);
      assert.deepEqual(seen.errors, []);
      // Without a config file the line says so, not "Settings from no loudword.json".
      const none = await openStandalone({ ...report, provenance: { config: { file: null, how: 'none' }, sources: {} } });
      assert.equal(await none.page.locator('.lw-provenance summary').textContent(), 'Settings without a loudword.json (none found); stop list stoplist.txt');
    });

    it("shows the input notes (the reader's and the review's) in the header, as text", async () => {
      const notes = ['2 files read as one corpus', '1,200 documents (29%) repeat another document exactly <b>not bold</b>'];
      const report: Report = { ...fixture('report-small.json'), input: { ...fixture('report-small.json').input, notes } };
      const { page, seen } = await openStandalone(report);
      assert.deepEqual(await page.locator('.lw-header p.lw-note').allTextContents(), notes);
      assert.equal(await page.locator('.lw-header b').count(), 0);
      assert.deepEqual(seen.errors, []);
    });

    it('hubs of a many-file corpus: the file and line never run into the list count, at any width', async () => {
      const base = fixture('report-small.json');
      const names = ['connectivity/note-302.txt', 'installation/a-folder-with-a-long-name/and-a-longer-file-name-still.txt', 'b.txt'];
      const report: Report = { ...base, hubs: base.hubs.slice(0, 3).map((h, i) => ({ ...h, file: names[i]! })) };
      const { page, seen } = await openStandalone(report);
      for (const width of [1200, 700, 420]) {
        await page.setViewportSize({ width, height: 900 });
        const rows = await page.locator('.lw-hub').evaluateAll((xs) =>
          xs.map((x) => {
            type Box = { getBoundingClientRect(): { left: number; right: number; width: number }; textContent: string; getAttribute(n: string): string | null };
            const line = x.querySelector('.lw-hub__line') as unknown as Box;
            // The list count is hidden on narrow panels; then the preview follows the name.
            const k = x.querySelector('.lw-hub__k') as unknown as Box;
            const after = k.getBoundingClientRect().width > 0 ? k : (x.querySelector('.lw-hub__preview') as unknown as Box);
            // Where the text shows to: its own extent (a grid cell's box does not grow with text
            // that overflows it), cut at the box when the box clips.
            const range = document.createRange();
            range.selectNodeContents(line);
            const clips = getComputedStyle(line).overflowX === 'hidden';
            const right = clips ? Math.min(range.getBoundingClientRect().right, line.getBoundingClientRect().right) : range.getBoundingClientRect().right;
            return { right, nextLeft: after.getBoundingClientRect().left, text: line.textContent, title: line.getAttribute('title') };
          }),
        );
        for (const r of rows) {
          assert.ok(r.right <= r.nextLeft + 0.5, `${width}px: "${r.text}" ends at ${r.right}, the next column starts at ${r.nextLeft}`);
          assert.equal(r.title, r.text, 'the whole name is in the title');
        }
      }
      await page.setViewportSize({ width: 1200, height: 900 });
      assert.deepEqual(seen.errors, []);
    });

    it('says what label precision needs instead of a tile of dashes when the review had no labels', async () => {
      const base = fixture('report-small.json');
      const unlabelled: Report = {
        ...base,
        baseline: { ...base.baseline, labelPrecisionAtK: null },
        suggested: { ...base.suggested, labelPrecisionAtK: null },
      };
      const { page, seen } = await openStandalone(unlabelled);
      const tile = page.locator('.lw-tile[data-measure="labelPrecisionAtK"]');
      assert.equal(await tile.locator('.lw-tile__absent').textContent(), 'No label column: name one ("label" in loudword.json, or --label) to measure it.');
      assert.equal(await tile.locator('[data-role]').count(), 0, 'no "— → —"');
      // The measures that have values keep their chain.
      assert.equal(await stripValue(page, 'backgroundSimilarity', 'suggested'), '0.0871');
      assert.deepEqual(seen.errors, []);
      // With labels the same tile shows its values (the first test) and no note.
      const labelled = await openStandalone(base);
      assert.equal(await labelled.page.locator('.lw-tile__absent').count(), 0);
    });

    it('shows 500 rows of a 20,000-term report and 500 more on request', async () => {
      const report = fixture('report-small.json');
      const many: TermRow[] = Array.from({ length: 20000 }, (_, i) => ({
        term: `term${String(i).padStart(5, '0')}`,
        df: 1 + (i % 900),
        idf: 1 + (i % 50) / 10,
        pullShare: 1 / (i + 50),
        neighborLift: i % 7 === 0 ? null : 0.5 + (i % 30) / 10,
        spread: (i % 100) / 100,
        loudness: 20000 - i,
        status: 'kept',
        why: 'invented row',
      }));
      const { page } = await openStandalone({ ...report, terms: many, suggestions: [] });
      assert.equal(await page.locator('.lw-table tbody tr').count(), 500);
      assert.match((await page.locator('.lw-count').textContent()) ?? '', /^500 of 20,000 terms/);
      await page.click('button.lw-more');
      assert.equal(await page.locator('.lw-table tbody tr').count(), 1000);
      assert.equal(await page.locator('.lw-table tbody tr').nth(999).getAttribute('data-term'), 'term00999');
    });

    it('follows a dark colour scheme preference', async () => {
      const { page } = await openStandalone(fixture('report-small.json'), { colorScheme: 'dark' });
      const bg = await page.evaluate(() => getComputedStyle(document.body).backgroundColor);
      const [r, g, b] = (bg.match(/\d+/g) ?? []).map(Number);
      assert.ok(r! + g! + b! < 3 * 80, `dark background, got ${bg}`);
      await shot(page, 'standalone-dark.png');
    });
  });

  describe('editor panel', () => {
    const origin = 'https://loudword.test';

    /** Serves the panel shell and the bundle from one fake origin, like the webview resource host. */
    async function openPanel(opts: { width?: number; height?: number; dark?: boolean; state?: unknown } = {}) {
      const context = await browser.newContext({ viewport: { width: opts.width ?? 1100, height: opts.height ?? 900 } });
      const page = await context.newPage();
      const seen = watch(page);
      const html = panelHtml({ cspSource: origin, nonce: 'dGVzdG5vbmNlLTEyMzQ1Njc4', scriptUri: `${origin}/dist/webview.js`, styleUri: `${origin}/dist/webview.css` });
      await page.route(`${origin}/**`, async (route) => {
        const path = new URL(route.request().url()).pathname;
        if (path === '/panel.html') return route.fulfill({ contentType: 'text/html', body: html });
        if (path === '/dist/webview.js') return route.fulfill({ contentType: 'text/javascript', body: assets.js });
        if (path === '/dist/webview.css') return route.fulfill({ contentType: 'text/css', body: assets.css });
        return route.fulfill({ status: 404, body: '' });
      });
      // A stand-in for VS Code's acquireVsCodeApi: records posts and keeps state like the editor does.
      // (A string, not a function: the test's TypeScript transform would add helpers the page lacks.)
      await page.addInitScript(`(() => {
        window.__posted = [];
        window.__state = ${JSON.stringify(opts.state ?? null)};
        window.acquireVsCodeApi = () => ({
          postMessage: (m) => window.__posted.push(JSON.parse(JSON.stringify(m))),
          getState: () => window.__state,
          setState: (s) => { window.__state = JSON.parse(JSON.stringify(s)); },
        });
      })();`);
      await page.goto(`${origin}/panel.html`);
      await page.waitForFunction(() => (window as unknown as { __posted: Array<{ type: string }> }).__posted.some((m) => m.type === 'ready'));
      if (opts.dark) {
        await page.evaluate((vars) => {
          for (const [k, v] of Object.entries(vars)) document.documentElement.style.setProperty(k, v);
          document.body.classList.add('vscode-dark');
        }, vscodeDark);
      }
      return { context, page, seen };
    }

    const posted = (page: Page) => page.evaluate(() => (window as unknown as { __posted: Array<Record<string, unknown>> }).__posted);
    const send = (page: Page, message: unknown) => page.evaluate((m) => window.postMessage(m, '*'), message);

    async function lastWhatIf(page: Page, count: number): Promise<{ removed: string[]; requestId: number }> {
      await page.waitForFunction((n) => (window as unknown as { __posted: Array<{ type: string }> }).__posted.filter((m) => m.type === 'whatIf').length >= n, count);
      const all = (await posted(page)).filter((m) => m.type === 'whatIf');
      return all[all.length - 1] as unknown as { removed: string[]; requestId: number };
    }

    it('renders a posted showReport; a toggle posts whatIf; only the latest whatIfResult counts; buttons and hubs post', async () => {
      const report = fixture('report-small.json');
      const { context, page, seen } = await openPanel();
      try {
        await send(page, { type: 'showReport', report });
        await page.waitForSelector('.lw-tile');
        assert.equal(await stripValue(page, 'backgroundSimilarity', 'suggested'), '0.0871');
        assert.equal(await page.locator('[data-role="selection"]').count(), 0, 'no selection column before a what-if');

        // Uncheck "the" (suggested) and check "account" (kept).
        await page.locator('tr[data-term="the"] input[type=checkbox]').uncheck();
        await page.locator('tr[data-term="account"] input[type=checkbox]').check();
        const expected = report.suggestions.filter((t) => t !== 'the').concat('account');
        // The first click is sent at once; the second waits for its answer (coalescing), and
        // goes out when that answer arrives, which is then stale and ignored.
        const first = await lastWhatIf(page, 1);
        assert.deepEqual([...first.removed].sort(), report.suggestions.filter((t) => t !== 'the').sort());
        assert.equal((await posted(page)).filter((m) => m.type === 'whatIf').length, 1, 'one request in flight at a time');
        const firstMeasures: Measures = { ...report.suggested, backgroundSimilarity: 0.777 };
        await send(page, { type: 'whatIfResult', removed: first.removed, measures: firstMeasures, requestId: first.requestId });
        const request = await lastWhatIf(page, 2);
        assert.deepEqual([...request.removed].sort(), [...expected].sort());
        assert.equal(await page.locator('[data-role="selection"]').count(), 0, 'the stale answer is not shown');

        // A stale answer (older requestId) is ignored; the latest one shows as "your selection".
        const measures = (bg: number): Measures => ({ ...report.suggested, backgroundSimilarity: bg, neighborStandout: 2.1 });
        await send(page, { type: 'whatIfResult', removed: request.removed, measures: measures(0.5), requestId: request.requestId - 1 });
        await send(page, { type: 'whatIfResult', removed: request.removed, measures: measures(0.1234), requestId: request.requestId });
        await page.waitForSelector('[data-measure="backgroundSimilarity"] [data-role="selection"]');
        assert.equal(await stripValue(page, 'backgroundSimilarity', 'selection'), '0.123');
        // The sticky toolbar's one-line summary follows the selection too.
        assert.equal(await page.locator('.lw-toolbar [data-measure="backgroundSimilarity"] [data-role="live"]').textContent(), '0.123');
        // 2.61 → 2.1 is a drop in standout: worse.
        assert.equal(await page.locator('[data-measure="neighborStandout"] .lw-v--selection').getAttribute('data-verdict'), 'worse');
        await send(page, { type: 'whatIfResult', removed: request.removed, measures: measures(0.9), requestId: request.requestId - 1 });
        await page.waitForTimeout(50);
        assert.equal(await stripValue(page, 'backgroundSimilarity', 'selection'), '0.123');

        // Add and export post what the host needs.
        await page.click('button:has-text("Add checked terms to stop list")');
        await page.click('button:has-text("Export HTML report")');
        const tail = (await posted(page)).slice(-2);
        assert.deepEqual((tail[0] as { terms: string[] }).terms.sort(), [...expected].sort());
        assert.equal(tail[0]!.type, 'addTerms');
        assert.deepEqual(tail[1], { type: 'exportHtml' });

        // Hubs: a click and Enter on a focused row both ask the host to reveal the line.
        await page.click(`button.lw-hub[data-line="${report.hubs[0]!.line}"]`);
        await page.focus(`button.lw-hub[data-line="${report.hubs[2]!.line}"]`);
        await page.keyboard.press('Enter');
        const reveals = (await posted(page)).filter((m) => m.type === 'revealLine');
        assert.deepEqual(reveals, [
          { type: 'revealLine', line: report.hubs[0]!.line },
          { type: 'revealLine', line: report.hubs[2]!.line },
        ]);

        // An error from the host (it may quote corpus text) is shown as text.
        const message = 'cannot read line 3: <img src=x onerror="window.__lwPwned=1">';
        await send(page, { type: 'error', message });
        assert.equal(await page.locator('.lw-error').textContent(), message);
        assert.equal(await page.locator('img').count(), 0);
        assert.deepEqual(seen.csp, []);
        assert.deepEqual(seen.errors, []);
      } finally {
        await context.close();
      }
    });

    it('an answer for another selection, drawn into the strip in place, gives the strip a fresh render gives', async () => {
      // The in-place update (health-strip updateStripSelection) must not drift from the full
      // render; compared as HTML with the generated ids taken out. Common practice, no source.
      const report = fixture('report-small.json');
      const { context, page, seen } = await openPanel();
      const stripHtml = () =>
        page.evaluate(() => (document.querySelector('.lw-strip') as unknown as { outerHTML: string }).outerHTML.replace(/ (id|aria-labelledby|aria-describedby)="[^"]*"/g, ''));
      try {
        await send(page, { type: 'showReport', report });
        await page.waitForSelector('.lw-tile');
        await page.locator('tr[data-term="the"] input[type=checkbox]').uncheck();
        const first = await lastWhatIf(page, 1);
        await send(page, { type: 'whatIfResult', removed: first.removed, measures: { ...report.suggested, backgroundSimilarity: 0.4321 }, requestId: first.requestId });
        await page.waitForSelector('.lw-strip:not([data-pending])');
        const built = await page.evaluateHandle(() => document.querySelector('.lw-strip'));
        await page.locator('tr[data-term="please"] input[type=checkbox]').uncheck();
        const second = await lastWhatIf(page, 2);
        // The baseline's measures as the answer: every value, mark, verdict and detail differs from the first.
        await send(page, { type: 'whatIfResult', removed: second.removed, measures: report.baseline, requestId: second.requestId });
        await page.waitForSelector('.lw-strip:not([data-pending])');
        assert.equal(await stripValue(page, 'backgroundSimilarity', 'selection'), await stripValue(page, 'backgroundSimilarity', 'baseline'));
        assert.ok(await page.evaluate((b) => b === document.querySelector('.lw-strip'), built), 'the strip was updated, not built again');
        const inPlace = await stripHtml();
        // The same Report again keeps the view state's selection and its measures: a fresh strip.
        await send(page, { type: 'showReport', report });
        await page.waitForFunction((b) => document.querySelector('.lw-strip') !== b, built);
        assert.equal(inPlace, await stripHtml());
        assert.deepEqual(seen.errors, []);
      } finally {
        await context.close();
      }
    });

    it("draws a what-if answer's charts with the strip when they are in view, and after the next frame when scrolled away", async () => {
      // Drawing charts nobody can see made the answer's frame wait for chart.js (issue 10's click).
      const report = fixture('report-small.json');
      const { context, page, seen } = await openPanel({ height: 300 });
      // Posts an answer and reads, in its own task (a listener added after the panel's), which charts wait.
      const answer = (message: unknown): Promise<string[]> =>
        page.evaluate(`new Promise((done) => {
          window.addEventListener('message', () => done([...document.querySelectorAll('.lw-chart[data-stale]')].map((f) => f.dataset.chart)), { once: true });
          window.postMessage(${JSON.stringify(message)}, '*');
        })`);
      const similarityImage = () => page.evaluate(`document.querySelector('.lw-chart[data-chart="similarity"] canvas').toDataURL()`);
      try {
        await send(page, { type: 'showReport', report });
        await page.waitForSelector('.lw-tile');
        // Scrolled to the top: the charts are far below the 300 px view.
        await page.locator('tr[data-term="the"] input[type=checkbox]').uncheck();
        await page.evaluate(() => window.scrollTo(0, 0));
        const first = await lastWhatIf(page, 1);
        const before = await similarityImage();
        const waiting = await answer({ type: 'whatIfResult', removed: first.removed, measures: report.baseline, requestId: first.requestId });
        assert.deepEqual(waiting.sort(), ['kOccurrence', 'similarity']);
        await page.waitForSelector('.lw-charts[data-stale="0"]');
        assert.notEqual(await similarityImage(), before, 'drawn after the frame');

        // Scrolled to the charts: drawn in the answer's own task.
        await page.evaluate(`document.querySelector('.lw-chart[data-chart="similarity"]').scrollIntoView({ block: 'start' })`);
        await page.locator('tr[data-term="please"] input[type=checkbox]').uncheck();
        await page.evaluate(`document.querySelector('.lw-chart[data-chart="similarity"]').scrollIntoView({ block: 'start' })`);
        const second = await lastWhatIf(page, 2);
        const shown = await similarityImage();
        const waitingInView = await answer({ type: 'whatIfResult', removed: second.removed, measures: report.suggested, requestId: second.requestId });
        assert.ok(!waitingInView.includes('similarity'), `the chart in view waited: ${waitingInView.join(', ')}`);
        assert.notEqual(await similarityImage(), shown);
        assert.deepEqual(seen.errors, []);
      } finally {
        await context.close();
      }
    });

    it('a pointer resting on a toggle prefetches its what-if; the click then shows that answer at once, asks the host to adopt it, and never shows an answer for another state', async () => {
      // The contract is issue 10's design (speculative answers on hover); common practice, no source.
      const report = fixture('report-small.json');
      const { context, page, seen } = await openPanel();
      try {
        await send(page, { type: 'showReport', report });
        await page.waitForSelector('.lw-tile');
        const prefetches = async () => (await posted(page)).filter((m) => m.type === 'whatIfPrefetch') as unknown as Array<{ removed: string[]; requestId: number }>;
        const clicks = async () => (await posted(page)).filter((m) => m.type === 'whatIf') as unknown as Array<{ removed: string[]; requestId: number }>;
        const prefetchOf = async (removed: string[]) => {
          const want = [...removed].sort().join(',');
          await page.waitForFunction((w) => (window as unknown as { __posted: Array<{ type: string; removed?: string[] }> }).__posted.some((m) => m.type === 'whatIfPrefetch' && [...m.removed!].sort().join(',') === w), want);
          return (await prefetches()).filter((m) => [...m.removed].sort().join(',') === want).pop()!;
        };
        const measures = (bg: number): Measures => ({ ...report.suggested, backgroundSimilarity: bg });
        const withoutThe = report.suggestions.filter((t) => t !== 'the');

        // Resting on a cell without a toggle asks nothing; resting on "the" asks for the selection without it.
        await page.hover('tr[data-term="order"] td:nth-child(2)');
        await page.waitForTimeout(200);
        assert.equal((await prefetches()).length, 0, 'no prefetch away from the toggles');
        await page.hover('tr[data-term="the"] input.lw-check');
        const ahead = await prefetchOf(withoutThe);
        assert.equal((await clicks()).length, 0, 'a prefetch is not a click');
        await send(page, { type: 'prefetchResult', removed: ahead.removed, measures: measures(0.4321), requestId: ahead.requestId, engineMs: 5 });
        await page.waitForTimeout(50);
        assert.equal(await page.locator('[data-role="selection"]').count(), 0, 'a prefetched answer is not shown before its click');

        // The click shows it at once (no answer sent yet), and asks the host for the same selection.
        await page.locator('tr[data-term="the"] input.lw-check').uncheck();
        assert.equal(await stripValue(page, 'backgroundSimilarity', 'selection'), '0.432');
        assert.equal(await page.locator('.lw-strip .lw-pending').count(), 0);
        const commit = (await clicks()).pop()!;
        assert.deepEqual([...commit.removed].sort(), [...withoutThe].sort());
        await send(page, { type: 'whatIfResult', removed: commit.removed, measures: measures(0.4321), requestId: commit.requestId });

        // Any state change drops what was asked before it: rest on "account", click "please" and
        // back (every toggle is a new state, even one that returns to a selection), then the
        // answer for "account" asked before arrives; clicking "account" waits for the host.
        await page.hover('tr[data-term="account"] input.lw-check');
        const stale = await prefetchOf([...withoutThe, 'account']);
        const click = (term: string) => page.evaluate((t) => (document.querySelector(`tr[data-term="${t}"] input.lw-check`) as { click(): void }).click(), term);
        await click('please');
        await click('please');
        await send(page, { type: 'prefetchResult', removed: stale.removed, measures: measures(0.9999), requestId: stale.requestId });
        // The second toggle waited for the first's answer (coalescing), then went out.
        const sentBefore = (await clicks()).length;
        const away = (await clicks()).pop()!;
        await send(page, { type: 'whatIfResult', removed: away.removed, measures: measures(0.5555), requestId: away.requestId });
        const back = await lastWhatIf(page, sentBefore + 1);
        assert.deepEqual([...back.removed].sort(), [...withoutThe].sort());
        // Back at a selection the strip already shows: nothing is waited for or drawn again.
        await send(page, { type: 'whatIfResult', removed: back.removed, measures: measures(0.4321), requestId: back.requestId });
        await page.waitForSelector('.lw-strip:not([data-pending="true"])');
        assert.equal(await stripValue(page, 'backgroundSimilarity', 'selection'), '0.432');
        await click('account');
        // The waiting mark comes once the wait has lasted a moment (panel-app PENDING_MARK_AFTER_MS).
        await page.waitForSelector('.lw-strip .lw-pending', { timeout: 2000 });
        assert.equal(await page.locator('.lw-strip .lw-pending').count(), 1, 'the earlier state\'s prefetch is not used');
        assert.equal(await stripValue(page, 'backgroundSimilarity', 'selection'), '0.432');

        // A click whose prefetch is still on its way shows that prefetch's answer when it comes.
        const withAccount = [...withoutThe, 'account'];
        const accountClick = (await clicks()).pop()!;
        assert.deepEqual([...accountClick.removed].sort(), [...withAccount].sort());
        await page.hover('tr[data-term="order"] input.lw-check');
        const orderAhead = await prefetchOf([...withAccount, 'order']);
        await click('order');
        await send(page, { type: 'whatIfResult', removed: accountClick.removed, measures: measures(0.3333), requestId: accountClick.requestId });
        await send(page, { type: 'prefetchResult', removed: orderAhead.removed, measures: measures(0.1111), requestId: orderAhead.requestId });
        await page.waitForSelector('.lw-strip:not([data-pending="true"])');
        assert.equal(await stripValue(page, 'backgroundSimilarity', 'selection'), '0.111');
        assert.deepEqual(seen.errors, []);
      } finally {
        await context.close();
      }
    });

    it('a button pressed on a toggle asks for its what-if at once, without the hover\'s rest; the right button and a cell without a toggle ask nothing', async () => {
      // Issue 10's design (a click's answer asked as early as the panel can know it); common practice, no source.
      const report = fixture('report-small.json');
      const { context, page, seen } = await openPanel();
      try {
        await send(page, { type: 'showReport', report });
        await page.waitForSelector('.lw-tile');
        const prefetches = async () => (await posted(page)).filter((m) => m.type === 'whatIfPrefetch') as unknown as Array<{ removed: string[] }>;
        // Synthetic events: no pointer movement comes before them, so no hover timer runs.
        await page.dispatchEvent('tr[data-term="the"] input.lw-check', 'pointerdown', { button: 2 });
        await page.dispatchEvent('tr[data-term="order"] td:nth-child(2)', 'pointerdown', { button: 0 });
        assert.equal((await prefetches()).length, 0);
        await page.dispatchEvent('tr[data-term="the"] input.lw-check', 'pointerdown', { button: 0 });
        // Asked inside the event's own handler: no wait at all.
        const asked = await prefetches();
        assert.equal(asked.length, 1);
        assert.deepEqual([...asked[0]!.removed].sort(), report.suggestions.filter((t) => t !== 'the').sort());
        // Space down on a toggle (the box toggles when it comes up) asks for that box's; sent
        // without focusing the box, whose focus alone would ask after the hover's rest.
        await page.dispatchEvent('tr[data-term="order"] input.lw-check', 'keydown', { key: ' ' });
        const afterKey = await prefetches();
        assert.ok(afterKey.some((m) => [...m.removed].sort().join(',') === [...report.suggestions, 'order'].sort().join(',')), JSON.stringify(afterKey));
        assert.deepEqual(seen.errors, []);
      } finally {
        await context.close();
      }
    });

    it('says when the review is out of date, counts the suggestions added since, and offers to review again', async () => {
      const report = fixture('report-small.json');
      const { context, page, seen } = await openPanel();
      try {
        await send(page, { type: 'showReport', report });
        await page.waitForSelector('.lw-tile');
        assert.equal(await page.locator('.lw-stale').count(), 0, 'no banner while up to date');
        await send(page, { type: 'stale', reason: 'stoplist.txt changed', added: report.suggestions });
        await page.waitForSelector('.lw-stale');
        assert.match((await page.locator('.lw-stale').textContent()) ?? '', /Out of date: stoplist\.txt changed since this review/);
        assert.match((await page.locator('.lw-strip__legend').textContent()) ?? '', /with \d+ suggested terms\(all added to the stop list since\)/);
        await page.click('.lw-stale button:has-text("Review again")');
        assert.deepEqual((await posted(page)).slice(-1), [{ type: 'reviewAgain' }]);
        await send(page, { type: 'stale', reason: null, added: [] });
        await page.waitForFunction(() => document.querySelectorAll('.lw-stale').length === 0);
        assert.deepEqual(seen.errors, []);
      } finally {
        await context.close();
      }
    });

    it('restores sort, filter and toggles from the saved state when the panel comes back', async () => {
      const report = fixture('report-small.json');
      const first = await openPanel();
      let saved: unknown;
      try {
        await send(first.page, { type: 'showReport', report });
        await first.page.waitForSelector('.lw-tile');
        await first.page.click('button[data-sort="term"]');
        await first.page.locator('tr[data-term="please"] input[type=checkbox]').uncheck();
        await lastWhatIf(first.page, 1);
        saved = await first.page.evaluate(() => (window as unknown as { __state: unknown }).__state);
      } finally {
        await first.context.close();
      }
      const second = await openPanel({ state: saved });
      try {
        await send(second.page, { type: 'showReport', report });
        await second.page.waitForSelector('.lw-tile');
        assert.equal(await second.page.locator('th.lw-col-term').getAttribute('aria-sort'), 'ascending');
        assert.equal(await second.page.locator('tr[data-term="please"] input[type=checkbox]').isChecked(), false);
        assert.equal(await second.page.locator('tr[data-term="the"] input[type=checkbox]').isChecked(), true);
        // The restored selection differs from the suggestions, so its measures are asked for again.
        const request = await lastWhatIf(second.page, 1);
        assert.ok(!request.removed.includes('please') && request.removed.includes('the'));
      } finally {
        await second.context.close();
      }
    });

    it('takes its colours from VS Code theme variables (dark, narrow side bar)', async () => {
      const report = fixture('report-small.json');
      const { context, page, seen } = await openPanel({ dark: true, width: 440 });
      try {
        const verdict = {
          outcome: 'helps',
          headline: 'Stopping the suggested terms makes nearest neighbours stand out more.',
          estimate: { measure: 'Neighbour standout', change: 0.42, low: 0.3, high: 0.55, draws: 20, method: 'seeds' },
          caveats: [{ measure: 'Relative contrast', sentence: 'falls, as it does on text when neighbours improve.' }],
        };
        await send(page, { type: 'showReport', report: { ...report, verdict } });
        await page.waitForSelector('.lw-tile');
        // The verdict and the loudest terms come first, right under the header.
        const order = await page.evaluate(() => Array.from(document.querySelectorAll('.lw-main > *'), (e) => (e as unknown as { className: string }).className));
        assert.match(order[1] ?? '', /lw-verdict/, `second block is ${order[1]}`);
        assert.equal(await page.locator('.lw-verdict__estimate').textContent(), 'Neighbours stand out more with the suggested list (without labels, a proxy): Neighbour standout +0.42 (+0.30 to +0.55 over 20 re-drawn samples).');
        // Narrow: term, pull share and status stay; df and the rest open under the term.
        assert.equal(await page.locator('tr[data-term="regards"] .lw-col-df').isVisible(), false);
        assert.equal(await page.locator('tr[data-term="regards"] .lw-col-pullShare').isVisible(), true);
        assert.equal(await page.locator('tr[data-term="regards"] .lw-col-status').isVisible(), true);
        const tableWidth = await page.locator('.lw-table').evaluate((t) => t.getBoundingClientRect().width);
        assert.ok(tableWidth <= 440, `the term table is ${tableWidth} px wide in a 440 px panel`);
        await page.locator('tr[data-term="regards"] .lw-rowmore__term').click();
        assert.equal(await page.locator('tr[data-term="regards"] .lw-rowmore__facts').isVisible(), true);
        await page.locator('tr[data-term="regards"]').scrollIntoViewIfNeeded();
        await shot(page, 'panel-dark-narrow-terms.png', false);
        // A measure's meaning is one click away.
        await page.locator('.lw-tile[data-measure="neighborStandout"] .lw-meaning__toggle').click();
        assert.equal(await page.locator('.lw-tile[data-measure="neighborStandout"] .lw-meaning__text').isVisible(), true);
        await page.locator('tr[data-term="regards"] input[type=checkbox]').uncheck();
        const request = await lastWhatIf(page, 1);
        await send(page, { type: 'whatIfResult', removed: request.removed, measures: { ...report.suggested, backgroundSimilarity: 0.0912, neighborStandout: 3.71 }, requestId: request.requestId });
        await page.waitForSelector('[data-role="selection"]');
        const bg = await page.evaluate(() => getComputedStyle(document.body).backgroundColor);
        assert.equal(bg, 'rgb(31, 31, 31)', 'body uses --vscode-editor-background (#1f1f1f)');
        await page.waitForTimeout(150); // charts rebuild after the theme observer's short delay
        await page.evaluate(() => window.scrollTo(0, 0));
        await shot(page, 'panel-dark-narrow.png');
        await shot(page, 'panel-dark-narrow-top.png', false);
        await page.setViewportSize({ width: 1100, height: 900 });
        await page.waitForTimeout(150);
        await page.evaluate(() => window.scrollTo(0, 0));
        await shot(page, 'panel-dark-wide.png');
        assert.deepEqual(seen.csp, []);
        assert.deepEqual(seen.errors, []);
      } finally {
        await context.close();
      }
    });
  });
});
