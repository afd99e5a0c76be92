/**
 * The server's end of the wire (server/src/lsp/transport.ts): framing that survives malformed
 * input, and the lifecycle rules of the Language Server Protocol ("initialize" first, nothing
 * after "shutdown" but "exit"), checked on the reader and gate directly and on the bundled server.
 */
import { spawn } from 'node:child_process';
import * as path from 'node:path';
import { PassThrough } from 'node:stream';
import fc from 'fast-check';
import { describe, expect, it, vi } from 'vitest';
import { ErrorCodes, type Message, type MessageWriter } from 'vscode-languageserver/node';
import { FramedStreamReader, LifecycleGate, MAX_MESSAGE_BYTES, type Malformed } from '../../server/src/lsp/transport';
import { ROOT } from './client';

function frame(message: unknown): Buffer {
  const body = Buffer.from(JSON.stringify(message), 'utf8');
  return Buffer.concat([Buffer.from(`Content-Length: ${body.length}\r\n\r\n`, 'ascii'), body]);
}

function reading(): { reader: FramedStreamReader; received: Message[]; problems: Malformed[]; skipped: number[] } {
  const received: Message[] = [];
  const problems: Malformed[] = [];
  const skipped: number[] = [];
  const reader = new FramedStreamReader(new PassThrough(), (problem) => problems.push(problem), (bytes) => skipped.push(bytes));
  reader.listen((message) => received.push(message));
  return { reader, received, problems, skipped };
}

const HOVER = (id: number) => ({ jsonrpc: '2.0', id, method: 'textDocument/hover', params: { textDocument: { uri: 'file:///a.tess' }, position: { line: 0, character: 0 } } });

describe('FramedStreamReader', () => {
  it('delivers every message, in order, however the bytes are split into chunks (UTF-8 across cuts)', () => {
    fc.assert(
      fc.property(fc.array(fc.nat({ max: 400 }), { maxLength: 20 }), (cuts) => {
        const messages = [HOVER(1), { jsonrpc: '2.0', method: 'x', params: { text: 'ångström α/β 😀' } }, HOVER(3)];
        const bytes = Buffer.concat(messages.map(frame));
        const { reader, received, problems } = reading();
        let at = 0;
        for (const cut of [...cuts.map((c) => c % (bytes.length + 1))].sort((a, b) => a - b)) {
          reader.receive(bytes.subarray(at, cut));
          at = cut;
        }
        reader.receive(bytes.subarray(at));
        expect(received).toEqual(messages);
        expect(problems).toEqual([]);
      }),
      { numRuns: 200 },
    );
  });

  it('a Content-Length that is not a number: a parse error, then the next message is read', () => {
    const { reader, received, problems, skipped } = reading();
    reader.receive(Buffer.concat([Buffer.from('Content-Length: abc\r\n\r\n{}', 'ascii'), frame(HOVER(2))]));
    expect(problems.map((p) => p.code)).toEqual([ErrorCodes.ParseError]);
    expect(problems[0]!.message).toBe("Content-Length 'abc' is not a whole number of bytes; the input is skipped up to the next Content-Length header");
    expect(skipped).toEqual([25]);
    expect(received).toEqual([HOVER(2)]);
  });

  it('no Content-Length, a body that is not JSON, and a JSON array: each reported, the reader goes on', () => {
    const { reader, received, problems } = reading();
    reader.receive(Buffer.from('Content-Type: x\r\n\r\n', 'ascii'));
    reader.receive(frame(HOVER(4)));
    reader.receive(Buffer.from('Content-Length: 5\r\n\r\n{oops', 'ascii'));
    reader.receive(frame([1, 2]));
    reader.receive(frame(HOVER(5)));
    expect(problems.map((p) => [p.code, p.message.split(';')[0]])).toEqual([
      [ErrorCodes.ParseError, 'the header has no Content-Length'],
      [ErrorCodes.ParseError, "the body is not JSON (Expected property name or '}' in JSON at position 1)"],
      [ErrorCodes.InvalidRequest, 'the body is not a JSON-RPC 2.0 message object'],
    ]);
    expect(received).toEqual([HOVER(4), HOVER(5)]);
  });

  it('a message declared beyond 64 MiB is neither kept nor waited for: the next header ends it', () => {
    const { reader, received, problems } = reading();
    reader.receive(Buffer.from(`Content-Length: ${MAX_MESSAGE_BYTES + 1}\r\n\r\n`, 'ascii'));
    for (let i = 0; i < 20; i++) reader.receive(Buffer.alloc(64 * 1024, 'x'));
    reader.receive(frame(HOVER(6)));
    expect(problems.map((p) => p.code)).toEqual([ErrorCodes.InvalidRequest]);
    expect(problems[0]!.message).toContain('a message of 67,108,865 bytes is larger than the 67,108,864 bytes the server accepts');
    expect(received).toEqual([HOVER(6)]);
  });

  it('joins the chunks of a long body once, when it is whole: copying grows with the message, not its square', () => {
    const { reader, received } = reading();
    const big = { jsonrpc: '2.0', method: 'textDocument/didOpen', params: { text: 'x'.repeat(4 * 1024 * 1024) } };
    const bytes = Buffer.concat([frame(big), frame(HOVER(8))]);
    const concat = vi.spyOn(Buffer, 'concat');
    try {
      for (let at = 0; at < bytes.length; at += 64 * 1024) reader.receive(bytes.subarray(at, at + 64 * 1024));
      // 65 chunks of 64 KiB: joining at every chunk would copy about 65²/2 × 64 KiB ≈ 135 MB.
      const copied = concat.mock.calls.reduce((sum, [list]) => sum + (list as Buffer[]).reduce((bytesIn, part) => bytesIn + part.length, 0), 0);
      expect(copied).toBeLessThan(2 * bytes.length);
    } finally {
      concat.mockRestore();
    }
    expect(received).toEqual([big, HOVER(8)]);
  });

  it('garbage without any header end is dropped after 8 KiB, and reading resumes', () => {
    const { reader, received, problems } = reading();
    reader.receive(Buffer.alloc(20_000, 'g'));
    reader.receive(frame(HOVER(7)));
    expect(problems).toHaveLength(1);
    expect(received).toEqual([HOVER(7)]);
  });
});

