/**
 * The language server while an SCF job runs in its worker thread. The same spec (an idealised
 * naphthalene, invented, in cc-pVDZ: 180 basis functions, an SCF of several seconds even on a quiet
 * machine) is opened in two fresh servers over stdio:
 *
 * - the anchor, with `tessera.meanField.autoFunctionLimit` 0: nothing is computed;
 * - the loaded server, with the limit raised above the part's size: its mean field starts by itself.
 *
 * In each, once the job runs (loaded) or after the same wait (anchor), a comment digit is edited
 * every 150 ms (an edit that keeps the fragment's inputs, so the job goes on) and each edit is
 * followed at once by a hover on the fragment name or a completion in its tier block. Edit →
 * diagnostics, hover and completion are timed in both; the targets are ratios between the two runs
 * of this benchmark (hover and completion p95 also under 20 ms): typing never waits for the job.
 * Then, in the loaded server, a coordinate is edited, which changes the fragment's inputs: the time
 * until the old job's progress ends is how long the cancellation takes to reach the editor
 * (scheduling of the analysis included).
 */
import { spawn } from 'node:child_process';
import { loadavg } from 'node:os';
import * as path from 'node:path';
import { createMessageConnection, StreamMessageReader, StreamMessageWriter, type MessageConnection } from 'vscode-jsonrpc/node';
import { ms, summarize, type Timing } from './timing';
import { stopServer } from './server';

const EDITS = 40;
const EDIT_INTERVAL_MS = 150;

/**
 * An idealised naphthalene (invented geometry: regular hexagons, C–C 1.40 Å, C–H 1.09 Å, D2h), in
 * cc-pVDZ: 10 × 14 + 8 × 5 = 180 basis functions, so that the SCF runs for several seconds even on a
 * quiet machine and the edits below all fall while it runs.
 */
function naphthaleneSpec(): string {
  const cc = 1.4;
  const ch = 1.09;
  const rows: string[] = [];
  const place = (symbol: string, name: string, x: number, y: number) => rows.push(`  ${symbol} ${name} ${x.toFixed(6)} ${y.toFixed(6)} 0.000000`);
  place('C', 'c1', 0, cc / 2);
  place('C', 'c2', 0, -cc / 2);
  let carbon = 3;
  let hydrogen = 1;
  for (const side of [1, -1]) {
    const centre = (side * cc * Math.sqrt(3)) / 2;
    for (const degrees of [90, 30, -30, -90]) {
      const angle = (degrees * Math.PI) / 180;
      const dx = side * Math.cos(angle);
      const dy = Math.sin(angle);
      place('C', `c${carbon++}`, centre + cc * dx, cc * dy);
      place('H', `h${hydrogen++}`, centre + (cc + ch) * dx, (cc + ch) * dy);
    }
  }
  return ['spec "naphthalene"', '# note 1000', 'basis cc-pVDZ', 'structure {', ...rows, '}', 'fragment rings {', '  atoms rest', '  tier quantum {', '    method vqe', '    active 10e 10o', '  }', '}', ''].join('\n');
}

/** Large enough that the loaded server computes the 180-function part by itself. */
const LOADED_FUNCTION_LIMIT = 400;

interface Position {
  line: number;
  character: number;
}

function positionOf(text: string, offset: number): Position {
  const before = text.slice(0, offset);
  return { line: before.split('\n').length - 1, character: offset - (before.lastIndexOf('\n') + 1) };
}

interface ProgressValue {
  kind: 'begin' | 'report' | 'end';
  title?: string;
}

