/**
 * The language server over stdio, driven the way an editor drives it. For each generated spec
 * (the dense water box and the organic-like chains, 5,000 and 50,000 atoms) a fresh server opens
 * the spec, then:
 *
 * - edits arrive on a timer, one every 100 ms, whatever the server is doing: first one-character
 *   changes of a coordinate digit, then a new atom line typed character by character (so the
 *   geometry is briefly malformed), then more digit changes;
 * - after each edit the requests an editor sends follow at once (semantic tokens, as a delta when
 *   the server offers one and one request at a time; inlay hints for the visible lines; code lens;
 *   document symbols), and the next edit cancels those still unanswered, as VS Code does;
 * - every fifth edit is followed at once by a hover on a fragment name or a completion in a tier
 *   block, the first request after the edit (never a cache hit);
 * - edit → diagnostics is the time from sending an edit to the first published diagnostics for that
 *   version or a later one;
 * - the server's peak resident memory (VmHWM) is read at the end.
 *
 * Each latency is also given as a ratio to JSON.parse of the same coordinates timed in this run.
 * Targets on 5,000 atoms: edit → diagnostics p95 under 100 ms and within 30× JSON.parse, hover and
 * completion under 20 ms, peak memory under 200 MB; on 50,000 atoms: p95 under 1 s and memory
 * under 400 MB; the first ten edits of a fresh server as fast as the rest.
 * TESSERA_BENCH_SERVER runs another build of the server (for before/after figures);
 * TESSERA_BENCH_NODE_ARGS passes options to its Node (for example --cpu-prof); TESSERA_BENCH_ONLY
 * (`water-5000`, `organic-50000`, ...) runs one scenario, TESSERA_BENCH_EDITS caps the edits, and
 * TESSERA_BENCH_VERBOSE prints every latency.
 */
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { CancellationTokenSource, createMessageConnection, StreamMessageReader, StreamMessageWriter, type MessageConnection } from 'vscode-jsonrpc/node';
import { generatedSpec, type GeometryKind, type GeneratedSpec } from './generate';
import { ms, summarize, time, type Timing } from './timing';
import { stopServer } from './server';

interface Position {
  line: number;
  character: number;
}

interface Published {
  uri: string;
  version?: number;
}

/** VmHWM (peak) and VmRSS of a process, in MB. */
function memoryOf(pid: number): { peak: number; now: number } {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  const read = (key: string) => Number(new RegExp(`${key}:\\s+(\\d+) kB`).exec(status)?.[1] ?? NaN) / 1024;
  return { peak: read('VmHWM'), now: read('VmRSS') };
}

/** The editor's copy of the document: text, version, and positions in it. */
class EditorDocument {
  version = 1;
  constructor(public text: string) {}

  positionOf(offset: number): Position {
    let line = 0;
    for (let at = this.text.indexOf('\n'); at >= 0 && at < offset; at = this.text.indexOf('\n', at + 1)) line++;
    return { line, character: offset - (this.text.lastIndexOf('\n', offset - 1) + 1) };
  }

  /** Replaces [start, end) and returns the LSP change. */
  replace(start: number, end: number, text: string): { range: { start: Position; end: Position }; text: string } {
    const range = { start: this.positionOf(start), end: this.positionOf(end) };
    this.text = this.text.slice(0, start) + text + this.text.slice(end);
    this.version++;
    return { range, text };
  }
}

/** The edits of one run: digit changes, a typed atom line, digit changes again. */
function editPlan(document: EditorDocument, count: number): (() => { range: { start: Position; end: Position }; text: string })[] {
  const edits: (() => { range: { start: Position; end: Position }; text: string })[] = [];
  const digitAt = () => {
    // The last digit of the first coordinate of the structure block's fifth line.
    const geometry = document.text.indexOf('structure {');
    let line = geometry;
    for (let i = 0; i < 5; i++) line = document.text.indexOf('\n', line + 1);
    const match = /-?\d+\.\d+/.exec(document.text.slice(line, line + 200))!;
    return line + match.index + match[0].length - 1;
  };
  const digit = (k: number) => () => {
    const at = digitAt();
    return document.replace(at, at + 1, String((Number(document.text[at]) + 1 + (k % 3)) % 10));
  };
  const typed = '\n  C c90001 12.5 3.25 7.125';
  const first = Math.max(1, Math.floor((count - typed.length) / 2));
  for (let k = 0; k < first; k++) edits.push(digit(k));
  for (let k = 0; k < typed.length; k++) {
    edits.push(() => {
      // After the first atom line, so the block stays open while the line is typed.
      const geometry = document.text.indexOf('structure {') + 'structure {'.length;
      const lineEnd = document.text.indexOf('\n', geometry + 1);
      const at = lineEnd + k;
      return document.replace(at, at, typed[k]!);
    });
  }
  for (let k = 0; edits.length < count; k++) edits.push(digit(k));
  return edits;
}

