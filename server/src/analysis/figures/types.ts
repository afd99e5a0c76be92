/**
 * The figures of an analysed spec under stable keys, with the convention behind each: the shapes
 * the CLI's JSON, hover cards, hints, reports and plots all read, so they cannot disagree. All
 * counted figures are planning estimates; results of the engine are marked computed where shown.
 */
import type { ScanCoordinate } from '../../chemistry/scan';
export const PLANNING_NOTE =
  'Planning estimates from counting rules, not results of a calculation: use them to size a study, not as guarantees. Figures marked computed are results of Tessera\'s own mean-field engine.';

export const CONVENTIONS = {
  electrons: 'sum of nuclear charges − charge − core electrons replaced by effective core potentials',
  spin: 'multiplicity 2S+1 valid when 2S ≤ N and N − 2S even; alpha = (N + 2S)/2, beta = (N − 2S)/2',
  orbitals: 'spatial orbitals = basis functions of the chosen type (linear dependencies not removed)',
  frozenCore: 'noble-gas core of each element, less orbitals replaced by an effective core potential (common practice)',
  activeSpace:
    'as given; otherwise every orbital of the problem the solver sees outside the frozen core (the DMET impurity under `embedding dmet`, else the fragment\'s own orbitals); irreps of the active orbitals as given per irrep, else in proportion to the orbitals of each irrep (an assumption)',
  qubits: 'Jordan–Wigner and Bravyi–Kitaev: 2n for n active spatial orbitals; parity with the two-qubit reduction: 2n − 2; tapered: 2n − rank over GF(2) of the Z2 symmetries (N_α and N_β parity, point-group generators acting on the active orbitals; Bravyi et al. 2017, Setia et al. 2020)',
  pauliTerms: 'distinct Pauli strings of the qubit Hamiltonian, identity included, for generic real integrals allowed by the abelian point group; the same under Jordan–Wigner, Bravyi–Kitaev and unreduced parity (Clifford-related); an upper bound when the full point group is non-abelian',
  measurement: 'qubit-wise commuting groups from a largest-degree-first greedy colouring (a heuristic, not the minimum) of the explicit Jordan–Wigner strings in block spin-orbital order (all α, then all β; the order changes the count) up to 14 qubits; beyond, 0.21 × (terms − 1), extrapolated from explicit groupings of 8–20 qubits',
  ansatz: 'UCCSD: spin-conserving spin-orbital excitations screened by the point group (Romero et al. 2019); k-UpCCGSD: k × 3n(n−1)/2 (Lee et al. 2019); hardware-efficient: q(3d+2) Euler angles (Kandala et al. 2017)',
  circuit: 'one Trotter step of UCCSD on the untapered Jordan–Wigner register (2 qubits per active orbital, interleaved spin order), whatever the fragment\'s mapping: Pauli-rotation ladders, 2(w−1) CNOTs per string of weight w; compact fermionic-excitation circuits after Yordanov et al. 2020; depth a serial upper estimate (no gates run in parallel); hardware-efficient circuits on the qubits needed',
  classical: 'full-CI determinants C(n, nα)·C(n, nβ); CI vector and CCSD amplitudes at 8 bytes each; statevector 2^q × 16 bytes',
  tiers: 'qubit, Pauli-term, measurement, ansatz and circuit figures belong to quantum tiers only; correlated and mean-field tiers get their solver cost instead',
  solverCost:
    'formal scaling, floating-point operations (a multiply–add counts two) and memory of the method on the fragment: Hartree–Fock and Kohn–Sham on its basis functions, correlated methods on the active space of its problem (DMET impurity or own orbitals); leading terms with stated prefactors, 20 iterations assumed for iterative methods; time at `limits { rate }` or 100 Gflops (an assumption)',
  fragmentCharge: 'formal charge of the fragment as written in the spec (default 0)',
  caps: 'cut covalent bonds capped with hydrogen link atoms on the kept atom\'s side when the spec says `caps hydrogen fixed|scaled` (Field, Bash & Karplus 1990): fixed at the typical X–H length of the element (common practice), or scaled g · d(X–Y), g = (r_X + r_H)/(r_X + r_Y) with Cordero radii (Dapprich et al. 1999); caps count in the fragment\'s formula, electrons, functions, orbitals, qubits and point group, not in its atom count',
  pointGroup: 'detected with a 0.01 Å tolerance in the system and in each fragment of up to 500 atoms (the near-symmetry search in the system only); larger ones are counted without symmetry (C1)',
  orbitalSources:
    'counted: irreps of the active orbitals as the spec gives them, else apportioned in proportion to the orbitals of each irrep, and the reference occupation as given, else assumed (each irrep spread evenly, the lowest filled); computed: the irrep and reference-determinant occupation of each active orbital the fragment\'s own mean field chose (MP2 natural orbitals: the most occupied filled in pairs). Tapering, Pauli terms, measurement groups, screened UCCSD parameters and circuits built on computed irreps are still counting rules applied to them, not a computed Hamiltonian',
  fragmentSymmetry:
    "a fragment that sees its environment (embedding dmet or projection) is counted in the stabiliser of its atoms in the system's point group — the operations of the system that map the fragment onto itself (group theory of stabiliser subgroups); a fragment that stands alone (subtractive, none) in its own point group",
} as const;

