/**
 * Hostile input, through the command line and through a live language server: every reproduction
 * of the robustness issue (a coordinate of 1e155, a 7 MB token, huge active spaces, a FIFO, a 1 GiB
 * include, /dev/zero, thousands of coincident atoms, deep braces, a 50 MB spec, a binary file,
 * control characters, markup and formulas in names, CR line ends, malformed protocol input) and
 * random mutations of the samples.
 *
 * Each run has a time bound and a memory bound. They are not speed targets (those live in
 * `npm run bench`): they sit one to two orders of magnitude above what a run takes (about a
 * second and 100–300 MB at the supported size), so that only a hang or a runaway allocation — the
 * failures the issue found, 24 s to forever and up to 6.5 GB — can cross them on a busy machine.
 * After the server has seen each hostile document, a hover on a good document must still answer.
 */
import { execFileSync, spawn } from 'node:child_process';
import { readFileSync, truncateSync, writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Hover, MarkupContent } from 'vscode-languageserver-types';
import { startServer, type TestClient } from '../lsp/client';
import { ROOT } from '../lsp/client';
import { tempFolder } from '../support/tempFolders';
import { WATER_LINES } from '../fixtures/water';

/** Hang bound of one command-line run, and of one server answer. */
const TIME_BOUND_MS = 60_000;
/** Peak resident memory bound of one command-line run, and of the server after everything. */
const MEMORY_BOUND_KIB = 1024 * 1024;
/** The V8 heap the processes get: a runaway allocation fails fast instead of swapping. */
const HEAP_MB = 768;

const WATER = `spec "w"\nbasis sto-3g\nstructure {\n${WATER_LINES}\n}\nfragment w { atoms rest; tier mean-field { } }\n`;
const H2 = (active: string) => `spec "h2"\nbasis sto-3g\nstructure {\n  H a 0 0 0\n  H b 0 0 0.74\n}\nfragment f { atoms rest; tier quantum { ${active} } }\n`;

/** The reproductions: file name and content (a function for what is made on disk another way). */
function reproductions(folder: string): { name: string; text?: string; make?: (file: string) => void }[] {
  const lines = (count: number, line: string) => line.repeat(count);
  return [
    { name: 'coordinate-1e155.tess', text: 'spec "x"\nbasis sto-3g\nstructure {\n  H 1e155 0 0\n  H 0 0 0\n}\n' },
    { name: 'token-7mb-word.tess', text: `${WATER}fragment ${'a'.repeat(7_000_000)} { atoms #1 }\n` },
    { name: 'token-7mb-string.tess', text: `spec "${'s'.repeat(7_000_000)}"\n` },
    { name: 'token-7mb-number.tess', text: `basis sto-3g\nstructure {\n  H 0 0 ${'1'.repeat(7_000_000)}\n}\n` },
    { name: 'active-huge.tess', text: H2('active 99999999999999999999e 99999999999999999999o') },
    { name: 'active-1e6.tess', text: H2('active 4e 1000000o') },
    { name: 'include-fifo.tess', text: 'basis sto-3g\nstructure from "pipe.xyz"\n', make: () => execFileSync('mkfifo', [path.join(folder, 'pipe.xyz')]) },
    { name: 'include-1gib.tess', text: 'basis sto-3g\nstructure from "big.xyz"\n', make: () => (writeFileSync(path.join(folder, 'big.xyz'), ''), truncateSync(path.join(folder, 'big.xyz'), 1024 ** 3)) },
    { name: 'coincident-5000.tess', text: `basis sto-3g\nstructure {\n${lines(5000, '  H 0 0 0\n')}}\n` },
    { name: 'braces-13000.tess', text: lines(13_000, '{\n') },
    { name: 'spec-50mb.tess', text: `${WATER}${'# a comment line that makes the spec fifty megabytes long\n'.repeat(Math.ceil((50 * 1024 * 1024) / 57))}` },
    { name: 'binary.tess', make: (file) => writeFileSync(file, pseudoRandomBytes(2 * 1024 * 1024)) },
    { name: 'control-characters.tess', text: `spec "\u001b]0;title\u0007\u001b[2J\u0000\u009b\u202e"\n${WATER.slice(WATER.indexOf('\n') + 1)}bogus \u001b[31m\n` },
    { name: 'markup-and-formula.tess', text: `spec "=HYPERLINK(\\"x\\") <img src=x onerror=alert(1)> *b*"\n${WATER.slice(WATER.indexOf('\n') + 1)}` },
    { name: 'cr-line-ends.tess', text: WATER.replace(/\n/g, '\r') },
    { name: 'scan-infinity.tess', text: `${WATER.replace('H  h2', 'H  h3')}scan distance o h1 from 1 to 1e308 step 1e-300\n` },
    { name: 'memory-tiny.tess', text: `${WATER}limits { memory 1e-30 GiB }\n` },
    { name: 'fragments-10001.tess', text: `basis sto-3g\nstructure {\n  H 0 0 0\n}\n${Array.from({ length: 10_001 }, (_, i) => `fragment f${i} { atoms #1 }`).join('\n')}\n` },
    { name: 'words-1m.tess', text: `spec "w"\n${';'.repeat(1_000_001)}\n` },
  ];
}

/** Deterministic bytes (a linear congruential generator), standing for any binary file. */
function pseudoRandomBytes(count: number): Uint8Array {
  const bytes = new Uint8Array(count);
  let state = 12345;
  for (let i = 0; i < count; i++) {
    state = (Math.imul(state, 1103515245) + 12345) >>> 0;
    bytes[i] = state >>> 24;
  }
  return bytes;
}

interface Bounded {
  code: number | null;
  stdout: string;
  stderr: string;
  peakKiB: number;
  timedOut: boolean;
}

/** The command line in its own process, with the heap, time and memory bounds. */
function boundedCli(args: readonly string[], cwd: string): Promise<Bounded> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [`--max-old-space-size=${HEAP_MB}`, path.join(ROOT, 'tests', 'robustness', 'bounded.cjs'), ...args], { cwd, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    let timedOut = false;
    child.stdout.on('data', (data: Buffer) => (stdout += data.toString('utf8')));
    child.stderr.on('data', (data: Buffer) => (stderr += data.toString('utf8')));
    const timer = setTimeout(() => {
      timedOut = true;
      child.kill('SIGKILL');
    }, TIME_BOUND_MS);
    child.on('close', (code) => {
      clearTimeout(timer);
      const peak = /\[peak resident memory (\d+) KiB\]/.exec(stderr);
      resolve({ code, stdout, stderr, peakKiB: peak ? Number(peak[1]) : Infinity, timedOut });
    });
  });
}

