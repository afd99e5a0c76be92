/** DocumentAnalysis diagnostics as LSP diagnostics, with related locations in the spec or its XYZ file. */
import { DiagnosticSeverity, type Diagnostic as LspDiagnostic, type DiagnosticRelatedInformation } from 'vscode-languageserver-types';
import type { DocumentAnalysis } from '../analysis';
import type { Diagnostic } from '../language/diagnostics';
import { toRange } from './positions';

const SEVERITY = {
  error: DiagnosticSeverity.Error,
  warning: DiagnosticSeverity.Warning,
  information: DiagnosticSeverity.Information,
  hint: DiagnosticSeverity.Hint,
} as const;

/** Turns a file path into a URI; the server passes its own, tests a plain file: one. */
export type UriOf = (path: string) => string;

export const fileUri: UriOf = (path) => `file://${path.split('/').map(encodeURIComponent).join('/')}`;

export function toLspDiagnostic(analysis: DocumentAnalysis, uri: string, diagnostic: Diagnostic, uriOf: UriOf = fileUri): LspDiagnostic {
  const related: DiagnosticRelatedInformation[] = (diagnostic.related ?? []).map((item) => ({
    location: item.file
      ? { uri: uriOf(item.file), range: { start: { line: item.line ?? 0, character: 0 }, end: { line: item.line ?? 0, character: 0 } } }
      : { uri, range: toRange(analysis, item.span) },
    message: item.message,
  }));
  return {
    range: toRange(analysis, diagnostic.span),
    severity: SEVERITY[diagnostic.severity],
    code: diagnostic.code,
    source: 'tessera',
    message: diagnostic.message,
    ...(related.length > 0 ? { relatedInformation: related } : {}),
    ...(diagnostic.data ? { data: { code: diagnostic.code, ...diagnostic.data } } : { data: { code: diagnostic.code } }),
  };
}

export function doValidation(analysis: DocumentAnalysis, uri: string, uriOf: UriOf = fileUri): LspDiagnostic[] {
  return analysis.diagnostics.map((diagnostic) => toLspDiagnostic(analysis, uri, diagnostic, uriOf));
}
