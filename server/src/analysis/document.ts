/**
 * One analysed document version and everything derived from it, each computed on first request and
 * kept (the query-database idea at this project's size): diagnostics, the point groups and plan
 * estimates of each part, each fragment's figures, the system's figures, the whole estimate report,
 * the growth series and the scan's moving atoms. Every consumer — hover, hints, lens, symbols,
 * views, the CLI, reports — asks here, so nothing is computed twice and nothing disagrees. A
 * request computes only what it shows: a hover on one fragment asks for that fragment's figures.
 *
 * Results that arrive later (late.ts) are read through `late`; a change there does not mutate this
 * object: whoever shows figures is told, and asks again.
 */
import { canBuildExplicitly, explicitLimitNote } from '../electronic/hamiltonian/qubitHamiltonian';
import type { SpecAst } from '../language/ast';
import { analyze, checkName, contained, type Analysis, type AnalyzeOptions } from '../language/analyze';
import type { Diagnostic } from '../language/diagnostics';
import { DiagnosticSink, finishDiagnostics } from '../language/diagnostics';
import { defaultScanMoving, type SpecModel } from '../language/model';
import type { SyntaxTree } from '../language/syntax';
import type { LineIndex } from '../language/text';
import { checkImpurityActiveSpaces } from './checks/impurity';
import { checkActiveIrreps } from './checks/activeIrreps';
import type { EstimateCheck } from './checks/context';
import { checkLimits } from './checks/limits';
import { checkNearSymmetry } from './checks/nearSymmetry';
import { checkScanSymmetry } from './checks/scanSymmetry';
import { Estimates } from './estimates';
import { scanSymmetryOf, type ScanSymmetry } from './scanSymmetry';
import { fragmentFigures } from './figures/fragment';
import { activeSpaceGrowth, GROWTH_MAX_ORBITALS, type GrowthPoint } from './figures/growth';
import { assembleReport } from './figures/report';
import { systemFigures } from './figures/system';
import type { EstimateReport, FragmentFigures, SystemFigures } from './figures/types';
import { LateResults } from './late';
import { analyseVariants, reportVariantProblems, type VariantAnalysis } from './variants';
import { ACTIVE_SPACE_KIND, hamiltonianRequest, partComputation, type ActiveSpaceOutcome, type BathOrbitals, type HamiltonianRequest, type HamiltonianSpace, type PartComputation, type RequestOptions } from './computed';
import { shotSeriesWindows } from './figures/shotSeries';
import { computedActiveOrbitals } from './computedOrbitals';
import type { PlanEstimate } from '../chemistry/estimate/plan';
import type { PartRef } from './inputKey';

/** The checks that read the estimates, after the language checks. */
export const ESTIMATE_CHECKS: readonly EstimateCheck[] = [checkNearSymmetry, checkActiveIrreps, checkImpurityActiveSpaces, checkLimits, checkScanSymmetry];

/** The language options, and the settings of computations that the text does not hold. */
export interface AnalysisOptions extends AnalyzeOptions {
  /** Singular values above it give DMET bath orbitals (editor setting `tessera.embedding.bathThreshold`). */
  readonly bathThreshold?: number;
  /** The fragment's orbitals the DMET bath is built against (`tessera.embedding.bathOrbitals`). */
  readonly bathOrbitals?: BathOrbitals;
}

export class DocumentAnalysis {
  readonly text: string;
  readonly path: string | undefined;
  readonly lines: LineIndex;
  readonly tree: SyntaxTree;
  readonly ast: SpecAst;
  readonly model: SpecModel;
  /** The per-part estimates (point groups, plan inputs and plans). */
  readonly estimates: Estimates;
  /** Results that arrive later, shared by every version of every document of one host. */
  readonly late: LateResults;

  private readonly languageDiagnostics: readonly Diagnostic[];
  private allDiagnostics: Diagnostic[] | undefined;
  /** Each fragment's figures, with the computed active space they were built on (undefined: counted). */
  private readonly fragments = new Map<number, { figures: FragmentFigures; outcome: ActiveSpaceOutcome | undefined }>();
  private system: SystemFigures | undefined;
  private whole: { report: EstimateReport; outcomes: (ActiveSpaceOutcome | undefined)[] } | undefined;
  private readonly growths = new Map<string, GrowthPoint[]>();
  private moving: number[] | undefined;
  private readonly computations = new Map<string, PartComputation>();
  private readonly series = new Map<number, HamiltonianRequest[]>();

  /**
   * The options the document was analysed with, less the previous version (kept, it would hold
   * every earlier version alive); its variants are analysed with the same.
   */
  readonly options: Omit<AnalysisOptions, 'previous'>;
  private variantList: VariantAnalysis[] | undefined;

  constructor(analysis: Analysis, late: LateResults = new LateResults(), options: AnalysisOptions = {}) {
    const { previous: _previous, ...kept } = options;
    this.options = kept;
    this.text = analysis.text;
    this.path = analysis.path;
    this.lines = analysis.lines;
    this.tree = analysis.tree;
    this.ast = analysis.ast;
    this.model = analysis.model;
    this.languageDiagnostics = analysis.diagnostics;
    this.estimates = new Estimates(analysis.model);
    this.late = late;
  }