function expectBounded(run: Bounded, what: string): void {
  expect(run.timedOut, `${what}: still running after ${TIME_BOUND_MS / 1000} s`).toBe(false);
  expect(run.peakKiB, `${what}: peak memory ${run.peakKiB} KiB\n${run.stderr.slice(-2000)}`).toBeLessThan(MEMORY_BOUND_KIB);
  expect(run.stderr, what).not.toContain('internal error');
  expect(`${run.stdout}${run.stderr}`, `${what}: a raw control character reached the terminal`).not.toMatch(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\u202a-\u202e]/);
}

let folder: string;
let files: { name: string; file: string }[];

beforeAll(() => {
  folder = tempFolder('tessera-hostile-');
  files = reproductions(folder).map(({ name, text, make }) => {
    const file = path.join(folder, name);
    if (make) make(file);
    if (text !== undefined) writeFileSync(file, text);
    return { name, file };
  });
});

describe('the command line', () => {
  it('checks every reproduction in one batch: each file reported, within the bounds', async () => {
    const run = await boundedCli(['check', ...files.map((f) => f.name), '/dev/zero'], folder);
    expectBounded(run, 'check of the whole batch');
    // Unreadable files (the 50 MB spec, /dev/zero) make it 2; nothing makes it 3.
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/cannot read spec-50mb\.tess: it is 50\.\d MiB \([\d,]+ bytes\); Tessera reads files of at most 8\.00 MiB/);
    expect(run.stderr).toContain('cannot read /dev/zero: it is a device, not a regular file');
    // Every other file read and checked (the summary counts the files read).
    expect(run.stderr).toMatch(new RegExp(`errors?, \\d+ warnings? in ${files.length - 1} files; 2 unreadable`));
    expect(run.stdout).toContain('include-fifo.tess:2:16: error include-unreadable Cannot read "pipe.xyz"');
    expect(run.stdout).toMatch(/binary\.tess:\d+:\d+: (warning|error) too-many-problems/);
  }, 2 * TIME_BOUND_MS);

  /** The reproductions that reach the report and export code with something to render. */
  const RENDERED = ['coordinate-1e155.tess', 'control-characters.tess', 'markup-and-formula.tess', 'cr-line-ends.tess', 'coincident-5000.tess', 'fragments-10001.tess', 'active-huge.tess'];
  for (const [command, extra, which] of [
    ['estimate', [], undefined],
    ['report', ['--format', 'html'], RENDERED],
    ['report', ['--format', 'csv'], RENDERED],
    ['export', ['--to', 'qcschema'], RENDERED],
  ] as const) {
    it(`${command} ${extra.join(' ')} on ${which ? 'the reproductions it renders' : 'every reproduction'}: within the bounds, exit 0, 1 or 2, never 3`, async () => {
      for (const { name } of files.filter((f) => !which || (which as readonly string[]).includes(f.name))) {
        const run = await boundedCli([command, name, ...extra], folder);
        expectBounded(run, `${command} ${name}`);
        expect([0, 1, 2], `${command} ${name}: exit ${run.code}`).toContain(run.code);
      }
    }, 40 * TIME_BOUND_MS);
  }

  it('random mutations of the samples, in one batch', async () => {
    const mutated = mutatedSamples(40);
    const names = mutated.map((text, i) => {
      writeFileSync(path.join(folder, `mutated-${i}.tess`), text);
      return `mutated-${i}.tess`;
    });
    const run = await boundedCli(['check', ...names], folder);
    expectBounded(run, 'check of 40 mutated samples');
    expect([0, 1]).toContain(run.code);
    expect(run.stderr).toMatch(/in 40 files/);
  }, 2 * TIME_BOUND_MS);
});