interface RunResult {
  readonly spec: GeneratedSpec;
  readonly anchor: Timing;
  readonly diagnostics: Timing;
  readonly digits: Timing;
  readonly typing: Timing;
  readonly firstTen: Timing;
  readonly hover: Timing;
  readonly completion: Timing;
  readonly memory: { peak: number; now: number };
  readonly openMs: number;
  readonly missed: number;
}

async function startServer(): Promise<{ connection: MessageConnection; pid: number; stop: () => Promise<void>; capabilities: Record<string, unknown> }> {
  const server = process.env['TESSERA_BENCH_SERVER'] ?? path.join(__dirname, 'server.js');
  const nodeArgs = (process.env['TESSERA_BENCH_NODE_ARGS'] ?? '').split(' ').filter(Boolean);
  const child = spawn(process.execPath, [...nodeArgs, server, '--stdio'], { stdio: ['pipe', 'pipe', 'inherit'] });
  const connection = createMessageConnection(new StreamMessageReader(child.stdout!), new StreamMessageWriter(child.stdin!));
  connection.onRequest('workspace/configuration', (params: { items: unknown[] }) => params.items.map(() => ({})));
  connection.onRequest('client/registerCapability', () => null);
  connection.onRequest('workspace/inlayHint/refresh', () => null);
  connection.onRequest('workspace/codeLens/refresh', () => null);
  connection.onRequest('workspace/semanticTokens/refresh', () => null);
  connection.onNotification('tessera/settingsChanged', () => undefined);
  connection.listen();
  const initialized = (await connection.sendRequest('initialize', {
    processId: process.pid,
    rootUri: null,
    capabilities: {
      workspace: { configuration: true, inlayHint: { refreshSupport: true }, codeLens: { refreshSupport: true } },
      textDocument: { semanticTokens: { requests: { full: { delta: true } }, tokenTypes: [], tokenModifiers: [], formats: ['relative'] } },
    },
  })) as { capabilities: Record<string, unknown> };
  await connection.sendNotification('initialized', {});
  return {
    connection,
    pid: child.pid!,
    capabilities: initialized.capabilities,
    stop: () => stopServer(connection, child),
  };
}

const EDIT_INTERVAL_MS = 100;

async function runScenario(kind: GeometryKind, atoms: number, editCount: number): Promise<RunResult> {
  const spec = generatedSpec(kind, atoms);
  const anchor = time(() => JSON.parse(spec.json), 20, 5);
  const { connection, pid, stop, capabilities } = await startServer();
  const uri = `file:///bench/${kind}-${atoms}.tess`;
  const document = new EditorDocument(spec.text);

  let publishedVersion = 0;
  const waiters: { version: number; resolve: (at: number) => void }[] = [];
  connection.onNotification('textDocument/publishDiagnostics', (params: Published) => {
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
  const published = (version: number) => new Promise<number>((resolve) => (publishedVersion >= version ? resolve(performance.now()) : waiters.push({ version, resolve })));

  const openStart = performance.now();
  const opened = published(1);
  await connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'tessera', version: 1, text: spec.text } });
  const openMs = (await opened) - openStart;

  const semanticDelta = (capabilities['semanticTokensProvider'] as { full?: boolean | { delta?: boolean } } | undefined)?.full;
  const useDelta = typeof semanticDelta === 'object' && semanticDelta.delta === true;
  let previousTokens: string | undefined;
  let pending = new CancellationTokenSource();
  // Like VS Code, one semantic-tokens request at a time: a new one waits until the last has settled.
  let tokensInFlight = false;
  const requestMix = (around: number) => {
    const textDocument = { uri };
    const token = pending.token;
    if (!tokensInFlight) {
      tokensInFlight = true;
      const tokens = useDelta && previousTokens
        ? connection.sendRequest('textDocument/semanticTokens/full/delta', { textDocument, previousResultId: previousTokens }, token)
        : connection.sendRequest('textDocument/semanticTokens/full', { textDocument }, token);
      void tokens.then(
        (result) => {
          previousTokens = (result as { resultId?: string } | null)?.resultId ?? previousTokens;
          tokensInFlight = false;
        },
        () => (tokensInFlight = false),
      );
    }
    void connection.sendRequest('textDocument/inlayHint', { textDocument, range: { start: { line: Math.max(0, around - 30), character: 0 }, end: { line: around + 30, character: 0 } } }, token).catch(() => undefined);
    void connection.sendRequest('textDocument/codeLens', { textDocument }, token).catch(() => undefined);
    void connection.sendRequest('textDocument/documentSymbol', { textDocument }, token).catch(() => undefined);
  };

  const edits = editPlan(document, editCount);
  const typedFrom = Math.max(1, Math.floor((editCount - 26) / 2));
  const latencies: { index: number; latency: Promise<number> }[] = [];
  const hovers: Promise<number>[] = [];
  const completions: Promise<number>[] = [];
  const firstEditAt = performance.now();
  for (let k = 0; k < edits.length; k++) {
    // Edits on a fixed timer from the start, whatever the server is doing.
    const due = firstEditAt + k * EDIT_INTERVAL_MS;
    const wait = due - performance.now();
    if (wait > 0) await new Promise((resolve) => setTimeout(resolve, wait));
    pending.cancel();
    pending = new CancellationTokenSource();
    const change = edits[k]!();
    const version = document.version;
    const start = performance.now();
    void connection.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: [change] });
    latencies.push({ index: k, latency: published(version).then((at) => at - start) });
    if (k % 5 === 4) {
      const sent = performance.now();
      if (k % 10 === 4) {
        const fragment = document.text.indexOf('fragment probe') + 'fragment pr'.length;
        hovers.push(connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: document.positionOf(fragment) }).then(() => performance.now() - sent));
      } else {
        const method = document.text.indexOf('method vqe') + 'method '.length;
        completions.push(connection.sendRequest('textDocument/completion', { textDocument: { uri }, position: document.positionOf(method) }).then(() => performance.now() - sent));
      }
    }
    requestMix(change.range.start.line);
  }
  const settled = await Promise.race([
    Promise.all(latencies.map(async (entry) => ({ index: entry.index, value: await entry.latency }))),
    new Promise<undefined>((resolve) => setTimeout(() => resolve(undefined), 60_000)),
  ]);
  const values = settled ?? [];
  if (process.env['TESSERA_BENCH_VERBOSE']) console.error(`${kind}-${atoms}: ${values.map((entry) => entry.value.toFixed(0)).join(' ')}`);
  const hover = summarize(await Promise.all(hovers));
  const completion = summarize(await Promise.all(completions));
  const memory = memoryOf(pid);
  await stop();
  const pick = (filter: (index: number) => boolean) => summarize(values.filter((entry) => filter(entry.index)).map((entry) => entry.value));
  return {
    spec,
    anchor,
    diagnostics: pick(() => true),
    digits: pick((index) => index < typedFrom || index >= typedFrom + 26),
    typing: pick((index) => index >= typedFrom && index < typedFrom + 26),
    firstTen: pick((index) => index < 10),
    hover,
    completion,
    memory,
    openMs,
    missed: latencies.length - values.length,
  };
}

