#!/usr/bin/env node
/**
 * A second, independent LSP client: headless Neovim runs nvim/lsp-client.lua, which starts
 * `npx tessera lsp --stdio`, and writes what the server sent to a JSON file. This checks that
 * file against the command line: the same diagnostics (code, message, position) for the
 * deliberate-mistakes spec, and a hover card with the qubit figures for the demo's largest
 * quantum fragment.
 *
 * Runs from run.mjs (npm run test:e2e), or alone: `node tests/e2e/nvim-lsp.mjs` (after
 * `npm run build`). Fails, never skips, when nvim is missing.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';

/** The command line's figures the Neovim client must see (run.mjs passes the same object). */
function cliReference(root, dir) {
  const cli = (args) => {
    const result = spawnSync(process.execPath, [path.join(root, 'dist', 'cli.js'), ...args, '--format', 'json'], { cwd: root, encoding: 'utf8' });
    if (result.status !== 0 && result.status !== 1) throw new Error(`tessera ${args.join(' ')}: ${result.stderr}`);
    return JSON.parse(result.stdout);
  };
  const demo = cli(['estimate', path.join(dir, 'zn-site-h2s-scan.tess')]);
  const largest = demo.fragments.filter((f) => f.qubitsRequired !== null).sort((a, b) => b.qubitsRequired - a.qubitsRequired)[0];
  return { mistakes: cli(['check', path.join(dir, 'mistakes.tess')]).files[0].diagnostics, demoLargest: { fragment: largest.name, qubits: largest.qubitsRequired } };
}

export async function runNeovimCheck({ root, runDir, reference, log = console.log }) {
  const result = { id: 'nvim', title: 'Neovim LSP client: diagnostics and hover from tessera lsp --stdio', ok: false, detail: '' };
  const started = Date.now();
  try {
    const workspace = path.join(runDir, 'workspace');
    const dir = existsSync(path.join(workspace, 'mistakes.tess')) ? workspace : path.join(root, 'samples');
    const scratch = path.join(runDir, 'nvim');
    rmSync(scratch, { recursive: true, force: true });
    for (const sub of ['config', 'data', 'cache', 'state']) mkdirSync(path.join(scratch, sub), { recursive: true });
    const out = path.join(scratch, 'received.json');
    const { fragment, qubits } = reference.demoLargest;
    const env = {
      ...process.env,
      // Neovim 0.7 writes lsp.log under the cache folder: keep it, and everything else, here.
      XDG_CONFIG_HOME: path.join(scratch, 'config'),
      XDG_DATA_HOME: path.join(scratch, 'data'),
      XDG_CACHE_HOME: path.join(scratch, 'cache'),
      XDG_STATE_HOME: path.join(scratch, 'state'),
      NVIM_LOG_FILE: path.join(scratch, 'nvim.log'),
      TESSERA_ROOT: root,
      TESSERA_DIAGNOSTICS_FILE: path.join(dir, 'mistakes.tess'),
      TESSERA_HOVER_FILE: path.join(dir, 'zn-site-h2s-scan.tess'),
      TESSERA_HOVER_FRAGMENT: fragment,
      TESSERA_OUT: out,
    };
    const script = path.join(root, 'tests', 'e2e', 'nvim', 'lsp-client.lua');
    // An outer time limit: a headless nvim that hits an unexpected prompt would wait forever.
    const nvim = spawnSync('timeout', ['--kill-after=5', '90', 'nvim', '--headless', '-u', 'NONE', '-i', 'NONE', '-n', '-c', `luafile ${script}`], {
      cwd: scratch, env, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'],
    });
    if (nvim.error) throw new Error(`could not run nvim: ${nvim.error.message}`);
    if (nvim.status !== 0) throw new Error(`nvim exited with ${nvim.status ?? nvim.signal}: ${nvim.stderr.trim()} ${existsSync(out) ? readFileSync(out, 'utf8') : ''}`);
    const received = JSON.parse(readFileSync(out, 'utf8'));
    if (!received.ok) throw new Error(`the Lua client reported: ${received.error}`);

    // Diagnostics: exactly the command line's, with LSP's 0-based positions.
    const key = (d) => `${d.line}:${d.character} ${d.code} ${d.message}`;
    const got = received.diagnostics.map(key).sort();
    const wanted = reference.mistakes.map((d) => key({ line: d.line - 1, character: d.column - 1, code: d.code, message: d.message })).sort();
    const missing = wanted.filter((k) => !got.includes(k));
    const extra = got.filter((k) => !wanted.includes(k));
    if (missing.length > 0 || extra.length > 0) throw new Error(`diagnostics differ from tessera check: missing ${missing.join(' / ') || '-'}; extra ${extra.join(' / ') || '-'}`);
    if (received.diagnostics.some((d) => d.source !== 'tessera')) throw new Error('a diagnostic without source "tessera"');
    if (received.shown_by_neovim !== received.diagnostics.length) throw new Error(`Neovim shows ${received.shown_by_neovim} of ${received.diagnostics.length} diagnostics`);

    const hover = received.hover ?? '';
    for (const text of [`**fragment ${fragment}**`, 'qubits needed', 'Jordan–Wigner']) {
      if (!hover.includes(text)) throw new Error(`hover lacks '${text}': ${hover.slice(0, 300)}`);
    }
    const needed = hover.split('\n').find((row) => row.includes('qubits needed')) ?? '';
    if (!new RegExp(`(^|\\D)${qubits}(\\D|$)`).test(needed.replace('qubits needed', ''))) throw new Error(`hover's '${needed.trim()}' does not say ${qubits}`);
    if (received.hover_kind !== 'markdown') throw new Error(`hover kind ${received.hover_kind}, expected markdown`);
    if (!received.server_stopped) throw new Error('the language server did not exit after shutdown');

    const codes = [...new Set(received.diagnostics.map((d) => d.code))];
    const qubitRow = hover.split('\n').find((row) => row.includes('qubits needed'));
    result.ok = true;
    result.detail = `Neovim ${received.nvim}: ${received.diagnostics.length} diagnostics identical to tessera check (codes ${codes.join(', ')}) after ${received.timings_ms.diagnostics} ms; hover on '${fragment}' at ${received.hover_position.line + 1}:${received.hover_position.character + 1} has '${qubitRow.trim()}' (${received.timings_ms.hover} ms); server exited on shutdown`;
  } catch (error) {
    result.detail = String(error?.message ?? error);
  }
  result.seconds = (Date.now() - started) / 1000;
  log(`${result.ok ? 'PASS' : 'FAIL'} ${result.id}. ${result.title} (${result.seconds.toFixed(1)} s): ${result.detail}`);
  return result;
}

// Standalone: node tests/e2e/nvim-lsp.mjs
if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
  const runDir = path.join(root, '.cache', 'e2e', 'runs', `nvim-${process.pid}`);
  const reference = cliReference(root, path.join(root, 'samples'));
  const result = await runNeovimCheck({ root, runDir, reference });
  if (result.ok) rmSync(runDir, { recursive: true, force: true });
  process.exit(result.ok ? 0 : 1);
}