/** Text that may end up anywhere in a mutated sample. */
const INSERTIONS = ['{', '}', '{'.repeat(50), '..', '#', '"', '\\', '1e999', '1e155', '-0', ' rest ', 'structure {', '\r', '\u0000', '\u001b[2J', '\u202e', 'é', ';'.repeat(20), 'active 99999e 99999o', ' 0 0 0\n H 0 0 0\n', '\n'];

function samplesText(): string[] {
  const list = ['mistakes.tess', 'zn-site-h2s-scan.tess', 'molecules/water-sto-3g.tess', 'molecules/benzene-6-31gs.tess', 'open-shell/copper-aqua-doublet.tess'];
  return list.map((name) => readFileSync(path.join(ROOT, 'samples', name), 'utf8'));
}

/** Deterministic mutations (fast-check with a fixed seed): deletions, insertions, repetitions. */
function mutatedSamples(count: number): string[] {
  const samples = samplesText();
  const mutation = fc.record({
    sample: fc.nat({ max: samples.length - 1 }),
    edits: fc.array(fc.record({ at: fc.nat(), remove: fc.nat({ max: 40 }), insert: fc.constantFrom(...INSERTIONS), times: fc.integer({ min: 1, max: 200 }) }), { minLength: 1, maxLength: 8 }),
  });
  return fc.sample(mutation, { numRuns: count, seed: 15 }).map(({ sample, edits }) => {
    let text = samples[sample]!;
    for (const edit of edits) {
      const at = edit.at % (text.length + 1);
      text = text.slice(0, at) + edit.insert.repeat(edit.times) + text.slice(at + edit.remove);
    }
    return text;
  });
}

