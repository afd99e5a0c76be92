#!/usr/bin/env node
/**
 * `npm run test:e2e`: Tessera in two real editors.
 *
 *  1. installs (or reuses) code-server, playwright-core and the Debian packages (install.sh);
 *  2. builds the bundles and the .vsix (`npm run build`, `npm run package`);
 *  3. installs the .vsix into code-server, serves a workspace of the samples on loopback and
 *     runs the workbench checks in headless Chromium (vscode-checks.mjs);
 *  4. runs the structure view and cost panel pages in headless Chromium, outside VS Code
 *     (views-checks.mjs);
 *  5. runs the second LSP client, headless Neovim, against `tessera lsp --stdio` (nvim-lsp.mjs).
 *
 * Screenshots go to tests/e2e/screenshots/ (git ignores it); the run folder to
 * /tmp/tessera-e2e/<id>/ (TESSERA_E2E_RUNS moves it; kept when something fails, for its logs). `--doc-images` also copies the
 * README pictures to docs/images/. Exits 1 when any check fails or the environment cannot be set
 * up: nothing here skips.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import { CodeServer, isolatedEnv, makeWorkspace, tail } from './lib/code-server.mjs';
import { launchBrowser, openWorkbench } from './lib/workbench.mjs';
import { runNeovimCheck } from './nvim-lsp.mjs';
import { publishDocImages, runWorkbenchChecks } from './vscode-checks.mjs';
import { runViewChecks, viewData } from './views-checks.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const cache = process.env.TESSERA_E2E_CACHE ?? path.join(root, '.cache', 'e2e');
const shots = path.join(root, 'tests', 'e2e', 'screenshots');
// Run folders live under a short path of their own: Chromium and code-server put Unix sockets in
// them, and a socket path longer than 107 bytes fails (a deep clone would exceed it under .cache).
const runsBase = process.env.TESSERA_E2E_RUNS ?? path.join('/tmp', 'tessera-e2e');
const runDir = path.join(runsBase, `r${Date.now().toString(36)}-${process.pid}`);
const docImages = process.argv.includes('--doc-images');

const began = Date.now();
const phases = [];
let phaseStart = Date.now();
const log = (line) => console.log(`[e2e ${((Date.now() - began) / 1000).toFixed(1).padStart(5)} s] ${line}`);
const phase = (name) => {
  const now = Date.now();
  phases.push({ name, seconds: (now - phaseStart) / 1000 });
  phaseStart = now;
};

/** Runs a command with inherited output; throws when it fails. */
function run(command, args, options = {}) {
  const result = spawnSync(command, args, { cwd: root, stdio: 'inherit', ...options });
  if (result.status !== 0) throw new Error(`${command} ${args.join(' ')} failed (${result.status ?? result.signal})`);
  return result;
}

/** The Tessera command line's JSON for a file (exit status 1 just means the file has errors). */
function tessera(args) {
  const result = spawnSync(process.execPath, [path.join(root, 'dist', 'cli.js'), ...args, '--format', 'json'], { cwd: root, encoding: 'utf8' });
  if (result.status !== 0 && result.status !== 1) throw new Error(`tessera ${args.join(' ')}: ${result.stderr}`);
  return JSON.parse(result.stdout);
}

/** What the command line says about the workspace's files: the figures the editors must show. */
async function referenceFigures(workspace) {
  const diagnosticsOf = (file) => tessera(['check', path.join(workspace, file)]).files[0].diagnostics;
  const demo = tessera(['estimate', path.join(workspace, 'zn-site-h2s-scan.tess')]);
  const quantum = demo.fragments.filter((f) => f.qubitsRequired !== null).sort((a, b) => b.qubitsRequired - a.qubitsRequired);
  if (quantum.length === 0) throw new Error('the demo has no quantum-tier fragment; the status bar check needs one');
  const multiplicity = diagnosticsOf('quick-fix.tess').filter((d) => d.code === 'multiplicity-parity');
  if (multiplicity.length !== 1) throw new Error(`quick-fix.tess should have one multiplicity-parity problem, has ${multiplicity.length}`);
  // One nearest value, or two ('… are 1 or 3'): the quick fix prefers the first (the lower one).
  const nearest = /nearest valid multiplicit(?:y is|ies are) (\d+)/.exec(multiplicity[0].message)?.[1];
  if (!nearest) throw new Error(`no nearest multiplicity in '${multiplicity[0].message}'`);
  return {
    mistakes: diagnosticsOf('mistakes.tess'),
    demoName: demo.spec.name,
    demoFragments: demo.fragments.map((f) => f.name),
    demoFigures: demo.fragments.map(({ name, qubitsRequired, orbitals, solverCost }) => ({ name, qubitsRequired, orbitals, solverMemory: solverCost?.memoryBytes?.text ?? null })),
    demoLargest: { fragment: quantum[0].name, qubits: quantum[0].qubitsRequired },
    quickFix: { ...multiplicity[0], nearest: Number(nearest) },
    // The language server's answers for the views (atom lines, colours, charts) over stdio.
    views: await viewData(root, path.join(workspace, 'zn-site-h2s-scan.tess')),
  };
}

