/**
 * A minimal LSP client for protocol tests: starts the bundled server as a child process and talks
 * JSON-RPC over stdio, as an editor does.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import * as path from 'node:path';
import { createMessageConnection, StreamMessageReader, StreamMessageWriter, type MessageConnection } from 'vscode-jsonrpc/node';
import type { Diagnostic } from 'vscode-languageserver-types';

interface PublishDiagnosticsParams {
  uri: string;
  version?: number;
  diagnostics: Diagnostic[];
}

export const ROOT = path.resolve(__dirname, '..', '..');

export interface TestClient {
  readonly connection: MessageConnection;
  readonly process: ChildProcess;
  /** Resolves with the next diagnostics published for a URI (optionally for a given version). */
  diagnostics(uri: string, version?: number): Promise<Diagnostic[]>;
  /** Resolves with the next diagnostics published for a URI that satisfy `wanted` (skipping others, such as a publish already on its way). */
  diagnosticsWhere(uri: string, wanted: (diagnostics: Diagnostic[]) => boolean): Promise<Diagnostic[]>;
  open(uri: string, text: string, version?: number): void;
  change(uri: string, version: number, changes: unknown[]): void;
  request<R>(method: string, params: unknown): Promise<R>;
  stop(): Promise<void>;
  /** Server requests the client answered, by method. */
  readonly serverRequests: string[];
}

export async function startServer(options: { settings?: Record<string, unknown>; capabilities?: Record<string, unknown>; nodeArgs?: readonly string[] } = {}): Promise<TestClient> {
  const child = spawn(process.execPath, [...(options.nodeArgs ?? []), path.join(ROOT, 'dist', 'server.js'), '--stdio'], { stdio: ['pipe', 'pipe', 'pipe'] });
  const connection = createMessageConnection(new StreamMessageReader(child.stdout!), new StreamMessageWriter(child.stdin!));
  const published = new Map<string, PublishDiagnosticsParams[]>();
  const waiters: { uri: string; version?: number; wanted?: (d: Diagnostic[]) => boolean; resolve: (d: Diagnostic[]) => void }[] = [];
  const serverRequests: string[] = [];
  connection.onNotification('textDocument/publishDiagnostics', (params: PublishDiagnosticsParams) => {
    const list = published.get(params.uri) ?? [];
    list.push(params);
    published.set(params.uri, list);
    for (const waiter of [...waiters]) {
      if (waiter.uri === params.uri && (waiter.version === undefined || waiter.version === params.version) && (!waiter.wanted || waiter.wanted(params.diagnostics))) {
        waiters.splice(waiters.indexOf(waiter), 1);
        waiter.resolve(params.diagnostics);
      }
    }
  });
  connection.onRequest('workspace/configuration', (params: { items: { section?: string }[] }) => {
    serverRequests.push('workspace/configuration');
    return params.items.map(() => options.settings ?? {});
  });
  connection.onRequest('client/registerCapability', () => {
    serverRequests.push('client/registerCapability');
    return null;
  });
  connection.onNotification('window/logMessage', () => undefined);
  connection.listen();
  await connection.sendRequest('initialize', {
    processId: process.pid,
    rootUri: null,
    capabilities: {
      workspace: { configuration: true, didChangeWatchedFiles: { dynamicRegistration: true } },
      textDocument: { publishDiagnostics: { relatedInformation: true, versionSupport: true } },
      ...options.capabilities,
    },
  });
  await connection.sendNotification('initialized', {});
  return {
    connection,
    process: child,
    serverRequests,
    diagnostics(uri, version) {
      return new Promise((resolve) => waiters.push({ uri, ...(version !== undefined ? { version } : {}), resolve }));
    },
    diagnosticsWhere(uri, wanted) {
      return new Promise((resolve) => waiters.push({ uri, wanted, resolve }));
    },
    open(uri, text, version = 1) {
      void connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'tessera', version, text } });
    },
    change(uri, version, changes) {
      void connection.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: changes });
    },
    request(method, params) {
      return connection.sendRequest(method, params);
    },
    async stop() {
      await connection.sendRequest('shutdown');
      await connection.sendNotification('exit');
      connection.dispose();
      child.kill();
    },
  };
}
