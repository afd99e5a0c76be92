/** Shutting down a language server the benchmarks started over stdio. */
import type { ChildProcess } from 'node:child_process';
import type { MessageConnection } from 'vscode-jsonrpc/node';

/** shutdown and exit as an editor sends them (each given a few seconds), then the process is gone. */
export async function stopServer(connection: MessageConnection, child: ChildProcess): Promise<void> {
  await Promise.race([connection.sendRequest('shutdown'), new Promise((resolve) => setTimeout(resolve, 5_000))]);
  const exited = new Promise((resolve) => child.once('exit', resolve));
  await connection.sendNotification('exit');
  await Promise.race([exited, new Promise((resolve) => setTimeout(resolve, 3_000))]);
  connection.dispose();
  child.kill();
}