/**
 * A count that may pass 2^53: a plain number while it is exact, beyond that a BigFigure (its text
 * to three significant digits, its exact digits when known, log10), never a number with false
 * digits. Read them with countText and countValue (figures/space.ts).
 */
export type Count = number | BigFigure;

/** A count or size that may exceed 2^53: its text, its exact digits when known, and log10. */
export interface BigFigure {
  text: string;
  exact: string | null;
  log10: number;
}

export interface PauliFigures {
  jordanWigner: Count;
  bravyiKitaev: Count;
  parity: Count;
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
  /** The active space; null for a mean-field tier, which has none. */
  active: { electrons: number; orbitals: number; alpha: number | null; beta: number | null; source: string } | null;
  /**
   * Qubits of the active space under each mapping: a quantum tier's register. Null for the
   * correlated and mean-field tiers (no qubits there); for the system a hypothetical figure (see
   * SystemFigures.qubitsScope).
   */
  qubits: { jordanWigner: number; bravyiKitaev: number; parity: number; tapered: number | null } | null;
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
  /** Hydrogen caps on the bonds the fragment boundary cuts; null when the fragment caps none. */
  caps: CapFigures | null;
  /** Qubits under the fragment's mapping, tapered with `taper on` (quantum tier only). */
  qubitsRequired: number | null;
  atomIndices: number[];
  /** The orbital space the solver sees: a DMET impurity or the fragment's own orbitals. */
  problem: { embedding: string; orbitals: number; electrons: number; alpha: number; beta: number; bath: { alpha: number; beta: number }; convention: string } | null;
  /**
   * Active orbitals per irrep and where they come from; `occupation` says where the reference
   * determinant's irreps come from: `given` (`occupied …`), or `assumed` (orbitals of each irrep
   * spread evenly, the lowest filled).
   */
  activeIrreps: { perIrrep: Record<string, number>; source: string; occupation: 'given' | 'computed' | 'assumed' } | null;
  /**
   * Which orbitals each figure that depends on the irreps and reference occupation of the active
   * orbitals was built on (CONVENTIONS.orbitalSources): `counted` (the spec's per-irrep counts and
   * occupation, else apportioned and assumed) or `computed` (the active orbitals the fragment's
   * mean field chose); `note` says why computed orbitals were not used when they exist. Null for
   * fragments without an active space.
   */
  orbitalSources: OrbitalSources | null;
  /**
   * The two point groups of the fragment: its own (its atoms alone) and the one it keeps inside the
   * system (the stabiliser of its atoms in the system's group); `countedIn` says which the figures
   * use (pointGroup, fullPointGroup and orbitalsPerIrrep above are that one's), by the embedding.
   */
  symmetry: {
    countedIn: 'in-system' | 'own';
    own: { pointGroup: string; fullPointGroup: string } | null;
    inSystem: { pointGroup: string; fullPointGroup: string } | null;
    reason: string;
  } | null;
  taperingSymmetries: string[];
  /**
   * Qubit-wise commuting groups. `explicit`: counted by grouping the strings themselves (a greedy
   * heuristic, not the minimum), else extrapolated; `exact` is the same flag under its first name,
   * kept for readers of earlier output (the count is never exact).
   */
  measurement: { groups: Count; explicit: boolean; exact: boolean; method: string } | null;
  ansatzCost: { kind: string; parameters: Count; singles: Count | null; doubles: Count | null; unscreened: Count | null; spinAdapted: Count | null } | null;
  circuit: { construction: string; cnots: Count; rotations: Count | null; depth: Count | null; compactCnots: Count | null } | null;
  classical: {
    determinants: BigFigure;
    ciVectorBytes: BigFigure;
    ccsdAmplitudes: BigFigure;
    /** How the amplitudes are counted: spin-adapted for a closed shell, spin orbitals for an open one. */
    ccsdAmplitudesConvention: 'closed-shell' | 'spin-orbital';
    statevectorBytes: BigFigure | null;
  } | null;
  /** What decides a classical tier's feasibility: scaling, operations, memory and time of its method. */
  solverCost: SolverCostFigures | null;
  notes: string[];
}

