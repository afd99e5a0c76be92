/**
 * `tessera estimate <spec>` and `tessera estimate --xyz <file> --basis <name> ...`: the counts for
 * the system and each fragment, as a table, Markdown or JSON; with `--mean-field` also their
 * computed mean fields (meanField.ts), under `meanField` in the JSON and in a table of their own;
 * with `--active Ne No` (for `--xyz`) or a quantum fragment's active space (for a spec) also the
 * active-space Hamiltonian, under `hamiltonian`.
 */
import { safeJsonStringify } from '../../language/printable';
import * as path from 'node:path';
import { normalizeBasisName } from '../../chemistry/basis/library';
import { analyzeDocument, type DocumentAnalysis } from '../../analysis';
import { readTextFile } from '../../language/files';
import { parseXyz } from '../../language/xyz';
import { renderEstimateMarkdown, renderEstimateText } from '../../report/format/render';
import type { BathOrbitals, ScfReference } from '../../analysis';
import { activeSpaceJson, renderActiveSpaceMarkdown, renderActiveSpaceText } from '../../report/format/activeSpace';
import { bathJson, renderBathMarkdown, renderBathText, type BathPart } from '../../report/format/dmetBath';
import { meanFieldJson, renderMeanFieldMarkdown, renderMeanFieldText, type MeanFieldPart } from '../../report/format/meanField';
import { exitCode, EXIT_INTERRUPTED, EXIT_USAGE, UsageError, type CliIo } from '../io';
import { computeMeanFields, type ActiveSpaceOf } from './meanField';
import { renderHamiltonianMarkdown, renderHamiltonianText, hamiltonianJson, type HamiltonianPart, type MeasurementSettings } from '../../report/format/hamiltonian';
import { CHEMICAL_ACCURACY } from '../../electronic/measurement/shots';
import { explicitLimitNote, MAX_EXPLICIT_ORBITALS } from '../../electronic/hamiltonian/qubitHamiltonian';
import { formatDiagnosticLine, printable, type PrintedDiagnostic } from '../output';
import { loadSpec, type SpecSettings } from '../specFile';

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
  /** Compute the mean field (and MP2) of the system and each fragment. */
  meanField?: boolean;
  /** Default: the spec's (a tier's `method rhf|uhf|rohf`), else rhf for singlets and uhf otherwise. */
  reference?: ScfReference;
  maxIterations?: number;
  memoryLimitMiB?: number;
  /** The editor's settings: default mapping and qubit limit. */
  settings?: SpecSettings;
  /** Singular values above it give DMET bath orbitals (with --mean-field under embedding dmet). */
  bathThreshold?: number;
  /** The fragment's orbitals for the DMET bath. */
  bathOrbitals?: BathOrbitals;
  /** `--active Ne No` with --xyz: the canonical window of the system's restricted mean field. */
  active?: { electrons: number; orbitals: number };
}

/** `4e4o` (electrons, then orbitals), as the spec's `active 4e 4o` without the space. */
export function parseActiveOption(value: string): { electrons: number; orbitals: number } {
  const match = /^\s*(\d+)\s*e\s*,?\s*(\d+)\s*o\s*$/i.exec(value);
  if (!match) throw new UsageError(`--active takes electrons and orbitals as <n>e<m>o, for example --active 4e4o; got '${value}'`);
  const electrons = Number(match[1]);
  const orbitals = Number(match[2]);
  if (orbitals < 1) throw new UsageError('--active needs at least one orbital');
  if (electrons > 2 * orbitals) throw new UsageError(`--active ${electrons}e${orbitals}o: ${electrons} electrons do not fit ${orbitals} orbitals (at most ${2 * orbitals})`);
  return { electrons, orbitals };
}

/**
 * Which parts get a Hamiltonian: with --xyz the system, in the window --active gives; in a spec
 * every quantum-tier fragment, in the window of its active space (electrons and orbitals of its
 * plan) on its own mean field. Spaces beyond the explicit limit keep the combinatorial bound.
 */
