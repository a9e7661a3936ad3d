// What a user does in the VS Code workbench, as playwright calls on code-server's page.
// Selectors are the workbench's own class names (stable across 1.9x–1.10x); webview content lives
// in nested iframes, so `findFrame` searches every frame of the page.
import { waitUntil, named } from './wait-until.mjs';

const QUICK_INPUT = '.quick-input-widget';
const QUICK_INPUT_BOX = '.quick-input-widget .quick-input-box input';
const QUICK_INPUT_ROWS = '.quick-input-widget .quick-input-list .monaco-list-row';

export async function waitForWorkbench(page) {
  await named('the workbench (.monaco-workbench)', page.waitForSelector('.monaco-workbench', { timeout: 60000 }));
  // The explorer filling in means the folder is open and the file service answers.
  await named('the explorer listing the workspace', page.waitForSelector('.explorer-folders-view .monaco-list-row', { timeout: 60000 }));
}

/** Labels of the palette rows shown for `title` (the palette is left open). */
export async function paletteRows(page, title) {
  await openPalette(page, '>' + title);
  await page.waitForTimeout(300);
  return page.$$eval(QUICK_INPUT_ROWS, (els) => els.map((e) => e.getAttribute('aria-label') ?? e.textContent ?? ''));
}

/**
 * Waits until the palette lists `title`. Contributed commands appear only once the extension host
 * has started and scanned the extensions, which on a busy machine is many seconds after the
 * workbench itself shows.
 */
export async function waitForCommand(page, title, timeout = 90000) {
  let last = [];
  try {
    await waitUntil(`"${title}" in the command palette`, async () => {
      last = await paletteRows(page, title);
      return last.some((label) => label === title || label.startsWith(title + ','));
    }, { timeout, interval: 1500 });
  } catch (error) {
    throw new Error(`${error.message}; rows shown: ${JSON.stringify(last.slice(0, 5))}`);
  } finally {
    await page.keyboard.press('Escape');
  }
}

/** Runs a command from the palette by its exact title, as a user would. */
export async function runCommand(page, title) {
  await openPalette(page, '>' + title);
  const row = await waitUntil(`the command "${title}" in the palette`, async () => {
    for (const handle of await page.$$(QUICK_INPUT_ROWS)) {
      const label = (await handle.getAttribute('aria-label')) ?? '';
      if (label === title || label.startsWith(title + ',') || label.startsWith(title + ' ')) return handle;
    }
    return null;
  }, { timeout: 15000 });
  await row.click();
  // Closed, or taken over by the command's own quick input (a picker, a save dialog).
  await waitUntil(`the command palette to close after "${title}"`, async () => {
    if (!(await page.isVisible(QUICK_INPUT))) return true;
    const value = await page.inputValue(QUICK_INPUT_BOX).catch(() => '');
    return !value.startsWith('>');
  }, { timeout: 5000 });
}

/** Quick-opens a workspace file by name and waits for its tab to be the active one. */
export async function openFile(page, fileName) {
  await openPalette(page, fileName);
  let seen = [];
  const row = await waitUntil(`"${fileName}" in quick open`, async () => {
    seen = [];
    for (const handle of await page.$$(QUICK_INPUT_ROWS)) {
      // aria-label is "<name>, <description>"; a dirty or decorated file may phrase it otherwise.
      const label = ((await handle.getAttribute('aria-label')) ?? '').trim();
      const name = ((await handle.$eval('.label-name', (e) => e.textContent ?? '').catch(() => '')) || label.split(',')[0]).trim();
      seen.push(label);
      if (name === fileName || label.startsWith(fileName + ',')) return handle;
    }
    return null;
  }, { timeout: 15000 }).catch((e) => {
    throw new Error(`${e.message}; rows: ${JSON.stringify(seen.slice(0, 4))}`);
  });
  await row.click();
  await waitForActiveTab(page, fileName);
  await page.waitForTimeout(300);
}

export async function waitForActiveTab(page, fileName) {
  return waitUntil(`the editor tab "${fileName}" to be active`, async () => {
    const label = await page.$eval('.tabs-container .tab.active', (e) => e.getAttribute('aria-label') ?? '').catch(() => '');
    return label.split(',')[0].trim() === fileName;
  }, { timeout: 15000 });
}

/** Moves the cursor of the active editor to a 1-based line and column (Ctrl+G). */
export async function goToLine(page, line, column) {
  await focusActiveEditor(page);
  await page.keyboard.press('Control+G');
  await named('the "go to line" box', page.waitForSelector(QUICK_INPUT_BOX, { state: 'visible', timeout: 5000 }));
  await page.keyboard.type(`${line}:${column}`);
  await page.keyboard.press('Enter');
  await waitUntil(`the cursor to reach ${line}:${column}`, async () => {
    const status = await page.textContent('.statusbar').catch(() => '');
    return status?.includes(`Ln ${line}, Col ${column}`);
  }, { timeout: 5000 });
}