export type OrbitalSource = 'counted' | 'computed';

export interface OrbitalSources {
  /** By figure key: activeIrreps, referenceOccupation, and for quantum tiers taperedQubits, qubitsRequired, pauliTerms, measurement, ansatzParameters, circuit. */
  figures: Record<string, OrbitalSource>;
  /** How the computed orbitals were chosen (point group and source); null when counted. */
  computedFrom: string | null;
  note: string | null;
}

export interface CapFigures {
  /** `fixed` or `scaled` (chemistry/capping.ts). */
  rule: string;
  count: number;
  /** Each cap: the kept atom and its partner as `#n` numbers of the spec, the X–H length (Å) and the position (Å). */
  list: { host: number; partner: number; element: string; length: number; position: [number, number, number] }[];
}


export interface SolverCostFigures {
  method: string;
  /** Formal scaling and the leading term. */
  scaling: string;
  /** What the method is applied to. */
  on: 'active-space' | 'dmet-impurity' | 'fragment';
  basisFunctions: number;
  orbitals: number;
  occupied: number;
  virtual: number;
  determinants: BigFigure | null;
  /** Floating-point operations of the whole solve (assumed iterations included). */
  operations: BigFigure;
  operationsPerIteration: BigFigure | null;
  iterations: number | null;
  memoryBytes: BigFigure;
  time: { seconds: number | null; log10Seconds: number; text: string; flopsPerSecond: number; rateFrom: 'limits' | 'default' };
  formula: string;
  references: string[];
}

/** What the system row's qubit, Pauli-term and tapering figures describe. */
export const SYSTEM_QUBITS_SCOPE = 'hypothetical: the whole system on one quantum tier, every orbital outside the frozen core active';

export type SystemFigures = SpaceFigures & { nearSymmetry: { group: string; within: number } | null; qubitsScope: typeof SYSTEM_QUBITS_SCOPE };

export interface BasisOverrideFigure {
  basis: string;
  on: string;
  atoms: number;
}

export interface EstimateReport {
  tool: 'tessera';
  note: string;
  spec: { name: string | null; path: string | null };
  /**
   * The main basis, the override lines that decide at least one atom (`on` as written, `atoms`
   * how many atoms take the line's basis), and the function type.
   */
  basis: { name: string | null; overrides: BasisOverrideFigure[]; functions: 'spherical' | 'cartesian' };
  embedding: string;
  conventions: typeof CONVENTIONS;
  system: SystemFigures;
  fragments: FragmentFigures[];
  scan: ScanFigures | null;
  limits: { qubits: number | null; memoryBytes: number | null; flopsPerSecond: number; flopsFrom: 'limits' | 'default' };
  diagnostics: { errors: number; warnings: number };
}

/**
 * The scan: the coordinate, its values in scan order (ångström for a distance, degrees for an angle
 * or dihedral; `distances` repeats them under the older key for distance scans) and its costs.
 */
export interface ScanFigures {
  coordinate: ScanCoordinate;
  unit: 'angstrom' | 'degree';
  points: number;
  values: number[];
  distances?: number[];
  totals: ScanTotals;
  /** The point group at every point and the figures that depend on it (analysis/scanSymmetry.ts). */
  symmetry: ScanSymmetryFigures;
}

/** Per-point symmetry of a scan: each point's groups and, for quantum tiers, tapered qubits and qubits needed in that point's group. */
export interface ScanSymmetryFigures {
  /** Null when every point was looked at; else why not (then `points` is empty and the structure's figures hold). */
  notLookedFor: string | null;
  /** Whether the system's full point group changes along the scan. */
  groupChanges: boolean;
  /** Whether a fragment's counted group, tapered qubits or qubits needed change along the scan. */
  figuresChange: boolean;
  points: {
    value: number;
    fullPointGroup: string | null;
    pointGroup: string | null;
    fragments: { fragment: string; pointGroup: string | null; taperedQubits: number | null; qubitsRequired: number | null }[];
  }[];
}

/** Costs along a scan: each point repeats every fragment's calculation. */
export interface ScanTotals {
  /** Fragment calculations over the whole scan: points × fragments with a tier. */
  fragmentCalculations: number;
  /** Measurement groups summed over quantum fragments, times the points: circuits per energy evaluation over the scan. */
  measurementCircuits: Count;
  /** Measurement groups summed over quantum fragments: circuits per energy evaluation at each point (counted at the structure's geometry, the same at every point). */
  measurementCircuitsPerPoint: Count;
  /** The largest qubit count any point needs, each point counted in its own point group when the points were looked at. */
  peakQubits: number | null;
}

