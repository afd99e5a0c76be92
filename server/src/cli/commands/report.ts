/**
 * `tessera report <spec> [--format markdown|html|csv] [--out <file>]`: the resource report of a
 * spec as a document. Every number comes from the estimate report (report/estimate.ts), the same
 * one `tessera estimate --format json` prints. Markdown and HTML carry the tables, the table of
 * every figure by part, the scan totals, the conventions and the problems with their lines; HTML
 * adds the plots inline as SVG; CSV has one row per part (columns in report/format/csv.ts). A spec
 * with errors still gets its report (the problems are in it), and the exit code is 1.
 */
import { renderEstimateCsv } from '../../report/format/csv';
import { renderReportHtml } from '../../report/format/html';
import { renderEstimateMarkdown, type ProblemLine } from '../../report/format/render';
import { exitCode, EXIT_USAGE, UsageError, type CliIo } from '../io';
import { checkOutPath, hasInternalError, loadSpec, printDiagnostics, writeOutput, type SpecSettings } from '../specFile';
import { VERSION } from '../version';

export const REPORT_FORMATS = ['markdown', 'html', 'csv'] as const;
export type ReportFormat = (typeof REPORT_FORMATS)[number];

export interface ReportOptions {
  spec?: string;
  format: ReportFormat;
  out?: string;
  /** The editor's settings: default mapping and qubit limit. */
  settings?: SpecSettings;
}

export async function runReport(options: ReportOptions, io: CliIo): Promise<number> {
  if (!options.spec) throw new UsageError('report needs a spec file: tessera report <file.tess> [--format markdown|html|csv] [--out <file>]');
  if (options.out === '') throw new UsageError('--out needs a file name');
  const spec = loadSpec(options.spec, io, options.settings);
  if (!spec) return EXIT_USAGE;
  checkOutPath(options.out, spec, io);
  const { analysis } = spec;
  const report = analysis.report();
  const problems: ProblemLine[] = spec.diagnostics
    .filter((d) => d.severity === 'error' || d.severity === 'warning')
    .map((d) => ({ line: d.line, severity: d.severity, code: d.code, message: d.message }));
  let text: string;
  if (options.format === 'csv') {
    text = renderEstimateCsv(report);
  } else if (options.format === 'html') {
    const growth = analysis.model.fragments
      .filter((fragment) => fragment.tier?.level === 'quantum')
      .map((fragment) => ({ fragment: fragment.name, points: analysis.growth(fragment.index) }));
    text = renderReportHtml(report, { problems, growth, generator: `Tessera ${VERSION}` });
  } else {
    text = renderEstimateMarkdown(report, { level: 1, problems, full: true });
  }
  printDiagnostics(spec, io);
  if (!(await writeOutput(text, options.out, spec, io))) return EXIT_USAGE;
  if (spec.errors > 0) io.stderr(`tessera: ${spec.errors} error${spec.errors === 1 ? '' : 's'}: the figures in the report may be incomplete.\n`);
  return exitCode({ internal: hasInternalError(spec), errors: spec.errors > 0 });
}
