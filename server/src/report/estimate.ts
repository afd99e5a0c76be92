/**
 * The estimate report: every figure of an analysed spec under stable keys, with the convention
 * behind it. The CLI's text, Markdown and JSON output, hover cards and reports all read this
 * structure, so they cannot disagree. All figures are planning estimates.
 */
import type { CircuitCost } from '../chemistry/cost/circuits';
import { formatBytes, formatCount } from '../chemistry/cost/format';
import type { Magnitude } from '../chemistry/cost/magnitude';
import type { OrbitalSpace } from '../chemistry/counting';
import { hillFormula } from '../chemistry/elements';
import type { PlanEstimate } from '../chemistry/estimate/plan';
import type { Analysis } from '../language/analyze';
import { estimatesOf, planSymmetry, type SymmetryFigures } from '../language/estimates';
import type { FragmentModel, SpecModel } from '../language/model';

export const PLANNING_NOTE =
  'Planning estimates from counting rules, not results of a calculation: use them to size a study, not as guarantees.';

export const CONVENTIONS = {
  electrons: 'sum of nuclear charges − charge − core electrons replaced by effective core potentials',
  spin: 'multiplicity 2S+1 valid when 2S ≤ N and N − 2S even; alpha = (N + 2S)/2, beta = (N − 2S)/2',
  orbitals: 'spatial orbitals = basis functions of the chosen type (linear dependencies not removed)',
  frozenCore: 'noble-gas core of each element, less orbitals replaced by an effective core potential (common practice)',
  activeSpace:
    'as given; otherwise every orbital of the problem the solver sees outside the frozen core (the DMET impurity under `embedding dmet`, else the fragment\'s own orbitals); irreps of the active orbitals as given per irrep, else in proportion to the orbitals of each irrep (an assumption)',
  qubits: 'Jordan–Wigner and Bravyi–Kitaev: 2n for n active spatial orbitals; parity with the two-qubit reduction: 2n − 2; tapered: 2n − rank over GF(2) of the Z2 symmetries (N_α and N_β parity, point-group generators acting on the active orbitals; Bravyi et al. 2017, Setia et al. 2020)',
  pauliTerms: 'distinct Pauli strings of the qubit Hamiltonian, identity included, for generic real integrals allowed by the abelian point group; the same under Jordan–Wigner, Bravyi–Kitaev and unreduced parity (Clifford-related); an upper bound when the full point group is non-abelian',
  measurement: 'qubit-wise commuting groups from a largest-degree-first greedy colouring of the explicit strings up to 14 qubits, else 0.21 × (terms − 1), an estimate',
  ansatz: 'UCCSD: spin-conserving spin-orbital excitations screened by the point group (Romero et al. 2019); k-UpCCGSD: k × 3n(n−1)/2 (Lee et al. 2019); hardware-efficient: q(3d+2) Euler angles (Kandala et al. 2017)',
  circuit: 'one Trotter step of UCCSD under Jordan–Wigner in interleaved spin order: Pauli-rotation ladders, 2(w−1) CNOTs per string of weight w; compact fermionic-excitation circuits after Yordanov et al. 2020',
  classical: 'full-CI determinants C(n, nα)·C(n, nβ); CI vector and CCSD amplitudes at 8 bytes each; statevector 2^q × 16 bytes',
  fragmentCharge: 'formal charge of the fragment as written in the spec (default 0)',
} as const;

/** A count or size that may exceed 2^53: its text, its exact digits when known, and log10. */
export interface BigFigure {
  text: string;
  exact: string | null;
  log10: number;
}

export interface PauliFigures {
  jordanWigner: number;
  bravyiKitaev: number;
  parity: number;
  identityIncluded: true;
  upperBound: boolean;
}