  /** Every diagnostic, the language's and those that read the estimates, sorted by position. */
  get diagnostics(): Diagnostic[] {
    if (!this.allDiagnostics) {
      const sink = new DiagnosticSink();
      const context = { ast: this.ast, model: this.model, sink, estimates: this.estimates };
      for (const check of ESTIMATE_CHECKS) contained(sink, checkName(check), () => check(context));
      if (this.ast.variants.length > 0) {
        const own = new Set([...this.languageDiagnostics, ...sink.items].map((d) => `${d.code} ${d.message}`));
        contained(sink, 'variants', () => reportVariantProblems(this, sink, own));
      }
      this.allDiagnostics = finishDiagnostics([...this.languageDiagnostics, ...sink.items], sink.dropped, sink.droppedErrors);
    }
    return this.allDiagnostics;
  }

  counts(): { errors: number; warnings: number } {
    let errors = 0;
    let warnings = 0;
    for (const d of this.diagnostics) {
      if (d.severity === 'error') errors++;
      else if (d.severity === 'warning') warnings++;
    }
    return { errors, warnings };
  }

  /** The spec's plan variants, each analysed as a spec of its own (analysis/variants.ts). */
  variants(): VariantAnalysis[] {
    if (!this.variantList) this.variantList = analyseVariants(this, (text) => analyzeDocument(text, this.options, this.late));
    return this.variantList;
  }

  /**
   * One fragment's figures (its point group and plan estimate only). Once the fragment's active
   * orbitals are computed (a late result under the key of its current inputs), the figures that
   * depend on the irreps and reference occupation of the active orbitals are built on the computed
   * ones and say so; they are built again when that result arrives, changes or goes.
   */
  fragmentFigures(index: number): FragmentFigures {
    const outcome = this.computedActiveSpace(index);
    let entry = this.fragments.get(index);
    if (!entry || entry.outcome !== outcome) {
      entry = { figures: fragmentFigures(this.estimates, index, outcome ? computedActiveOrbitals(outcome) : undefined), outcome };
      this.fragments.set(index, entry);
    }
    return entry.figures;
  }

  /**
   * The fragment's computed active space when its result is ready under the key of the fragment's
   * current inputs (atoms, basis, charge, spin and the active-space choice): a result for other
   * inputs is never read. Undefined for fragments without an active space or before it arrives.
   */
  computedActiveSpace(index: number): ActiveSpaceOutcome | undefined {
    const tier = this.model.fragments[index]?.tier;
    if (!tier?.active || tier.level === 'mean-field') return undefined;
    const key = this.computation({ kind: 'fragment', index }).activeSpaceKey;
    if (!key) return undefined;
    const result = this.late.get<ActiveSpaceOutcome>(ACTIVE_SPACE_KIND, key);
    return result.state === 'ready' ? result.value : undefined;
  }

  /**
   * The Hamiltonians of a quantum fragment's shot series (figures/shotSeries.ts: canonical windows
   * of 2, 4, … orbitals and its own active space) on its own restricted mean field; empty when the
   * fragment cannot be computed or has no series.
   */
  /**
   * Whether a fragment's problem is a DMET impurity: its Hamiltonian needs the bath, which the
   * engine does not build into a Hamiltonian, so neither its own nor its shot series is computed.
   */
  underDmet(index: number): boolean {
    return this.estimates.plan(index)?.problem.embedding === 'dmet';
  }

  shotSeriesRequests(index: number): HamiltonianRequest[] {
    let requests = this.series.get(index);
    if (!requests) {
      const computation = this.computation({ kind: 'fragment', index });
      const meanField = computation.refusal || this.underDmet(index) ? null : computation.meanField;
      requests = meanField ? shotSeriesWindows(this.estimates, index).map((window) => hamiltonianRequest(meanField, { kind: 'window', ...window }, null)) : [];
      this.series.set(index, requests);
    }
    return requests;
  }

  /**
   * The plan estimate a fragment's figures are built on: from its computed active orbitals when
   * they are there and can be used (fragmentFigures says which), else the counted one.
   */
  fragmentPlan(index: number): PlanEstimate | undefined {
    const outcome = this.computedActiveSpace(index);
    if (outcome) {
      const computed = this.estimates.computedPlan(index, computedActiveOrbitals(outcome));
      if (computed.plan) return computed.plan;
    }
    return this.estimates.plan(index);
  }

  /** The system's figures, with its point group (within the size policy of estimates.ts). */
  systemFigures(): SystemFigures {
    return (this.system ??= systemFigures(this.estimates));
  }