/** A gate over a reader we feed by hand, and what it answers. */
function gated(): { feed: (message: unknown) => void; passed: Message[]; answered: Message[]; logged: string[] } {
  const passed: Message[] = [];
  const answered: Message[] = [];
  const logged: string[] = [];
  const { reader } = reading();
  const writer = { write: (message: Message) => (answered.push(message), Promise.resolve()) } as unknown as MessageWriter;
  const gate = new LifecycleGate(reader, writer, (line) => logged.push(line));
  gate.listen((message) => passed.push(message));
  return { feed: (message) => reader.receive(frame(message)), passed, answered, logged };
}

describe('LifecycleGate (LSP 3.17, "Lifecycle Messages")', () => {
  it('before initialize: requests get ServerNotInitialized (-32002), notifications are dropped, exit passes', () => {
    const { feed, passed, answered, logged } = gated();
    feed(HOVER(1));
    feed({ jsonrpc: '2.0', method: 'textDocument/didOpen', params: {} });
    feed({ jsonrpc: '2.0', method: 'exit' });
    expect(answered).toEqual([{ jsonrpc: '2.0', id: 1, error: { code: -32002, message: "the server is not initialized: 'textDocument/hover' arrived before 'initialize'" } }]);
    expect(passed.map((m) => (m as { method?: string }).method)).toEqual(['exit']);
    expect(logged).toHaveLength(2);
    expect(logged[1]).toContain("dropped the notification 'textDocument/didOpen'");
  });

  it('after shutdown: requests get InvalidRequest (-32600), notifications but exit are dropped', () => {
    const { feed, passed, answered } = gated();
    feed({ jsonrpc: '2.0', id: 1, method: 'initialize', params: { capabilities: {} } });
    feed({ jsonrpc: '2.0', method: 'initialized', params: {} });
    feed(HOVER(2));
    feed({ jsonrpc: '2.0', id: 3, method: 'shutdown' });
    feed(HOVER(4));
    feed({ jsonrpc: '2.0', method: 'textDocument/didChange', params: {} });
    feed({ jsonrpc: '2.0', method: 'exit' });
    expect(passed.map((m) => (m as { method?: string }).method)).toEqual(['initialize', 'initialized', 'textDocument/hover', 'shutdown', 'exit']);
    expect(answered).toEqual([{ jsonrpc: '2.0', id: 4, error: { code: -32600, message: "the server is shutting down: 'textDocument/hover' arrived after 'shutdown'" } }]);
  });

  it('a second initialize is refused', () => {
    const { feed, answered } = gated();
    feed({ jsonrpc: '2.0', id: 1, method: 'initialize', params: { capabilities: {} } });
    feed({ jsonrpc: '2.0', id: 2, method: 'initialize', params: { capabilities: {} } });
    expect(answered.map((m) => (m as { error?: { code: number } }).error?.code)).toEqual([-32600]);
  });
});

