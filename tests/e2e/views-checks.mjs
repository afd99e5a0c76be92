#!/usr/bin/env node
/**
 * The structure view and the cost panel in headless Chromium, outside VS Code: the pages come from
 * the same HTML generator the extension uses (client/src/views/html.ts), with the packaged view
 * scripts, served from a loopback server under the same content-security policy; a stub stands in
 * for the editor's `acquireVsCodeApi` and records what the page posts. The data comes from the
 * language server itself (`tessera/structure`, `tessera/costs` over stdio) for the demo spec.
 *
 * Checks: the key lists every fragment with its cost and colour; the canvas shows pixels of every
 * fragment's colour, of the dashed cut bonds and of the scan arrow; the label toggle draws labels;
 * a highlight marks the fragment; a click on an atom posts its index; malformed messages are
 * ignored; the cost panel shows the four charts, the fragment selector and exports SVG and PNG;
 * and no content-security-policy violation or page error happens. Each leaves a screenshot.
 *
 * Runs from run.mjs (npm run test:e2e), or alone after `npm run build && npm run package`:
 * `node tests/e2e/views-checks.mjs`. Fails, never skips, when anything is missing.
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:http';
import { createRequire } from 'node:module';
import * as path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/** Chromium flags for WebGL without a GPU: ANGLE on SwiftShader, allowed explicitly. */
export const WEBGL_FLAGS = ['--use-angle=swiftshader', '--enable-unsafe-swiftshader'];
const WAIT = 30_000;

/** The language server over stdio, as an editor starts it; answers the views' requests for one spec. */
export async function viewData(root, specPath) {
  const rpc = createRequire(path.join(root, 'package.json'))('vscode-jsonrpc/node');
  const child = spawn(process.execPath, [path.join(root, 'dist', 'server.js'), '--stdio'], { stdio: ['pipe', 'pipe', 'inherit'] });
  const connection = rpc.createMessageConnection(new rpc.StreamMessageReader(child.stdout), new rpc.StreamMessageWriter(child.stdin));
  connection.onRequest('workspace/configuration', (params) => params.items.map(() => ({})));
  connection.onRequest('client/registerCapability', () => null);
  connection.onNotification('textDocument/publishDiagnostics', () => undefined);
  connection.onNotification('window/logMessage', () => undefined);
  connection.listen();
  try {
    await connection.sendRequest('initialize', { processId: process.pid, rootUri: null, capabilities: {} });
    await connection.sendNotification('initialized', {});
    const uri = pathToFileURL(specPath).toString();
    await connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'tessera', version: 1, text: readFileSync(specPath, 'utf8') } });
    const structure = await connection.sendRequest('tessera/structure', { uri });
    const costs = await connection.sendRequest('tessera/costs', { uri });
    if (!structure || !costs) throw new Error(`the language server answered no view data for ${specPath}`);
    const others = [];
    for (const fragment of costs.fragments.filter((f) => f.index !== costs.selected)) others.push(await connection.sendRequest('tessera/costs', { uri, fragment: fragment.index }));
    await connection.sendRequest('shutdown');
    await connection.sendNotification('exit');
    return { structure, costs, others };
  } finally {
    connection.dispose();
    child.kill();
  }
}

/** The HTML generator and the message checks, bundled from the extension's TypeScript sources. */
async function loadViewModules(root, scratch) {
  const { build } = createRequire(path.join(root, 'package.json'))('esbuild');
  const outfile = path.join(scratch, 'view-modules.mjs');
  await build({
    stdin: { contents: "export * from './client/src/views/html.ts';\nexport * from './client/src/views/protocol.ts';\n", resolveDir: root, loader: 'ts' },
    bundle: true,
    platform: 'node',
    format: 'esm',
    outfile,
    logLevel: 'warning',
  });
  return import(pathToFileURL(outfile).toString());
}