  /** Every figure under stable keys: the system, each fragment, the scan totals, the limits. */
  report(): EstimateReport {
    const outcomes = this.model.fragments.map((fragment) => this.computedActiveSpace(fragment.index));
    if (!this.whole || this.whole.outcomes.some((outcome, k) => outcome !== outcomes[k])) {
      const report = assembleReport({
        analysis: this,
        system: this.systemFigures(),
        fragments: this.model.fragments.map((fragment) => this.fragmentFigures(fragment.index)),
        diagnostics: this.counts(),
        scanSymmetry: this.scanSymmetry(),
      });
      this.whole = { report, outcomes };
    }
    return this.whole.report;
  }

  /** The largest qubit count any quantum-tier fragment needs (only those fragments are estimated). */
  largestQubitCount(): { fragment: string; qubits: number } | undefined {
    let best: { fragment: string; qubits: number } | undefined;
    for (const fragment of this.model.fragments) {
      if (fragment.tier?.level !== 'quantum') continue;
      const figures = this.fragmentFigures(fragment.index);
      if (figures.qubitsRequired !== null && (!best || figures.qubitsRequired > best.qubits)) best = { fragment: figures.name, qubits: figures.qubitsRequired };
    }
    return best;
  }

  /** How qubits and Pauli terms grow with the fragment's active space (figures/growth.ts). */
  growth(fragmentIndex: number, maxOrbitals = GROWTH_MAX_ORBITALS): GrowthPoint[] {
    const key = `${fragmentIndex}:${maxOrbitals}`;
    let points = this.growths.get(key);
    if (!points) {
      points = activeSpaceGrowth(this.estimates, fragmentIndex, maxOrbitals);
      this.growths.set(key, points);
    }
    return points;
  }

  /**
   * What computing a part (its mean field, MP2 after it) would ask for, or why it cannot be
   * computed; the results themselves arrive later, in `late`, under the keys given here.
   */
  computation(part: PartRef): PartComputation {
    const id = part.kind === 'system' ? 'system' : String(part.index);
    let computation = this.computations.get(id);
    if (!computation) {
      const settings: RequestOptions = {
        ...(this.options.bathThreshold !== undefined ? { bathThreshold: this.options.bathThreshold } : {}),
        ...(this.options.bathOrbitals !== undefined ? { bathOrbitals: this.options.bathOrbitals } : {}),
      };
      computation = partComputation(this.model, part, part.kind === 'fragment' ? { ...settings, activeSpace: this.activeSpaceChoice(part.index) } : settings);
      this.computations.set(id, computation);
    }
    return computation;
  }

  /**
   * The active space a quantum fragment's Hamiltonian is computed in: for `active Ne No` the
   * canonical window of its active space (electrons and orbitals of its plan) on its own restricted
   * mean field; for the per-irrep form and the suggestions (`active shells …`, `active natural`)
   * the orbitals its active-space job chose (`selection`: that job is the Hamiltonian's
   * prerequisite). Beyond the explicit limit the counted figures stay, with the reason (a
   * suggestion larger than its counted size is refused by the job); null for other fragments.
   */
  activeSpaceChoice(index: number): HamiltonianSpace | { readonly bound: string } | null {
    const fragment = this.model.fragments[index];
    if (fragment?.tier?.level !== 'quantum') return null;
    const plan = this.estimates.plan(index);
    if (!plan) return null;
    if (plan.problem.embedding === 'dmet') {
      return { bound: 'under embedding dmet the active space lies in the impurity (fragment and bath orbitals), whose Hamiltonian needs the embedding; Tessera computes a fragment alone, so the counted figures stand' };
    }
    if (!canBuildExplicitly(plan.active.orbitals)) return { bound: explicitLimitNote(plan.active.orbitals) };
    const tier = fragment.tier;
    const chosen = tier.activeChoice?.kind === 'shells' || tier.activeChoice?.kind === 'natural' || (tier.activeIrreps?.length ?? 0) > 0;
    const window = { electrons: plan.active.electrons, orbitals: plan.active.orbitals };
    return chosen ? { kind: 'selection', window } : { kind: 'window', ...window };
  }

  /** The point group at every scan point and the figures that depend on it; undefined without a scan that resolves. */
  scanSymmetry(): ScanSymmetry | undefined {
    return scanSymmetryOf(this.estimates);
  }

  /**
   * The atoms a scan moves: those its `moving` clause names, else for a distance the second atom's
   * fragment (its bonded group without fragments), for an angle or dihedral the last atom's side of
   * the molecule (the last atom alone when a ring leaves no side; the checks report that).
   */
  scanMovingAtoms(): number[] {
    if (!this.moving) {
      const model = this.model;
      const scan = model.scan;
      if (!scan) this.moving = [];
      else {
        const side = scan.moving ? undefined : defaultScanMoving(model, scan);
        this.moving = scan.moving ? [...scan.moving] : side && 'atoms' in side ? side.atoms : [scan.second];
      }
    }
    return this.moving;
  }
}

/** Analyses a document: the language analysis now, everything else when first asked for. */
export function analyzeDocument(text: string, options: AnalysisOptions = {}, late?: LateResults): DocumentAnalysis {
  return new DocumentAnalysis(analyze(text, options), late, options);
}