function ratio(value: number, anchor: Timing): string {
  return `${(value / anchor.median).toFixed(0)}×`;
}

export async function benchLanguageServer(): Promise<string[]> {
  const lines = [
    '## Language server over stdio, driven like an editor',
    '',
    'Edits every 100 ms whatever the server is doing (digit changes, then a new atom line typed character by character, then digit changes); after each edit semantic tokens, inlay hints for the visible lines, code lens and document symbols; hover and completion as the first request after every fifth edit. Ratios are to JSON.parse of the same coordinates in this run.',
    '',
    '| spec | atoms | JSON.parse | open → diagnostics | edit → diagnostics p50 / p95 | p95 ÷ JSON.parse | digits p95 | typing a line p95 | first 10 edits p95 | hover p50 / max | completion p50 / max | peak memory |',
    '| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |',
  ];
  const scenarios = [
    ['water', 5_000, 80],
    ['organic', 5_000, 80],
    ['water', 50_000, 60],
    ['organic', 50_000, 60],
  ] as const;
  // TESSERA_BENCH_ONLY=water-5000 runs one scenario.
  const only = process.env['TESSERA_BENCH_ONLY'];
  const editLimit = Number(process.env['TESSERA_BENCH_EDITS'] ?? Infinity);
  for (const [kind, atoms, edits] of scenarios.filter(([kind, atoms]) => !only || only === `${kind}-${atoms}`)) {
    const run = await runScenario(kind, atoms, Math.min(edits, editLimit));
    const d = run.diagnostics;
    lines.push(
      `| ${kind === 'water' ? 'water box' : 'organic-like'} | ${run.spec.atoms} | ${ms(run.anchor.median)} | ${ms(run.openMs)} | ${ms(d.median)} / ${ms(d.p95)} | ${ratio(d.p95, run.anchor)} | ${ms(run.digits.p95)} | ${ms(run.typing.p95)} | ${ms(run.firstTen.p95)} | ${ms(run.hover.median)} / ${ms(run.hover.max)} | ${ms(run.completion.median)} / ${ms(run.completion.max)} | ${run.memory.peak.toFixed(0)} MB |${run.missed > 0 ? ` (${run.missed} edits never published)` : ''}`,
    );
  }
  lines.push(
    '',
    'Targets: 5,000 atoms: edit → diagnostics p95 < 100 ms and ≤ 30× JSON.parse, hover and completion < 20 ms, peak memory < 200 MB; 50,000 atoms: p95 < 1 s, peak memory < 400 MB; a fresh server fast from its first edits.',
  );
  return lines;
}
