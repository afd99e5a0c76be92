/**
 * The analysis room: one analysed document version and everything derived from it
 * (document.ts), the per-part estimates (estimates.ts), the figures under stable keys (figures/),
 * the checks that read the estimates (checks/), results that arrive later (late.ts), and the host
 * that keeps one analysis per open document version (host.ts).
 */
export { analyzeDocument, DocumentAnalysis, ESTIMATE_CHECKS, type AnalysisOptions } from './document';
export { Estimates, SYMMETRY_ATOM_LIMIT } from './estimates';
export { fragmentInputKey, inputKey, partAtoms, partInputs, partLabel, type PartAtom, type PartInputs, type PartRef } from './inputKey';
export {
  ACTIVE_SPACE_KIND,
  DEFAULT_BATH_THRESHOLD,
  defaultReference,
  DMET_BATH_KIND,
  HAMILTONIAN_KIND,
  hamiltonianFigures,
  hamiltonianRequest,
  MEAN_FIELD_KIND,
  MP2_KIND,
  partComputation,
  prerequisites,
  requestKey,
  restrictedMeanField,
  samePart,
  specParts,
  type ActiveSpaceChoice,
  type HamiltonianSpace,
  type ActiveSpaceOutcome,
  type ActiveSpaceRequest,
  type BathOrbitals,
  type ComputeRequest,
  type DmetBathRequest,
  type DmetBathSummary,
  type HamiltonianOutcome,
  type HamiltonianRequest,
  type MeanFieldOutcome,
  type MeanFieldRequest,
  type Mp2Request,
  type Mp2Summary,
  type OrbitalArrays,
  type PartComputation,
  type RequestOptions,
  type ScfReference,
  type SpinBathSummary,
} from './computed';
export { computeCost, costText, DEFAULT_MEMORY_LIMIT_BYTES, formatDuration, formatMemory, type ComputeCost } from './computeCost';
export { LateResults, type LateResult, type LateResultChange } from './late';
export { CONVENTIONS, PLANNING_NOTE, SYSTEM_QUBITS_SCOPE } from './figures/types';
export type { BigFigure, CapFigures, Count, EstimateReport, FragmentFigures, PauliFigures, ScanFigures, ScanSymmetryFigures, ScanTotals, SolverCostFigures, SpaceFigures, SystemFigures } from './figures/types';
export { TIER_SECTIONS, type FigureSection } from './figures/fragment';
export { GROWTH_MAX_ORBITALS, type GrowthPoint } from './figures/growth';
export { AnalysisHost, type AnalysisSettings, type DocumentSource, type OpenDocument } from './host';
export { basisFigures } from './figures/report';
export { BEST_PLAN_RULE, comparePlans, planSummary, specPlans, type PlanComparison, type PlanSummary } from './figures/compare';
export type { VariantAnalysis } from './variants';
export { approximateCount, countText, countValue, exactCount } from './figures/space';
