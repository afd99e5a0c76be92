/**
 * `tessera report <spec> [--format markdown|html|csv] [--out <file>] [--mean-field]`: the resource report of a
 * spec as a document. Every number comes from the estimate report (report/estimate.ts), the same
 * one `tessera estimate --format json` prints. Markdown and HTML carry the tables, the table of
 * every figure by part, the scan totals, the conventions and the problems with their lines; HTML
 * adds the plots inline as SVG; CSV has one row per part (columns in report/format/csv.ts). A spec
 * with errors still gets its report (the problems are in it), and the exit code is 1. With
 * `--mean-field` (Markdown and HTML) the computed results follow, labelled computed, and the HTML
 * plots shots against active-space size from Hamiltonians computed for a series of windows.
 */
import { hamiltonianFigures, type DocumentAnalysis } from '../../analysis';
import { shotSeriesWindows } from '../../analysis/figures/shotSeries';
import { computedSections, type ComputedSection } from '../../report/format/computedSections';
import { renderEstimateCsv } from '../../report/format/csv';
import { markdownText } from '../../report/format/escape';
import { renderReportHtml, type ShotSeries } from '../../report/format/html';
import { renderEstimateMarkdown, type ProblemLine } from '../../report/format/render';
import { renderMarkdownTable } from '../../report/format/table';
import { exitCode, EXIT_INTERRUPTED, EXIT_USAGE, UsageError, type CliIo } from '../io';
import { activeSpaces, meanFieldTrouble, measurementSettings } from './estimate';
import { computeMeanFields, type MeanFieldRun } from './meanField';
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
  /**
   * Compute the mean field of every part first (as `estimate --mean-field`), and report the
   * computed results beside the planning estimates: mean fields, active orbitals, DMET baths, the
   * Hamiltonians and their budgets, and (HTML) shots against active-space size.
   */
  meanField?: boolean;
}

/** The computed tables and the shot series of a spec, from a finished run. */
function computedReport(analysis: DocumentAnalysis, run: MeanFieldRun): { sections: ComputedSection[]; shots: ShotSeries[] } {
  const settings = run.hamiltonians.map((_, k) => measurementSettings(analysis, k));
  const sections = computedSections({ parts: run.parts, hamiltonians: run.hamiltonians, settings });
  const shots: ShotSeries[] = run.series.map((series) => {
    const k = series.part.kind === 'fragment' ? series.part.index + 1 : 0;
    const epsilon = measurementSettings(analysis, k).epsilon;
    const points = series.points.map(({ space, result }) => {
      const size = space.kind === 'window' ? { orbitals: space.orbitals, electrons: space.electrons } : { orbitals: 0, electrons: 0 };
      if (result.state !== 'computed' || result.outcome.figures.status !== 'computed') return { ...size, bound: null, grouped: null };
      const shots = (hamiltonianFigures(result.outcome, epsilon) as Extract<ReturnType<typeof hamiltonianFigures>, { status: 'computed' }>).mappings.jordanWigner.shots;
      return { ...size, bound: shots.separateBound, grouped: shots.groupedEstimate };
    });
    return { fragment: series.part.kind === 'fragment' ? analysis.model.fragments[series.part.index]!.name : 'system', epsilon, points };
  });
  return { sections, shots };
}

function computedMarkdown(sections: readonly ComputedSection[]): string {
  return [
    '## Computed results (Tessera\'s engine)',
    '',
    ...sections.flatMap((section) => [renderMarkdownTable(section.table, '###'), '', ...section.notes.map((note) => `- ${markdownText(note)}`), '']),
  ].join('\n');
}

export async function runReport(options: ReportOptions, io: CliIo): Promise<number> {
  if (!options.spec) throw new UsageError('report needs a spec file: tessera report <file.tess> [--format markdown|html|csv] [--out <file>]');
  if (options.out === '') throw new UsageError('--out needs a file name');
  const spec = loadSpec(options.spec, io, options.settings);
  if (!spec) return EXIT_USAGE;
  checkOutPath(options.out, spec, io);
  const { analysis } = spec;
  if (options.meanField && options.format === 'csv') throw new UsageError('--mean-field goes with --format markdown or html; the CSV holds the planning figures only');
  let run: MeanFieldRun | undefined;
  if (options.meanField) {
    const activeSpaceOf = activeSpaces({ spec: options.spec }, analysis);
    run = await computeMeanFields(
      analysis,
      {
        ...(activeSpaceOf ? { activeSpaces: activeSpaceOf } : {}),
        // The shot series is plotted in HTML only; not under DMET, where the problem is the impurity.
        seriesSpaces: (computation) => (options.format === 'html' && computation.part.kind === 'fragment' && !analysis.underDmet(computation.part.index) ? shotSeriesWindows(analysis.estimates, computation.part.index).map((window) => ({ kind: 'window' as const, ...window })) : []),
      },
      io,
    );
    if (run.interrupted) {
      io.stderr('tessera: interrupted: the computations still running were cancelled; no report written.\n');
      return EXIT_INTERRUPTED;
    }
  }
  // After the run: the figures that read the active irreps are built on the computed orbitals.
  const report = analysis.report();
  const computed = run ? computedReport(analysis, run) : undefined;
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
    text = renderReportHtml(report, { problems, growth, generator: `Tessera ${VERSION}`, ...(computed ? { computed: computed.sections, shots: computed.shots } : {}) });
  } else {
    text = renderEstimateMarkdown(report, { level: 1, problems, full: true });
    if (computed) text = `${text}\n${computedMarkdown(computed.sections)}`;
  }
  printDiagnostics(spec, io);
  if (!(await writeOutput(text, options.out, spec, io))) return EXIT_USAGE;
  if (spec.errors > 0) io.stderr(`tessera: ${spec.errors} error${spec.errors === 1 ? '' : 's'}: the figures in the report may be incomplete.\n`);
  const trouble = run ? meanFieldTrouble(run.parts, run.hamiltonians) : { errors: 0, internal: false };
  if (trouble.errors > 0) io.stderr(`tessera: ${trouble.errors} computed result${trouble.errors === 1 ? '' : 's'} failed or did not converge: the report says which.\n`);
  return exitCode({ internal: hasInternalError(spec) || trouble.internal, errors: spec.errors > 0 || trouble.errors > 0 });
}
