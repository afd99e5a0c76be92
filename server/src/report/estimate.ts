/**
 * The estimate report: every figure of an analysed spec under stable keys, with the convention
 * behind it. The CLI's text, Markdown and JSON output, hover cards and reports all read this
 * structure, so they cannot disagree. All figures are planning estimates.
 */
import type { OrbitalSpace } from '../chemistry/counting';
import { hillFormula } from '../chemistry/elements';
import type { Analysis } from '../language/analyze';
import type { FragmentModel, SpecModel } from '../language/model';

export const PLANNING_NOTE =
  'Planning estimates from counting rules, not results of a calculation: use them to size a study, not as guarantees.';

export const CONVENTIONS = {
  electrons: 'sum of nuclear charges − charge − core electrons replaced by effective core potentials',
  spin: 'multiplicity 2S+1 valid when 2S ≤ N and N − 2S even; alpha = (N + 2S)/2, beta = (N − 2S)/2',
  orbitals: 'spatial orbitals = basis functions of the chosen type (linear dependencies not removed)',
  frozenCore: 'noble-gas core of each element, less orbitals replaced by an effective core potential (common practice)',
  activeSpace: 'as given; otherwise every orbital outside the frozen core (or every orbital with frozen-core off)',
  qubits: 'Jordan–Wigner and Bravyi–Kitaev: 2n for n active spatial orbitals; parity with the two-qubit reduction: 2n − 2',
  fragmentCharge: 'formal charge of the fragment as written in the spec (default 0)',
} as const;

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
  qubits: { jordanWigner: number; bravyiKitaev: number; parity: number };
}

export interface FragmentFigures extends SpaceFigures {
  name: string;
  tier: string | null;
  method: string | null;
  ansatz: string | null;
  mapping: string | null;
  /** Qubits under the fragment's own mapping (quantum tier only). */
  qubitsRequired: number | null;
  atomIndices: number[];
}

export interface EstimateReport {
  tool: 'tessera';
  note: string;
  spec: { name: string | null; path: string | null };
  basis: { name: string | null; overrides: Record<string, string>; functions: 'spherical' | 'cartesian' };
  embedding: string;
  conventions: typeof CONVENTIONS;
  system: SpaceFigures;
  fragments: FragmentFigures[];
  scan: { points: number; distances: number[] } | null;
  limits: { qubits: number | null; memoryBytes: number | null };
  diagnostics: { errors: number; warnings: number };
}

export function spaceFigures(space: OrbitalSpace, symbols: string[]): SpaceFigures {
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
    qubits: { ...space.qubits },
  };
}

function fragmentFigures(model: SpecModel, fragment: FragmentModel): FragmentFigures {
  const symbols = fragment.atoms.map((atom) => model.atoms[atom]!.element.symbol);
  const tier = fragment.tier;
  const mapping = tier?.mapping ?? null;
  const qubits = fragment.space.qubits;
  const required = mapping === 'parity' ? qubits.parity : mapping === 'bravyi-kitaev' ? qubits.bravyiKitaev : mapping === 'jordan-wigner' ? qubits.jordanWigner : null;
  return {
    name: fragment.name,
    tier: tier?.level ?? null,
    method: tier?.method ?? null,
    ansatz: tier?.ansatz ?? null,
    mapping,
    qubitsRequired: required,
    atomIndices: fragment.atoms.map((atom) => atom + 1),
    ...spaceFigures(fragment.space, symbols),
  };
}

export function buildEstimateReport(analysis: Analysis): EstimateReport {
  const { model } = analysis;
  const overrides: Record<string, string> = {};
  for (const [symbol, set] of model.basis.overrides) overrides[symbol] = set.displayName;
  const errors = analysis.diagnostics.filter((d) => d.severity === 'error').length;
  const warnings = analysis.diagnostics.filter((d) => d.severity === 'warning').length;
  return {
    tool: 'tessera',
    note: PLANNING_NOTE,
    spec: { name: model.name ?? null, path: analysis.path ?? null },
    basis: { name: model.basis.main?.displayName ?? analysis.ast.basis?.name?.value ?? null, overrides, functions: model.basis.functions },
    embedding: model.embedding,
    conventions: CONVENTIONS,
    system: spaceFigures(model.system, model.atoms.map((atom) => atom.element.symbol)),
    fragments: model.fragments.map((fragment) => fragmentFigures(model, fragment)),
    scan: model.scan ? { points: model.scan.distances.length, distances: model.scan.distances } : null,
    limits: { qubits: model.limits.qubits ?? null, memoryBytes: model.limits.memoryBytes ?? null },
    diagnostics: { errors, warnings },
  };
}