/** Run folders are kept after failures, for their logs; only the last few. */
function pruneOldRuns(keep = 3) {
  const runs = runsBase;
  let names = [];
  try {
    names = readdirSync(runs).sort();
  } catch {
    return;
  }
  for (const name of names.slice(0, Math.max(0, names.length - keep))) rmSync(path.join(runs, name), { recursive: true, force: true });
}

let server;
let browser;
let stopping = false;
let interrupted;
async function cleanUp() {
  if (stopping) return;
  stopping = true;
  if (browser) await browser.close().catch(() => {});
  if (server) log(`code-server ${await server.stop()}`);
}
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) {
  process.on(signal, () => {
    interrupted = signal;
    log(`${signal}: stopping code-server`);
    void cleanUp().finally(() => process.exit(130));
  });
}
// Whatever happens, never leave code-server behind.
process.on('exit', () => server?.killNow());

async function main() {
  log(`Tessera e2e: node ${process.version}, run folder ${path.relative(root, runDir)}`);
  run('bash', [path.join(root, 'tests', 'e2e', 'install.sh')]);
  phase('install (install.sh)');

  run('npm', ['run', '--silent', 'build']);
  run('npm', ['run', '--silent', 'package']);
  const { version } = JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8'));
  const vsix = path.join(root, `tessera-${version}.vsix`);
  phase('build and package the .vsix');

  pruneOldRuns();
  rmSync(shots, { recursive: true, force: true });
  mkdirSync(shots, { recursive: true });
  mkdirSync(runDir, { recursive: true });
  const workspace = makeWorkspace(root, path.join(runDir, 'workspace'));
  const reference = await referenceFigures(workspace);
  const viewResults = await runViewChecks({ root, runDir, shots, toolsDir: path.join(cache, 'tools'), webviewDir: path.join(root, '.cache', 'vsix-stage', 'dist', 'webview'), log });
  phase('view pages in headless Chromium');
  server = new CodeServer({ installDir: path.join(cache, 'code-server'), runDir });
  server.prepare();
  const extensions = server.installExtension(vsix);
  if (!extensions.includes(`tessera-dev.tessera@${version}`)) throw new Error(`code-server lists ${extensions.join(', ') || 'no extensions'} after installing ${vsix}`);
  log(`installed into code-server: ${extensions.join(', ')}`);
  phase('install the .vsix into code-server');

  await server.start(workspace);
  log(`code-server ${server.url} (pid ${server.child.pid}), log ${path.relative(root, server.log)}`);
  browser = await launchBrowser({ toolsDir: path.join(cache, 'tools'), runDir, env: isolatedEnv(runDir) });
  const { page, readyMs } = await openWorkbench(browser.context, server.url, workspace, log);
  log(`workbench ready in ${readyMs} ms`);
  phase('start code-server and the workbench');

  const { results, measurements } = await runWorkbenchChecks({ page, workspace, shots, reference, log });
  results.unshift(...viewResults);
  if (interrupted) throw new Error(`interrupted by ${interrupted}`);
  phase('workbench checks');
  await cleanUp();
  phase('stop code-server');

  const neovim = await runNeovimCheck({ root, runDir, reference, log });
  results.push(neovim);
  phase('Neovim LSP client');

  console.log('\nResults');
  for (const result of results) console.log(`  ${result.ok ? 'PASS' : 'FAIL'}  ${result.id}. ${result.title}`);
  console.log(`\nActivation (opening mistakes.tess to its first problem in the Problems panel): ${measurements.activationMs ?? 'not measured'} ms`);
  console.log(`Second spec, server running (opening the demo to its qubit count in the status bar): ${measurements.secondFileMs ?? 'not measured'} ms`);
  console.log('\nTimings');
  for (const { name, seconds } of phases) console.log(`  ${name.padEnd(40)} ${seconds.toFixed(1).padStart(6)} s`);
  console.log(`  ${'total'.padEnd(40)} ${((Date.now() - began) / 1000).toFixed(1).padStart(6)} s`);
  console.log(`\nScreenshots: ${path.relative(root, shots)}/ (${readdirSync(shots).filter((f) => f.endsWith('.png')).length} files)`);

  const failed = results.filter((result) => !result.ok);
  if (docImages) {
    // Pictures of a failing run could show the failure: only a passing run updates them.
    if (failed.length === 0) console.log(`README pictures copied: ${publishDocImages(shots, root).join(', ')}`);
    else console.log('README pictures NOT copied to docs/images/: some checks failed');
  }
  if (failed.length > 0) {
    console.log(`\n${failed.length} of ${results.length} checks FAILED; run folder kept: ${runDir}`);
    return 1;
  }
  rmSync(runDir, { recursive: true, force: true });
  console.log(`\nAll ${results.length} checks passed.`);
  return 0;
}

main().then(
  (code) => cleanUp().then(() => process.exit(code)),
  async (error) => {
    console.error(`\n[e2e] FAILED to run: ${error?.stack ?? error}`);
    if (server) console.error(`code-server log (${server.log}):\n${tail(server.log)}`);
    await cleanUp();
    console.error(`run folder kept: ${runDir}`);
    process.exit(1);
  },
);
