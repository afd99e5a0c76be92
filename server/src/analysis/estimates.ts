/**
 * The per-part estimates of one model, each computed on first request and kept: the point group
 * of the system and of each fragment (orbitals per irrep inside and outside the frozen core), what
 * each fragment's plan estimate is computed from, the plan estimate itself, and the system's
 * symmetry-reduced counts. Symmetry detection is the costliest step, so it follows one size
 * policy everywhere (checks and figures alike): SYMMETRY_ATOM_LIMIT.
 */
import { elementByNumber, frozenCoreShells } from '../chemistry/elements';
import { activeIrreps, planSymmetryOf, resolveGivenIrreps, symmetryCounts, type GivenOccupation, type IrrepShare, type PlanSymmetry } from '../chemistry/estimate/activeIrreps';
import { CHARACTER_TABLES, type AbelianGroupName } from '../chemistry/symmetry/characterTables';
import type { PauliTermCounts } from '../chemistry/estimate/pauliTerms';
import { EMBEDDING_SYMMETRY, embeddingName, type SymmetryScope } from '../chemistry/estimate/embeddingSymmetry';
import { estimatePlan, type PlanEstimate, type PlanInput } from '../chemistry/estimate/plan';
import { embeddedOrbitalSymmetry, orbitalSymmetry, type OrbitalSymmetry, type SymmetryAtoms } from '../chemistry/symmetry';
import type { Mapping } from '../chemistry/qubits';
import type { CapModel, SpecModel } from '../language/model';
import { InputMemo } from './memo';

/**
 * Point groups are looked for in atom sets up to this many atoms (the whole system with the
 * near-symmetry search, fragments without it); larger ones are counted without symmetry (C1), so
 * that checking and hovering stay fast on clusters. The near-symmetry check uses the same limit.
 */
export const SYMMETRY_ATOM_LIMIT = 500;

export interface SystemCounts {
  readonly pauliTerms: PauliTermCounts | undefined;
  readonly taperedQubits: number | undefined;
  /** True when the full group is non-abelian: the Pauli count is then an upper bound. */
  readonly upperBound: boolean;
}

const PLAN_EMBEDDINGS = new Set(['dmet', 'projection', 'subtractive']);

/**
 * The active orbitals a mean field chose for a fragment, as the estimates read them: the point
 * group of the labels, the irrep of each active orbital in register order and the electrons it
 * holds in the reference determinant (2, 1 or 0). Built from the fragment's active-space result
 * (analysis/computedOrbitals.ts), which is kept under a key of the fragment's inputs, so a result
 * for other atoms, basis, charge or spin never reaches here.
 */
export interface ComputedActiveOrbitals {
  readonly pointGroup: string;
  /** Irrep label of each active orbital; null where the orbital belongs to no irrep. */
  readonly irreps: readonly (string | null)[];
  /** Electrons of each active orbital in the reference determinant. */
  readonly occupations: readonly number[];
}

/** Whether a fragment's estimates use its computed active orbitals, and why not when they do not. */
export type ComputedUse = { readonly use: true; readonly input: PlanInput } | { readonly use: false; readonly reason: string };

/** Point groups of atom sets and plan estimates, by their full inputs, across versions and documents. */
const SYMMETRIES = new InputMemo<OrbitalSymmetry | undefined>(64);
const PLANS = new InputMemo<PlanEstimate | undefined>(256);

export class Estimates {
  private systemSymmetryCache: OrbitalSymmetry | undefined | null = null;
  private readonly fragmentSymmetries = new Map<number, OrbitalSymmetry | undefined>();
  private readonly inSystemSymmetries = new Map<number, OrbitalSymmetry | undefined>();
  private readonly plans = new Map<number, PlanEstimate | undefined>();
  private systemCountsCache: SystemCounts | undefined;

  /** `nearSymmetry: false` skips the near-symmetry search of the system (scan points need only the exact group). */
  constructor(
    readonly model: SpecModel,
    private readonly options: { readonly nearSymmetry?: boolean } = {},
  ) {}

  /** Whether an atom set of this size gets a point group (see SYMMETRY_ATOM_LIMIT). */
  static symmetryApplies(atoms: number): boolean {
    return atoms > 0 && atoms <= SYMMETRY_ATOM_LIMIT;
  }