export function activeSpaces(options: Pick<EstimateOptions, 'active' | 'spec'>, analysis: DocumentAnalysis): ActiveSpaceOf | undefined {
  if (options.active) {
    const active = options.active;
    return (computation) => {
      if (computation.part.kind !== 'system') return null;
      if (active.orbitals > MAX_EXPLICIT_ORBITALS) return { bound: explicitLimitNote(active.orbitals) };
      return { kind: 'window', electrons: active.electrons, orbitals: active.orbitals };
    };
  }
  if (!options.spec) return undefined;
  const quantum = analysis.model.fragments.some((fragment) => fragment.tier?.level === 'quantum');
  if (!quantum) return undefined;
  return (computation) => (computation.part.kind === 'fragment' ? analysis.activeSpaceChoice(computation.part.index) : null);
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

function prepareSpec(file: string, io: CliIo, settings: SpecSettings): Prepared | undefined {
  const spec = loadSpec(file, io, settings);
  return spec && { analysis: spec.analysis, file, diagnostics: spec.diagnostics };
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
  const analysis = analyzeDocument(lines.join('\n'), options.settings ?? {});
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

/**
 * What the spec says about measuring part k (0 the system, k the fragment k − 1): the target
 * accuracy (the tier's, else the spec's, else 1.6 mHa), and for a variational quantum tier its
 * run (parameters of the ansatz estimate, steps, scan points, shot rate).
 */
export function measurementSettings(analysis: DocumentAnalysis, k: number): MeasurementSettings {
  const model = analysis.model;
  const fragment = k > 0 ? model.fragments[k - 1] : undefined;
  const tier = fragment?.tier;
  const epsilon = tier?.accuracy ?? (model.accuracyGiven ? model.accuracy : CHEMICAL_ACCURACY);
  if (!fragment || tier?.level !== 'quantum') return { epsilon, method: null, vqe: null };
  const parameters = tier.method === 'vqe' ? analysis.fragmentPlan(fragment.index)?.quantum?.ansatz?.parameters : undefined;
  return {
    epsilon,
    method: tier.method,
    vqe:
      parameters === undefined
        ? null
        : { parameters, steps: tier.steps, stepsGiven: tier.stepsGiven, scanPoints: model.scan?.values.length ?? 1, shotRate: model.limits.shotRate ?? null },
  };
}

/** The fragments that have a DMET bath (computed or failed). */
function bathParts(parts: readonly MeanFieldPart[]): BathPart[] {
  return parts.flatMap((part) => (part.bath ? [{ label: part.label, bath: part.bath }] : []));
}

/** `dmetBath` for a fragment's JSON, when the spec uses DMET. */
function bathJsonOf(part: MeanFieldPart): { dmetBath?: Record<string, unknown>; activeSpace?: Record<string, unknown> } {
  return { ...(part.bath ? { dmetBath: bathJson(part.bath) } : {}), ...(part.activeSpace ? { activeSpace: activeSpaceJson(part.activeSpace) } : {}) };
}

/** Why the command ends with errors because of the computed parts: failures and non-convergence count. */
export function meanFieldTrouble(parts: readonly MeanFieldPart[], hamiltonians: readonly HamiltonianPart[]): { errors: number; internal: boolean } {
  let errors = 0;
  let internal = false;
  for (const { result, bath } of parts) {
    if (bath?.state === 'failed') {
      errors++;
      if (bath.code === 'internal' || bath.code === 'worker') internal = true;
    }
    if (result.state === 'failed') {
      errors++;
      if (result.code === 'internal' || result.code === 'worker') internal = true;
    } else if (!result.outcome.result.converged) errors++;
  }
  for (const [k, { result }] of hamiltonians.entries()) {
    // A part whose mean field failed is counted once, above.
    if (result.state !== 'failed' || parts[k]?.result.state === 'failed') continue;
    errors++;
    if (result.code === 'internal' || result.code === 'worker') internal = true;
  }
  return { errors, internal };
}

export async function runEstimate(options: EstimateOptions, io: CliIo): Promise<number> {
  if (options.spec && options.xyz) throw new UsageError('give either a spec file or --xyz <file>, not both');
  if (!options.spec && !options.xyz) throw new UsageError('estimate needs a spec file, or --xyz <file> --basis <name>');
  if (options.spec && (options.basis || options.charge !== undefined || options.multiplicity !== undefined || options.functions)) {
    throw new UsageError('--basis, --charge, --multiplicity and --functions go with --xyz; a spec sets them itself');
  }
  if (!options.meanField && (options.reference || options.maxIterations !== undefined || options.memoryLimitMiB !== undefined || options.bathThreshold !== undefined || options.bathOrbitals || options.active)) {
    throw new UsageError('--reference, --max-iterations, --memory-limit, --bath-threshold, --bath-orbitals and --active go with --mean-field');
  }
  if (options.active && options.spec) throw new UsageError("--active goes with --xyz; in a spec each quantum fragment's `active` statement gives its active space");
  const prepared = options.spec ? prepareSpec(options.spec, io, options.settings ?? {}) : prepareXyz(options, io);
  if (!prepared) return EXIT_USAGE;
  const counted = prepared.analysis.report();
  const errors = prepared.diagnostics.filter((d) => d.severity === 'error').length;
  const activeSpaceOf = options.meanField ? activeSpaces(options, prepared.analysis) : undefined;
  const run = options.meanField
    ? await computeMeanFields(
        prepared.analysis,
        {
          ...(options.reference ? { reference: options.reference } : {}),
          ...(options.maxIterations !== undefined ? { maxIterations: options.maxIterations } : {}),
          ...(options.memoryLimitMiB !== undefined ? { memoryLimitBytes: options.memoryLimitMiB * 2 ** 20 } : {}),
          ...(activeSpaceOf ? { activeSpaces: activeSpaceOf } : {}),
          ...(options.bathThreshold !== undefined ? { bathThreshold: options.bathThreshold } : {}),
          ...(options.bathOrbitals ? { bathOrbitals: options.bathOrbitals } : {}),
        },
        io,
      )
    : undefined;
  // With computed active orbitals, the figures that read their irreps are built again on them.
  const report = run ? prepared.analysis.report() : counted;
  const parts = run?.parts;
  const hamiltonians = run && run.hamiltonians.length > 0 ? run.hamiltonians : undefined;
  const settings = hamiltonians ? hamiltonians.map((_, k) => measurementSettings(prepared.analysis, k)) : [];
  const hamiltonianOf = (k: number) => (hamiltonians ? { hamiltonian: hamiltonianJson(hamiltonians[k]!.result, settings[k]!) } : {});
  if (options.format === 'json') {
    const json = parts
      ? {
          ...report,
          system: { ...report.system, meanField: meanFieldJson(parts[0]!.result), ...hamiltonianOf(0) },
          fragments: report.fragments.map((fragment, k) => ({ ...fragment, meanField: meanFieldJson(parts[k + 1]!.result), ...bathJsonOf(parts[k + 1]!), ...hamiltonianOf(k + 1) })),
        }
      : report;
    io.stdout(`${safeJsonStringify({ ...json, diagnostics: { ...report.diagnostics, errors, items: prepared.diagnostics } }, 2)}\n`);
  } else {
    io.stdout(options.format === 'markdown' ? renderEstimateMarkdown(report, { level: 2 }) : renderEstimateText(report));
    if (parts) io.stdout(options.format === 'markdown' ? `\n${renderMeanFieldMarkdown(parts)}` : `\n${renderMeanFieldText(parts)}`);
    const baths = parts ? bathParts(parts) : [];
    if (baths.length > 0) io.stdout(options.format === 'markdown' ? `\n${renderBathMarkdown(baths)}` : `\n${renderBathText(baths)}`);
    if (hamiltonians) io.stdout(options.format === 'markdown' ? `\n${renderHamiltonianMarkdown(hamiltonians, settings)}` : `\n${renderHamiltonianText(hamiltonians, settings)}`);
    const actives = parts ? parts.flatMap((part) => (part.activeSpace ? [{ label: part.label, activeSpace: part.activeSpace }] : [])) : [];
    if (actives.length > 0) io.stdout(options.format === 'markdown' ? `\n${renderActiveSpaceMarkdown(actives)}` : `\n${renderActiveSpaceText(actives)}`);
    for (const diagnostic of prepared.diagnostics) {
      const line = diagnostic.line > 0 ? formatDiagnosticLine(diagnostic) : `${diagnostic.file}: ${diagnostic.severity} ${diagnostic.code} ${diagnostic.message}`;
      io.stderr(`${line}\n`);
    }
  }
  if (errors > 0 && options.format !== 'json') io.stderr(`tessera: ${errors} error${errors === 1 ? '' : 's'}: the figures above may be incomplete.\n`);
  const trouble = parts ? meanFieldTrouble(parts, hamiltonians ?? []) : { errors: 0, internal: false };
  if (trouble.errors > 0) {
    for (const { label, result, bath } of parts!) {
      if (bath?.state === 'failed') io.stderr(`tessera: ${label}: DMET bath not computed: ${bath.message}\n`);
      if (result.state === 'failed') io.stderr(`tessera: ${label}: mean field not computed: ${result.message}\n`);
      else if (!result.outcome.result.converged) io.stderr(`tessera: ${label}: the SCF did not converge in ${result.outcome.result.iterations} iterations (last energy ${result.outcome.result.energy.toFixed(6)} Ha, not a result)\n`);
    }
    for (const { label, result } of hamiltonians ?? []) if (result.state === 'failed') io.stderr(`tessera: ${label}: Hamiltonian not computed: ${result.message}\n`);
  }
  if (run?.interrupted) {
    io.stderr('tessera: interrupted: the computations still running were cancelled.\n');
    return EXIT_INTERRUPTED;
  }
  return exitCode({ internal: trouble.internal || prepared.diagnostics.some((d) => d.code === 'internal-error'), errors: errors > 0 || trouble.errors > 0 });
}
