/**
 * The newest version of each document that has arrived on the wire, read as messages come in and
 * before they are handled in turn. When the server is behind the editor (a large document, edits
 * faster than it analyses them), the version it holds may already be superseded by a change that
 * waits in the queue: analysing and publishing it would be work nobody sees. The server publishes
 * the newest version instead, and answers the editor's refresh-type requests for a superseded
 * version with ContentModified (the editor asks again for the new one).
 */
import { Message, type NotificationMessage } from 'vscode-languageserver/node';

export class ArrivedVersions {
  private readonly newest = new Map<string, number>();

  /** Every message as it is read; only `textDocument/didChange` (and didOpen, didClose) count. */
  observe(message: Message): void {
    if (!Message.isNotification(message)) return;
    const method = (message as NotificationMessage).method;
    if (method !== 'textDocument/didChange' && method !== 'textDocument/didOpen' && method !== 'textDocument/didClose') return;
    const document = ((message as NotificationMessage).params as { textDocument?: { uri?: unknown; version?: unknown } } | undefined)?.textDocument;
    if (typeof document?.uri !== 'string') return;
    if (method === 'textDocument/didClose') this.newest.delete(document.uri);
    else if (typeof document.version === 'number' && document.version > (this.newest.get(document.uri) ?? -Infinity)) this.newest.set(document.uri, document.version);
  }

  /** Whether a newer version of the document than `version` has been read and waits to be applied. */
  superseded(uri: string, version: number): boolean {
    return (this.newest.get(uri) ?? -Infinity) > version;
  }
}
