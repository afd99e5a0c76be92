/**
 * The server's end of the wire, stricter than the library's defaults:
 *
 * - `FramedStreamReader` reads `Content-Length` framed messages from a stream (stdio, socket,
 *   pipe). A header without a whole-number Content-Length, a body that is not JSON or not a
 *   JSON-RPC 2.0 object, or a message beyond MAX_MESSAGE_BYTES is reported (the server answers it
 *   with the JSON-RPC error the protocol defines, id null, and logs what was dropped) and the
 *   reader picks up at the next `Content-Length` header, instead of going deaf for good.
 * - `LifecycleGate` answers requests that arrive before `initialize` with ServerNotInitialized
 *   (-32002) and requests after `shutdown` with InvalidRequest (-32600), and drops notifications in
 *   both states except `exit`, as the Language Server Protocol says; each is logged.
 *
 * `openServerConnection` picks the transport from the command line as the library does (`--stdio`,
 * `--node-ipc`, `--socket=<port>`, `--pipe=<name>`) and puts both in front of the connection.
 */
import * as net from 'node:net';
import {
  AbstractMessageReader,
  createConnection,
  Disposable,
  ErrorCodes,
  IPCMessageReader,
  IPCMessageWriter,
  Message,
  ProposedFeatures,
  StreamMessageWriter,
  type Connection,
  type DataCallback,
  type MessageReader,
  type MessageWriter,
  type ConnectionStrategy,
} from 'vscode-languageserver/node';

/** Largest message accepted: far beyond the 8 MiB supported spec, even escaped in JSON. */
export const MAX_MESSAGE_BYTES = 64 * 1024 * 1024;
/** A header block longer than this is not a header. */
const MAX_HEADER_BYTES = 8 * 1024;
const HEADER_END = Buffer.from('\r\n\r\n', 'ascii');
const CONTENT_LENGTH = Buffer.from('content-length:', 'ascii');

/** What went wrong with one incoming message: the JSON-RPC error code to answer with and why. */
export interface Malformed {
  readonly code: number;
  readonly message: string;
  /** Bytes dropped so far (the header, or the body); skipping to the next header is reported apart. */
  readonly dropped: number;
}

/** Position of `needle` in `haystack` ignoring ASCII case, from `from`; -1 when absent. */
function indexOfCaseless(haystack: Buffer, needle: Buffer, from: number): number {
  const last = haystack.length - needle.length;
  outer: for (let i = from; i <= last; i++) {
    for (let k = 0; k < needle.length; k++) {
      const c = haystack[i + k]!;
      if ((c >= 65 && c <= 90 ? c + 32 : c) !== needle[k]) continue outer;
    }
    return i;
  }
  return -1;
}

export class FramedStreamReader extends AbstractMessageReader implements MessageReader {
  private buffer: Buffer = Buffer.alloc(0);
  /**
   * Chunks not yet joined to `buffer`, and their bytes: while a long body arrives they are only
   * collected and joined once it is whole, so a message of n bytes costs O(n) copying, not O(n²)
   * (a 50 MB document took a minute when every 64 KiB chunk copied all before it).
   */
  private chunks: Buffer[] = [];
  private pending = 0;
  /** Bytes `buffer` must hold before reading it again is worth it (the end of the body awaited). */
  private needed = 0;
  /** Looking for the next `Content-Length` after input that could not be read; bytes skipped so far. */
  private hunting: number | undefined;
  private callback: DataCallback | undefined;

  constructor(
    private readonly stream: NodeJS.ReadableStream,
    private readonly onMalformed: (problem: Malformed) => void,
    private readonly onSkipped: (bytes: number) => void = () => undefined,
  ) {
    super();
  }

  listen(callback: DataCallback): Disposable {
    this.callback = callback;
    const onData = (chunk: Buffer | string) => this.receive(typeof chunk === 'string' ? Buffer.from(chunk, 'utf8') : chunk);
    const onError = (error: Error) => this.fireError(error);
    const onClose = () => this.fireClose();
    this.stream.on('data', onData);
    this.stream.on('error', onError);
    this.stream.on('end', onClose);
    this.stream.on('close', onClose);
    return Disposable.create(() => {
      this.stream.off('data', onData);
      this.stream.off('error', onError);
      this.stream.off('end', onClose);
      this.stream.off('close', onClose);
    });
  }