describe('a live language server', () => {
  let client: TestClient;
  const goodPath = path.join(ROOT, 'samples', 'zn-site-h2s-scan.tess');
  const goodUri = pathToFileURL(goodPath).toString();
  const goodText = readFileSync(goodPath, 'utf8');
  const fragmentSite = (() => {
    const index = goodText.indexOf('fragment site') + 'fragment '.length;
    const before = goodText.slice(0, index);
    return { line: before.split('\n').length - 1, character: index - before.lastIndexOf('\n') - 1 };
  })();

  /** A promise, or a failure once the time bound has passed. */
  function within<T>(promise: Promise<T>, what: string): Promise<T> {
    return Promise.race([promise, new Promise<T>((_, reject) => setTimeout(() => reject(new Error(`${what}: no answer within ${TIME_BOUND_MS / 1000} s`)), TIME_BOUND_MS))]);
  }

  async function goodHoverAnswers(after: string): Promise<void> {
    const hover = await within(client.request<Hover | null>('textDocument/hover', { textDocument: { uri: goodUri }, position: fragmentSite }), `hover after ${after}`);
    expect((hover?.contents as MarkupContent | undefined)?.value, `hover after ${after}`).toContain('**fragment site**');
  }

  /** Peak resident memory of the server process (Linux), or 0 where /proc is not there. */
  function serverPeakKiB(): number {
    try {
      const status = readFileSync(`/proc/${client.process.pid}/status`, 'utf8');
      return Number(/VmHWM:\s+(\d+) kB/.exec(status)?.[1] ?? 0);
    } catch {
      return 0;
    }
  }

  beforeAll(async () => {
    client = await startServer({ nodeArgs: [`--max-old-space-size=${HEAP_MB}`] });
    const opened = client.diagnostics(goodUri);
    client.open(goodUri, goodText);
    await within(opened, 'the good document');
  });

  afterAll(async () => {
    await client.stop();
  });

  it('every reproduction as an open document: diagnostics published, the good document still served', async () => {
    for (const { name, file } of files) {
      let text: string;
      try {
        text = readFileSync(file, 'utf8');
      } catch {
        continue;
      }
      // The editor has the text in memory: the 50 MB spec comes in as a document too.
      const uri = pathToFileURL(file).toString();
      const published = client.diagnostics(uri);
      client.open(uri, text);
      const diagnostics = await within(published, `diagnostics of ${name}`);
      expect(diagnostics.map((d) => d.code), name).not.toContain('internal-error');
      for (const d of diagnostics) expect(d.message, name).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202a-\u202e]/);
      await goodHoverAnswers(name);
      await client.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
    }
    expect(serverPeakKiB()).toBeLessThan(MEMORY_BOUND_KIB);
  }, 40 * TIME_BOUND_MS);

  it('a malformed Content-Length in the middle of the stream: the next request is answered', async () => {
    client.process.stdin!.write('Content-Length: abc\r\n\r\n{}');
    await goodHoverAnswers('a malformed header');
  }, 2 * TIME_BOUND_MS);

  it('every request kind on hostile documents answers (or fails alone), and hover on the good one still works', async () => {
    const worst = files.filter((f) => ['coordinate-1e155.tess', 'braces-13000.tess', 'coincident-5000.tess', 'control-characters.tess', 'fragments-10001.tess'].includes(f.name));
    for (const { name, file } of worst) {
      const uri = pathToFileURL(file).toString();
      const published = client.diagnostics(uri);
      client.open(uri, readFileSync(file, 'utf8'));
      await within(published, name);
      const document = { textDocument: { uri } };
      const whole = { start: { line: 0, character: 0 }, end: { line: 10_000, character: 0 } };
      for (const [method, params] of [
        ['textDocument/hover', { ...document, position: { line: 3, character: 3 } }],
        ['textDocument/completion', { ...document, position: { line: 1, character: 0 } }],
        ['textDocument/documentSymbol', document],
        ['textDocument/formatting', { ...document, options: { tabSize: 2, insertSpaces: true } }],
        ['textDocument/semanticTokens/full', document],
        ['textDocument/foldingRange', document],
        ['textDocument/inlayHint', { ...document, range: whole }],
        ['textDocument/codeLens', document],
        ['tessera/report', { uri }],
        ['tessera/structure', { uri }],
        ['tessera/costs', { uri, fragment: 0 }],
      ] as const) {
        await within(client.request(method, params).catch((error: Error) => error), `${method} on ${name}`);
      }
      await goodHoverAnswers(`every request on ${name}`);
      await client.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
    }
    expect(serverPeakKiB()).toBeLessThan(MEMORY_BOUND_KIB);
  }, 40 * TIME_BOUND_MS);

  it('random mutations of the samples as documents', async () => {
    const mutated = mutatedSamples(40);
    for (let i = 0; i < mutated.length; i++) {
      const uri = `untitled:mutated-${i}.tess`;
      const published = client.diagnostics(uri);
      client.open(uri, mutated[i]!);
      const diagnostics = await within(published, `mutated sample ${i}`);
      expect(diagnostics.map((d) => d.code), `mutated sample ${i}`).not.toContain('internal-error');
      await client.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
    }
    await goodHoverAnswers('40 mutated samples');
  }, 40 * TIME_BOUND_MS);
});
