/** How the command line prints diagnostics. */
import type { Analysis } from '../language/analyze';
import type { Diagnostic } from '../language/diagnostics';

export interface PrintedDiagnostic {
  file: string;
  line: number;
  column: number;
  endLine: number;
  endColumn: number;
  severity: Diagnostic['severity'];
  code: string;
  message: string;
  related: { file: string; line: number; column: number; message: string }[];
}

/** Lines and columns are 1-based in printed output, as compilers print them. */
export function printable(file: string, analysis: Pick<Analysis, 'lines'>, diagnostic: Diagnostic): PrintedDiagnostic {
  const range = analysis.lines.rangeOf(diagnostic.span);
  return {
    file,
    line: range.start.line + 1,
    column: range.start.character + 1,
    endLine: range.end.line + 1,
    endColumn: range.end.character + 1,
    severity: diagnostic.severity,
    code: diagnostic.code,
    message: diagnostic.message,
    related: (diagnostic.related ?? []).map((related) => {
      if (related.file) return { file: related.file, line: (related.line ?? 0) + 1, column: 1, message: related.message };
      const position = analysis.lines.positionAt(related.span.start);
      return { file, line: position.line + 1, column: position.character + 1, message: related.message };
    }),
  };
}

export function formatDiagnosticLine(d: PrintedDiagnostic): string {
  return `${d.file}:${d.line}:${d.column}: ${d.severity} ${d.code} ${d.message}`;
}

export function summaryLine(errors: number, warnings: number, files: number): string {
  const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
  return `${plural(errors, 'error')}, ${plural(warnings, 'warning')} in ${plural(files, 'file')}`;
}

/** One line for a failure inside Tessera: the error and where it happened (the stack with TESSERA_DEBUG set). */
export function describeFailure(error: unknown): string {
  if (!(error instanceof Error)) return `${String(error)} (a bug in Tessera)`;
  const frame = error.stack?.split('\n').find((line) => line.trim().startsWith('at '))?.trim();
  const stack = process.env['TESSERA_DEBUG'] ? `\n${error.stack ?? ''}` : '';
  return `${error.name}: ${error.message}${frame ? ` (${frame})` : ''}. This is a bug in Tessera; set TESSERA_DEBUG=1 for the whole stack.${stack}`;
}