  /** Takes in bytes and hands on every complete message; public for tests. */
  receive(chunk: Buffer): void {
    this.chunks.push(chunk);
    this.pending += chunk.length;
    if (this.buffer.length + this.pending < this.needed) return;
    this.buffer = this.buffer.length === 0 && this.chunks.length === 1 ? chunk : Buffer.concat([this.buffer, ...this.chunks]);
    this.chunks = [];
    this.pending = 0;
    this.needed = 0;
    for (;;) {
      if (this.hunting !== undefined && !this.hunt()) return;
      const headerEnd = this.buffer.indexOf(HEADER_END);
      if (headerEnd < 0) {
        if (this.buffer.length > MAX_HEADER_BYTES) this.startHunting(ErrorCodes.ParseError, `no end of header within ${MAX_HEADER_BYTES.toLocaleString('en-US')} bytes`, 1);
        else return;
        continue;
      }
      const length = this.contentLength(this.buffer.toString('ascii', 0, headerEnd));
      const bodyStart = headerEnd + HEADER_END.length;
      if (typeof length === 'string') {
        this.startHunting(ErrorCodes.ParseError, length, bodyStart);
        continue;
      }
      if (length > MAX_MESSAGE_BYTES) {
        // Not kept, and not skipped by its declared length either (a wrong length would swallow
        // everything after it): the next header found ends it.
        this.startHunting(ErrorCodes.InvalidRequest, `a message of ${length.toLocaleString('en-US')} bytes is larger than the ${MAX_MESSAGE_BYTES.toLocaleString('en-US')} bytes the server accepts`, bodyStart);
        continue;
      }
      if (this.buffer.length < bodyStart + length) {
        this.needed = bodyStart + length;
        return;
      }
      const body = this.buffer.toString('utf8', bodyStart, bodyStart + length);
      this.buffer = this.buffer.subarray(bodyStart + length);
      this.deliver(body, bodyStart + length);
    }
  }

  /** The Content-Length of a header block, or why there is none. */
  private contentLength(header: string): number | string {
    let found: string | undefined;
    for (const line of header.split('\r\n')) {
      const colon = line.indexOf(':');
      if (colon < 0) return `header line '${line.slice(0, 60)}' has no ':'`;
      if (line.slice(0, colon).trim().toLowerCase() === 'content-length') found = line.slice(colon + 1).trim();
    }
    if (found === undefined) return 'the header has no Content-Length';
    if (!/^[0-9]{1,15}$/.test(found)) return `Content-Length '${found.slice(0, 40)}' is not a whole number of bytes`;
    return Number(found);
  }

  /** Reports unreadable input and skips from `from` to the next `Content-Length` header. */
  private startHunting(code: number, why: string, from: number): void {
    const skipped = Math.min(from, this.buffer.length);
    this.buffer = this.buffer.subarray(skipped);
    this.hunting = skipped;
    this.onMalformed({ code, message: `${why}; the input is skipped up to the next Content-Length header`, dropped: skipped });
  }

  /** Skips to the next `Content-Length`, keeping nothing else; true when found. */
  private hunt(): boolean {
    // A body may hold the words too; that only means one more malformed message, then on.
    const next = indexOfCaseless(this.buffer, CONTENT_LENGTH, 0);
    if (next < 0) {
      const keep = Math.min(this.buffer.length, CONTENT_LENGTH.length - 1);
      this.hunting! += this.buffer.length - keep;
      this.buffer = this.buffer.subarray(this.buffer.length - keep);
      return false;
    }
    const skipped = this.hunting! + next;
    this.hunting = undefined;
    this.buffer = this.buffer.subarray(next);
    this.onSkipped(skipped);
    return true;
  }

  private deliver(body: string, size: number): void {
    let parsed: unknown;
    try {
      parsed = JSON.parse(body);
    } catch (error) {
      this.onMalformed({ code: ErrorCodes.ParseError, message: `the body is not JSON (${(error as Error).message})`, dropped: size });
      return;
    }
    if (typeof parsed !== 'object' || parsed === null || Array.isArray(parsed) || (parsed as { jsonrpc?: unknown }).jsonrpc !== '2.0') {
      this.onMalformed({ code: ErrorCodes.InvalidRequest, message: 'the body is not a JSON-RPC 2.0 message object', dropped: size });
      return;
    }
    this.callback?.(parsed as Message);
  }
}

type Phase = 'waiting' | 'running' | 'shutting-down';

/** Holds back what the protocol forbids before `initialize` and after `shutdown` (see the header). */
export class LifecycleGate extends AbstractMessageReader implements MessageReader {
  private phase: Phase = 'waiting';

  constructor(
    private readonly inner: MessageReader,
    private readonly writer: MessageWriter,
    private readonly log: (line: string) => void,
    /** Sees every admitted message as soon as it is read (before it waits its turn). */
    private readonly observe: (message: Message) => void = () => undefined,
  ) {
    super();
    inner.onError((error) => this.fireError(error));
    inner.onClose(() => this.fireClose());
    inner.onPartialMessage((info) => this.firePartialMessage(info));
  }

