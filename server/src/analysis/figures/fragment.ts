/**
 * A fragment's figures: what every part has (space.ts), then the sections its tier shows, each
 * read from the fragment's plan estimate (or, for the solver cost, from the estimates directly).
 * TIER_SECTIONS says which tier shows which section: a new tier is a new row there; a new figure is
 * a new section (and its key in types.ts, its convention and its rows in the renderers). Qubit,
 * Hamiltonian, measurement, ansatz and circuit figures belong to the quantum tier alone; the
 * classical tiers show their solver cost instead.
 */
import type { PlanEstimate, QuantumPlan } from '../../chemistry/estimate/plan';
import type { OrbitalSymmetry } from '../../chemistry/symmetry';
import type { TierLevel } from '../../language/vocabulary';
import type { ComputedActiveOrbitals, Estimates } from '../estimates';
import { solverCostFigures } from './solver';
import { approximateCount, bigFigure, exactCount, spaceFigures } from './space';
import type { CapFigures, FragmentFigures, OrbitalSource, OrbitalSources } from './types';
import type { FragmentModel } from '../../language/model';

/** Fills one group of keys from the plan (undefined when the fragment has none). */
type Section = (figures: FragmentFigures, plan: PlanEstimate | undefined, estimates: Estimates, index: number) => Partial<FragmentFigures>;

/** A section that needs the plan: nothing without one. */
function fromPlan(fill: (figures: FragmentFigures, plan: PlanEstimate) => Partial<FragmentFigures>): Section {
  return (figures, plan) => (plan ? fill(figures, plan) : {});
}

/** A section that needs the quantum part of the plan: nothing without one. */
function fromQuantum(fill: (figures: FragmentFigures, quantum: QuantumPlan) => Partial<FragmentFigures>): Section {
  return (figures, plan) => (plan?.quantum ? fill(figures, plan.quantum) : {});
}

const SECTIONS = {
  problem: fromPlan((_figures, plan) => ({
    problem: {
      embedding: plan.problem.embedding,
      orbitals: plan.problem.orbitals,
      electrons: plan.problem.electrons,
      alpha: plan.problem.alpha,
      beta: plan.problem.beta,
      bath: { ...plan.problem.bath },
      convention: plan.problem.convention,
    },
    notes: [...plan.notes],
  })),
  active: fromPlan((figures, plan) => ({
    active: {
      electrons: plan.active.electrons,
      orbitals: plan.active.orbitals,
      alpha: plan.active.alpha,
      beta: plan.active.beta,
      source: plan.active.source === 'given' ? 'given' : plan.problem.embedding === 'dmet' ? 'dmet-impurity' : (figures.active?.source ?? 'problem'),
    },
    activeIrreps:
      plan.active.irrepsSource === 'none'
        ? null
        : { perIrrep: Object.fromEntries(plan.active.irreps.filter((share) => share.count > 0).map((share) => [share.label, share.count])), source: plan.active.irrepsSource, occupation: plan.active.occupation },
  })),
  qubits: fromQuantum((_figures, quantum) => ({
    qubits: { jordanWigner: quantum.qubits.jordanWigner, bravyiKitaev: quantum.qubits.bravyiKitaev, parity: quantum.qubits.parity, tapered: quantum.qubits.tapered },
    qubitsRequired: quantum.qubits.required,
    taperingSymmetries: [...quantum.qubits.taperingSymmetries],
  })),
  pauliTerms: fromQuantum((_figures, quantum) => ({
    pauliTerms: {
      jordanWigner: exactCount(quantum.pauliTerms.exact.full),
      bravyiKitaev: exactCount(quantum.pauliTerms.exact.full),
      parity: exactCount(quantum.pauliTerms.exact.parity),
      identityIncluded: true,
      upperBound: quantum.pauliTerms.upperBound,
    },
  })),
  measurement: fromQuantum((_figures, quantum) => ({ measurement: { groups: approximateCount(quantum.measurement.groups), explicit: quantum.measurement.exact, exact: quantum.measurement.exact, method: quantum.measurement.method } })),
  ansatz: fromQuantum((_figures, quantum) => ({ ansatzCost: ansatzFigures(quantum) })),
  circuit: fromQuantum((_figures, quantum) => ({ circuit: circuitFigures(quantum) })),
  classical: fromPlan((_figures, plan) => ({
    classical: {
      determinants: bigFigure(plan.classical.determinants.determinants),
      ciVectorBytes: bigFigure(plan.classical.ciVectorBytes, true),
      ccsdAmplitudes: bigFigure(plan.classical.ccsd.amplitudes),
      ccsdAmplitudesConvention: plan.classical.ccsd.convention,
      statevectorBytes: plan.quantum ? bigFigure(plan.quantum.statevectorBytes, true) : null,
    },
  })),
  solverCost: (_figures, plan, estimates, index) => ({ solverCost: solverCostFigures(estimates, index, plan) }),
} satisfies Record<string, Section>;

