/**
 * The language server over stdio on a 5,000-atom spec: time from a one-character edit to published
 * diagnostics, hover and completion latency, and the server's resident memory. Targets:
 * diagnostics p95 under 100 ms, hover and completion under 20 ms, memory under 200 MB.
 */
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { createMessageConnection, StreamMessageReader, StreamMessageWriter } from 'vscode-jsonrpc/node';
import { waterBoxSpec } from './generate';
import { ms, summarize } from './timing';

interface Published {
  uri: string;
  version?: number;
  diagnostics: unknown[];
}

function residentMegabytes(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  const match = /VmRSS:\s+(\d+) kB/.exec(status);
  return match ? Number(match[1]) / 1024 : NaN;
}

function positionOf(text: string, needle: string, delta = 0): { line: number; character: number } {
  const index = text.indexOf(needle) + delta;
  const before = text.slice(0, index);
  return { line: before.split('\n').length - 1, character: index - before.lastIndexOf('\n') - 1 };
}

export async function benchLanguageServer(atoms = 5_000, edits = 60): Promise<string[]> {
  const server = path.join(__dirname, 'server.js');
  const child = spawn(process.execPath, [server, '--stdio'], { stdio: ['pipe', 'pipe', 'inherit'] });
  const connection = createMessageConnection(new StreamMessageReader(child.stdout!), new StreamMessageWriter(child.stdin!));
  const waiting = new Map<number, (at: number) => void>();
  connection.onNotification('textDocument/publishDiagnostics', (params: Published) => {
    const resolve = waiting.get(params.version ?? -1);
    if (resolve) {
      waiting.delete(params.version ?? -1);
      resolve(performance.now());
    }
  });
  connection.onRequest('workspace/configuration', (params: { items: unknown[] }) => params.items.map(() => ({})));
  connection.onRequest('client/registerCapability', () => null);
  connection.listen();
  await connection.sendRequest('initialize', { processId: process.pid, rootUri: null, capabilities: { workspace: { configuration: true } } });
  await connection.sendNotification('initialized', {});

  const spec = waterBoxSpec(atoms);
  const uri = 'file:///bench/water-box.tess';
  const published = (version: number) => new Promise<number>((resolve) => waiting.set(version, resolve));
  const opened = published(1);
  await connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'tessera', version: 1, text: spec.text } });
  await opened;

  // Toggle the last digit of the first atom line (its z coordinate): a one-character edit that
  // keeps the spec valid.
  const firstAtomLine = spec.text.indexOf('\n', spec.text.indexOf('geometry {')) + 1;
  const lastDigit = spec.text.indexOf('\n', firstAtomLine) - 1;
  const digit = positionOf(spec.text, spec.text.slice(firstAtomLine, lastDigit + 1), lastDigit - firstAtomLine);
  const latencies: number[] = [];
  for (let version = 2; version < edits + 2; version++) {
    const done = published(version);
    const start = performance.now();
    await connection.sendNotification('textDocument/didChange', {
      textDocument: { uri, version },
      contentChanges: [{ range: { start: digit, end: { line: digit.line, character: digit.character + 1 } }, text: version % 2 === 0 ? '4' : '3' }],
    });
    latencies.push((await done) - start);
  }

  const timeRequest = async (method: string, params: unknown, runs: number) => {
    const samples: number[] = [];
    for (let i = 0; i < runs; i++) {
      const start = performance.now();
      await connection.sendRequest(method, params);
      samples.push(performance.now() - start);
    }
    return summarize(samples);
  };
  const lastAtom = spec.text.lastIndexOf('\n  H ') + 3;
  const before = spec.text.slice(0, lastAtom);
  const lastAtomPosition = { line: before.split('\n').length - 1, character: lastAtom - before.lastIndexOf('\n') - 1 };
  const hoverFragment = await timeRequest('textDocument/hover', { textDocument: { uri }, position: positionOf(spec.text, 'fragment probe', 10) }, 50);
  const hoverAtom = await timeRequest('textDocument/hover', { textDocument: { uri }, position: lastAtomPosition }, 50);
  const completion = await timeRequest('textDocument/completion', { textDocument: { uri }, position: positionOf(spec.text, 'method vqe', 7) }, 50);
  const memory = residentMegabytes(child.pid!);

  await connection.sendRequest('shutdown');
  await connection.sendNotification('exit');
  connection.dispose();
  child.kill();

  const diagnostics = summarize(latencies);
  return [
    `## Language server over stdio (${spec.atoms}-atom spec)`,
    '',
    '| measurement | median | p95 | target |',
    '| --- | ---: | ---: | --- |',
    `| one-character edit → published diagnostics (${diagnostics.runs} edits, includes the 20 ms typing pause) | ${ms(diagnostics.median)} | ${ms(diagnostics.p95)} | p95 < 100 ms |`,
    `| hover on a fragment name | ${ms(hoverFragment.median)} | ${ms(hoverFragment.p95)} | < 20 ms |`,
    `| hover on the last atom | ${ms(hoverAtom.median)} | ${ms(hoverAtom.p95)} | < 20 ms |`,
    `| completion in a tier block | ${ms(completion.median)} | ${ms(completion.p95)} | < 20 ms |`,
    '',
    `Server resident memory after the runs: ${memory.toFixed(0)} MB (target < 200 MB).`,
  ];
}
