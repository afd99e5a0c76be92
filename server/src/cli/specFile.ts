/** Reading a spec and writing a command's output (standard output, or a file with --out). */
import { readFileSync, writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { analyzeDocument, type DocumentAnalysis } from '../analysis';
import { UsageError, type CliIo } from './io';
import { formatDiagnosticLine, printable, type PrintedDiagnostic } from './output';

export interface LoadedSpec {
  readonly file: string;
  readonly absolute: string;
  readonly analysis: DocumentAnalysis;
  readonly diagnostics: PrintedDiagnostic[];
  readonly errors: number;
}

function reason(error: unknown): string {
  return (error as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (error as Error).message;
}

/** Reads and analyses a spec; prints why and returns undefined when the file cannot be read. */
export function loadSpec(file: string, io: CliIo): LoadedSpec | undefined {
  const absolute = path.resolve(io.cwd, file);
  let text: string;
  try {
    text = readFileSync(absolute, 'utf8');
  } catch (error) {
    io.stderr(`tessera: cannot read ${file}: ${reason(error)}\n`);
    return undefined;
  }
  const analysis = analyzeDocument(text, { path: absolute });
  const diagnostics = analysis.diagnostics.map((diagnostic) => printable(file, analysis, diagnostic));
  return { file, absolute, analysis, diagnostics, errors: diagnostics.filter((d) => d.severity === 'error').length };
}

/** Prints every diagnostic as `file:line:col: severity code message` on standard error. */
export function printDiagnostics(spec: LoadedSpec, io: CliIo): void {
  for (const diagnostic of spec.diagnostics) io.stderr(`${formatDiagnosticLine(diagnostic)}\n`);
}

/** The name a spec goes by in exports and reports: its `spec "name"`, else its file name. */
export function specTitle(spec: LoadedSpec): string {
  return spec.analysis.model.name ?? path.basename(spec.file).replace(/\.tess$/i, '');
}

/** Refuses an --out that would overwrite the spec itself. */
export function checkOutPath(out: string | undefined, spec: string, io: CliIo): void {
  if (out === undefined) return;
  if (out === '') throw new UsageError('--out needs a file name');
  if (path.resolve(io.cwd, out) === path.resolve(io.cwd, spec)) throw new UsageError(`--out ${out} would overwrite the spec itself`);
}

/** Writes to standard output, or to `out`; false (after saying why) when the file cannot be written. */
export function writeOutput(text: string, out: string | undefined, io: CliIo): boolean {
  if (out === undefined) {
    io.stdout(text);
    return true;
  }
  try {
    writeFileSync(path.resolve(io.cwd, out), text, 'utf8');
  } catch (error) {
    io.stderr(`tessera: cannot write ${out}: ${reason(error)}\n`);
    return false;
  }
  return true;
}
