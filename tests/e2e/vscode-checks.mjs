/**
 * The checks in the real VS Code workbench (served by code-server, driven in Chromium). Each
 * check reads what the workbench shows (status bar, Problems panel, hover, suggestions, editor
 * lines, quick input, tabs, the report's webview) and compares it with what the Tessera command
 * line says about the same file, so a wrong figure in the editor fails the check.
 *
 * Every check runs even when an earlier one failed; each leaves a screenshot.
 */
import { copyFileSync, existsSync, mkdirSync, readFileSync, statSync } from 'node:fs';
import * as path from 'node:path';
import { activeEditor, allRowLabels, dismiss, filterProblems, goTo, hidePanel, hideSideBar, openFile, plain, runCommand, showProblems, visibleLines, waitForLine } from './lib/workbench.mjs';
import { sampleCanvas } from './views-checks.mjs';

/** Longest wait for anything the workbench should show; these machines can be busy. */
const WAIT = 30_000;

/** 1-based number of the first line of a file that contains `text`. */
function lineOf(file, text) {
  const index = readFileSync(file, 'utf8').split('\n').findIndex((line) => line.includes(text));
  if (index < 0) throw new Error(`'${text}' not found in ${file}`);
  return index + 1;
}

/** The atom rows of the first structure block in a list of lines (between `structure {` and `}`). */
function geometryRows(lines) {
  const start = lines.findIndex((line) => /^\s*structure(\s+in\s+\w+)?\s*\{\s*$/.test(line));
  const end = lines.findIndex((line, index) => index > start && /^\s*\}\s*$/.test(line));
  if (start < 0 || end < 0) throw new Error(`no structure block in:\n${lines.join('\n')}`);
  return lines.slice(start + 1, end).filter((line) => line.trim() !== '');
}

/** Columns (0-based) where each number of an atom row ends, and the numbers' values. */
function numberColumns(row) {
  const columns = [];
  const values = [];
  for (const match of row.matchAll(/-?\d+\.\d*/g)) {
    columns.push(match.index + match[0].length);
    values.push(Number(match[0]));
  }
  return { columns, values, decimals: [...row.matchAll(/-?\d+\.(\d*)/g)].map((m) => m[1].length) };
}

/** The frame (a webview's inner document) in which `selector` matches, waiting up to `timeout`. */
async function frameWith(page, selector, timeout = WAIT) {
  const deadline = Date.now() + timeout;
  while (Date.now() < deadline) {
    for (const frame of page.frames()) {
      if (await frame.evaluate((s) => document.querySelector(s) !== null, selector).catch(() => false)) return frame;
    }
    await page.waitForTimeout(250);
  }
  throw new Error(`no webview shows '${selector}' within ${timeout} ms`);
}

/** The cost label the views show for a fragment: its qubits when it needs some, else its orbitals. */
function costLabel({ qubitsRequired, orbitals }) {
  return qubitsRequired !== null ? `${qubitsRequired} qubits` : `${orbitals} orbitals`;
}

/** Waits for a file to appear with some content; returns its bytes. */
async function waitForFile(page, file) {
  const deadline = Date.now() + WAIT;
  while (Date.now() < deadline) {
    if (existsSync(file) && statSync(file).size > 0) {
      await page.waitForTimeout(200); // let the write finish
      return readFileSync(file);
    }
    await page.waitForTimeout(200);
  }
  throw new Error(`${path.basename(file)} was not written within ${WAIT} ms`);
}

/**
 * @param {object} options
 * @param {import('playwright-core').Page} options.page
 * @param {string} options.workspace   folder the workbench has open
 * @param {string} options.shots       folder for screenshots
 * @param {object} options.reference   figures from the command line (see run.mjs)
 * @param {(line: string) => void} options.log
 */