export async function focusActiveEditor(page) {
  await named('the active text editor', page.click('.editor-group-container.active .monaco-editor .view-lines', { timeout: 5000, position: { x: 5, y: 5 } }));
}

/** Text of the toasts currently shown (errors, progress, information). */
export async function notificationTexts(page) {
  return page.$$eval('.notifications-toasts .notification-toast .notification-list-item-message', (els) => els.map((e) => e.textContent ?? '')).catch(() => []);
}

/** Messages of the error toasts on screen. */
export async function errorNotificationTexts(page) {
  return page.$$eval('.notifications-toasts .notification-toast', (els) => els
    .filter((e) => e.querySelector('.codicon-error, .codicon-notifications-error, .error'))
    .map((e) => e.querySelector('.notification-list-item-message')?.textContent ?? '')).catch(() => []);
}

export async function clearNotifications(page) {
  await runCommand(page, 'Notifications: Clear All Notifications').catch(() => {});
}

/** Finds the frame (at any depth) that holds `selector`; webviews nest two iframes deep. */
export async function findFrame(page, selector, what, timeout = 30000) {
  return waitUntil(what, async () => {
    for (const frame of page.frames()) {
      if (frame.isDetached()) continue;
      const el = await frame.$(selector).catch(() => null);
      if (el) return frame;
    }
    return null;
  }, { timeout });
}

/** Whether the workbench still responds: the palette opens and closes. */
export async function workbenchResponds(page) {
  await openPalette(page, '>');
  await page.keyboard.press('Escape');
  return waitUntil('the command palette to close', async () => !(await page.isVisible(QUICK_INPUT)), { timeout: 5000 });
}

async function openPalette(page, text) {
  if (await page.isVisible(QUICK_INPUT)) await page.keyboard.press('Escape');
  // F1 can be swallowed while the workbench is still restoring focus: press it again.
  await waitUntil('the command palette to open (F1)', async () => {
    await page.keyboard.press('F1');
    return page.waitForSelector(QUICK_INPUT_BOX, { state: 'visible', timeout: 4000 }).then(() => true, () => false);
  }, { timeout: 20000, interval: 500 });
  await page.fill(QUICK_INPUT_BOX, text);
}

/** Ctrl+. in the active editor, then picks the code action titled `title` from the menu. */
export async function applyQuickFix(page, title) {
  let labels = [];
  const row = await waitUntil(`the quick fix "${title}" in the Ctrl+. menu`, async () => {
    if (!(await page.isVisible('.action-widget'))) {
      await page.keyboard.press('Control+Period');
      await page.waitForSelector('.action-widget', { state: 'visible', timeout: 3000 }).catch(() => {});
    }
    const rows = await page.$$('.action-widget .monaco-list-row');
    labels = [];
    for (const r of rows) {
      const label = ((await r.getAttribute('aria-label')) ?? (await r.textContent()) ?? '').trim();
      labels.push(label);
      if (label === title || label.startsWith(title)) return r;
    }
    // The provider may answer after the menu opened (the review is still landing): ask again.
    await page.keyboard.press('Escape');
    return null;
  }, { timeout: 30000, interval: 1000 }).catch((e) => {
    throw new Error(`${e.message}; menu showed ${JSON.stringify(labels)}`);
  });
  await row.click();
  await waitUntil('the quick-fix menu to close', async () => !(await page.isVisible('.action-widget')), { timeout: 5000 });
}

/** Ctrl+S on the active editor, waiting until its tab no longer shows unsaved changes. */
export async function saveActiveEditor(page, fileName) {
  await focusActiveEditor(page);
  await page.keyboard.press('Control+S');
  await waitUntil(`"${fileName}" to be saved`, async () => {
    const dirty = await page.$('.tabs-container .tab.active.dirty');
    return dirty === null;
  }, { timeout: 10000 });
}

/** Right-clicks `folder` in the explorer and picks "Review distances" from its context menu. */
export async function reviewFolderFromExplorer(page, folder) {
  const row = await waitUntil(`the folder ${folder} in the explorer`, () => page.$(`.explorer-folders-view .monaco-list-row[aria-label^="${folder}"]`), { timeout: 30000 });
  await row.click({ button: 'right' });
  const item = await waitUntil('"Review distances" in the explorer context menu', async () => {
    for (const handle of await page.$$('.monaco-menu .action-item .action-label')) {
      if (((await handle.textContent()) ?? '').trim() === 'Review distances') return handle;
    }
    return null;
  }, { timeout: 15000 });
  await item.click();
}
