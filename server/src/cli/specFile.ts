/** Reading a spec and writing a command's output (standard output, or a file with --out). */
import * as path from 'node:path';
import { readTextFile } from '../language/files';
import { analyzeDocument, type DocumentAnalysis } from '../analysis';
import type { Mapping } from '../chemistry/qubits';
import { exitCode, EXIT_USAGE, UsageError, type CliIo } from './io';
import { OutputError, resolveOutputTarget, writeOutputFile, type OutputContent, type ProtectedFile } from './outputFile';
import { formatDiagnosticLine, printable, type PrintedDiagnostic } from './output';

export interface LoadedSpec {
  readonly file: string;
  readonly absolute: string;
  readonly analysis: DocumentAnalysis;
  readonly diagnostics: PrintedDiagnostic[];
  readonly errors: number;
}

/**
 * The editor's settings on the command line (`--mapping`, `--qubit-limit`): the same options the
 * language server passes for `tessera.defaultMapping` and `tessera.qubitLimit`, so that a command
 * shows what the editor shows.
 */
export interface SpecSettings {
  readonly defaultMapping?: Mapping;
  readonly defaultQubitLimit?: number;
}

/** A spec read and analysed, or why it could not be read. */
export type SpecReading = { readonly ok: true; readonly spec: LoadedSpec } | { readonly ok: false; readonly reason: string };

/** Reads and analyses a spec with the given settings; every command reads its specs here. */
export function readSpec(file: string, io: Pick<CliIo, 'cwd'>, settings: SpecSettings = {}): SpecReading {
  const absolute = path.resolve(io.cwd, file);
  const read = readTextFile(absolute);
  if (!read.ok) return { ok: false, reason: `cannot read ${file}: ${read.reason}` };
  const analysis = analyzeDocument(read.text, { path: absolute, ...settings });
  const diagnostics = analysis.diagnostics.map((diagnostic) => printable(file, analysis, diagnostic));
  return { ok: true, spec: { file, absolute, analysis, diagnostics, errors: diagnostics.filter((d) => d.severity === 'error').length } };
}

/** Reads and analyses a spec; prints why and returns undefined when the file cannot be read. */
export function loadSpec(file: string, io: CliIo, settings: SpecSettings = {}): LoadedSpec | undefined {
  const reading = readSpec(file, io, settings);
  if (reading.ok) return reading.spec;
  io.stderr(`tessera: ${reading.reason}\n`);
  return undefined;
}

/** Prints every diagnostic as `file:line:col: severity code message` on standard error. */
export function printDiagnostics(spec: LoadedSpec, io: CliIo): void {
  for (const diagnostic of spec.diagnostics) io.stderr(`${formatDiagnosticLine(diagnostic)}\n`);
}

/** Whether Tessera itself failed on part of the spec (exit code 3). */
export function hasInternalError(spec: LoadedSpec): boolean {
  return spec.diagnostics.some((d) => d.code === 'internal-error');
}

/** The name a spec goes by in exports and reports: its `spec "name"`, else its file name. */
export function specTitle(spec: LoadedSpec): string {
  return spec.analysis.model.name ?? path.basename(spec.file).replace(/\.tess$/i, '');
}

/** The files an --out must never replace: the spec and every file it read. */
export function protectedFiles(spec: LoadedSpec): ProtectedFile[] {
  return [
    { file: spec.absolute, role: 'the spec itself' },
    ...spec.analysis.model.includes.map((file) => ({ file, role: `a file the spec reads (${path.basename(file)})` })),
  ];
}

/**
 * Refuses an --out that would replace the spec or a file it reads (by real path and by inode, so
 * also through symbolic and hard links), a folder or a device, before any work is done.
 */
export function checkOutPath(out: string | undefined, spec: LoadedSpec, io: CliIo): void {
  if (out === undefined) return;
  if (out === '') throw new UsageError('--out needs a file name');
  try {
    resolveOutputTarget(out, { cwd: io.cwd, protect: protectedFiles(spec), shownAs: out });
  } catch (error) {
    if (error instanceof OutputError && error.kind === 'refused') throw new UsageError(`--out: ${error.message}`);
    // A folder that does not exist: reported when writing, after the spec's own diagnostics.
  }
}

/**
 * Writes to standard output, or to `out` through a temporary file and a rename (cli/outputFile.ts);
 * false (after saying why) when the file cannot be written, in which case any old file is unchanged.
 */
export async function writeOutput(content: OutputContent, out: string | undefined, spec: LoadedSpec, io: CliIo): Promise<boolean> {
  if (out === undefined) {
    if (typeof content === 'string') io.stdout(content);
    else if (content instanceof Uint8Array) io.stdout(Buffer.from(content).toString('utf8'));
    else {
      for await (const chunk of content) {
        io.stdout(typeof chunk === 'string' ? chunk : Buffer.from(chunk).toString('utf8'));
        // A reader slower than the export (a pipe, a terminal) holds it back: memory stays bounded.
        await io.drained?.();
      }
    }
    return true;
  }
  try {
    await writeOutputFile(out, content, { cwd: io.cwd, protect: protectedFiles(spec), shownAs: out });
  } catch (error) {
    if (!(error instanceof OutputError)) throw error;
    io.stderr(`tessera: ${error.message}\n`);
    return false;
  }
  return true;
}

/**
 * The spec an export writes from: loaded, the output path checked against it, its problems printed;
 * with errors nothing is exported and the exit code comes back instead of the spec.
 */
export function loadSpecToExport(file: string, out: string | undefined, io: CliIo, settings: SpecSettings = {}): LoadedSpec | number {
  const spec = loadSpec(file, io, settings);
  if (!spec) return EXIT_USAGE;
  checkOutPath(out, spec, io);
  printDiagnostics(spec, io);
  if (spec.errors > 0) {
    io.stderr(`tessera: ${spec.errors} error${spec.errors === 1 ? '' : 's'} in ${spec.file}: nothing exported. Fix ${spec.errors === 1 ? 'it' : 'them'} first.\n`);
    return exitCode({ internal: hasInternalError(spec), errors: true });
  }
  return spec;
}
