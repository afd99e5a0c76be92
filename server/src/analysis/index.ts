/**
 * The analysis room: one analysed document version and everything derived from it
 * (document.ts), the per-part estimates (estimates.ts), the figures under stable keys (figures/),
 * the checks that read the estimates (checks/), results that arrive later (late.ts), and the host
 * that keeps one analysis per open document version (host.ts).
 */
export { analyzeDocument, DocumentAnalysis, ESTIMATE_CHECKS, type AnalysisOptions } from './document';
export { Estimates, SYMMETRY_ATOM_LIMIT } from './estimates';
export { fragmentInputKey } from './inputKey';
export { LateResults, type LateResult, type LateResultChange } from './late';
export { CONVENTIONS, PLANNING_NOTE, SYSTEM_QUBITS_SCOPE } from './figures/types';
export type { BigFigure, EstimateReport, FragmentFigures, PauliFigures, ScanTotals, SolverCostFigures, SpaceFigures, SystemFigures } from './figures/types';
export { TIER_SECTIONS, type FigureSection } from './figures/fragment';
export { GROWTH_MAX_ORBITALS, type GrowthPoint } from './figures/growth';
export { AnalysisHost, type AnalysisSettings, type DocumentSource, type OpenDocument } from './host';
export { basisFigures } from './figures/report';