  /** The whole system's symmetry, with the near-symmetry search; undefined above the size limit. */
  systemSymmetry(): OrbitalSymmetry | undefined {
    if (this.systemSymmetryCache === null) {
      const atoms = this.model.atoms.map((atom) => atom.index);
      this.systemSymmetryCache = this.symmetryOf(atoms, this.model.frozenCore, this.options.nearSymmetry !== false);
    }
    return this.systemSymmetryCache;
  }

  fragmentSymmetry(index: number): OrbitalSymmetry | undefined {
    if (!this.fragmentSymmetries.has(index)) {
      const fragment = this.model.fragments[index]!;
      // Caps are part of the fragment the solver sees: they count in its point group.
      this.fragmentSymmetries.set(index, this.symmetryOf(fragment.atoms, fragment.tier?.frozenCore ?? this.model.frozenCore, false, fragment.caps));
    }
    return this.fragmentSymmetries.get(index);
  }

  /**
   * The symmetry a fragment keeps inside the system: the stabiliser of its atoms in the system's
   * point group (chemistry/symmetry/orbitalSymmetry.ts). Undefined when the system is beyond the
   * size policy or cannot be counted per irrep; the fragment is then counted in C1.
   */
  fragmentSymmetryInSystem(index: number): OrbitalSymmetry | undefined {
    if (!this.inSystemSymmetries.has(index)) {
      const fragment = this.model.fragments[index]!;
      const all = this.model.atoms.map((atom) => atom.index);
      let found: OrbitalSymmetry | undefined;
      if (fragment.atoms.length > 0 && Estimates.symmetryApplies(all.length + fragment.caps.length)) {
        // The fragment's caps join the system and the fragment: an operation that keeps the
        // fragment's atoms maps its cut bonds onto each other, and so its caps.
        const atoms = this.symmetryAtoms(all, fragment.tier?.frozenCore ?? this.model.frozenCore, fragment.caps);
        const members = [...fragment.atoms, ...fragment.caps.map((_, k) => all.length + k)];
        const key = JSON.stringify(['in-system', atoms.key, members]);
        found = SYMMETRIES.get(key, () => embeddedOrbitalSymmetry(atoms.atoms, members));
      }
      this.inSystemSymmetries.set(index, found);
    }
    return this.inSystemSymmetries.get(index);
  }

  /** Whether fragments are counted in their own group or in the stabiliser, by the spec's embedding. */
  symmetryScope(): { scope: SymmetryScope; reason: string } {
    return EMBEDDING_SYMMETRY[embeddingName(this.model.embedding)];
  }

  /** The symmetry a fragment's figures are counted in: its stabiliser in the system when embedded, else its own. */
  countedSymmetry(index: number): OrbitalSymmetry | undefined {
    return this.symmetryScope().scope === 'in-system' ? this.fragmentSymmetryInSystem(index) : this.fragmentSymmetry(index);
  }