async function startServer(autoFunctionLimit: number): Promise<{ connection: MessageConnection; stop: () => Promise<void>; progress: Map<string, ProgressValue[]>; onProgress: (listener: () => void) => void }> {
  const server = process.env['TESSERA_BENCH_SERVER'] ?? path.join(__dirname, 'server.js');
  const child = spawn(process.execPath, [server, '--stdio'], { stdio: ['pipe', 'pipe', 'inherit'] });
  const connection = createMessageConnection(new StreamMessageReader(child.stdout!), new StreamMessageWriter(child.stdin!));
  const settings = { meanField: { autoFunctionLimit } };
  const progress = new Map<string, ProgressValue[]>();
  const listeners: (() => void)[] = [];
  connection.onRequest('workspace/configuration', (params: { items: unknown[] }) => params.items.map(() => settings));
  connection.onRequest('client/registerCapability', () => null);
  connection.onRequest('window/workDoneProgress/create', (params: { token: string }) => {
    progress.set(params.token, []);
    return null;
  });
  connection.onNotification('$/progress', (params: { token: string; value: ProgressValue }) => {
    progress.get(params.token)?.push(params.value);
    for (const listener of listeners) listener();
  });
  connection.onNotification('textDocument/publishDiagnostics', () => undefined);
  connection.onNotification('tessera/settingsChanged', () => undefined);
  connection.onNotification('tessera/computedChanged', () => undefined);
  connection.listen();
  await connection.sendRequest('initialize', { processId: process.pid, rootUri: null, capabilities: { workspace: { configuration: true }, window: { workDoneProgress: true } } });
  await connection.sendNotification('initialized', {});
  return {
    connection,
    progress,
    onProgress: (listener) => listeners.push(listener),
    stop: () => stopServer(connection, child),
  };
}

interface Run {
  readonly diagnostics: Timing;
  readonly hover: Timing;
  readonly completion: Timing;
  /** Whether the mean-field job was running from the first edit to the last. */
  readonly jobThroughout: boolean;
  /** Edit of a coordinate → the old job's progress ended (loaded run only). */
  readonly cancelMs: number | null;
  /** Diagnostics of that edit published (its analysis done, the new demand given to the queue) → the old job's progress ended. */
  readonly cancelAfterAnalysisMs: number | null;
}

function jobState(progress: Map<string, ProgressValue[]>): { running: boolean; ended: number } {
  let running = false;
  let ended = 0;
  for (const values of progress.values()) {
    if (!values.some((value) => value.kind === 'begin' && value.title?.includes('mean field'))) continue;
    if (values.some((value) => value.kind === 'end')) ended++;
    else running = true;
  }
  return { running, ended };
}

async function run(loaded: boolean): Promise<Run> {
  const { connection, stop, progress, onProgress } = await startServer(loaded ? LOADED_FUNCTION_LIMIT : 0);
  const uri = 'file:///bench/naphthalene-job.tess';
  let text = naphthaleneSpec();
  let version = 1;
  let publishedVersion = 0;
  const waiters: { version: number; resolve: (at: number) => void }[] = [];
  connection.onNotification('textDocument/publishDiagnostics', (params: { uri: string; version?: number }) => {
    if (params.uri !== uri) return;
    const at = performance.now();
    publishedVersion = Math.max(publishedVersion, params.version ?? 0);
    for (let i = waiters.length - 1; i >= 0; i--) {
      if (waiters[i]!.version <= publishedVersion) {
        waiters[i]!.resolve(at);
        waiters.splice(i, 1);
      }
    }
  });
  const published = (wanted: number) => new Promise<number>((resolve) => (publishedVersion >= wanted ? resolve(performance.now()) : waiters.push({ version: wanted, resolve })));
  const opened = published(1);
  await connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'tessera', version: 1, text } });
  await opened;
  // The loaded server starts its job after a short delay; the anchor waits as long.
  const startedBy = performance.now() + 10_000;
  while (performance.now() < startedBy && (loaded ? !jobState(progress).running : performance.now() < startedBy - 9_000)) await new Promise((resolve) => setTimeout(resolve, 20));
  const runningAtStart = jobState(progress).running;

  const edit = (start: number, end: number, replacement: string) => {
    const range = { start: positionOf(text, start), end: positionOf(text, end) };
    text = text.slice(0, start) + replacement + text.slice(end);
    version++;
    void connection.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: [{ range, text: replacement }] });
    return version;
  };
  const latencies: Promise<number>[] = [];
  const hovers: Promise<number>[] = [];
  const completions: Promise<number>[] = [];
  const first = performance.now();
  for (let k = 0; k < EDITS; k++) {
    const wait = first + k * EDIT_INTERVAL_MS - performance.now();
    if (wait > 0) await new Promise((resolve) => setTimeout(resolve, wait));
    const digit = text.indexOf('# note ') + '# note '.length + 3;
    const sent = performance.now();
    const edited = edit(digit, digit + 1, String((Number(text[digit]) + 1) % 10));
    latencies.push(published(edited).then((at) => at - sent));
    const asked = performance.now();
    if (k % 2 === 0) {
      const at = text.indexOf('fragment rings') + 'fragment ri'.length;
      hovers.push(connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: positionOf(text, at) }).then(() => performance.now() - asked));
    } else {
      const at = text.indexOf('method vqe') + 'method '.length;
      completions.push(connection.sendRequest('textDocument/completion', { textDocument: { uri }, position: positionOf(text, at) }).then(() => performance.now() - asked));
    }
  }
  const diagnostics = summarize(await Promise.all(latencies));
  const hover = summarize(await Promise.all(hovers));
  const completion = summarize(await Promise.all(completions));
  const jobThroughout = runningAtStart && jobState(progress).running;

  let cancelMs: number | null = null;
  let cancelAfterAnalysisMs: number | null = null;
  if (loaded && jobThroughout) {
    const endedBefore = jobState(progress).ended;
    const ended = new Promise<number>((resolve) => onProgress(() => jobState(progress).ended > endedBefore && resolve(performance.now())));
    const coordinate = text.indexOf('c1 ') + 'c1 '.length;
    const sent = performance.now();
    const analysed = published(edit(coordinate, coordinate + 1, '2'));
    const endedAt = await Promise.race([ended, new Promise<number>((resolve) => setTimeout(() => resolve(NaN), 10_000))]);
    cancelMs = endedAt - sent;
    cancelAfterAnalysisMs = endedAt - (await analysed);
  }
  await stop();
  return { diagnostics, hover, completion, jobThroughout, cancelMs, cancelAfterAnalysisMs };
}

