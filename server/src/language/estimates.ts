/**
 * Resource estimates of an analysed spec: the point group of the system and of each fragment,
 * orbitals per irrep, and each fragment's plan estimate (chemistry/estimate/plan.ts). Computed
 * lazily and once per model, because symmetry detection of a large cluster is the costliest step;
 * the checks ask only for the fragments they need.
 */
import type { FunctionType, ShellCounts } from '../chemistry/basis/shells';
import { countPauliTerms } from '../chemistry/estimate/pauliTerms';
import { symmetryPattern } from '../chemistry/estimate/integralPattern';
import { apportion, estimatePlan, spreadIrreps, type IrrepShare, type PlanEstimate, type PlanInput, type PlanSymmetry } from '../chemistry/estimate/plan';
import { taperQubits } from '../chemistry/estimate/tapering';
import { nobleGasCoreOrbitals } from '../chemistry/elements';
import { ABELIAN_GROUPS, CHARACTER_TABLES, detectSymmetry, orbitalIrreps, type AbelianGroupName, type OrbitalIrreps, type SymmetryResult } from '../chemistry/symmetry';
import type { Mapping } from '../chemistry/qubits';
import type { FragmentModel, SpecModel } from './model';

/** Whole-system symmetry (and near symmetry) is looked for in geometries up to this many atoms in the check path. */
export const SYMMETRY_CHECK_ATOM_LIMIT = 500;

/**
 * Shells of the noble-gas core (common practice, no source): He 1s; Ne 1s2s2p; Ar + 3s3p; Kr + 3d4s4p;
 * Xe + 4d5s5p; Rn + 4f5d6s6p; less the shells an effective core potential replaces
 * (28 electrons: 1s–3d; 46: 1s–4d; 60: 1s–4f).
 */
export function frozenCoreShells(z: number, ecpCoreElectrons: number): ShellCounts {
  const byCore: Record<number, number[]> = { 0: [], 1: [1], 5: [2, 1], 9: [3, 2], 18: [4, 3, 1], 27: [5, 4, 2], 43: [6, 5, 3, 1] };
  const core = [...(byCore[nobleGasCoreOrbitals(z)] ?? [])];
  const ecp: Record<number, number[]> = { 0: [], 10: [2, 1], 18: [3, 2], 28: [3, 2, 1], 36: [4, 3, 1], 46: [4, 3, 2], 54: [5, 4, 2], 60: [4, 3, 2, 1], 68: [5, 4, 2, 1], 78: [5, 4, 3, 1] };
  const removed = ecp[ecpCoreElectrons] ?? [];
  return core.map((count, l) => Math.max(0, count - (removed[l] ?? 0)));
}

export interface SymmetryFigures {
  readonly symmetry: SymmetryResult;
  readonly group: AbelianGroupName;
  readonly orbitals: OrbitalIrreps;
  /** Orbitals per irrep outside the frozen core. */
  readonly available: readonly IrrepShare[];
}

export interface SystemEstimate {
  readonly symmetry: SymmetryFigures | undefined;
  readonly pauliTerms: { jordanWigner: number; bravyiKitaev: number; parity: number } | undefined;
  readonly taperedQubits: number | undefined;
}

function symmetryFigures(model: SpecModel, atoms: readonly number[], frozenCore: boolean, withNear: boolean): SymmetryFigures | undefined {
  if (atoms.length === 0) return undefined;
  const numbers = atoms.map((atom) => model.atoms[atom]!.element.z);
  const positions = new Float64Array(3 * atoms.length);
  atoms.forEach((atom, k) => positions.set(model.coordinates.subarray(3 * atom, 3 * atom + 3), 3 * k));
  const symmetry = detectSymmetry(numbers, positions, withNear ? {} : { nearTolerance: 0 });
  const shells = atoms.map((atom) => shellsOf(model, atom));
  if (shells.some((s) => s === undefined)) return undefined;
  try {
    const functions: FunctionType = model.basis.functions;
    const orbitals = orbitalIrreps(symmetry, shells, functions);
    const core = frozenCore ? orbitalIrreps(symmetry, atoms.map((atom) => frozenCoreShells(model.atoms[atom]!.element.z, ecpOf(model, atom))), 'spherical') : undefined;
    const available = orbitals.irreps.map((irrep, i) => ({ label: irrep.label, mask: irrep.mask, count: irrep.count - (core?.irreps[i]?.count ?? 0) }));
    return { symmetry, group: symmetry.abelianGroup, orbitals, available };
  } catch {
    // Equivalent atoms with different basis functions: no symmetry-adapted count.
    return undefined;
  }
}

function basisOf(model: SpecModel, atom: number) {
  const symbol = model.atoms[atom]!.element.symbol;
  return model.basis.overrides.get(symbol) ?? model.basis.main;
}

function shellsOf(model: SpecModel, atom: number): ShellCounts | undefined {
  return basisOf(model, atom)?.shellsFor(model.atoms[atom]!.element.symbol);
}

function ecpOf(model: SpecModel, atom: number): number {
  return basisOf(model, atom)?.ecpCoreElectrons(model.atoms[atom]!.element.symbol) ?? 0;
}