  /**
   * What a fragment's plan estimate is computed from when its active orbitals are computed: the
   * counted input with the active space replaced by the computed one (its size, the irrep of each
   * orbital and the reference occupation), or why the counted input stands.
   */
  computedPlanInput(index: number, computed: ComputedActiveOrbitals): ComputedUse {
    const counted = this.planInput(index);
    if (!counted) return { use: false, reason: 'the fragment has no plan estimate to refine' };
    if (counted.embedding === 'dmet') return { use: false, reason: "under embedding dmet the solver's active space lies in the impurity, while the orbitals were chosen from the fragment alone" };
    if (computed.irreps.some((irrep) => irrep === null)) return { use: false, reason: 'an active orbital of the computed space belongs to no single irrep' };
    const countedSymmetry = counted.symmetry;
    let symmetry: PlanSymmetry | undefined;
    if (countedSymmetry?.group === computed.pointGroup) symmetry = countedSymmetry;
    else if (this.symmetryScope().scope === 'in-system') {
      return { use: false, reason: `the orbitals carry irreps of the fragment's own group ${computed.pointGroup}, while its figures are counted in ${countedSymmetry?.group ?? 'C1'}, the symmetry it keeps inside the system` };
    } else symmetry = groupSymmetry(computed.pointGroup, countedSymmetry);
    if (!symmetry) return { use: false, reason: `the computed point group ${computed.pointGroup} is not one Tessera counts in` };
    const counts = (keep: (occupation: number) => boolean) => {
      const byLabel = new Map<string, number>();
      computed.irreps.forEach((label, k) => {
        if (keep(computed.occupations[k]!)) byLabel.set(label!, (byLabel.get(label!) ?? 0) + 1);
      });
      return [...byLabel].map(([label, count]) => ({ label, count }));
    };
    const perIrrep = resolveGivenIrreps(symmetry.group, counts(() => true));
    const doubly = resolveGivenIrreps(symmetry.group, counts((occupation) => occupation === 2));
    const singly = resolveGivenIrreps(symmetry.group, counts((occupation) => occupation === 1));
    if (!perIrrep || !doubly || !singly) return { use: false, reason: `an irrep label of the computed orbitals is not one of ${symmetry.group}` };
    const electrons = computed.occupations.reduce((sum, occupation) => sum + occupation, 0);
    const occupation: GivenOccupation = { doubly, singly };
    const active: { electrons: number; orbitals: number; perIrrep: IrrepShare[]; occupation: GivenOccupation; origin: 'computed' } = { electrons, orbitals: computed.irreps.length, perIrrep, occupation, origin: 'computed' };
    return { use: true, input: { ...counted, active, symmetry } };
  }

  /** The plan estimate of a fragment from its computed active orbitals, or why the counted one stands. */
  computedPlan(index: number, computed: ComputedActiveOrbitals): { plan: PlanEstimate } | { plan: undefined; reason: string } {
    const use = this.computedPlanInput(index, computed);
    if (!use.use) return { plan: undefined, reason: use.reason };
    const plan = PLANS.get(JSON.stringify(use.input), () => {
      try {
        return estimatePlan(use.input);
      } catch {
        return undefined;
      }
    });
    return plan ? { plan } : { plan: undefined, reason: 'the computed active space does not fit the problem the solver sees' };
  }

