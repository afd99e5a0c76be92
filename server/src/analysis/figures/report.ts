/** The whole estimate report of a document, assembled from the per-part figures it already holds. */
import { DEFAULT_FLOPS } from '../../chemistry/cost/solvers';
import { describeTarget } from '../../language/ast';
import type { Analysis } from '../../language/analyze';
import { approximateCount, countValue } from './space';
import { SCAN_UNITS } from '../../chemistry/scan';
import { CONVENTIONS, PLANNING_NOTE, type BasisOverrideFigure, type EstimateReport, type FragmentFigures, type ScanSymmetryFigures, type ScanTotals, type SystemFigures } from './types';
import type { ScanSymmetry } from '../scanSymmetry';

export interface ReportParts {
  readonly analysis: Pick<Analysis, 'ast' | 'model' | 'path'>;
  readonly system: SystemFigures;
  readonly fragments: readonly FragmentFigures[];
  readonly diagnostics: { errors: number; warnings: number };
  /** Per-point symmetry of the scan, when it has one that resolves. */
  readonly scanSymmetry?: ScanSymmetry | undefined;
}

function scanSymmetryFigures(symmetry: ScanSymmetry | undefined): ScanSymmetryFigures {
  if (!symmetry) return { notLookedFor: 'the scan does not resolve', groupChanges: false, figuresChange: false, points: [] };
  return {
    notLookedFor: symmetry.notLookedFor,
    groupChanges: symmetry.groupChanges,
    figuresChange: symmetry.figuresChange,
    points: symmetry.points.map((point) => ({ value: point.value, fullPointGroup: point.fullPointGroup, pointGroup: point.pointGroup, fragments: point.fragments.map((fragment) => ({ ...fragment })) })),
  };
}

/** The most qubits any point needs, each in its own group; the structure's figure when the points were not looked at. */
function peakOverPoints(totals: ScanTotals, symmetry: ScanSymmetryFigures): ScanTotals {
  const perPoint = symmetry.points.flatMap((point) => point.fragments.map((fragment) => fragment.qubitsRequired)).filter((value): value is number => value !== null);
  return perPoint.length > 0 ? { ...totals, peakQubits: perPoint.reduce((most, q) => Math.max(most, q), -Infinity) } : totals;
}

export function scanTotals(points: number, fragments: readonly FragmentFigures[]): ScanTotals {
  const withTier = fragments.filter((fragment) => fragment.tier !== null).length;
  const groups = fragments.reduce((sum, fragment) => sum + (fragment.tier === 'quantum' && fragment.measurement ? countValue(fragment.measurement.groups) : 0), 0);
  const qubits = fragments.map((fragment) => fragment.qubitsRequired).filter((value): value is number => value !== null);
  return { fragmentCalculations: points * withTier, measurementCircuits: approximateCount(points * groups), measurementCircuitsPerPoint: approximateCount(groups), peakQubits: qubits.length > 0 ? qubits.reduce((most, q) => Math.max(most, q), -Infinity) : null };
}

/** The basis as the report names it: the main set, the override lines that decide atoms, the function type. */
export function basisFigures(analysis: Pick<Analysis, 'ast' | 'model'>): EstimateReport['basis'] {
  const { model, ast } = analysis;
  const decided = new Map<number, number>();
  for (const line of model.basis.decidedBy) if (line >= 0) decided.set(line, (decided.get(line) ?? 0) + 1);
  const overrides: BasisOverrideFigure[] = [];
  model.basis.overrides.forEach((line, index) => {
    const atoms = decided.get(index) ?? 0;
    if (line.set && atoms > 0) overrides.push({ basis: line.set.displayName, on: line.ast.targets.map(describeTarget).join(' '), atoms });
  });
  return { name: model.basis.main?.displayName ?? ast.basis?.name?.value ?? null, overrides, functions: model.basis.functions };
}

export function assembleReport(parts: ReportParts): EstimateReport {
  const { model, path } = parts.analysis;
  const fragments = [...parts.fragments];
  return {
    tool: 'tessera',
    note: PLANNING_NOTE,
    spec: { name: model.name ?? null, path: path ?? null },
    basis: basisFigures(parts.analysis),
    embedding: model.embedding,
    conventions: CONVENTIONS,
    system: parts.system,
    fragments,
    scan: model.scan
      ? {
          coordinate: model.scan.coordinate,
          unit: SCAN_UNITS[model.scan.coordinate],
          points: model.scan.values.length,
          values: model.scan.values,
          ...(model.scan.coordinate === 'distance' ? { distances: model.scan.values } : {}),
          totals: peakOverPoints(scanTotals(model.scan.values.length, fragments), scanSymmetryFigures(parts.scanSymmetry)),
          symmetry: scanSymmetryFigures(parts.scanSymmetry),
        }
      : null,
    limits: {
      qubits: model.limits.qubits ?? null,
      memoryBytes: model.limits.memoryBytes ?? null,
      flopsPerSecond: model.limits.flopsPerSecond ?? DEFAULT_FLOPS,
      flopsFrom: model.limits.flopsPerSecond !== undefined ? 'limits' : 'default',
    },
    diagnostics: parts.diagnostics,
  };
}
