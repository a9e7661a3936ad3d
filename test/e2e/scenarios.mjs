// Runs the e2e scenarios against a code-server that test/e2e/run.sh started. Each scenario does
// what a user would do, asserts what the user would see, and saves a screenshot; the last line
// printed is "N passed, N failed". Exit code 1 on any failure.
//
// Environment (set by run.sh): E2E_PORT, E2E_WORKSPACE, E2E_REPO; E2E_ONLY=<substring> filters.
import { chromium } from 'playwright-core';
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { waitForWorkbench, clearNotifications } from './lib/workbench.mjs';
import { named } from './lib/wait-until.mjs';
import { scenarios } from './scenario-list.mjs';

const port = requireEnv('E2E_PORT');
const workspace = requireEnv('E2E_WORKSPACE');
const repo = requireEnv('E2E_REPO');
const only = process.env.E2E_ONLY ?? '';
const screenshotsDir = path.join(repo, 'test', 'e2e', 'screenshots');
mkdirSync(screenshotsDir, { recursive: true });

// A stray rejection must fail a scenario, not end the run without its summary line.
process.on('unhandledRejection', (e) => console.log(`  (unhandled rejection: ${String(e?.message ?? e).split('\n')[0]})`));

// A scenario that hangs must not hold the whole run: each gets this long, then counts as failed.
const SCENARIO_TIMEOUT_MS = 300000; // the 100k what-if scenario reviews 100k documents first (~150 s on a busy 2-core machine)
// The whole e2e run must stay well inside 20 minutes on a fresh 2-core machine, editor install
// included: past this budget the remaining scenarios are reported as failed without running.
const RUN_BUDGET_MS = 15 * 60 * 1000;
const runStarted = Date.now();

// launchServer rather than launch: playwright starts chromium in a process group of its own, and
// run.sh needs its id to take it down if this runner is killed before it can close the browser.
const server = await chromium.launchServer({
  executablePath: process.env.E2E_CHROMIUM ?? '/usr/bin/chromium',
  args: ['--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-background-networking',
    '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-crash-reporter', '--disable-breakpad'],
  timeout: 60000,
});
const chromiumPid = server.process().pid;
if (process.env.E2E_TMP && chromiumPid) writeFileSync(path.join(process.env.E2E_TMP, 'chromium.pid'), `${chromiumPid}\n`);
const browser = await chromium.connect(server.wsEndpoint(), { timeout: 60000 });
let passed = 0;
let failed = 0;
try {
  const context = await browser.newContext({ viewport: { width: 1600, height: 1000 }, acceptDownloads: false });
  context.setDefaultTimeout(15000);
  const page = await context.newPage();
  const url = `http://127.0.0.1:${port}/?folder=${encodeURIComponent(workspace)}`;
  await named(`loading ${url}`, page.goto(url, { waitUntil: 'domcontentloaded', timeout: 60000 }));
  await waitForWorkbench(page);
  const ctx = { page, browser, port, workspace, repo, screenshotsDir };

  const selected = scenarios.filter((s) => s.name.includes(only));
  for (const [index, scenario] of selected.entries()) {
    const shot = path.join(screenshotsDir, `${String(index + 1).padStart(2, '0')}-${scenario.slug}.png`);
    const started = Date.now();
    let error = null;
    let shotTaken = false;
    // A scenario may take its screenshot at the telling moment, before it tidies up.
    ctx.screenshot = async () => {
      await page.screenshot({ path: shot });
      shotTaken = true;
    };
    try {
      if (Date.now() - runStarted > RUN_BUDGET_MS) throw new Error(`not run: the e2e budget of ${RUN_BUDGET_MS / 60000} minutes is spent`);
      await withTimeout(scenario.run(ctx), SCENARIO_TIMEOUT_MS, `scenario "${scenario.name}"`);
    } catch (e) {
      error = e;
    }
    if (error || !shotTaken) await page.screenshot({ path: shot }).catch((e) => console.log(`  (screenshot failed: ${e.message.split('\n')[0]})`));
    const seconds = ((Date.now() - started) / 1000).toFixed(1);
    if (error) {
      failed++;
      console.log(`FAIL ${scenario.name} (${seconds} s): ${String(error.message ?? error).split('\n')[0]}`);
    } else {
      passed++;
      console.log(`PASS ${scenario.name} (${seconds} s)`);
    }
    console.log(`  screenshot: ${shot}`);
    await resetWorkbench(page);
  }
} catch (e) {
  failed++;
  console.log(`FAIL e2e setup: ${String(e.message ?? e).split('\n')[0]}`);
} finally {
  await browser.close().catch(() => {});
  await server.close().catch(() => {});
}
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);

/** Back to a plain workbench between scenarios, whatever the last one left open. */
async function resetWorkbench(page) {
  try {
    for (let i = 0; i < 3; i++) await page.keyboard.press('Escape');
    await clearNotifications(page);
  } catch {
    // A broken workbench shows up in the next scenario's own assertions.
  }
}

function withTimeout(promise, ms, what) {
  let timer;
  const timeout = new Promise((_, reject) => {
    timer = setTimeout(() => reject(new Error(`${what} took longer than ${ms / 1000} s`)), ms);
  });
  return Promise.race([promise, timeout]).finally(() => clearTimeout(timer));
}

function requireEnv(name) {
  const value = process.env[name];
  if (!value) {
    console.error(`scenarios.mjs: ${name} is not set; run it through test/e2e/run.sh (npm run e2e)`);
    process.exit(2);
  }
  return value;
}