export type FigureSection = keyof typeof SECTIONS;

/**
 * The sections each tier shows: the quantum tier its register, Hamiltonian, measurement, ansatz and
 * circuit (and the classical size of its active space, for comparison); the correlated tier its
 * problem, active space and solver cost; the mean-field tier its solver cost.
 */
export const TIER_SECTIONS: Readonly<Record<TierLevel, readonly FigureSection[]>> = {
  quantum: ['problem', 'active', 'qubits', 'pauliTerms', 'measurement', 'ansatz', 'circuit', 'classical'],
  correlated: ['problem', 'active', 'classical', 'solverCost'],
  'mean-field': ['solverCost'],
};

/** The figures of a quantum tier that read the irreps and reference occupation of the active orbitals. */
const QUANTUM_ORBITAL_FIGURES = ['taperedQubits', 'qubitsRequired', 'pauliTerms', 'measurement', 'ansatzParameters', 'circuit'] as const;

/** Where each orbital-dependent figure comes from, by the tier. */
function orbitalSources(level: TierLevel, source: OrbitalSource, computedFrom: string | null, note: string | null): OrbitalSources {
  const keys = ['activeIrreps', 'referenceOccupation', ...(level === 'quantum' ? QUANTUM_ORBITAL_FIGURES : [])];
  return { figures: Object.fromEntries(keys.map((key) => [key, source])), computedFrom, note };
}

/**
 * A fragment's figures; with `computed` (its computed active orbitals, see
 * DocumentAnalysis.fragmentFigures) the orbital-dependent figures are built on them when they can
 * be (Estimates.computedPlan says when not, and the figures carry its reason).
 */
export function fragmentFigures(estimates: Estimates, index: number, computed?: ComputedActiveOrbitals): FragmentFigures {
  const model = estimates.model;
  const fragment = model.fragments[index]!;
  // The formula is the part the solver sees: the fragment's atoms and its caps.
  const symbols = [...fragment.atoms.map((atom) => model.atoms[atom]!.element.symbol), ...fragment.caps.map(() => CAP_SYMBOL)];
  const tier = fragment.tier;
  const base = spaceFigures(fragment.space, symbols, tier ? estimates.countedSymmetry(index) : undefined);
  let figures: FragmentFigures = {
    name: fragment.name,
    tier: tier?.level ?? null,
    method: tier?.method ?? null,
    ansatz: tier?.ansatz ?? null,
    mapping: tier?.mapping ?? null,
    qubitsRequired: null,
    atomIndices: fragment.atoms.map((atom) => atom + 1),
    ...base,
    atoms: fragment.atoms.length,
    caps: capFigures(fragment),
    problem: null,
    activeIrreps: null,
    orbitalSources: null,
    symmetry: tier ? symmetryFigures(estimates, index) : null,
    taperingSymmetries: [],
    measurement: null,
    ansatzCost: null,
    circuit: null,
    classical: null,
    solverCost: null,
    notes: [],
    // Qubits are a quantum tier's figure; an active space is not a mean-field tier's.
    ...(tier?.level === 'quantum' ? {} : { qubits: null }),
    ...(tier?.level === 'mean-field' ? { active: null } : {}),
  };
  if (!tier) return figures;
  let plan = tier.level === 'mean-field' ? undefined : estimates.plan(index);
  let sources: OrbitalSources | null = null;
  if (plan && tier.active) {
    sources = orbitalSources(tier.level, 'counted', null, null);
    if (computed) {
      const refined = estimates.computedPlan(index, computed);
      if (refined.plan) {
        plan = refined.plan;
        sources = orbitalSources(tier.level, 'computed', `the ${computed.irreps.length} active orbitals chosen from the fragment's own mean field (${computed.pointGroup})`, null);
      } else sources = orbitalSources(tier.level, 'counted', null, `Computed active orbitals not used: ${refined.reason}.`);
    }
  }
  for (const section of TIER_SECTIONS[tier.level]) figures = { ...figures, ...SECTIONS[section](figures, plan, estimates, index) };
  if (sources) figures = { ...figures, orbitalSources: sources, ...(sources.note ? { notes: [...figures.notes, sources.note] } : {}) };
  if (sources?.computedFrom && figures.active) {
    // The computed space replaces the counted one, suggestions included (no longer an estimate).
    figures = { ...figures, active: { ...figures.active, source: 'computed' } };
  } else if (tier.activeSource === 'estimated' && tier.activeChoice && figures.active) {
    // Counted for a suggestion before its orbitals exist: a planning estimate, and the figures say so.
    const how = tier.activeChoice.kind === 'shells' ? 'the named shells of the free atoms (aufbau)' : 'the minimal-basis valence space';
    figures = {
      ...figures,
      active: { ...figures.active, source: `estimated-${tier.activeChoice.kind}` },
      notes: [...figures.notes, `Active space ${tier.active!.electrons}e ${tier.active!.orbitals}o counted from ${how} until the ${tier.activeChoice.kind === 'shells' ? 'projected' : 'MP2 natural'} orbitals are computed (a planning estimate).`],
    };
  }
  return figures;
}