/** Waits, in a script for `talk`, until the server's output holds this text (at most 10 s). */
interface WaitFor {
  readonly waitFor: string;
}

/** Raw bytes to the bundled server over stdio; the messages it writes back, and its exit code. */
async function talk(chunks: readonly (string | object | WaitFor)[], waitMs = 400): Promise<{ messages: Record<string, unknown>[]; code: number | null }> {
  const child = spawn(process.execPath, [path.join(ROOT, 'dist', 'server.js'), '--stdio'], { stdio: ['pipe', 'pipe', 'pipe'] });
  let out = '';
  child.stdout.on('data', (data: Buffer) => (out += data.toString('utf8')));
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  for (const chunk of chunks) {
    if (typeof chunk === 'object' && 'waitFor' in chunk) {
      const until = Date.now() + 10_000;
      while (!out.includes(chunk.waitFor) && Date.now() < until) await new Promise((resolve) => setTimeout(resolve, 20));
    } else child.stdin.write(typeof chunk === 'string' ? chunk : frame(chunk));
  }
  const code = await Promise.race([exited, new Promise<null>((resolve) => setTimeout(() => resolve(null), 5000 + waitMs))]);
  if (code === null) child.kill();
  const messages = out
    .split(/Content-Length: \d+\r\n\r\n/)
    .filter((part) => part.length > 0)
    .map((part) => JSON.parse(part) as Record<string, unknown>);
  return { messages, code };
}

describe('the bundled server', () => {
  it('answers through a malformed header and before initialize, refuses after shutdown, exits 0', async () => {
    const { messages, code } = await talk([
      'Content-Length: abc\r\n\r\n{}',
      HOVER(1),
      { jsonrpc: '2.0', id: 2, method: 'initialize', params: { capabilities: {} } },
      { jsonrpc: '2.0', method: 'initialized', params: {} },
      { jsonrpc: '2.0', id: 3, method: 'shutdown' },
      HOVER(4),
      // A client sends exit once shutdown is answered.
      { waitFor: '"id":3,"result"' },
      { jsonrpc: '2.0', method: 'exit' },
    ]);
    // Answers may come in any order (the gate answers at once, the server after its handlers).
    const answers = messages.filter((m) => 'id' in m).sort((a, b) => Number(a['id'] ?? -1) - Number(b['id'] ?? -1));
    expect(answers.map((m) => [m['id'], (m['error'] as { code?: number } | undefined)?.code ?? 'result'])).toEqual([
      [null, -32700],
      [1, -32002],
      [2, 'result'],
      [3, 'result'],
      [4, -32600],
    ]);
    const logs = messages.filter((m) => m['method'] === 'window/logMessage').map((m) => (m['params'] as { message: string }).message);
    expect(logs.some((line) => line.includes("Content-Length 'abc' is not a whole number of bytes"))).toBe(true);
    expect(logs.some((line) => line.includes("'textDocument/hover' arrived after 'shutdown'"))).toBe(true);
    expect(code).toBe(0);
  });
});
