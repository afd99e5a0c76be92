/**
 * Containment of failures in the server: a bug that one document triggers fails that document's
 * request (an LSP InternalError answer) or its diagnostics (an `internal-error` diagnostic in its
 * Problems), is logged with its stack, is shown to the user once per document version, and never
 * stops the server from answering for the other documents.
 */
import { DiagnosticSeverity, ErrorCodes, ResponseError, type Connection, type Diagnostic as LspDiagnostic } from 'vscode-languageserver/node';
import { internalErrorMessage } from '../language/analyze';

function describe(error: unknown): string {
  return error instanceof Error ? `${error.name}: ${error.message}` : String(error);
}

/** A short name for a document in messages: its file name. */
function shortName(uri: string): string {
  const last = uri.split('/').pop() ?? uri;
  try {
    return decodeURIComponent(last);
  } catch {
    return last;
  }
}

export class FailureReporter {
  /** `uri#version` of the documents whose failure was already shown. */
  private readonly shown = new Set<string>();

  constructor(private readonly connection: Connection) {}

  /** Logs a failure with its stack and tells the user once per document version. */
  report(feature: string, uri: string | undefined, version: number | undefined, error: unknown): void {
    const where = uri ? ` for ${uri}` : '';
    const stack = error instanceof Error && error.stack ? `\n${error.stack}` : '';
    this.connection.console.error(`Tessera: ${feature} failed${where}: ${describe(error)}${stack}`);
    const key = `${uri ?? ''}#${version ?? ''}`;
    if (this.shown.has(key)) return;
    this.shown.add(key);
    if (this.shown.size > 1000) this.shown.clear();
    const subject = uri ? ` for ${shortName(uri)}` : '';
    void this.connection.window.showErrorMessage(
      `Tessera: ${feature} failed${subject} (${describe(error)}). This is a bug in Tessera; other files are not affected. Details are in the Tessera output.`,
    );
  }

  /** The diagnostic published in place of a document's own when computing them failed. */
  diagnosticFor(error: unknown): LspDiagnostic {
    return {
      range: { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } },
      severity: DiagnosticSeverity.Error,
      code: 'internal-error',
      source: 'tessera',
      message: internalErrorMessage('checking this spec', error),
      data: { code: 'internal-error' },
    };
  }

  /**
   * Wraps a request handler: an exception becomes an InternalError answer naming the feature, and
   * is reported; ResponseErrors the handler throws on purpose pass unchanged.
   */
  guard<P, R, T extends unknown[]>(feature: string, documentOf: (params: P) => { uri?: string; version?: number }, handler: (params: P, ...rest: T) => R): (params: P, ...rest: T) => R {
    return (params: P, ...rest: T): R => {
      try {
        return handler(params, ...rest);
      } catch (error) {
        if (error instanceof ResponseError) throw error;
        let document: { uri?: string; version?: number } = {};
        try {
          document = documentOf(params);
        } catch {
          document = {};
        }
        this.report(feature, document.uri, document.version, error);
        throw new ResponseError(ErrorCodes.InternalError, `Tessera: ${feature} failed (${describe(error)}); this is a bug in Tessera, other files are not affected.`);
      }
    };
  }
}
