/**
 * `tessera estimate <spec>` and `tessera estimate --xyz <file> --basis <name> ...`: the counts for
 * the system and each fragment, as a table, Markdown or JSON.
 */
import { safeJsonStringify } from '../../language/printable';
import * as path from 'node:path';
import { normalizeBasisName } from '../../chemistry/basis/library';
import { analyzeDocument, type DocumentAnalysis } from '../../analysis';
import { readTextFile } from '../../language/files';
import { parseXyz } from '../../language/xyz';
import { renderEstimateMarkdown, renderEstimateText } from '../../report/format/render';
import { exitCode, EXIT_USAGE, UsageError, type CliIo } from '../io';
import { formatDiagnosticLine, printable, type PrintedDiagnostic } from '../output';

export type EstimateFormat = 'text' | 'json' | 'markdown';

export interface EstimateOptions {
  spec?: string;
  xyz?: string;
  basis?: string;
  charge?: number;
  multiplicity?: number;
  functions?: 'spherical' | 'cartesian';
  frozenCore: boolean;
  format: EstimateFormat;
}

interface Prepared {
  analysis: DocumentAnalysis;
  file: string;
  diagnostics: PrintedDiagnostic[];
}

function readText(file: string, io: CliIo): string | undefined {
  const read = readTextFile(path.resolve(io.cwd, file));
  if (read.ok) return read.text;
  io.stderr(`tessera: cannot read ${file}: ${read.reason}\n`);
  return undefined;
}

function prepareSpec(file: string, io: CliIo): Prepared | undefined {
  const text = readText(file, io);
  if (text === undefined) return undefined;
  const analysis = analyzeDocument(text, { path: path.resolve(io.cwd, file) });
  return { analysis, file, diagnostics: analysis.diagnostics.map((d) => printable(file, analysis, d)) };
}

const BASIS_WORD = /^[A-Za-z0-9_+*'(),\- ]+$/;

/** The XYZ file becomes an inline spec so that the numbers come from exactly the same code. */
function prepareXyz(options: EstimateOptions, io: CliIo): Prepared | undefined {
  const file = options.xyz!;
  if (!options.basis) throw new UsageError('estimate --xyz needs --basis <name>, for example --basis cc-pVDZ');
  if (!BASIS_WORD.test(options.basis)) throw new UsageError(`'${options.basis}' is not a basis-set name`);
  const text = readText(file, io);
  if (text === undefined) return undefined;
  const xyz = parseXyz(text);
  const atomLines: number[] = [];
  const lines = [
    `# generated from ${path.basename(file)}`,
    `spec "${path.basename(file).replace(/["\\\n]/g, '')}"`,
    `charge ${options.charge ?? 0}`,
    ...(options.multiplicity !== undefined ? [`multiplicity ${options.multiplicity}`] : []),
    `frozen-core ${options.frozenCore ? 'on' : 'off'}`,
    `basis ${normalizeBasisName(options.basis).replace(/\s+/g, '')}`,
    ...(options.functions ? [`functions ${options.functions}`] : []),
    'structure {',
  ];
  const firstAtomLine = lines.length;
  for (const atom of xyz.atoms) {
    atomLines.push(atom.line);
    lines.push(`  ${atom.symbol} ${atom.x} ${atom.y} ${atom.z}`);
  }
  lines.push('}');
  const analysis = analyzeDocument(lines.join('\n'));
  const diagnostics: PrintedDiagnostic[] = xyz.problems.map((problem) => ({
    file,
    line: problem.line + 1,
    column: 1,
    endLine: problem.line + 1,
    endColumn: 1,
    severity: 'error',
    code: 'include-invalid',
    message: problem.message,
    related: [],
  }));
  for (const diagnostic of analysis.diagnostics) {
    const printed = printable(file, analysis, diagnostic);
    const atomIndex = printed.line - 1 - firstAtomLine;
    const xyzLine = atomLines[atomIndex];
    diagnostics.push({
      ...printed,
      line: xyzLine !== undefined ? xyzLine + 1 : 0,
      column: xyzLine !== undefined ? 1 : 0,
      endLine: xyzLine !== undefined ? xyzLine + 1 : 0,
      endColumn: xyzLine !== undefined ? 1 : 0,
      related: [],
    });
  }
  return { analysis, file, diagnostics };
}

export function runEstimate(options: EstimateOptions, io: CliIo): number {
  if (options.spec && options.xyz) throw new UsageError('give either a spec file or --xyz <file>, not both');
  if (!options.spec && !options.xyz) throw new UsageError('estimate needs a spec file, or --xyz <file> --basis <name>');
  if (options.spec && (options.basis || options.charge !== undefined || options.multiplicity !== undefined || options.functions)) {
    throw new UsageError('--basis, --charge, --multiplicity and --functions go with --xyz; a spec sets them itself');
  }
  const prepared = options.spec ? prepareSpec(options.spec, io) : prepareXyz(options, io);
  if (!prepared) return EXIT_USAGE;
  const report = prepared.analysis.report();
  const errors = prepared.diagnostics.filter((d) => d.severity === 'error').length;
  if (options.format === 'json') {
    io.stdout(`${safeJsonStringify({ ...report, diagnostics: { ...report.diagnostics, errors, items: prepared.diagnostics } }, 2)}\n`);
  } else {
    io.stdout(options.format === 'markdown' ? renderEstimateMarkdown(report, { level: 2 }) : renderEstimateText(report));
    for (const diagnostic of prepared.diagnostics) {
      const line = diagnostic.line > 0 ? formatDiagnosticLine(diagnostic) : `${diagnostic.file}: ${diagnostic.severity} ${diagnostic.code} ${diagnostic.message}`;
      io.stderr(`${line}\n`);
    }
  }
  if (errors > 0 && options.format !== 'json') io.stderr(`tessera: ${errors} error${errors === 1 ? '' : 's'}: the figures above may be incomplete.\n`);
  return exitCode({ internal: prepared.diagnostics.some((d) => d.code === 'internal-error'), errors: errors > 0 });
}