export async function runWorkbenchChecks({ page, workspace, shots, reference, log }) {
  mkdirSync(path.join(shots, 'docs'), { recursive: true });
  const results = [];
  const measurements = {};
  const shot = async (name, clip) => {
    const file = path.join(shots, `${name}.png`);
    await page.screenshot({ path: file, ...(clip ? { clip } : {}) });
    return file;
  };
  /** A screenshot of a region, padded and kept inside the viewport. */
  const docShot = async (name, box, pad = 8) => {
    const viewport = page.viewportSize();
    const x = Math.max(0, Math.floor(box.x - pad));
    const y = Math.max(0, Math.floor(box.y - pad));
    const clip = { x, y, width: Math.min(viewport.width - x, Math.ceil(box.width + 2 * pad)), height: Math.min(viewport.height - y, Math.ceil(box.height + 2 * pad)) };
    return shot(path.join('docs', name), clip);
  };
  const check = async (id, title, body) => {
    const started = Date.now();
    let detail;
    let ok = false;
    try {
      detail = await body();
      ok = true;
    } catch (error) {
      detail = String(error?.message ?? error).split('\n').slice(0, 6).join(' | ');
    }
    const screenshot = await shot(`${id}-${title.replace(/[^a-z0-9]+/gi, '-').replace(/-+$/, '').toLowerCase()}`).catch((error) => `no screenshot: ${error.message}`);
    const result = { id, title, ok, detail, seconds: (Date.now() - started) / 1000, screenshot };
    results.push(result);
    log(`${ok ? 'PASS' : 'FAIL'} ${id}. ${title} (${result.seconds.toFixed(1)} s): ${detail}`);
    await dismiss(page).catch(() => {});
  };

  const statusQubits = page.locator('.statusbar-item[id$="tessera.qubits"]');
  const problemRows = page.locator('.markers-panel .monaco-list-row');

  // --- a + b: open the deliberate-mistakes file with the Problems panel showing -------------
  await showProblems(page);
  const emptyPanel = plain(await page.locator('.markers-panel').innerText());
  const opened = await openFile(page, 'mistakes.tess');
  // Watch for the first problem from the moment the file opens, whatever the checks wait for.
  const firstProblem = problemRows.filter({ hasText: 'tessera' }).first().waitFor({ timeout: 60_000 }).then(() => Date.now(), (error) => error);

  await check('a', 'language mode shows Tessera', async () => {
    const mode = page.locator('#status\\.editor\\.mode');
    await page.waitForFunction(() => (document.querySelector('#status\\.editor\\.mode')?.textContent ?? '').trim() === 'Tessera', null, { timeout: WAIT });
    return `status bar language indicator reads '${(await mode.innerText()).trim()}' for mistakes.tess`;
  });

  await check('b', 'Problems panel lists the mistakes', async () => {
    if (!/No problems have been detected/.test(emptyPanel)) throw new Error(`the Problems panel was not empty before the file opened: ${emptyPanel.slice(0, 200)}`);
    const seen = await firstProblem;
    if (seen instanceof Error) throw seen;
    measurements.activationMs = seen - opened;
    log(`activation: ${measurements.activationMs} ms from opening mistakes.tess to its first problem in the Problems panel`);
    // The server publishes every diagnostic at once; wait for the header to count all of them.
    const expected = reference.mistakes;
    const header = problemRows.filter({ hasText: 'mistakes.tess' }).first();
    await page.waitForFunction(
      (count) => [...document.querySelectorAll('.markers-panel .monaco-list-row')].some((row) => (row.getAttribute('aria-label') ?? '').startsWith(`${count} problems in file mistakes.tess`)),
      expected.length,
      { timeout: WAIT },
    ).catch(async () => {
      throw new Error(`Problems panel header: '${await header.getAttribute('aria-label')}', expected ${expected.length} problems`);
    });
    const panel = await page.locator('.part.panel').boundingBox();
    await docShot('problems-panel', panel, 0);
    const labels = await allRowLabels(page, '.markers-panel');
    const missing = expected.filter((d) => !labels.some((label) => label.includes(d.message) && label.includes(`at line ${d.line} and character ${d.column}`)));
    if (missing.length > 0) throw new Error(`not in the Problems panel: ${missing.map((d) => `${d.line}:${d.column} ${d.message}`).join(' / ')}`);
    const named = ['is not in the basis-set library', 'Multiplicity 3 needs', 'not an element symbol', "Unknown method 'vqee'. Did you mean 'vqe'?"];
    const absent = named.filter((text) => !labels.some((label) => label.includes(text)));
    if (absent.length > 0) throw new Error(`messages not shown: ${absent.join(', ')}`);
    return `${expected.length} problems listed, each message and position as \`tessera check\` gives them (including: ${named.map((t) => `"${t}"`).join(', ')})`;
  });

  // --- the demo: status bar, hints and lens, hover, outline ------------------------------------
  const demo = path.join(workspace, 'zn-site-h2s-scan.tess');
  await hidePanel(page).catch(() => {});
  const demoOpened = await openFile(page, 'zn-site-h2s-scan.tess');
  // With the server running: from opening a second spec to its figure in the status bar.
  const demoFigure = statusQubits.filter({ hasText: `${reference.demoLargest.qubits} qubits` }).waitFor({ timeout: 60_000 }).then(() => Date.now(), (error) => error);

  await check('i', 'status bar shows the largest fragment\'s qubits', async () => {
    const { fragment, qubits } = reference.demoLargest;
    const shown = await demoFigure;
    if (shown instanceof Error) throw shown;
    measurements.secondFileMs = shown - demoOpened;
    log(`second spec: ${measurements.secondFileMs} ms from opening zn-site-h2s-scan.tess to its qubit count in the status bar`);
    const text = plain(await statusQubits.innerText()).trim();
    const label = (await statusQubits.getAttribute('aria-label')) ?? '';
    if (!label.includes(`'${fragment}'`)) throw new Error(`status bar item's tooltip does not name '${fragment}': ${label}`);
    return `status bar item reads '${text}' (${label.replace(/^.*?Tessera: /, 'Tessera: ').slice(0, 90)}…); \`tessera estimate\` says ${qubits} for '${fragment}'`;
  });

  await check('e', 'inlay hints and code lens show qubit costs', async () => {
    const { fragment, qubits } = reference.demoLargest;
    const lens = page.locator('.codelens-decoration', { hasText: 'qubits' }).first();
    await goTo(page, 1, 1);
    await lens.waitFor({ timeout: WAIT });
    const lensText = plain(await lens.innerText()).trim();
    const wantedLens = `largest quantum fragment ${qubits} qubits (${fragment})`;
    if (!lensText.includes(wantedLens)) throw new Error(`code lens '${lensText}' lacks '${wantedLens}'`);
    const hints = [];
    for (const { name, qubitsRequired, orbitals, solverMemory } of reference.demoFigures) {
      await goTo(page, lineOf(demo, `fragment ${name} `), 1);
      const hint = activeEditor(page).locator('.view-line', { hasText: `fragment ${name} ` }).first().locator('[class*="dyn-rule-"]', { hasText: /\S/ });
      await hint.first().waitFor({ timeout: WAIT });
      const text = plain((await hint.allTextContents()).join('')).trim();
      // A quantum fragment's hint names the qubits it needs; a classical tier's its solver's memory
      // (the command line's solverCost); a fragment without figures its orbitals.
      const expected = qubitsRequired !== null ? `${qubitsRequired} and 'qubits'` : `'${solverMemory ?? `${orbitals} orbitals`}'`;
      const fits = qubitsRequired !== null ? new RegExp(`(^|\\D)${qubitsRequired}(\\D|$)`).test(text) && text.includes('qubits') : text.includes(solverMemory ?? `${orbitals} orbitals`);
      if (!fits) throw new Error(`inlay hint after '${name}' reads '${text}', expected ${expected}`);
      hints.push(`${name} → '${text}'`);
    }
    return `code lens: '${lensText}'; inlay hints: ${hints.join(', ')}`;
  });

  await check('c', 'hover on a fragment name shows its resource card', async () => {
    const { fragment, qubits } = reference.demoLargest;
    await goTo(page, lineOf(demo, `fragment ${fragment} `), 1);
    const line = activeEditor(page).locator('.view-line', { hasText: `fragment ${fragment} ` }).first();
    const word = line.locator('span > span', { hasText: new RegExp(`^${fragment}$`) }).first();
    const box = await word.boundingBox();
    if (!box) throw new Error(`'${fragment}' is not on screen`);
    const hover = page.locator('.monaco-hover', { hasText: 'qubits needed' });
    // Move onto the word in two steps: the editor shows a hover after the mouse rests on it.
    for (let attempt = 0; attempt < 3 && !(await hover.first().isVisible()); attempt++) {
      await page.mouse.move(box.x + 2, box.y + box.height / 2);
      await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2, { steps: 4 });
      await hover.first().waitFor({ state: 'visible', timeout: 8_000 }).catch(() => {});
    }
    await hover.first().waitFor({ state: 'visible', timeout: 2_000 });
    await page.waitForTimeout(300); // let the card finish its layout before the screenshot
    const text = plain(await hover.first().innerText());
    for (const wanted of [`fragment ${fragment}`, 'qubits needed', 'Jordan–Wigner', 'Planning estimates']) {
      if (!text.includes(wanted)) throw new Error(`hover card lacks '${wanted}': ${text.slice(0, 300)}`);
    }
    const needed = text.split('\n').find((row) => row.includes('qubits needed')) ?? '';
    if (!new RegExp(`(^|\\D)${qubits}(\\D|$)`).test(needed.replace('qubits needed', ''))) throw new Error(`hover card's '${needed.trim()}' does not say ${qubits}`);
    // The picture: from the editor's left edge (line numbers, the hovered line) to the card's right.
    const card = await hover.first().boundingBox();
    const editor = await activeEditor(page).boundingBox();
    const top = Math.min(card.y, box.y);
    const right = Math.max(card.x + card.width, box.x + box.width);
    await docShot('hover-card', { x: editor.x, y: top, width: right - editor.x, height: Math.max(card.y + card.height, box.y + box.height) - top });
    return `hover on '${fragment}': ${text.split('\n').filter((row) => /qubits/.test(row)).map((row) => row.replace(/\s+/g, ' ').trim()).join(' / ')}`;
  });

  await check('g', 'Go to Symbol lists the fragments', async () => {
    await page.keyboard.press('Control+Shift+O');
    const rows = page.locator('.quick-input-widget .monaco-list-row');
    await rows.filter({ hasText: 'fragment' }).first().waitFor({ timeout: WAIT });
    const labels = await allRowLabels(page, '.quick-input-widget');
    const wanted = reference.demoFragments.map((name) => `fragment ${name}`);
    const missing = wanted.filter((name) => !labels.some((label) => label.startsWith(name)));
    if (missing.length > 0) throw new Error(`Go to Symbol lacks ${missing.join(', ')}: ${labels.join(' / ')}`);
    return `Go to Symbol (Ctrl+Shift+O) lists ${labels.filter((label) => label.startsWith('fragment ')).join(', ')} among ${labels.length} symbols`;
  });

  // --- completion ---------------------------------------------------------------------------
  await check('d', 'completion offers the keywords and values of a tier', async () => {
    await openFile(page, 'completion.tess');
    const blank = lineOf(path.join(workspace, 'completion.tess'), 'method vqe') + 1;
    await goTo(page, blank, 1);
    await page.keyboard.type('    ');
    const suggestions = page.locator('.suggest-widget.visible .monaco-list-row');
    await page.keyboard.press('Control+Space');
    await suggestions.first().waitFor({ timeout: WAIT });
    const keywords = await allRowLabels(page, '.suggest-widget.visible');
    const names = keywords.map((label) => label.split(',')[0].trim());
    const offered = ['ansatz', 'mapping', 'active', 'taper', 'layers', 'frozen-core'];
    const notOffered = ['method', 'atoms', 'structure', 'basis'];
    const missing = offered.filter((word) => !names.includes(word));
    const wrong = notOffered.filter((word) => names.includes(word));
    if (missing.length > 0 || wrong.length > 0) throw new Error(`tier keywords offered: ${names.join(', ')}; missing ${missing.join(', ') || '-'}; out of place ${wrong.join(', ') || '-'}`);
    await shot('d-completion-keywords');
    await dismiss(page);
    // After `mapping ` (a trigger character) the values of that keyword, and nothing else.
    await page.keyboard.type('mapping ', { delay: 20 });
    await suggestions.filter({ hasText: 'jordan-wigner' }).first().waitFor({ timeout: WAIT });
    const values = (await allRowLabels(page, '.suggest-widget.visible')).map((label) => label.split(',')[0].trim());
    if (values.slice().sort().join(' ') !== 'bravyi-kitaev jordan-wigner parity') throw new Error(`values after 'mapping ': ${values.join(', ')}`);
    // Enter with the list still open ends the line (Tab accepts): the next statement is not glued on.
    await page.keyboard.type('parity', { delay: 20 });
    await suggestions.filter({ hasText: 'parity' }).first().waitFor({ timeout: WAIT });
    await page.keyboard.press('Enter');
    await page.keyboard.type('taper on', { delay: 20 });
    await dismiss(page);
    await waitForLine(page, (line) => line.trim() === 'taper on').catch(async () => {
      throw new Error(`Enter did not end the line: ${(await waitForLine(page, (line) => line.includes('parity'), 2000).catch(() => '?')).trim()}`);
    });
    await waitForLine(page, (line) => line.trim() === 'mapping parity');
    return `Ctrl+Space in an empty tier line offers ${names.filter((name) => offered.includes(name)).join(', ')} (not method, already given); after 'mapping ' it offers ${values.join(', ')}; Enter with the list open ends the line ('mapping parity', then 'taper on' on the next)`;
  });

  // --- quick fix ------------------------------------------------------------------------------
  await check('f', 'quick fix changes the text and clears its diagnostic', async () => {
    const file = path.join(workspace, 'quick-fix.tess');
    const target = reference.quickFix;
    await openFile(page, 'quick-fix.tess');
    await showProblems(page);
    // Only this file's problems, so that its row is in view whatever else is open.
    await filterProblems(page, '**/quick-fix.tess');
    const row = problemRows.filter({ hasText: target.message.slice(0, 40) });
    await row.first().waitFor({ timeout: WAIT });
    await goTo(page, target.line, target.column);
    await page.locator('.lightBulbWidget').waitFor({ state: 'visible', timeout: WAIT });
    await page.keyboard.press('Control+.');
    const actions = page.locator('.action-widget .monaco-list-row.action');
    await actions.first().waitFor({ timeout: WAIT });
    const titles = await actions.evaluateAll((rows) => rows.map((r) => r.getAttribute('aria-label')));
    const wanted = `Set the multiplicity to ${target.nearest}`;
    if (!titles.includes(wanted)) throw new Error(`the light bulb offers ${titles.join(' / ')}, not '${wanted}'`);
    for (let i = 0; i < titles.length; i++) {
      if ((await page.locator('.action-widget .monaco-list-row.action.focused').getAttribute('aria-label')) === wanted) break;
      await page.keyboard.press('ArrowDown');
    }
    await shot('f-quick-fix-menu');
    await page.keyboard.press('Enter');
    const fixedLine = `multiplicity ${target.nearest}`;
    const original = readFileSync(file, 'utf8').split('\n')[target.line - 1].replace(/\s*#.*$/, '');
    if (original === fixedLine) throw new Error(`line ${target.line} already reads '${fixedLine}': the check would prove nothing`);
    await waitForLine(page, (line) => line === fixedLine);
    await row.first().waitFor({ state: 'detached', timeout: WAIT });
    const stillListed = await problemRows.count();
    if (stillListed > 0) throw new Error(`quick-fix.tess still has problems listed after the fix: ${(await problemRows.allInnerTexts()).join(' / ')}`);
    await filterProblems(page, '');
    return `'${wanted}' from Ctrl+. turned '${original}' into '${fixedLine}'; its problem left the Problems panel (offered: ${titles.join(' / ')})`;
  });

  // --- formatter ------------------------------------------------------------------------------
  await check('h', 'Format Document aligns the structure block', async () => {
    const file = path.join(workspace, 'messy-geometry.tess');
    await hidePanel(page).catch(() => {});
    await openFile(page, 'messy-geometry.tess');
    const before = geometryRows(await visibleLines(page, { withInjected: false }));
    const original = geometryRows(readFileSync(file, 'utf8').split('\n'));
    if (before.join('\n') !== original.join('\n')) throw new Error(`the editor does not show the file as written:\n${before.join('\n')}`);
    const layoutsBefore = new Set(before.map((row) => numberColumns(row).columns.join(',')));
    if (layoutsBefore.size < 2) throw new Error('the messy geometry is already aligned: the check would prove nothing');
    await runCommand(page, 'Format Document');
    await page.waitForFunction(
      (first) => ![...document.querySelectorAll('.editor-group-container.active .view-line')].some((line) => line.textContent.replace(/\u00a0/g, ' ') === first),
      before[0],
      { timeout: WAIT },
    );
    const after = geometryRows(await visibleLines(page, { withInjected: false }));
    const parsed = after.map(numberColumns);
    const layouts = new Set(parsed.map((row) => row.columns.join(',')));
    const decimals = new Set(parsed.flatMap((row) => row.decimals));
    const indents = new Set(after.map((row) => row.length - row.trimStart().length));
    const elementColumn = new Set(after.map((row) => row.search(/\S/)));
    if (after.length !== before.length) throw new Error(`${before.length} atom rows became ${after.length}`);
    if (layouts.size !== 1) throw new Error(`coordinate columns still differ:\n${after.join('\n')}`);
    if (decimals.size !== 1) throw new Error(`coordinates written with different decimals:\n${after.join('\n')}`);
    if (indents.size !== 1 || elementColumn.size !== 1) throw new Error(`rows indented differently:\n${after.join('\n')}`);
    const valuesBefore = before.map((row) => numberColumns(row).values.join(' '));
    const valuesAfter = parsed.map((row) => row.values.join(' '));
    if (valuesBefore.join('|') !== valuesAfter.join('|')) throw new Error(`coordinates changed value: ${valuesBefore.join('|')} -> ${valuesAfter.join('|')}`);
    await page.keyboard.press('Control+S');
    await page.locator('.tabs-container .tab.active.dirty').waitFor({ state: 'detached', timeout: WAIT });
    const saved = geometryRows(readFileSync(file, 'utf8').split('\n'));
    if (saved.join('\n') !== after.join('\n')) throw new Error(`the saved file differs from what the editor shows:\n${saved.join('\n')}`);
    return `${after.length} atom rows aligned, numbers end at columns ${[...layouts][0]} with ${[...decimals][0]} decimals; values unchanged; saved file matches:\n      ${after.join('\n      ')}`;
  });

  // --- a small spec for the README picture of hints and lens ----------------------------------
  try {
    await openFile(page, 'water-cc-pvdz.tess');
    await page.locator('.codelens-decoration', { hasText: 'qubits' }).first().waitFor({ timeout: WAIT });
    await activeEditor(page).locator('[class*="dyn-rule-"]', { hasText: 'qubits' }).first().waitFor({ timeout: WAIT });
    await page.mouse.move(5, 790);
    const editor = await activeEditor(page).boundingBox();
    const lines = await visibleLines(page);
    const lineHeight = (await activeEditor(page).locator('.view-line').first().boundingBox()).height;
    await docShot('inlay-hints-code-lens', { x: editor.x, y: editor.y, width: Math.min(editor.width, 760), height: Math.min(editor.height, (lines.length + 2) * lineHeight) }, 0);
  } catch (error) {
    log(`(picture of hints and lens not taken: ${error.message.split('\n')[0]})`);
  }

  // --- report ---------------------------------------------------------------------------------
  await check('j', 'Show Resource Report opens the report beside the editor', async () => {
    await openFile(page, 'zn-site-h2s-scan.tess');
    await hideSideBar(page).catch(() => {}); // more room for the two editor groups
    await runCommand(page, 'Tessera: Show Resource Report');
    const tab = page.locator('.tabs-container .tab[aria-label*="Report: zn-site-h2s-scan.tess"]');
    await tab.waitFor({ timeout: WAIT });
    const groups = await page.locator('.editor-group-container').count();
    if (groups < 2) throw new Error(`the report opened in the same group (${groups} group)`);
    const sourceGroup = page.locator('.editor-group-container', { has: page.locator('.tab[aria-label="zn-site-h2s-scan.tess"]') });
    const reportGroup = page.locator('.editor-group-container', { has: tab });
    const [sourceBox, reportBox] = [await sourceGroup.first().boundingBox(), await reportGroup.first().boundingBox()];
    if (!(reportBox.x > sourceBox.x)) throw new Error('the report is not to the right of the spec');
    // The report's text lives in the webview's inner frame.
    let body = '';
    const deadline = Date.now() + WAIT;
    while (Date.now() < deadline && !body.includes('Resource report')) {
      for (const frame of page.frames()) {
        const text = await frame.evaluate(() => document.body?.innerText ?? '').catch(() => '');
        if (text.includes('Resource report')) body = text;
      }
      if (!body) await page.waitForTimeout(250);
    }
    const wanted = [`Resource report: ${reference.demoName}`, 'qubits', 'Jordan–Wigner', ...reference.demoFragments];
    const missing = wanted.filter((text) => !body.includes(text));
    if (missing.length > 0) throw new Error(`report lacks ${missing.join(', ')}: ${body.slice(0, 200)}`);
    // Park the mouse on the report, away from buttons whose tooltips would cover it.
    await page.mouse.move(reportBox.x + reportBox.width / 2, reportBox.y + reportBox.height - 20);
    await page.waitForTimeout(500);
    await docShot('report-view', reportBox, 0);
    return `tab 'Report: zn-site-h2s-scan.tess' in a second editor group right of the spec; the webview shows '${body.split('\n')[0]}' with the fragments ${reference.demoFragments.join(', ')}`;
  });

  // --- structure view -------------------------------------------------------------------------
  const specTab = page.locator('.tabs-container .tab', { has: page.locator('.label-name', { hasText: /^zn-site-h2s-scan\.tess$/ }) }).first();
  const structure = reference.views.structure;
  await check('k', 'Show Structure draws the fragments and follows the editor', async () => {
    await specTab.click();
    // The cursor outside every fragment block, so that the view picks none out.
    await goTo(page, 1, 1);
    await runCommand(page, 'Tessera: Show Structure');
    const tab = page.locator('.tabs-container .tab[aria-label*="Structure: zn-site-h2s-scan.tess"]');
    await tab.waitFor({ timeout: WAIT });
    const frame = await frameWith(page, '#fragments li[data-fragment]');
    const marked = await frame.$$eval('#fragments li[aria-current="true"]', (rows) => rows.length);
    if (marked !== 0) throw new Error(`${marked} fragments marked in the key with the cursor on line 1`);
    // The key: each fragment with the cost the command line gives it.
    const key = await frame.$$eval('#fragments li[data-fragment]', (rows) => rows.map((row) => `${row.querySelector('.name').textContent}: ${row.querySelector('.cost').textContent}`));
    const wantedKey = reference.demoFigures.map((figures) => `${figures.name}: ${costLabel(figures)}`);
    if (key.join(' / ') !== wantedKey.join(' / ')) throw new Error(`key reads ${key.join(' / ')}, \`tessera estimate\` gives ${wantedKey.join(' / ')}`);
    // The canvas: pixels of every fragment's colour.
    const colours = Object.fromEntries(structure.fragments.map((f) => [f.name, f.colour]));
    let sample = null;
    const deadline = Date.now() + WAIT;
    while ((!sample || Object.values(sample.counts).some((n) => n < 40)) && Date.now() < deadline) {
      await page.waitForTimeout(300);
      sample = await frame.evaluate(sampleCanvas, { colours }).catch(() => null);
    }
    if (!sample) throw new Error('the structure view drew no canvas');
    const faint = Object.entries(sample.counts).filter(([, n]) => n < 40);
    if (faint.length > 0) throw new Error(`too few pixels of ${faint.map(([name, n]) => `${name} (${n})`).join(', ')}`);
    const counts = Object.entries(sample.counts).map(([name, n]) => `${name} ${n}`).join(', ');
    const viewBox = await page.locator('.editor-group-container', { has: tab }).first().boundingBox();
    // Park the mouse on the view's key, away from buttons whose tooltips would cover the picture.
    await page.mouse.move(viewBox.x + viewBox.width - 12, viewBox.y + viewBox.height - 12);
    await page.waitForTimeout(600);
    await docShot('structure-view', viewBox, 0);
    // The cursor in a fragment block picks that fragment out in the view.
    const guest = structure.fragments.findIndex((f) => f.tier === 'correlated');
    const guestName = structure.fragments[guest].name;
    await specTab.click();
    await goTo(page, lineOf(demo, 'tier correlated'), 5);
    await frame.locator(`#fragments li[data-fragment="${guest}"][aria-current="true"]`).waitFor({ timeout: WAIT });
    // A click on an atom of that fragment selects the atom's line in the editor.
    sample = null;
    const again = Date.now() + WAIT;
    while ((!sample?.centres?.[guestName] || sample.counts[guestName] < 40) && Date.now() < again) {
      await page.waitForTimeout(300);
      sample = await frame.evaluate(sampleCanvas, { colours: { [guestName]: colours[guestName] }, centres: true }).catch(() => null);
    }
    const centre = sample?.centres?.[guestName];
    if (!centre) throw new Error(`no pixel of ${guestName} to click`);
    const frameBox = await (await frame.frameElement()).boundingBox();
    await page.mouse.click(frameBox.x + centre.x, frameBox.y + centre.y);
    const guestLines = structure.atoms.filter((atom) => atom.fragment === guest).map((atom) => atom.line + 1);
    const selection = page.locator('#status\\.editor\\.selection');
    let shown = '';
    const clicked = Date.now() + WAIT;
    while (Date.now() < clicked) {
      shown = plain(await selection.innerText().catch(() => ''));
      const line = Number(/Ln (\d+)/.exec(shown)?.[1]);
      if (guestLines.includes(line) && /selected/.test(shown)) break;
      await page.waitForTimeout(200);
    }
    const line = Number(/Ln (\d+)/.exec(shown)?.[1]);
    if (!guestLines.includes(line)) throw new Error(`after the click the editor shows '${shown}'; the ${guestName} atoms are on lines ${guestLines.join(', ')}`);
    const text = readFileSync(demo, 'utf8').split('\n')[line - 1].trim();
    // Live: an edit of the fragment's name reaches the key.
    await goTo(page, lineOf(demo, `fragment ${guestName} `), `fragment ${guestName}`.length + 1);
    await page.keyboard.type('x');
    try {
      await frame.locator('#fragments .name', { hasText: new RegExp(`^${guestName}x$`) }).waitFor({ timeout: WAIT });
    } finally {
      await specTab.click();
      await page.keyboard.press('Control+Z');
    }
    await frame.locator('#fragments .name', { hasText: new RegExp(`^${guestName}$`) }).waitFor({ timeout: WAIT });
    return `key: ${key.join(' / ')}; canvas pixels ${counts}; cursor in '${guestName}' marked it in the key; a click on a ${guestName} atom selected line ${line} ('${text}'); renaming the fragment reached the key`;
  });

  // --- cost panel -----------------------------------------------------------------------------
  await check('l', 'Show Cost Plots shows the charts and saves SVG and PNG exports', async () => {
    const costs = reference.views.costs;
    await specTab.click();
    await runCommand(page, 'Tessera: Show Cost Plots');
    const tab = page.locator('.tabs-container .tab[aria-label*="Costs: zn-site-h2s-scan.tess"]');
    await tab.waitFor({ timeout: WAIT });
    const frame = await frameWith(page, '#plot-scan > svg');
    const titles = await frame.$$eval('.ts-figure > svg', (svgs) => svgs.map((svg) => svg.querySelector('text')?.textContent ?? ''));
    const selectedName = costs.fragments.find((f) => f.index === costs.selected).name;
    const wanted = ['Qubits per fragment (planning estimate)', `Cost against active-space size: ${selectedName} (planning estimate)`, `Shots against active-space size: ${selectedName} (computed Hamiltonians)`, 'Cumulative cost along the scan (planning estimate)'];
    if (titles.join(' / ') !== wanted.join(' / ')) throw new Error(`charts: ${titles.join(' / ')}`);
    // The sample's site is a DMET fragment: its problem is the impurity, so the shots chart says why it is empty.
    const shotsText = await frame.$eval('#plot-shots > svg', (svg) => svg.textContent ?? '');
    if (!shotsText.includes('Under embedding dmet')) throw new Error(`the shots chart of a DMET fragment reads '${shotsText.slice(0, 160)}'`);
    const options = await frame.$$eval('#fragment option', (rows) => rows.map((row) => row.textContent));
    if (options.join() !== costs.fragments.map((f) => f.name).join()) throw new Error(`selector offers ${options.join(', ')}`);
    const other = costs.fragments.find((f) => f.index !== costs.selected);
    await frame.locator('#fragment').selectOption(String(other.index));
    await frame.locator('#plot-growth > svg', { hasText: `active-space size: ${other.name}` }).waitFor({ timeout: WAIT });
    const tabBox = await page.locator('.editor-group-container', { has: tab }).first().boundingBox();
    await page.mouse.move(tabBox.x + tabBox.width - 12, tabBox.y + tabBox.height - 12);
    await page.waitForTimeout(600);
    await docShot('cost-panel', tabBox, 0);
    // Exports: the save dialog (code-server's own, in the quick input) proposes the spec's folder.
    const saved = [];
    for (const [plot, format] of [['qubits', 'svg'], ['growth', 'png']]) {
      const file = path.join(workspace, `zn-site-h2s-scan-${plot}.${format}`);
      await frame.locator(`[data-plot="${plot}"] button[data-export="${format}"]`).click();
      const input = page.locator('.quick-input-widget input');
      await input.waitFor({ state: 'visible', timeout: WAIT });
      await page.waitForFunction((name) => (document.querySelector('.quick-input-widget input')?.value ?? '').endsWith(name), path.basename(file), { timeout: WAIT }).catch(async () => {
        throw new Error(`the save dialog proposes '${await input.inputValue()}', not ${path.basename(file)}`);
      });
      await page.keyboard.press('Enter');
      const bytes = await waitForFile(page, file);
      if (format === 'svg' && bytes.toString('utf8') !== costs.svg.qubits) throw new Error('the saved SVG differs from the chart the language server drew');
      if (format === 'png' && (bytes.readUInt32BE(0) !== 0x89504e47 || bytes.readUInt32BE(16) !== 1280 || bytes.readUInt32BE(20) !== 680)) throw new Error(`the saved PNG is not a 1280×680 PNG (${bytes.length} bytes)`);
      saved.push(`${path.basename(file)} (${bytes.length} bytes)`);
    }
    return `charts: ${titles.join(' / ')}; selector ${options.join(', ')} → ${other.name}; saved ${saved.join(', ')}`;
  });

  return { results, measurements };
}

/** Copies the pictures made for the README into docs/images/. */
export function publishDocImages(shots, root) {
  const target = path.join(root, 'docs', 'images');
  mkdirSync(target, { recursive: true });
  const copied = [];
  for (const name of ['problems-panel', 'hover-card', 'inlay-hints-code-lens', 'report-view', 'structure-view']) {
    const from = path.join(shots, 'docs', `${name}.png`);
    copyFileSync(from, path.join(target, `${name}.png`));
    copied.push(path.join('docs', 'images', `${name}.png`));
  }
  return copied;
}
