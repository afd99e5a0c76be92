/**
 * Runs code-server (a real VS Code workbench over HTTP) for the editor tests: everything it writes
 * goes under one run folder (HOME, XDG folders, TMPDIR, user data, extensions), it listens on
 * 127.0.0.1 only, with auth, telemetry and update checks off. Stopping ends the process group it
 * was started in, then any descendant still alive, by pid.
 */
import { spawn, spawnSync } from 'node:child_process';
import { closeSync, cpSync, existsSync, mkdirSync, openSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import * as path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';

/** Editor settings of the test profile: no network, no tips, nothing that competes for focus. */
export const WORKBENCH_SETTINGS = {
  'telemetry.telemetryLevel': 'off',
  'update.mode': 'none',
  'extensions.autoCheckUpdates': false,
  'extensions.autoUpdate': false,
  'extensions.ignoreRecommendations': true,
  'workbench.enableExperiments': false,
  'workbench.startupEditor': 'none',
  'workbench.tips.enabled': false,
  'workbench.welcomePage.walkthroughs.openOnInstall': false,
  'workbench.editor.enablePreview': false,
  'security.workspace.trust.enabled': false,
  'git.enabled': false,
  'npm.fetchOnlinePackageInfo': false,
  'typescript.disableAutomaticTypeAcquisition': true,
  'chat.disableAIFeatures': true,
  'editor.minimap.enabled': false,
  // Completion from the language server only, so the completion check sees what Tessera offers.
  'editor.wordBasedSuggestions': 'off',
  'editor.inlayHints.enabled': 'on',
  'editor.codeLens': true,
  'editor.lightbulb.enabled': 'on',
  'files.autoSave': 'off',
};

/** The process environment that keeps code-server (and what it starts) inside the run folder. */
export function isolatedEnv(runDir) {
  const home = path.join(runDir, 'home');
  return {
    ...process.env,
    HOME: home,
    XDG_CONFIG_HOME: path.join(home, '.config'),
    XDG_DATA_HOME: path.join(home, '.local', 'share'),
    XDG_CACHE_HOME: path.join(home, '.cache'),
    XDG_STATE_HOME: path.join(home, '.local', 'state'),
    TMPDIR: path.join(runDir, 'tmp'),
  };
}

/** A free TCP port on the loopback interface. */
export async function freePort() {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
  });
}

export class CodeServer {
  /** @param {{ installDir: string, runDir: string }} options */
  constructor({ installDir, runDir }) {
    this.installDir = installDir;
    this.runDir = runDir;
    this.bin = path.join(installDir, 'node_modules', '.bin', 'code-server');
    this.log = path.join(runDir, 'code-server.log');
    this.child = undefined;
    this.port = undefined;
  }

  /** Fresh profile folders and settings. */
  prepare() {
    for (const dir of ['home', 'tmp', 'user-data/User', 'extensions']) mkdirSync(path.join(this.runDir, dir), { recursive: true });
    writeFileSync(path.join(this.runDir, 'config.yaml'), 'cert: false\n');
    writeFileSync(path.join(this.runDir, 'user-data', 'User', 'settings.json'), JSON.stringify(WORKBENCH_SETTINGS, null, 2));
  }

  commonArgs() {
    return ['--config', path.join(this.runDir, 'config.yaml'), '--user-data-dir', path.join(this.runDir, 'user-data'), '--extensions-dir', path.join(this.runDir, 'extensions')];
  }

  /** Installs a .vsix with code-server's command line; returns the `id@version` lines it lists. */
  installExtension(vsix) {
    const run = (args) => {
      const result = spawnSync(this.bin, [...this.commonArgs(), ...args], { env: isolatedEnv(this.runDir), encoding: 'utf8', timeout: 120_000 });
      if (result.status !== 0) throw new Error(`code-server ${args.join(' ')} failed (${result.status ?? result.signal}):\n${result.stdout}\n${result.stderr}`);
      return result.stdout;
    };
    run(['--install-extension', vsix, '--force']);
    return run(['--list-extensions', '--show-versions']).split('\n').map((line) => line.trim()).filter(Boolean);
  }