export function planSymmetry(figures: SymmetryFigures | undefined): PlanSymmetry | undefined {
  if (!figures) return undefined;
  const table = CHARACTER_TABLES[figures.group];
  const full = figures.symmetry.fullGroup;
  return {
    group: figures.group,
    generatorCount: table.generators.length,
    generatorNames: table.generators,
    available: figures.available,
    fullGroupNonAbelian: !(ABELIAN_GROUPS as readonly string[]).includes(full),
    fullGroup: full,
  };
}

/** Lazily computed estimates of one model. */
export class SpecEstimates {
  private systemFigures: SymmetryFigures | undefined | null = null;
  private readonly fragmentFigures = new Map<number, SymmetryFigures | undefined>();
  private readonly plans = new Map<number, PlanEstimate | undefined>();
  private systemEstimate: SystemEstimate | undefined;

  constructor(private readonly model: SpecModel) {}

  /** The whole system's symmetry (with the near-symmetry search). */
  systemSymmetry(): SymmetryFigures | undefined {
    if (this.systemFigures === null) {
      const atoms = this.model.atoms.map((atom) => atom.index);
      this.systemFigures = symmetryFigures(this.model, atoms, this.model.frozenCore, true);
    }
    return this.systemFigures;
  }

  fragmentSymmetry(index: number): SymmetryFigures | undefined {
    if (!this.fragmentFigures.has(index)) {
      const fragment = this.model.fragments[index]!;
      this.fragmentFigures.set(index, symmetryFigures(this.model, fragment.atoms, fragment.tier?.frozenCore ?? this.model.frozenCore, false));
    }
    return this.fragmentFigures.get(index);
  }

  /** The plan estimate of a fragment with a tier; undefined when it cannot be sized. */
  fragment(index: number): PlanEstimate | undefined {
    if (!this.plans.has(index)) this.plans.set(index, this.computePlan(this.model.fragments[index]!));
    return this.plans.get(index);
  }

  /** What the plan estimate of a fragment is computed from; undefined for fragments that cannot be sized. */
  planInput(index: number): PlanInput | undefined {
    const fragment = this.model.fragments[index]!;
    const tier = fragment.tier;
    // A mean-field tier has no active space to size: its cost is the orbital count alone.
    if (!tier || tier.level === 'mean-field' || fragment.atoms.length === 0 || fragment.space.atomsWithoutBasis > 0) return undefined;
    const symmetry = planSymmetry(this.fragmentSymmetry(fragment.index));
    const perIrrep = tier.activeIrreps && symmetry ? activeIrrepShares(symmetry, tier.activeIrreps) : undefined;
    const active = tier.active ? { ...tier.active, ...(perIrrep ? { perIrrep } : {}) } : undefined;
    return {
      fragment: fragment.space,
      system: this.model.system,
      embedding: (['dmet', 'projection', 'subtractive'].includes(this.model.embedding) ? this.model.embedding : 'none') as PlanInput['embedding'],
      tier: tier.level,
      method: tier.method,
      ansatz: tier.ansatz,
      mapping: tier.mapping as Mapping | undefined,
      taper: tier.taper,
      layers: tier.layers,
      ...(active ? { active } : {}),
      ...(symmetry ? { symmetry } : {}),
    };
  }

  private computePlan(fragment: FragmentModel): PlanEstimate | undefined {
    const input = this.planInput(fragment.index);
    if (!input) return undefined;
    try {
      return estimatePlan(input);
    } catch {
      // Sizes outside what the counting rules accept (reported by the checks); no estimate.
      return undefined;
    }
  }

  /** System-level Pauli terms and tapered qubits for the system's active space (outside the frozen core). */
  system(): SystemEstimate {
    if (this.systemEstimate) return this.systemEstimate;
    const space = this.model.system;
    const symmetry = this.systemSymmetry();
    const plan = planSymmetry(symmetry);
    const orbitals = space.active.orbitals;
    const shares = plan ? apportion(plan.available, orbitals) : [{ label: 'A', mask: 0, count: orbitals }];
    const irreps = Uint8Array.from(spreadIrreps(shares));
    const valid = space.active.alpha !== undefined && space.active.beta !== undefined && orbitals > 0;
    const electrons = valid ? { alpha: space.active.alpha!, beta: space.active.beta! } : undefined;
    this.systemEstimate = {
      symmetry,
      pauliTerms: valid ? countPauliTerms(symmetryPattern(irreps), electrons) : undefined,
      taperedQubits: valid ? taperQubits(irreps, plan?.generatorCount ?? 0, electrons).tapered : undefined,
    };
    return this.systemEstimate;
  }
}

/** Per-irrep active orbitals as written (`A1=3 B2=1`), resolved against the fragment's group. */
export function activeIrrepShares(symmetry: PlanSymmetry, given: readonly { label: string; count: number }[]): IrrepShare[] | undefined {
  const table = CHARACTER_TABLES[symmetry.group as AbelianGroupName];
  const shares: IrrepShare[] = [];
  for (const entry of given) {
    const irrep = table.irreps.find((candidate) => candidate.label.toLowerCase() === entry.label.toLowerCase().replace(/''$/, '"'));
    if (!irrep) return undefined;
    shares.push({ label: irrep.label, mask: irrep.mask, count: entry.count });
  }
  return shares;
}

const cache = new WeakMap<SpecModel, SpecEstimates>();

export function estimatesOf(model: SpecModel): SpecEstimates {
  let found = cache.get(model);
  if (!found) {
    found = new SpecEstimates(model);
    cache.set(model, found);
  }
  return found;
}
