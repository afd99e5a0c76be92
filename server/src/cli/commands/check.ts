/** `tessera check <files…> [--format text|json]`: diagnostics for each spec. */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { analyzeDocument } from '../../analysis';
import { EXIT_ERRORS, EXIT_OK, EXIT_USAGE, UsageError, type CliIo } from '../io';
import { formatDiagnosticLine, printable, summaryLine, type PrintedDiagnostic } from '../output';

export interface CheckOptions {
  files: string[];
  format: 'text' | 'json';
}

export function runCheck(options: CheckOptions, io: CliIo): number {
  if (options.files.length === 0) throw new UsageError('check needs at least one spec file: tessera check <file.tess>...');
  let errors = 0;
  let warnings = 0;
  let unreadable = 0;
  const results: { file: string; diagnostics: PrintedDiagnostic[]; error?: string }[] = [];
  for (const file of options.files) {
    const absolute = path.resolve(io.cwd, file);
    let text: string;
    try {
      text = readFileSync(absolute, 'utf8');
    } catch (error) {
      unreadable++;
      const reason = (error as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (error as Error).message;
      results.push({ file, diagnostics: [], error: `cannot read ${file}: ${reason}` });
      if (options.format === 'text') io.stderr(`tessera: cannot read ${file}: ${reason}\n`);
      continue;
    }
    const analysis = analyzeDocument(text, { path: absolute });
    const printed = analysis.diagnostics.map((diagnostic) => printable(file, analysis, diagnostic));
    errors += printed.filter((d) => d.severity === 'error').length;
    warnings += printed.filter((d) => d.severity === 'warning').length;
    results.push({ file, diagnostics: printed });
    if (options.format === 'text') {
      for (const diagnostic of printed) io.stdout(`${formatDiagnosticLine(diagnostic)}\n`);
    }
  }
  if (options.format === 'json') {
    io.stdout(`${JSON.stringify({ files: results, errors, warnings, unreadable }, null, 2)}\n`);
  } else {
    io.stderr(`${summaryLine(errors, warnings, options.files.length - unreadable)}${unreadable > 0 ? `; ${unreadable} unreadable` : ''}\n`);
  }
  if (unreadable > 0) return EXIT_USAGE;
  return errors > 0 ? EXIT_ERRORS : EXIT_OK;
}
