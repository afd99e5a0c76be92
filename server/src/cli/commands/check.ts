/** `tessera check <files…> [--format text|json]`: diagnostics for each spec. */
import { safeJsonStringify } from '../../language/printable';
import { exitCode, UsageError, type CliIo } from '../io';
import { describeFailure, formatDiagnosticLine, summaryLine, type PrintedDiagnostic } from '../output';
import { readSpec, type SpecSettings } from '../specFile';

export interface CheckOptions {
  files: string[];
  format: 'text' | 'json';
  settings?: SpecSettings;
}

interface FileResult {
  file: string;
  diagnostics: PrintedDiagnostic[];
  error?: string;
}

/**
 * Checks every file, whatever happens to one of them: a file that cannot be read, or on which
 * Tessera itself fails, is reported and the batch goes on. Exit code: 3 when Tessera failed on
 * some file, else 2 when some file could not be read, else 1 when errors were found, else 0.
 */
export function runCheck(options: CheckOptions, io: CliIo): number {
  if (options.files.length === 0) throw new UsageError('check needs at least one spec file: tessera check <file.tess>...');
  let errors = 0;
  let warnings = 0;
  let unreadable = 0;
  let failed = 0;
  const results: FileResult[] = [];
  for (const file of options.files) {
    try {
      const reading = readSpec(file, io, options.settings);
      if (!reading.ok) {
        unreadable++;
        results.push({ file, diagnostics: [], error: reading.reason });
        if (options.format === 'text') io.stderr(`tessera: ${reading.reason}\n`);
        continue;
      }
      const printed = reading.spec.diagnostics;
      errors += printed.filter((d) => d.severity === 'error').length;
      warnings += printed.filter((d) => d.severity === 'warning').length;
      if (printed.some((d) => d.code === 'internal-error')) failed++;
      results.push({ file, diagnostics: printed });
      if (options.format === 'text') {
        for (const diagnostic of printed) io.stdout(`${formatDiagnosticLine(diagnostic)}\n`);
      }
    } catch (error) {
      failed++;
      const message = `Tessera failed on ${file}: ${describeFailure(error)}`;
      results.push({ file, diagnostics: [], error: message });
      if (options.format === 'text') io.stderr(`tessera: ${message}\n`);
    }
  }
  if (options.format === 'json') {
    io.stdout(`${safeJsonStringify({ files: results, errors, warnings, unreadable, failed }, 2)}\n`);
  } else {
    const notes = [unreadable > 0 ? `${unreadable} unreadable` : '', failed > 0 ? `Tessera failed on ${failed} (a bug; see above)` : ''].filter(Boolean);
    io.stderr(`${summaryLine(errors, warnings, options.files.length - unreadable)}${notes.length > 0 ? `; ${notes.join('; ')}` : ''}\n`);
  }
  return exitCode({ internal: failed > 0, usage: unreadable > 0, errors: errors > 0 });
}