/** Serves the two pages and the view scripts on 127.0.0.1. */
async function servePages(modules, webviewDir) {
  const pages = new Map();
  const server = createServer((request, response) => {
    const url = new URL(request.url ?? '/', 'http://127.0.0.1');
    const page = pages.get(url.pathname);
    if (page) {
      response.writeHead(200, { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' });
      response.end(page);
      return;
    }
    const script = /^\/webview\/([a-z-]+\.js)$/.exec(url.pathname)?.[1];
    if (script && existsSync(path.join(webviewDir, script))) {
      response.writeHead(200, { 'content-type': 'text/javascript; charset=utf-8' });
      response.end(readFileSync(path.join(webviewDir, script)));
      return;
    }
    response.writeHead(404).end();
  });
  await new Promise((resolve) => server.listen(0, '127.0.0.1', resolve));
  const origin = `http://127.0.0.1:${server.address().port}`;
  for (const kind of ['structure', 'costs']) {
    pages.set(`/${kind}.html`, modules.viewPage({ kind, cspSource: origin, scriptUri: `${origin}/webview/${kind}.js`, nonce: modules.makeNonce(), title: `${kind} (test page)` }));
  }
  return { origin, close: () => new Promise((resolve) => server.close(resolve)) };
}

/** Runs before the page's scripts: the editor API stub, and a record of CSP violations and posts. */
function installStub() {
  window.__posted = [];
  window.__violations = [];
  window.acquireVsCodeApi = () => ({ postMessage: (message) => window.__posted.push(JSON.parse(JSON.stringify(message))), getState: () => undefined, setState: () => undefined });
  document.addEventListener('securitypolicyviolation', (event) => window.__violations.push(`${event.violatedDirective}: ${event.blockedURI || '(inline)'}`));
}

/**
 * Counts the pixels of the 3D canvas near each colour, allowing for shading: a pixel matches when
 * it is the colour scaled by a factor in [0.45, 1.08], within a small tolerance per channel. Also
 * returns, per colour, the pixel deepest inside a region of that colour (the middle of an atom).
 */
export function sampleCanvas({ colours, centres: wantCentres = false }) {
  const canvas = document.querySelector('#viewer canvas');
  if (!canvas) return null;
  const copy = document.createElement('canvas');
  copy.width = canvas.width;
  copy.height = canvas.height;
  const context = copy.getContext('2d');
  context.drawImage(canvas, 0, 0);
  const { data, width, height } = context.getImageData(0, 0, copy.width, copy.height);
  const parsed = Object.fromEntries(Object.entries(colours).map(([name, hex]) => [name, [1, 3, 5].map((k) => parseInt(hex.slice(k, k + 2), 16))]));
  const counts = Object.fromEntries(Object.keys(colours).map((name) => [name, 0]));
  const masks = Object.fromEntries(Object.keys(colours).map((name) => [name, new Uint8Array(width * height)]));
  for (let p = 0; p < width * height; p++) {
    const pixel = [data[4 * p], data[4 * p + 1], data[4 * p + 2]];
    for (const [name, colour] of Object.entries(parsed)) {
      const dot = colour.reduce((sum, c, k) => sum + c * pixel[k], 0);
      const norm = colour.reduce((sum, c) => sum + c * c, 0) || 1;
      const scale = dot / norm;
      if (scale < 0.45 || scale > 1.08) continue;
      if (colour.every((c, k) => Math.abs(pixel[k] - scale * c) <= 14)) {
        counts[name]++;
        masks[name][p] = 1;
      }
    }
  }
  // The deepest pixel: the one with the most matching pixels in a 9 × 9 window.
  const centres = {};
  for (const [name, mask] of wantCentres ? Object.entries(masks) : []) {
    let best = { score: -1, x: 0, y: 0 };
    for (let y = 4; y < height - 4; y += 2) {
      for (let x = 4; x < width - 4; x += 2) {
        if (!mask[y * width + x]) continue;
        let score = 0;
        for (let dy = -4; dy <= 4; dy++) for (let dx = -4; dx <= 4; dx++) score += mask[(y + dy) * width + x + dx];
        if (score > best.score) best = { score, x, y };
      }
    }
    const box = canvas.getBoundingClientRect();
    centres[name] = best.score < 0 ? null : { x: box.left + (best.x * box.width) / width, y: box.top + (best.y * box.height) / height, score: best.score };
  }
  return { width, height, counts, centres };
}

/** The 3D canvas in grey levels at a quarter of its size (to compare two drawings). */
function canvasGrey() {
  const canvas = document.querySelector('#viewer canvas');
  const copy = document.createElement('canvas');
  copy.width = Math.ceil(canvas.width / 4);
  copy.height = Math.ceil(canvas.height / 4);
  const context = copy.getContext('2d');
  context.drawImage(canvas, 0, 0, copy.width, copy.height);
  const { data } = context.getImageData(0, 0, copy.width, copy.height);
  const grey = [];
  for (let k = 0; k < data.length; k += 4) grey.push(Math.round((data[k] + data[k + 1] + data[k + 2]) / 3));
  return grey;
}

/** How many samples of two grey images differ by more than a few levels. */
function differing(a, b) {
  let count = 0;
  for (let k = 0; k < Math.min(a.length, b.length); k++) if (Math.abs(a[k] - b[k]) > 24) count++;
  return count + Math.abs(a.length - b.length);
}

/**
 * @param {object} options
 * @param {string} options.root        repository root
 * @param {string} options.runDir      scratch folder of this run
 * @param {string} options.shots       folder for screenshots
 * @param {string} options.toolsDir    where playwright-core is installed
 * @param {string} options.webviewDir  the view scripts to serve (the packaged ones)
 * @param {(line: string) => void} [options.log]
 */
export async function runViewChecks({ root, runDir, shots, toolsDir, webviewDir, log = console.log }) {
  const results = [];
  mkdirSync(shots, { recursive: true });
  const scratch = mkdtempSync(path.join(runDir, 'views-'));
  const spec = path.join(root, 'samples', 'zn-site-h2s-scan.tess');
  for (const script of ['structure.js', 'costs.js']) if (!existsSync(path.join(webviewDir, script))) throw new Error(`${path.join(webviewDir, script)} is missing: build and package first`);
  const modules = await loadViewModules(root, scratch);
  const { structure, costs, others } = await viewData(root, spec);
  const server = await servePages(modules, webviewDir);
  const { chromium } = createRequire(path.join(toolsDir, 'package.json'))('playwright-core');
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE 127.0.0.1', ...WEBGL_FLAGS],
  });
  const context = await browser.newContext({ viewport: { width: 1100, height: 720 }, deviceScaleFactor: 1 });
  await context.addInitScript(installStub);
  const page = await context.newPage();
  const pageErrors = [];
  const consoleLines = [];
  page.on('pageerror', (error) => pageErrors.push(error.message));
  page.on('console', (message) => consoleLines.push(message.text()));
  page.on('request', (request) => {
    if (!request.url().startsWith(server.origin) && !/^(data|blob):/.test(request.url())) pageErrors.push(`request outside the test server: ${request.url()}`);
  });

  const check = async (id, title, body) => {
    const started = Date.now();
    let ok = false;
    let detail;
    try {
      detail = await body();
      ok = true;
    } catch (error) {
      detail = String(error?.message ?? error).split('\n').slice(0, 6).join(' | ');
      const warnings = consoleLines.filter((line) => line.includes('[tessera view]')).slice(-3);
      if (warnings.length > 0) detail += ` | page console: ${warnings.join(' | ')}`;
    }
    const screenshot = path.join(shots, `${id}-${title.replace(/[^a-z0-9]+/gi, '-').replace(/-+$/, '').toLowerCase()}.png`);
    await page.screenshot({ path: screenshot }).catch(() => {});
    results.push({ id, title, ok, detail, seconds: (Date.now() - started) / 1000, screenshot });
    log(`${ok ? 'PASS' : 'FAIL'} ${id}. ${title} (${((Date.now() - started) / 1000).toFixed(1)} s): ${detail}`);
  };
  const posted = () => page.evaluate(() => window.__posted);
  /** Waits until the page has posted a message that passes `test` (polled from here: the page allows no eval). */
  const waitPosted = async (test, what) => {
    const deadline = Date.now() + WAIT;
    for (;;) {
      const messages = await posted();
      if (messages.some(test)) return;
      if (Date.now() > deadline) throw new Error(`the page did not post ${what}; it posted ${JSON.stringify(messages).slice(0, 300)}`);
      await page.waitForTimeout(100);
    }
  };
  const send = (message) => page.evaluate((m) => window.postMessage(m, '*'), message);
  const cleanPage = async () => {
    const violations = await page.evaluate(() => window.__violations);
    if (violations.length > 0) throw new Error(`content-security-policy violations: ${violations.join('; ')}`);
    if (pageErrors.length > 0) throw new Error(`page errors: ${pageErrors.join('; ')}`);
  };

  const colours = Object.fromEntries(structure.fragments.map((f) => [f.name, f.colour]));
  const marks = { cut: '#1f1f1f', scan: '#6a3d9a' };
  try {
    // --- structure view ---------------------------------------------------------------------
    await page.goto(`${server.origin}/structure.html`);
    await check('v1', 'structure view key lists every fragment with its colour and cost', async () => {
      await waitPosted((m) => m.type === 'ready', "'ready'");
      await send({ type: 'structure', title: 'Structure: zn-site-h2s-scan.tess', data: structure });
      await page.locator('#fragments li[data-fragment]').nth(structure.fragments.length - 1).waitFor({ timeout: WAIT });
      const items = await page.$$eval('#fragments li[data-fragment]', (rows) =>
        rows.map((row) => ({ name: row.querySelector('.name').textContent, cost: row.querySelector('.cost').textContent, chip: getComputedStyle(row.querySelector('.chip')).backgroundColor })),
      );
      const rgb = (hex) => `rgb(${[1, 3, 5].map((k) => parseInt(hex.slice(k, k + 2), 16)).join(', ')})`;
      const expected = structure.fragments.map((f) => ({ name: f.name, cost: f.cost, chip: rgb(f.colour) }));
      if (JSON.stringify(items) !== JSON.stringify(expected)) throw new Error(`key shows ${JSON.stringify(items)}, expected ${JSON.stringify(expected)}`);
      const scanText = await page.locator('#scan-detail').innerText();
      const low = Math.min(...structure.scan.values).toFixed(2);
      const high = Math.max(...structure.scan.values).toFixed(2);
      if (!scanText.includes(`${low}–${high} Å`) || !scanText.includes(`${structure.scan.values.length} points`)) throw new Error(`scan line reads '${scanText}'`);
      const note = await page.locator('#note').innerText();
      if (!/planning estimates/i.test(note)) throw new Error(`no planning-estimate note: '${note}'`);
      await cleanPage();
      return `key: ${items.map((i) => `${i.name} ${i.cost} ${i.chip}`).join('; ')}; '${scanText}'`;
    });

    let centres = {};
    await check('v2', 'structure view canvas shows every fragment colour, cut bonds and the scan arrow', async () => {
      let sample;
      const deadline = Date.now() + WAIT;
      do {
        await page.waitForTimeout(200);
        sample = await page.evaluate(sampleCanvas, { colours: { ...colours, ...marks }, centres: true });
      } while ((!sample || Object.values(sample.counts).some((n) => n < 40)) && Date.now() < deadline);
      if (!sample) throw new Error('the view drew no canvas (WebGL unavailable?)');
      const missing = Object.entries(sample.counts).filter(([, n]) => n < 40);
      if (missing.length > 0) throw new Error(`too few pixels of ${missing.map(([name, n]) => `${name} (${n})`).join(', ')} on a ${sample.width}×${sample.height} canvas`);
      centres = sample.centres;
      await cleanPage();
      return `pixels on the ${sample.width}×${sample.height} canvas: ${Object.entries(sample.counts).map(([name, n]) => `${name} ${n}`).join(', ')}`;
    });

    await check('v3', 'atom labels toggle draws labels', async () => {
      const before = await page.evaluate(canvasGrey);
      await page.locator('#labels').check();
      let changed = 0;
      const deadline = Date.now() + WAIT;
      const enough = Math.round(before.length * 0.01);
      while (changed < enough && Date.now() < deadline) {
        await page.waitForTimeout(200);
        changed = differing(before, await page.evaluate(canvasGrey));
      }
      if (changed < enough) throw new Error(`turning labels on changed ${changed} of ${before.length} sampled pixels (expected at least ${enough})`);
      await page.screenshot({ path: path.join(shots, 'v3-structure-view-with-labels.png') });
      await page.locator('#labels').uncheck();
      let back = changed;
      const again = Date.now() + WAIT;
      while (back > enough / 4 && Date.now() < again) {
        await page.waitForTimeout(200);
        back = differing(before, await page.evaluate(canvasGrey));
      }
      if (back > enough / 4) throw new Error(`turning labels off left ${back} sampled pixels different from before`);
      await cleanPage();
      return `labels on: ${changed} of ${before.length} sampled pixels changed; off again: ${back} differ`;
    });

    await check('v4', 'clicking an atom posts its index', async () => {
      const target = structure.fragments.find((f) => f.tier === 'quantum') ?? structure.fragments[0];
      const centre = centres[target.name];
      if (!centre) throw new Error(`no pixel of ${target.name} to click`);
      await page.mouse.click(centre.x, centre.y);
      await waitPosted((m) => m.type === 'revealAtom', "'revealAtom'");
      const message = (await posted()).find((m) => m.type === 'revealAtom');
      const checked = modules.checkStructureViewMessage(message, { atoms: structure.atoms.length, fragments: structure.fragments.length });
      if (!checked.ok) throw new Error(`the posted message fails the extension's check: ${checked.reason}`);
      const atom = structure.atoms[message.atom];
      if (structure.fragments[atom.fragment]?.name !== target.name) throw new Error(`clicked a ${target.name} pixel at (${centre.x.toFixed(0)}, ${centre.y.toFixed(0)}) but atom #${atom.index + 1} (${atom.element}) of fragment ${atom.fragment} was posted`);
      await page.locator('#fragments li[data-fragment="1"]').click();
      await waitPosted((m) => m.type === 'revealFragment' && m.fragment === 1, "'revealFragment' 1");
      return `click at (${centre.x.toFixed(0)}, ${centre.y.toFixed(0)}) posted ${JSON.stringify(message)}: ${atom.element}${atom.label ? ` ${atom.label}` : ''} on line ${atom.line + 1}, fragment ${target.name}; a click on the key posted revealFragment 1`;
    });

    await check('v5', 'a highlight marks one fragment and fades the others', async () => {
      const chosen = 1;
      const name = structure.fragments[chosen].name;
      const before = (await page.evaluate(sampleCanvas, { colours })).counts;
      await send({ type: 'highlight', fragment: chosen, atom: null });
      await page.locator(`#fragments li[data-fragment="${chosen}"][aria-current="true"]`).waitFor({ timeout: WAIT });
      const current = await page.$$eval('#fragments li[aria-current="true"]', (rows) => rows.map((row) => row.dataset.fragment));
      if (current.join() !== String(chosen)) throw new Error(`marked in the key: ${current.join()}`);
      let after = before;
      const deadline = Date.now() + WAIT;
      const others = structure.fragments.filter((_, k) => k !== chosen).map((f) => f.name);
      while (others.some((other) => after[other] > before[other] / 4) && Date.now() < deadline) {
        await page.waitForTimeout(200);
        after = (await page.evaluate(sampleCanvas, { colours })).counts;
      }
      if (others.some((other) => after[other] > before[other] / 4)) throw new Error(`other fragments not faded: ${JSON.stringify(before)} → ${JSON.stringify(after)}`);
      if (after[name] < before[name] / 2) throw new Error(`the highlighted fragment lost its colour: ${before[name]} → ${after[name]}`);
      await page.screenshot({ path: path.join(shots, 'v5-structure-view-highlight.png') });
      await send({ type: 'highlight', fragment: null, atom: null });
      await cleanPage();
      return `'${name}' marked in the key; pixels ${JSON.stringify(before)} → ${JSON.stringify(after)}`;
    });

    await check('v6', 'malformed messages are ignored', async () => {
      const warningsBefore = consoleLines.filter((line) => line.includes('message ignored')).length;
      const bad = structuredClone(structure);
      bad.fragments[0].colour = 'red;background:url(http://example.invalid/x)';
      bad.fragments[0].name = 'SHOULD-NOT-APPEAR';
      await send({ type: 'structure', title: 'bad', data: bad });
      await send({ type: 'highlight', fragment: -3, atom: null });
      await send({ type: 'run', code: 'alert(1)' });
      await send({ type: 'structure', title: 'extra field', data: structure, extra: 1 });
      const deadline = Date.now() + WAIT;
      while (consoleLines.filter((line) => line.includes('message ignored')).length < warningsBefore + 4 && Date.now() < deadline) await page.waitForTimeout(100);
      const warnings = consoleLines.filter((line) => line.includes('message ignored')).slice(warningsBefore);
      if (warnings.length !== 4) throw new Error(`expected 4 ignored messages, the page logged ${warnings.length}: ${warnings.join(' | ')}`);
      const names = await page.$$eval('#fragments .name', (rows) => rows.map((row) => row.textContent));
      if (names.includes('SHOULD-NOT-APPEAR') || (await page.locator('#title').innerText()) !== 'Structure: zn-site-h2s-scan.tess') throw new Error(`a malformed message changed the page: ${names.join(', ')}`);
      await cleanPage();
      return warnings.join(' | ');
    });

    await page.screenshot({ path: path.join(shots, 'v-structure-view.png') });

    // --- cost panel ---------------------------------------------------------------------------
    await page.goto(`${server.origin}/costs.html`);
    await check('v7', 'cost panel shows the four charts and the fragment selector', async () => {
      await waitPosted((m) => m.type === 'ready', "'ready'");
      await send({ type: 'costs', title: 'Costs: zn-site-h2s-scan.tess', data: costs });
      for (const plot of ['qubits', 'growth', 'shots', 'scan']) await page.locator(`#plot-${plot} > svg`).waitFor({ timeout: WAIT });
      const text = Object.fromEntries(await Promise.all(['qubits', 'growth', 'shots', 'scan'].map(async (plot) => [plot, await page.locator(`#plot-${plot} > svg`).evaluate((svg) => svg.textContent)])));
      const selected = costs.fragments.find((f) => f.index === costs.selected);
      const wanted = {
        // Only quantum tiers have qubits, so only they get bars.
        qubits: ['Qubits per fragment (planning estimate)', 'Jordan–Wigner', 'Bravyi–Kitaev', 'tapered', ...structure.fragments.filter((f) => f.tier === 'quantum').map((f) => f.name)],
        growth: [`Cost against active-space size: ${selected.name}`, 'Pauli terms'],
        shots: [`Shots against active-space size: ${selected.name}`],
        scan: ['Cumulative cost along the scan', 'measurement circuits'],
      };
      for (const [plot, words] of Object.entries(wanted)) {
        const missing = words.filter((word) => !text[plot].includes(word));
        if (missing.length > 0) throw new Error(`${plot} chart lacks ${missing.join(', ')}`);
      }
      const options = await page.$$eval('#fragment option', (rows) => rows.map((row) => ({ value: Number(row.value), name: row.textContent, selected: row.selected })));
      const expected = costs.fragments.map((f) => ({ value: f.index, name: f.name, selected: f.index === costs.selected }));
      if (JSON.stringify(options) !== JSON.stringify(expected)) throw new Error(`selector offers ${JSON.stringify(options)}, expected ${JSON.stringify(expected)}`);
      await cleanPage();
      return `charts: ${Object.keys(text).join(', ')}; selector: ${options.map((o) => `${o.name}${o.selected ? ' (selected)' : ''}`).join(', ')}`;
    });

    await check('v8', 'cost panel selector and exports post checked messages', async () => {
      const other = others[0];
      if (!other) throw new Error('the demo needs two fragments with a growth chart');
      await page.locator('#fragment').selectOption(String(other.selected));
      await waitPosted((m) => m.type === 'selectFragment', "'selectFragment'");
      await send({ type: 'costs', title: 'Costs: zn-site-h2s-scan.tess', data: other });
      const otherName = other.fragments.find((f) => f.index === other.selected).name;
      await page.locator('#plot-growth > svg', { hasText: `active-space size: ${otherName}` }).waitFor({ timeout: WAIT });
      await page.locator('[data-plot="qubits"] button[data-export="svg"]').click();
      await waitPosted((m) => m.type === 'exportSvg', "'exportSvg'");
      await page.locator('[data-plot="growth"] button[data-export="png"]').click();
      await waitPosted((m) => m.type === 'exportPng', "'exportPng'");
      const context = { fragments: other.fragments.map((f) => f.index) };
      const checks = (await posted()).filter((m) => m.type !== 'ready').map((m) => ({ type: m.type, checked: modules.checkCostsViewMessage(m, context) }));
      const refused = checks.filter((c) => !c.checked.ok);
      if (refused.length > 0) throw new Error(`posted messages refused by the extension's check: ${refused.map((c) => `${c.type}: ${c.checked.reason}`).join('; ')}`);
      const png = (await posted()).find((m) => m.type === 'exportPng');
      const bytes = Buffer.from(png.dataUrl.split(',')[1], 'base64');
      const width = bytes.readUInt32BE(16);
      const height = bytes.readUInt32BE(20);
      if (png.plot !== 'growth' || width !== 1280 || height !== 680) throw new Error(`PNG of ${png.plot} is ${width}×${height}, expected growth at 1280×680`);
      await cleanPage();
      return `selectFragment ${other.selected} → growth chart of ${otherName}; exportSvg qubits; exportPng growth ${width}×${height} (${bytes.length} bytes); all pass the extension's checks`;
    });

    await page.screenshot({ path: path.join(shots, 'v-cost-panel.png'), fullPage: true });
  } finally {
    await browser.close().catch(() => {});
    await server.close();
    rmSync(scratch, { recursive: true, force: true });
  }
  return results;
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
  const cache = process.env.TESSERA_E2E_CACHE ?? path.join(root, '.cache', 'e2e');
  // A short path: Chromium puts Unix sockets under it (see run.mjs).
  const runDir = path.join(process.env.TESSERA_E2E_RUNS ?? path.join('/tmp', 'tessera-e2e'), `views-${process.pid}`);
  mkdirSync(runDir, { recursive: true });
  runViewChecks({ root, runDir, shots: path.join(root, 'tests', 'e2e', 'screenshots'), toolsDir: path.join(cache, 'tools'), webviewDir: path.join(root, '.cache', 'vsix-stage', 'dist', 'webview') })
    .then((results) => {
      const failed = results.filter((r) => !r.ok);
      console.log(failed.length === 0 ? `All ${results.length} view checks passed.` : `${failed.length} of ${results.length} view checks FAILED.`);
      if (failed.length === 0) rmSync(runDir, { recursive: true, force: true });
      process.exit(failed.length === 0 ? 0 : 1);
    })
    .catch((error) => {
      console.error(`[views] FAILED to run: ${error?.stack ?? error}`);
      process.exit(1);
    });
}
