/** The whole estimate report of a document, assembled from the per-part figures it already holds. */
import type { Analysis } from '../../language/analyze';
import { CONVENTIONS, PLANNING_NOTE, type EstimateReport, type FragmentFigures, type ScanTotals, type SystemFigures } from './types';

export interface ReportParts {
  readonly analysis: Pick<Analysis, 'ast' | 'model' | 'path'>;
  readonly system: SystemFigures;
  readonly fragments: readonly FragmentFigures[];
  readonly diagnostics: { errors: number; warnings: number };
}

export function scanTotals(points: number, fragments: readonly FragmentFigures[]): ScanTotals {
  const withTier = fragments.filter((fragment) => fragment.tier !== null).length;
  const groups = fragments.reduce((sum, fragment) => sum + (fragment.tier === 'quantum' ? (fragment.measurement?.groups ?? 0) : 0), 0);
  const qubits = fragments.map((fragment) => fragment.qubitsRequired).filter((value): value is number => value !== null);
  return { fragmentCalculations: points * withTier, measurementCircuits: points * groups, peakQubits: qubits.length > 0 ? qubits.reduce((most, q) => Math.max(most, q), -Infinity) : null };
}

/** The basis as the report names it: the main set, the per-element overrides, the function type. */
export function basisFigures(analysis: Pick<Analysis, 'ast' | 'model'>): EstimateReport['basis'] {
  const { model, ast } = analysis;
  const overrides: Record<string, string> = {};
  for (const [symbol, set] of model.basis.overrides) overrides[symbol] = set.displayName;
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
    scan: model.scan ? { points: model.scan.distances.length, distances: model.scan.distances, totals: scanTotals(model.scan.distances.length, fragments) } : null,
    limits: { qubits: model.limits.qubits ?? null, memoryBytes: model.limits.memoryBytes ?? null },
    diagnostics: parts.diagnostics,
  };
}