  /** What the plan estimate of a fragment is computed from; undefined for fragments that cannot be sized. */
  planInput(index: number): PlanInput | undefined {
    const fragment = this.model.fragments[index]!;
    const tier = fragment.tier;
    // A mean-field tier has no active space to size: its cost is the orbital count alone.
    if (!tier || tier.level === 'mean-field' || fragment.atoms.length === 0 || fragment.space.atomsWithoutBasis > 0) return undefined;
    const symmetry = planSymmetryOf(this.countedSymmetry(fragment.index));
    const perIrrep = tier.activeIrreps && symmetry ? resolveGivenIrreps(symmetry.group, tier.activeIrreps) : undefined;
    const doubly = perIrrep && tier.activeOccupation ? resolveGivenIrreps(symmetry!.group, tier.activeOccupation.doubly) : undefined;
    const singly = perIrrep && tier.activeOccupation ? resolveGivenIrreps(symmetry!.group, tier.activeOccupation.singly) : undefined;
    const occupation = doubly && singly ? { doubly, singly } : undefined;
    const active = tier.active ? { ...tier.active, ...(perIrrep ? { perIrrep } : {}), ...(occupation ? { occupation } : {}) } : undefined;
    return {
      fragment: fragment.space,
      system: this.model.system,
      embedding: (PLAN_EMBEDDINGS.has(this.model.embedding) ? this.model.embedding : 'none') as PlanInput['embedding'],
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

  /** The plan estimate of a fragment with a tier; undefined when it cannot be sized. */
  plan(index: number): PlanEstimate | undefined {
    if (!this.plans.has(index)) this.plans.set(index, this.computePlan(index));
    return this.plans.get(index);
  }

  /** The system's point group as the counts use it. */
  systemPlanSymmetry(): PlanSymmetry | undefined {
    return planSymmetryOf(this.systemSymmetry());
  }

  /** Pauli terms and tapered qubits of the system's active space (outside the frozen core). */
  systemCounts(): SystemCounts {
    if (this.systemCountsCache) return this.systemCountsCache;
    const space = this.model.system;
    const symmetry = this.systemPlanSymmetry();
    const orbitals = space.active.orbitals;
    const valid = space.active.alpha !== undefined && space.active.beta !== undefined && orbitals > 0 && space.atomsWithoutBasis === 0;
    if (!valid) return (this.systemCountsCache = { pauliTerms: undefined, taperedQubits: undefined, upperBound: false });
    const counts = symmetryCounts(activeIrreps(symmetry, orbitals), { alpha: space.active.alpha!, beta: space.active.beta! });
    this.systemCountsCache = { pauliTerms: counts.pauli, taperedQubits: counts.tapering.tapered, upperBound: symmetry?.fullGroupNonAbelian ?? false };
    return this.systemCountsCache;
  }

  private computePlan(index: number): PlanEstimate | undefined {
    const input = this.planInput(index);
    if (!input) return undefined;
    return PLANS.get(JSON.stringify(input), () => {
      try {
        return estimatePlan(input);
      } catch {
        // Sizes outside what the counting rules accept (reported by the checks); no estimate.
        return undefined;
      }
    });
  }

  private symmetryOf(atoms: readonly number[], frozenCore: boolean, withNear: boolean, caps: readonly CapModel[] = []): OrbitalSymmetry | undefined {
    if (!Estimates.symmetryApplies(atoms.length + caps.length)) return undefined;
    const prepared = this.symmetryAtoms(atoms, frozenCore, caps);
    return SYMMETRIES.get(JSON.stringify([withNear, prepared.key]), () => orbitalSymmetry(prepared.atoms, withNear ? {} : { nearTolerance: 0 }));
  }

  /** Elements, positions and shells of a set of atoms and caps (after the atoms), with a key that holds all of them. */
  private symmetryAtoms(atoms: readonly number[], frozenCore: boolean, caps: readonly CapModel[] = []): { atoms: SymmetryAtoms; key: string } {
    const model = this.model;
    const numbers = [...atoms.map((atom) => model.atoms[atom]!.element.z), ...caps.map((cap) => cap.z)];
    const positions = new Float64Array(3 * numbers.length);
    atoms.forEach((atom, k) => positions.set(model.coordinates.subarray(3 * atom, 3 * atom + 3), 3 * k));
    caps.forEach((cap, k) => positions.set(cap.position, 3 * (atoms.length + k)));
    const basisOf = (atom: number) => model.basis.atomSets[atom];
    const capSymbol = (cap: CapModel) => elementByNumber(cap.z)!.symbol;
    const shells = [...atoms.map((atom) => basisOf(atom)?.shellsFor(model.atoms[atom]!.element.symbol)), ...caps.map((cap) => cap.basis?.shellsFor(capSymbol(cap)))];
    const coreShells = frozenCore
      ? [
          ...atoms.map((atom) => frozenCoreShells(model.atoms[atom]!.element.z, basisOf(atom)?.ecpCoreElectrons(model.atoms[atom]!.element.symbol) ?? 0)),
          ...caps.map((cap) => frozenCoreShells(cap.z, cap.basis?.ecpCoreElectrons(capSymbol(cap)) ?? 0)),
        ]
      : undefined;
    const functions = model.basis.functions;
    const key = JSON.stringify([functions, numbers, Array.from(positions), shells, coreShells ?? null]);
    return { atoms: { numbers, positions, shells, coreShells, functions }, key };
  }
}

/**
 * The symmetry of a computed group for the estimates, when the counted one is another (the mean
 * field found the fragment's own group with its own tolerance): its generators; whether the full
 * group is non-abelian is taken from the counted symmetry, and assumed so without one (the Pauli
 * count is then said to be an upper bound rather than claimed exact).
 */
function groupSymmetry(group: string, counted: PlanSymmetry | undefined): PlanSymmetry | undefined {
  const table = CHARACTER_TABLES[group as AbelianGroupName];
  if (!table) return undefined;
  return { group, generatorCount: table.generators.length, generatorNames: table.generators, available: [], fullGroupNonAbelian: counted?.fullGroupNonAbelian ?? table.generators.length > 0, fullGroup: counted?.fullGroup ?? group };
}