  /** Starts the server on a free loopback port and waits until /healthz answers. */
  async start(folder) {
    this.port = await freePort();
    const out = openSync(this.log, 'a');
    this.child = spawn(
      this.bin,
      [
        ...this.commonArgs(),
        '--bind-addr', `127.0.0.1:${this.port}`,
        '--auth', 'none',
        '--disable-telemetry', '--disable-update-check', '--disable-workspace-trust', '--disable-getting-started-override',
        folder,
      ],
      // Its own process group, so that stop() reaches the extension hosts and language servers too.
      { env: isolatedEnv(this.runDir), detached: true, stdio: ['ignore', out, out] },
    );
    closeSync(out);
    let exited;
    this.child.once('exit', (code, signal) => (exited = { code, signal }));
    const deadline = Date.now() + 60_000;
    while (Date.now() < deadline) {
      if (exited) throw new Error(`code-server exited during start-up (${JSON.stringify(exited)}); log: ${this.log}\n${tail(this.log)}`);
      try {
        const response = await fetch(`http://127.0.0.1:${this.port}/healthz`);
        if (response.ok) return this.url;
      } catch {
        // not listening yet
      }
      await sleep(250);
    }
    throw new Error(`code-server did not answer on port ${this.port} within 60 s; log: ${this.log}\n${tail(this.log)}`);
  }

  get url() {
    return `http://127.0.0.1:${this.port}`;
  }

  /** Every live process below the server (extension hosts, language servers, watchers). */
  descendants() {
    if (!this.child?.pid) return [];
    const children = new Map();
    for (const entry of readdirSync('/proc')) {
      if (!/^\d+$/.test(entry)) continue;
      try {
        const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
        const ppid = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
        if (!children.has(ppid)) children.set(ppid, []);
        children.get(ppid).push(Number(entry));
      } catch {
        // the process ended meanwhile
      }
    }
    const found = [];
    const walk = (pid) => {
      for (const child of children.get(pid) ?? []) {
        found.push(child);
        walk(child);
      }
    };
    walk(this.child.pid);
    return found;
  }

  /**
   * SIGTERM to the server's process group, a wait of up to 10 s for the server and every
   * descendant to end (extension hosts take a second or two), then SIGKILL to stragglers by pid.
   * Returns what it had to do, for the log.
   */
  async stop() {
    const child = this.child;
    if (!child?.pid) return 'not running';
    const pids = [child.pid, ...this.descendants()];
    const alive = () => pids.filter((pid) => isAlive(pid));
    signalGroup(child.pid, 'SIGTERM');
    for (let i = 0; i < 40 && alive().length > 0; i++) await sleep(250);
    const stragglers = alive();
    for (const pid of stragglers) signal(pid, 'SIGKILL');
    signalGroup(child.pid, 'SIGKILL');
    this.child = undefined;
    return stragglers.length === 0 ? `stopped (${pids.length} processes)` : `stopped; killed stragglers ${stragglers.join(' ')}`;
  }

  /** Last-resort synchronous stop, for process exit handlers. */
  killNow() {
    const child = this.child;
    if (!child?.pid) return;
    const pids = [child.pid, ...this.descendants()];
    signalGroup(child.pid, 'SIGKILL');
    for (const pid of pids) signal(pid, 'SIGKILL');
    this.child = undefined;
  }
}

function isAlive(pid) {
  try {
    process.kill(pid, 0);
    // A zombie still answers signal 0; it has ended all the same.
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    return stat.slice(stat.lastIndexOf(')') + 2)[0] !== 'Z';
  } catch {
    return false;
  }
}

function signal(pid, name) {
  try {
    process.kill(pid, name);
  } catch {
    // already gone
  }
}

function signalGroup(pgid, name) {
  try {
    process.kill(-pgid, name);
  } catch {
    // already gone
  }
}

export function tail(file, lines = 30) {
  if (!existsSync(file)) return '';
  return readFileSync(file, 'utf8').split('\n').slice(-lines).join('\n');
}

/** Copies the project's samples and the test's own specs into a fresh workspace folder. */
export function makeWorkspace(root, folder) {
  mkdirSync(folder, { recursive: true });
  cpSync(path.join(root, 'samples'), folder, { recursive: true });
  cpSync(path.join(root, 'tests', 'e2e', 'workspace'), folder, { recursive: true });
  return folder;
}