  get shutdownReceived(): boolean {
    return this.phase === 'shutting-down';
  }

  listen(callback: DataCallback): Disposable {
    return this.inner.listen((message) => {
      if (!this.admit(message)) return;
      this.observe(message);
      callback(message);
    });
  }

  private admit(message: Message): boolean {
    if (Message.isRequest(message)) {
      if (this.phase === 'waiting' && message.method !== 'initialize') {
        this.refuse(message.id, ErrorCodes.ServerNotInitialized, `the server is not initialized: '${message.method}' arrived before 'initialize'`);
        return false;
      }
      if (this.phase === 'shutting-down') {
        this.refuse(message.id, ErrorCodes.InvalidRequest, `the server is shutting down: '${message.method}' arrived after 'shutdown'`);
        return false;
      }
      if (message.method === 'initialize') {
        if (this.phase === 'running') {
          this.refuse(message.id, ErrorCodes.InvalidRequest, "'initialize' may be sent only once");
          return false;
        }
        this.phase = 'running';
      } else if (message.method === 'shutdown') {
        this.phase = 'shutting-down';
      }
      return true;
    }
    if (Message.isNotification(message)) {
      if (message.method === 'exit') return true;
      if (this.phase === 'waiting') {
        this.log(`Tessera: dropped the notification '${message.method}': it arrived before 'initialize'.`);
        return false;
      }
      if (this.phase === 'shutting-down') {
        this.log(`Tessera: dropped the notification '${message.method}': it arrived after 'shutdown'.`);
        return false;
      }
    }
    return true;
  }

  private refuse(id: number | string | null, code: number, message: string): void {
    this.log(`Tessera: refused a request (${code}): ${message}.`);
    void this.writer.write({ jsonrpc: '2.0', id, error: { code, message } } as Message);
  }
}

function argument(argv: readonly string[], name: string): string | undefined {
  for (let i = 0; i < argv.length; i++) {
    if (argv[i] === name) return argv[i + 1];
    if (argv[i]!.startsWith(`${name}=`)) return argv[i]!.slice(name.length + 1);
  }
  return undefined;
}

/** The connection of a server process, on the transport its command line names. */
export function openServerConnection(argv: readonly string[] = process.argv.slice(2), strategy?: ConnectionStrategy, observe?: (message: Message) => void): Connection {
  let log: (line: string) => void = (line) => process.stderr.write(`${line}\n`);
  let writer: MessageWriter;
  let reader: MessageReader;
  let stream: NodeJS.ReadableStream | undefined;
  const report = (problem: Malformed) => {
    log(`Tessera: could not read a message (${problem.dropped.toLocaleString('en-US')} bytes dropped): ${problem.message}.`);
    void writer.write({ jsonrpc: '2.0', id: null, error: { code: problem.code, message: problem.message } } as Message);
  };
  const skipped = (bytes: number) => log(`Tessera: skipped ${bytes.toLocaleString('en-US')} bytes of unreadable input; reading again from the next message.`);
  const socket = argument(argv, '--socket');
  const pipe = argument(argv, '--pipe');
  if (argv.includes('--node-ipc')) {
    reader = new IPCMessageReader(process);
    writer = new IPCMessageWriter(process);
  } else if (socket !== undefined || pipe !== undefined) {
    const connection = socket !== undefined ? net.createConnection(Number(socket), '127.0.0.1') : net.createConnection(pipe!);
    stream = connection;
    writer = new StreamMessageWriter(connection, 'utf-8');
    reader = new FramedStreamReader(connection, report, skipped);
  } else {
    stream = process.stdin;
    writer = new StreamMessageWriter(process.stdout, 'utf-8');
    reader = new FramedStreamReader(process.stdin, report, skipped);
  }
  const gate = new LifecycleGate(reader, writer, (line) => log(line), observe);
  const connection = createConnection(ProposedFeatures.all, gate, writer, strategy);
  log = (line) => connection.console.warn(line);
  if (stream === process.stdin) {
    // Standard output carries the protocol: nothing else may print there.
    console.log = console.info = console.debug = (...parts: unknown[]) => connection.console.log(parts.map(String).join(' '));
    console.warn = (...parts: unknown[]) => connection.console.warn(parts.map(String).join(' '));
    console.error = (...parts: unknown[]) => connection.console.error(parts.map(String).join(' '));
  }
  // The editor went away: end as the protocol says (0 after shutdown, 1 otherwise).
  stream?.on('end', () => process.exit(gate.shutdownReceived ? 0 : 1));
  return connection;
}