const CAP_SYMBOL = 'H';

function capFigures(fragment: FragmentModel): CapFigures | null {
  if (!fragment.capRule) return null;
  return {
    rule: fragment.capRule,
    count: fragment.caps.length,
    list: fragment.caps.map((cap) => ({ host: cap.host + 1, partner: cap.partner + 1, element: CAP_SYMBOL, length: cap.length, position: [cap.position[0], cap.position[1], cap.position[2]] })),
  };
}

function groupFigures(symmetry: OrbitalSymmetry | undefined): { pointGroup: string; fullPointGroup: string } | null {
  return symmetry ? { pointGroup: symmetry.group, fullPointGroup: symmetry.symmetry.fullGroup } : null;
}

/** Both groups of a fragment and which one counts, by the embedding (chemistry/estimate/embeddingSymmetry.ts). */
function symmetryFigures(estimates: Estimates, index: number): FragmentFigures['symmetry'] {
  const { scope, reason } = estimates.symmetryScope();
  const own = groupFigures(estimates.fragmentSymmetry(index));
  // The stabiliser is looked for only where it counts (it needs the whole system's symmetry).
  const inSystem = scope === 'in-system' ? (groupFigures(estimates.fragmentSymmetryInSystem(index)) ?? { pointGroup: 'C1', fullPointGroup: 'C1' }) : null;
  return { countedIn: scope, own, inSystem, reason };
}

function circuitFigures(plan: QuantumPlan): FragmentFigures['circuit'] {
  const circuit = plan.circuit;
  if (!circuit) return null;
  const standard = circuit.standard;
  const optional = (value: number | undefined) => (value === undefined ? null : approximateCount(value));
  return { construction: standard.construction, cnots: approximateCount(standard.cnots), rotations: optional(standard.rotations), depth: optional(standard.depth), compactCnots: optional(circuit.compact?.cnots) };
}

function ansatzFigures(plan: QuantumPlan): FragmentFigures['ansatzCost'] {
  const ansatz = plan.ansatz;
  if (!ansatz) return null;
  if (ansatz.kind === 'uccsd') {
    return {
      kind: 'uccsd',
      parameters: approximateCount(ansatz.parameters),
      singles: approximateCount(ansatz.spinOrbitalScreened.singles),
      doubles: approximateCount(ansatz.spinOrbitalScreened.doubles),
      unscreened: approximateCount(ansatz.spinOrbital.total),
      spinAdapted: ansatz.spinAdaptedScreened ? approximateCount(ansatz.spinAdaptedScreened.total) : null,
    };
  }
  return { kind: ansatz.kind, parameters: approximateCount(ansatz.parameters), singles: null, doubles: null, unscreened: null, spinAdapted: null };
}