export interface SpaceFigures {
  atoms: number;
  formula: string;
  charge: number;
  multiplicity: number;
  electrons: number;
  alpha: number | null;
  beta: number | null;
  ecpCoreElectrons: number;
  functions: 'spherical' | 'cartesian';
  basisFunctions: { spherical: number; cartesian: number };
  /** Atoms whose element the basis does not define; their functions are missing above. */
  atomsWithoutBasis: number;
  orbitals: number;
  occupied: number | null;
  virtual: number | null;
  frozenCore: { orbitals: number; electrons: number };
  active: { electrons: number; orbitals: number; alpha: number | null; beta: number | null; source: string };
  qubits: { jordanWigner: number; bravyiKitaev: number; parity: number; tapered: number | null };
  /** The abelian group used for counting (D2h or a subgroup), and the full Schoenflies group. */
  pointGroup: string | null;
  fullPointGroup: string | null;
  orbitalsPerIrrep: Record<string, number> | null;
  pauliTerms: PauliFigures | null;
}

export interface FragmentFigures extends SpaceFigures {
  name: string;
  tier: string | null;
  method: string | null;
  ansatz: string | null;
  mapping: string | null;
  /** Qubits under the fragment's mapping, tapered with `taper on` (quantum tier only). */
  qubitsRequired: number | null;
  atomIndices: number[];
  /** The orbital space the solver sees: a DMET impurity or the fragment's own orbitals. */
  problem: { embedding: string; orbitals: number; electrons: number; alpha: number; beta: number; bath: { alpha: number; beta: number }; convention: string } | null;
  activeIrreps: { perIrrep: Record<string, number>; source: string } | null;
  taperingSymmetries: string[];
  measurement: { groups: number; exact: boolean; method: string } | null;
  ansatzCost: { kind: string; parameters: number; singles: number | null; doubles: number | null; unscreened: number | null; spinAdapted: number | null } | null;
  circuit: { construction: string; cnots: number; rotations: number | null; depth: number | null; compactCnots: number | null } | null;
  classical: { determinants: BigFigure; ciVectorBytes: BigFigure; ccsdAmplitudes: BigFigure; statevectorBytes: BigFigure | null } | null;
  notes: string[];
}

export interface EstimateReport {
  tool: 'tessera';
  note: string;
  spec: { name: string | null; path: string | null };
  basis: { name: string | null; overrides: Record<string, string>; functions: 'spherical' | 'cartesian' };
  embedding: string;
  conventions: typeof CONVENTIONS;
  system: SpaceFigures & { nearSymmetry: { group: string; within: number } | null };
  fragments: FragmentFigures[];
  scan: { points: number; distances: number[]; totals: ScanTotals } | null;
  limits: { qubits: number | null; memoryBytes: number | null };
  diagnostics: { errors: number; warnings: number };
}

/** Costs along a scan: each point repeats every fragment's calculation. */
export interface ScanTotals {
  /** Fragment calculations over the whole scan: points × fragments with a tier. */
  fragmentCalculations: number;
  /** Measurement groups summed over quantum fragments, times the points: circuits per energy evaluation over the scan. */
  measurementCircuits: number;
  /** The largest qubit count any point needs (the same at every point). */
  peakQubits: number | null;
}

function bigFigure(value: Magnitude, bytes = false): BigFigure {
  return { text: bytes ? formatBytes(value) : formatCount(value), exact: value.exact !== undefined ? value.exact.toString() : null, log10: value.log10 };
}

function irrepRecord(symmetry: SymmetryFigures | undefined): Record<string, number> | null {
  if (!symmetry) return null;
  return Object.fromEntries(symmetry.orbitals.irreps.map((irrep) => [irrep.label, irrep.count]));
}