function cancelText(value: number | null): string {
  return value === null ? 'not measured' : Number.isNaN(value) ? 'NOT within 10 s' : ms(value);
}

function ratio(value: number, anchor: number): string {
  return anchor > 0 ? `${(value / anchor).toFixed(2)}` : '–';
}

/** Anchor and loaded runs alternate, ROUNDS times each, so that a change of the machine's load shows as a difference between rounds. */
const ROUNDS = 2;

export async function benchJobs(): Promise<string[]> {
  const row = (name: string, a: Timing, b: Timing) => `| ${name} | ${ms(a.median)} / ${ms(a.p95)} | ${ms(b.median)} / ${ms(b.p95)} | ${ratio(b.p95, a.p95)} |`;
  const lines = [
    '## Language server while an SCF job runs',
    '',
    `Naphthalene/cc-pVDZ (180 functions, computed by itself with the auto-compute limit raised to ${LOADED_FUNCTION_LIMIT}), ${EDITS} comment edits ${EDIT_INTERVAL_MS} ms apart, each followed by a hover or a completion; anchor: the same spec on a server that computes nothing, in this run; ${ROUNDS} rounds of anchor then loaded. Load average at the start: ${loadavg().map((value) => value.toFixed(1)).join(', ')} (2 cores shared).`,
  ];
  for (let round = 1; round <= ROUNDS; round++) {
    const anchor = await run(false);
    const loaded = await run(true);
    lines.push(
      '',
      `Round ${round}. The job ran throughout the loaded run: ${loaded.jobThroughout ? 'yes' : 'NO (the figures below do not measure the target)'}.`,
      '',
      '| request | anchor p50 / p95 | during the SCF p50 / p95 | p95 ratio |',
      '| --- | ---: | ---: | ---: |',
      row('edit → diagnostics', anchor.diagnostics, loaded.diagnostics),
      row('hover', anchor.hover, loaded.hover),
      row('completion', anchor.completion, loaded.completion),
      '',
      `Edit of a coordinate (the job's inputs change) → the old job's progress ended: ${cancelText(loaded.cancelMs)}; of which after the edit's diagnostics were published (its analysis done, the queue told): ${cancelText(loaded.cancelAfterAnalysisMs)}.`,
    );
  }
  lines.push(
    '',
    'Targets: hover and completion p95 under 20 ms while the job runs; edit → diagnostics, hover and completion p95 within 1.5× the anchor (not delayed by the job); cancellation reaching the editor within 200 ms plus the analysis of the edit.',
  );
  return lines;
}
