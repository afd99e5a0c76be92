/**
 * Drives the VS Code workbench that code-server serves, in Debian's Chromium through
 * playwright-core: launching a loopback-only browser, opening files, running commands, reading
 * what the workbench shows. Everything here reads the real DOM; nothing calls into VS Code.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import * as path from 'node:path';

export const VIEWPORT = { width: 1280, height: 800 };

/** Chromium with a fresh profile under the run folder, that resolves nothing but loopback. */
export async function launchBrowser({ toolsDir, runDir, env }) {
  const { chromium } = createRequire(path.join(toolsDir, 'package.json'))('playwright-core');
  const profile = mkdtempSync(path.join(runDir, 'chromium-profile-'));
  // Playwright refuses --user-data-dir among the arguments; a persistent context is the same thing.
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    env,
    headless: true,
    viewport: VIEWPORT,
    args: [
      '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync',
      '--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE 127.0.0.1, EXCLUDE localhost',
      // WebGL for the structure view without a GPU: ANGLE on SwiftShader.
      '--use-angle=swiftshader', '--enable-unsafe-swiftshader',
    ],
  });
  return {
    context,
    async close() {
      await context.close().catch(() => {});
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Opens the workbench on a folder and waits until the explorer lists it (server connected). */
export async function openWorkbench(context, url, folder, log) {
  const page = context.pages()[0] ?? (await context.newPage());
  page.on('pageerror', (error) => log(`[page error] ${error.message}`));
  page.on('request', (request) => {
    const address = request.url();
    if (!/^(https?|wss?):\/\/(127\.0\.0\.1|localhost)[:/]/.test(address) && !/^(data|blob|vscode-[a-z-]+|about):/.test(address)) log(`[non-loopback request] ${address}`);
  });
  const started = Date.now();
  await page.goto(`${url}/?folder=${encodeURIComponent(folder)}`, { waitUntil: 'domcontentloaded' });
  await page.locator('.monaco-workbench').waitFor({ timeout: 60_000 });
  await page.locator('.explorer-folders-view .monaco-list-row').first().waitFor({ timeout: 60_000 });
  return { page, readyMs: Date.now() - started };
}

/** Text of an element with the non-breaking spaces the editor renders turned into spaces. */
export function plain(text) {
  return (text ?? '').replace(/\u00a0/g, ' ');
}

const QUICK_INPUT = '.quick-input-widget';

/**
 * Presses a shortcut that opens a quick input and waits for it. The workbench can swallow the
 * shortcut while focus is still leaving a webview (seen after the structure view's clicks): it is
 * pressed again, up to three times, before the wait fails.
 */
async function openQuickInput(page, shortcut) {
  for (let attempt = 1; ; attempt++) {
    await page.keyboard.press(shortcut);
    try {
      await page.locator(`${QUICK_INPUT} input`).waitFor({ state: 'visible', timeout: 5_000 });
      return;
    } catch (error) {
      if (attempt === 3) throw error;
    }
  }
}

async function waitQuickInput(page) {
  await page.locator(`${QUICK_INPUT} input`).waitFor({ state: 'visible', timeout: 15_000 });
}

/** Closes whatever quick input, menu or widget is open. */
export async function dismiss(page) {
  for (let i = 0; i < 3; i++) await page.keyboard.press('Escape');
}

/**
 * Opens a workspace file with Quick Open (Ctrl+P) and waits for its editor. Returns the time
 * (Date.now()) at which Enter was pressed, the moment the file is opened.
 */
export async function openFile(page, name) {
  const tab = page.locator(`.tabs-container .tab.active[aria-label*="${name}"]`);
  let lastError;
  // Quick Open fills its list while it searches; a second try covers an Enter that landed on
  // a list about to be replaced.
  for (let attempt = 1; attempt <= 2; attempt++) {
    try {
      await dismiss(page);
      await page.keyboard.press('Control+P');
      await waitQuickInput(page);
      await page.keyboard.type(name, { delay: 10 });
      await page.locator(`${QUICK_INPUT} .monaco-list-row.focused[aria-label*="${name}"]`).first().waitFor({ timeout: 15_000 });
      const opened = Date.now();
      await page.keyboard.press('Enter');
      await tab.waitFor({ timeout: 10_000 });
      await activeEditor(page).locator('.view-lines .view-line').first().waitFor({ timeout: 15_000 });
      return opened;
    } catch (error) {
      lastError = error;
    }
  }
  throw new Error(`could not open ${name} with Quick Open: ${lastError.message.split('\n')[0]}`);
}

/** Runs a command from the command palette by its exact title. */
export async function runCommand(page, title) {
  await dismiss(page);
  await openQuickInput(page, 'Control+Shift+P');
  await page.keyboard.type(title, { delay: 10 });
  const row = page.locator(`${QUICK_INPUT} .monaco-list-row`).filter({ has: page.locator('.label-name', { hasText: new RegExp(`^${escapeRegExp(title)}$`) }) }).first();
  await row.waitFor({ timeout: 15_000 });
  await row.click();
  await page.locator(QUICK_INPUT).waitFor({ state: 'hidden', timeout: 5_000 });
}

export function escapeRegExp(text) {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/** The editor of the active group. */
export function activeEditor(page) {
  return page.locator('.editor-group-container.active .editor-instance .monaco-editor').first();
}

/** Moves the cursor with Go to Line (Ctrl+G), `line` and `column` 1-based. */
export async function goTo(page, line, column = 1) {
  await dismiss(page);
  await openQuickInput(page, 'Control+G');
  await page.keyboard.type(`${line}:${column}`, { delay: 10 });
  await page.keyboard.press('Enter');
  await page.locator(`${QUICK_INPUT}`).waitFor({ state: 'hidden', timeout: 5_000 });
}

/**
 * The visible lines of the active editor, top to bottom, as the user sees them. With
 * `withInjected: false` the text the editor injects between characters (inlay hints) is left out,
 * which leaves the document's own text.
 */
export async function visibleLines(page, { withInjected = true } = {}) {
  return activeEditor(page).evaluate((editor, withInjected) => {
    const lines = [...editor.querySelectorAll('.view-lines .view-line')].map((line) => {
      let text = '';
      const walk = (node) => {
        if (node.nodeType === Node.TEXT_NODE) text += node.textContent;
        else if (withInjected || ![...node.classList].some((name) => name.startsWith('dyn-rule-'))) node.childNodes.forEach(walk);
      };
      walk(line);
      return { top: parseFloat(line.style.top), text: text.replace(/\u00a0/g, ' ') };
    });
    return lines.sort((a, b) => a.top - b.top).map((line) => line.text);
  }, withInjected);
}

/** Shows the Problems panel (Ctrl+Shift+M) unless it is showing. */
export async function showProblems(page) {
  if (!(await page.locator('.markers-panel').isVisible().catch(() => false))) await page.keyboard.press('Control+Shift+M');
  await page.locator('.markers-panel').waitFor({ state: 'visible', timeout: 10_000 });
}

/** Types a filter into the Problems panel ('' clears it). */
export async function filterProblems(page, text) {
  const input = page.locator('.part.panel input[aria-label="Filter Problems"]');
  await input.waitFor({ state: 'visible', timeout: 10_000 });
  await input.fill(text);
  // Back to the editor: an Escape in the filter box would clear it.
  await page.locator('.editor-group-container.active .tabs-container .tab.active').click();
}

/**
 * Waits until a visible line of the active editor (its own text, without inlay hints) passes
 * the test; returns that line.
 */
export async function waitForLine(page, test, timeout = 20_000) {
  const deadline = Date.now() + timeout;
  let lines = [];
  while (Date.now() < deadline) {
    lines = await visibleLines(page, { withInjected: false });
    const found = lines.find(test);
    if (found !== undefined) return found;
    await page.waitForTimeout(100);
  }
  throw new Error(`no such line within ${timeout} ms among:\n${lines.join('\n')}`);
}

/** Hides the panel area (Ctrl+J toggles it) unless it is hidden. */
export async function hidePanel(page) {
  if (await page.locator('.part.panel').isVisible().catch(() => false)) await page.keyboard.press('Control+J');
  await page.locator('.part.panel').waitFor({ state: 'hidden', timeout: 10_000 });
}

/** Hides the primary side bar (Ctrl+B toggles it) unless it is hidden. */
export async function hideSideBar(page) {
  if (await page.locator('.part.sidebar').isVisible().catch(() => false)) await page.keyboard.press('Control+B');
  await page.locator('.part.sidebar').waitFor({ state: 'hidden', timeout: 10_000 });
}

/**
 * The accessible labels of every row of a virtualised list (Problems, suggestions ...): the
 * list renders only the rows in view, so this scrolls it through, top to bottom, and back.
 */
export async function allRowLabels(page, container) {
  const list = page.locator(`${container} .monaco-list`).first();
  await list.waitFor({ state: 'visible', timeout: 10_000 });
  const box = await list.boundingBox();
  await page.mouse.move(box.x + box.width / 2, box.y + Math.min(box.height / 2, 40));
  const seen = [];
  let unchanged = 0;
  for (let i = 0; i < 100 && unchanged < 3; i++) {
    const labels = await page.$$eval(`${container} .monaco-list-row`, (rows) => rows.map((row) => row.getAttribute('aria-label') ?? row.textContent));
    const before = seen.length;
    for (const label of labels) if (!seen.includes(label)) seen.push(label);
    unchanged = seen.length === before ? unchanged + 1 : 0;
    await page.mouse.wheel(0, Math.max(60, box.height / 2));
    await page.waitForTimeout(80);
  }
  await page.mouse.wheel(0, -100_000);
  return seen;
}