export function spaceFigures(space: OrbitalSpace, symbols: string[], symmetry: SymmetryFigures | undefined): SpaceFigures {
  return {
    atoms: space.atomCount,
    formula: hillFormula(symbols),
    charge: space.charge,
    multiplicity: space.multiplicity,
    electrons: space.electrons,
    alpha: space.spin?.alpha ?? null,
    beta: space.spin?.beta ?? null,
    ecpCoreElectrons: space.ecpCoreElectrons,
    functions: space.functions,
    basisFunctions: { ...space.basisFunctions },
    atomsWithoutBasis: space.atomsWithoutBasis,
    orbitals: space.orbitals,
    occupied: space.occupied ?? null,
    virtual: space.virtual ?? null,
    frozenCore: { ...space.frozenCore },
    active: {
      electrons: space.active.electrons,
      orbitals: space.active.orbitals,
      alpha: space.active.alpha ?? null,
      beta: space.active.beta ?? null,
      source: space.active.source,
    },
    qubits: { ...space.qubits, tapered: null },
    pointGroup: symmetry?.group ?? null,
    fullPointGroup: symmetry?.symmetry.fullGroup ?? null,
    orbitalsPerIrrep: irrepRecord(symmetry),
    pauliTerms: null,
  };
}

function circuitFigures(circuit: PlanEstimate['circuit']): FragmentFigures['circuit'] {
  if (!circuit) return null;
  const standard: CircuitCost = circuit.standard;
  return { construction: standard.construction, cnots: standard.cnots, rotations: standard.rotations ?? null, depth: standard.depth ?? null, compactCnots: circuit.compact?.cnots ?? null };
}

function ansatzFigures(plan: PlanEstimate): FragmentFigures['ansatzCost'] {
  const ansatz = plan.ansatz;
  if (!ansatz) return null;
  if (ansatz.kind === 'uccsd') {
    return {
      kind: 'uccsd',
      parameters: ansatz.parameters,
      singles: ansatz.spinOrbitalScreened.singles,
      doubles: ansatz.spinOrbitalScreened.doubles,
      unscreened: ansatz.spinOrbital.total,
      spinAdapted: ansatz.spinAdaptedScreened?.total ?? null,
    };
  }
  return { kind: ansatz.kind, parameters: ansatz.parameters, singles: null, doubles: null, unscreened: null, spinAdapted: null };
}

function fragmentFigures(model: SpecModel, fragment: FragmentModel): FragmentFigures {
  const estimates = estimatesOf(model);
  const symbols = fragment.atoms.map((atom) => model.atoms[atom]!.element.symbol);
  const tier = fragment.tier;
  const plan = estimates.fragment(fragment.index);
  const base = spaceFigures(fragment.space, symbols, tier ? estimates.fragmentSymmetry(fragment.index) : undefined);
  const figures: FragmentFigures = {
    name: fragment.name,
    tier: tier?.level ?? null,
    method: tier?.method ?? null,
    ansatz: tier?.ansatz ?? null,
    mapping: tier?.mapping ?? null,
    qubitsRequired: null,
    atomIndices: fragment.atoms.map((atom) => atom + 1),
    ...base,
    problem: null,
    activeIrreps: null,
    taperingSymmetries: [],
    measurement: null,
    ansatzCost: null,
    circuit: null,
    classical: null,
    notes: [],
  };
  if (!plan) return figures;
  return {
    ...figures,
    active: { electrons: plan.active.electrons, orbitals: plan.active.orbitals, alpha: plan.active.alpha, beta: plan.active.beta, source: plan.active.source === 'given' ? 'given' : plan.problem.embedding === 'dmet' ? 'dmet-impurity' : base.active.source },
    qubits: { jordanWigner: plan.qubits.jordanWigner, bravyiKitaev: plan.qubits.bravyiKitaev, parity: plan.qubits.parity, tapered: plan.qubits.tapered },
    qubitsRequired: plan.qubits.required,
    pauliTerms: { jordanWigner: plan.pauliTerms.jordanWigner, bravyiKitaev: plan.pauliTerms.bravyiKitaev, parity: plan.pauliTerms.parity, identityIncluded: true, upperBound: plan.pauliTerms.upperBound },
    problem: {
      embedding: plan.problem.embedding,
      orbitals: plan.problem.orbitals,
      electrons: plan.problem.electrons,
      alpha: plan.problem.alpha,
      beta: plan.problem.beta,
      bath: { ...plan.problem.bath },
      convention: plan.problem.convention,
    },
    activeIrreps: plan.active.irrepsSource === 'none' ? null : { perIrrep: Object.fromEntries(plan.active.irreps.filter((share) => share.count > 0).map((share) => [share.label, share.count])), source: plan.active.irrepsSource },
    taperingSymmetries: [...plan.qubits.taperingSymmetries],
    measurement: { groups: plan.measurement.groups, exact: plan.measurement.exact, method: plan.measurement.method },
    ansatzCost: ansatzFigures(plan),
    circuit: circuitFigures(plan.circuit),
    classical: {
      determinants: bigFigure(plan.classical.determinants.determinants),
      ciVectorBytes: bigFigure(plan.classical.ciVectorBytes, true),
      ccsdAmplitudes: bigFigure(plan.classical.ccsd.amplitudes),
      statevectorBytes: plan.classical.statevectorBytes ? bigFigure(plan.classical.statevectorBytes, true) : null,
    },
    notes: [...plan.notes],
  };
}

