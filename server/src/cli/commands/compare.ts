/**
 * `tessera compare <spec> [<spec2>] [--format markdown|html|csv] [--out <file>]`: plans side by
 * side. One spec: the spec and each of its variants; two specs: both, each with its variants. The
 * figures are those of each plan's own analysis (analysis/figures/compare.ts); the rendering is in
 * report/format/compare.ts. Written even when a plan has errors (they are counted in its column,
 * and the exit code is 1).
 */
import { comparePlans, specPlans } from '../../analysis';
import { renderCompareCsv, renderCompareHtml, renderCompareMarkdown } from '../../report/format/compare';
import { exitCode, EXIT_USAGE, UsageError, type CliIo } from '../io';
import { checkOutPath, hasInternalError, loadSpec, printDiagnostics, specTitle, writeOutput } from '../specFile';

export const COMPARE_FORMATS = ['markdown', 'html', 'csv'] as const;
export type CompareFormat = (typeof COMPARE_FORMATS)[number];

export interface CompareOptions {
  specs: string[];
  format: CompareFormat;
  out?: string;
}

export async function runCompare(options: CompareOptions, io: CliIo): Promise<number> {
  if (options.specs.length === 0) throw new UsageError('compare needs a spec file: tessera compare <file.tess> [<file2.tess>] [--format markdown|html|csv] [--out <file>]');
  if (options.specs.length > 2) throw new UsageError('compare takes one or two spec files');
  if (options.out === '') throw new UsageError('--out needs a file name');
  const specs = [];
  for (const file of options.specs) {
    const spec = loadSpec(file, io);
    if (!spec) return EXIT_USAGE;
    specs.push(spec);
  }
  const first = specs[0]!;
  checkOutPath(options.out, first, io);
  const plans = specs.flatMap((spec) => specPlans(spec.analysis, specTitle(spec)));
  const comparison = comparePlans(plans);
  const text = options.format === 'csv' ? renderCompareCsv(comparison) : options.format === 'html' ? renderCompareHtml(comparison) : renderCompareMarkdown(comparison);
  for (const spec of specs) printDiagnostics(spec, io);
  if (!(await writeOutput(text, options.out, first, io))) return EXIT_USAGE;
  const errors = plans.some((plan) => plan.errors > 0);
  if (errors) io.stderr('tessera: some plans have errors: their figures may be incomplete.\n');
  return exitCode({ internal: specs.some(hasInternalError), errors });
}