function scanTotals(points: number, fragments: readonly FragmentFigures[]): ScanTotals {
  const withTier = fragments.filter((fragment) => fragment.tier !== null).length;
  const groups = fragments.reduce((sum, fragment) => sum + (fragment.tier === 'quantum' ? (fragment.measurement?.groups ?? 0) : 0), 0);
  const qubits = fragments.map((fragment) => fragment.qubitsRequired).filter((value): value is number => value !== null);
  return { fragmentCalculations: points * withTier, measurementCircuits: points * groups, peakQubits: qubits.length > 0 ? Math.max(...qubits) : null };
}

export function buildEstimateReport(analysis: Analysis): EstimateReport {
  const { model } = analysis;
  const estimates = estimatesOf(model);
  const overrides: Record<string, string> = {};
  for (const [symbol, set] of model.basis.overrides) overrides[symbol] = set.displayName;
  const errors = analysis.diagnostics.filter((d) => d.severity === 'error').length;
  const warnings = analysis.diagnostics.filter((d) => d.severity === 'warning').length;
  const systemEstimate = model.atoms.length > 0 && model.system.atomsWithoutBasis === 0 ? estimates.system() : undefined;
  const systemBase = spaceFigures(model.system, model.atoms.map((atom) => atom.element.symbol), systemEstimate?.symmetry);
  const near = systemEstimate?.symmetry?.symmetry.nearGroup;
  const fragments = model.fragments.map((fragment) => fragmentFigures(model, fragment));
  return {
    tool: 'tessera',
    note: PLANNING_NOTE,
    spec: { name: model.name ?? null, path: analysis.path ?? null },
    basis: { name: model.basis.main?.displayName ?? analysis.ast.basis?.name?.value ?? null, overrides, functions: model.basis.functions },
    embedding: model.embedding,
    conventions: CONVENTIONS,
    system: {
      ...systemBase,
      qubits: { ...systemBase.qubits, tapered: systemEstimate?.taperedQubits ?? null },
      pauliTerms: systemEstimate?.pauliTerms
        ? {
            jordanWigner: systemEstimate.pauliTerms.jordanWigner,
            bravyiKitaev: systemEstimate.pauliTerms.bravyiKitaev,
            parity: systemEstimate.pauliTerms.parity,
            identityIncluded: true,
            upperBound: planSymmetry(systemEstimate.symmetry)?.fullGroupNonAbelian ?? false,
          }
        : null,
      nearSymmetry: near ? { group: near.group, within: near.within } : null,
    },
    fragments,
    scan: model.scan ? { points: model.scan.distances.length, distances: model.scan.distances, totals: scanTotals(model.scan.distances.length, fragments) } : null,
    limits: { qubits: model.limits.qubits ?? null, memoryBytes: model.limits.memoryBytes ?? null },
    diagnostics: { errors, warnings },
  };
}
