/**
 * The cost of one fragment's solver, from its orbital space, the embedding, its tier and the point
 * group: the problem the solver sees (DMET impurity or the fragment's own orbitals), the active
 * space and its irreps, qubits under each mapping and after tapering, Pauli terms, measurement
 * groups, ansatz parameters, circuit costs and classical memory. Every figure names its convention.
 * Planning estimates: counting rules applied to generic integrals, not a calculation.
 */
import {
  kUpccgsdCount,
  hardwareEfficientModel,
  referenceIrreps,
  spinOrbitalCounts,
  uccsdSpinAdaptedCount,
  uccsdSpinAdaptedCountWithSymmetry,
  uccsdSpinOrbitalCount,
  uccsdSpinOrbitalCountWithSymmetry,
  type ExcitationCount,
} from '../cost/ansatz';
import { hardwareEfficientCircuit, uccsdFermionicExcitationCircuit, uccsdPauliRotationCircuit, type CircuitCost } from '../cost/circuits';
import { ccsdAmplitudeCount, ciVectorBytes, fciDeterminantCount, statevectorBytes, type AmplitudeCount, type DeterminantCount } from '../cost/classical';
import { dmetSizesForSpaces, ownOrbitalSizes, type EmbeddedSizes } from '../cost/dmet';
import type { Magnitude } from '../cost/magnitude';
import type { OrbitalSpace } from '../counting';
import { mappingKey, qubitCounts, type Mapping } from '../qubits';
import { symmetryPattern } from './integralPattern';
import { EXPLICIT_GROUPING_QUBITS, estimatedGroupsMethod, estimateQubitWiseGroups, measurementGroups, type MeasurementEstimate } from './measurement';
import { activeIrreps, PER_ORBITAL_LIMIT, symmetryCounts, taperingOf, type ActiveIrreps, type GivenOccupation, type IrrepShare, type PlanSymmetry } from './activeIrreps';

export type { IrrepShare, PlanSymmetry } from './activeIrreps';
export { apportion, spreadIrreps } from './activeIrreps';

export interface PlanInput {
  readonly fragment: OrbitalSpace;
  readonly system: OrbitalSpace;
  readonly embedding: 'dmet' | 'projection' | 'subtractive' | 'none';
  readonly tier: 'quantum' | 'correlated' | 'mean-field';
  readonly method: string;
  readonly ansatz: string | undefined;
  readonly mapping: Mapping | undefined;
  readonly taper: boolean;
  readonly layers: number;
  /**
   * The active space as written: totals, and per irrep when given; `origin: 'computed'` when the
   * per-irrep counts and occupation are those of orbitals a mean field chose (not the spec's).
   */
  readonly active?: { readonly electrons: number; readonly orbitals: number; readonly perIrrep?: readonly IrrepShare[]; readonly occupation?: GivenOccupation; readonly origin?: 'spec' | 'computed' };
  readonly symmetry?: PlanSymmetry;
}

export interface ActiveFigures {
  readonly electrons: number;
  readonly orbitals: number;
  readonly alpha: number;
  readonly beta: number;
  readonly source: 'given' | 'problem';
  /** Orbitals per irrep of the active space, and whether that split was given or assumed. */
  readonly irreps: readonly IrrepShare[];
  readonly irrepsSource: 'given' | 'computed' | 'proportional' | 'none';
  /** Where the reference determinant's irreps come from (activeIrreps.ts). */
  readonly occupation: 'given' | 'computed' | 'assumed';
}

export interface QuantumPlan {
  readonly qubits: {
    readonly jordanWigner: number;
    readonly bravyiKitaev: number;
    readonly parity: number;
    readonly tapered: number;
    readonly taperingSymmetries: readonly string[];
    /** Under the fragment's mapping, tapered when `taper on`. */
    readonly required: number | null;
  };
  readonly pauliTerms: {
    readonly jordanWigner: number;
    readonly bravyiKitaev: number;
    readonly parity: number;
    /** The counts in exact integer arithmetic (the numbers are exact up to 2^53). */
    readonly exact: { readonly full: bigint; readonly parity: bigint };
    readonly identityIncluded: true;
    readonly upperBound: boolean;
    readonly convention: string;
  };
  readonly measurement: MeasurementEstimate;
  readonly ansatz: AnsatzFigures | null;
  readonly circuit: { readonly standard: CircuitCost; readonly compact: CircuitCost | null } | null;
  readonly statevectorBytes: Magnitude;
}

export interface PlanEstimate {
  readonly problem: EmbeddedSizes;
  readonly active: ActiveFigures;
  /** The register, Hamiltonian, measurement, ansatz and circuit of a quantum tier; null for the classical tiers. */
  readonly quantum: QuantumPlan | null;
  readonly classical: { readonly determinants: DeterminantCount; readonly ciVectorBytes: Magnitude; readonly ccsd: AmplitudeCount };
  /** Problems that prevent an estimate (an active space larger than the problem, an invalid spin). */
  readonly notes: readonly string[];
}

export type AnsatzFigures =
  | { readonly kind: 'uccsd'; readonly parameters: number; readonly spinOrbital: ExcitationCount; readonly spinOrbitalScreened: ExcitationCount; readonly spinAdapted: ExcitationCount | null; readonly spinAdaptedScreened: ExcitationCount | null }
  | { readonly kind: 'k-upccgsd'; readonly parameters: number; readonly layers: number; readonly description: string }
  | { readonly kind: 'hardware-efficient'; readonly parameters: number; readonly layers: number; readonly description: string };


function problemSizes(input: PlanInput): EmbeddedSizes | undefined {
  const { fragment, system } = input;
  if (fragment.spin === undefined) return undefined;
  if (input.embedding === 'dmet' && input.tier !== 'mean-field') {
    const dmet = dmetSizesForSpaces(system, fragment);
    if (dmet) return dmet;
  }
  const frozen = fragment.frozenCore.orbitals;
  return ownOrbitalSizes(input.embedding === 'dmet' ? 'none' : input.embedding, {
    orbitals: Math.max(0, fragment.orbitals - frozen),
    alpha: Math.max(0, fragment.spin.alpha - frozen),
    beta: Math.max(0, fragment.spin.beta - frozen),
  });
}

/**
 * Unpaired electrons (nα − nβ) of what the solver treats, one rule for the problem, its active
 * space and its determinant counts. Under DMET the impurity's electrons come from the system's
 * determinant (dmet.ts: per spin, bath plus fully occupied fragment orbitals), so its spin is the
 * impurity's nα − nβ, not the fragment's own multiplicity; otherwise the fragment is solved with
 * its own electrons and multiplicity.
 */
export function problemUnpaired(input: PlanInput, problem: EmbeddedSizes): number {
  return problem.embedding === 'dmet' ? Math.abs(problem.alpha - problem.beta) : input.fragment.multiplicity - 1;
}

/** The DMET impurity sizes the solver sees, or undefined without DMET or a valid spin. */
export function impurityOf(input: PlanInput): EmbeddedSizes | undefined {
  const problem = problemSizes(input);
  return problem?.embedding === 'dmet' ? problem : undefined;
}

function ansatzFigures(input: PlanInput, active: ActiveFigures, irreps: ActiveIrreps, qubits: number): AnsatzFigures | null {
  if (input.tier !== 'quantum' || input.method !== 'vqe' || !input.ansatz) return null;
  const { orbitals, alpha, beta } = active;
  const orbitalIrreps = irreps.orbitalIrreps;
  switch (input.ansatz) {
    case 'uccsd': {
      const spinOrbital = uccsdSpinOrbitalCount(spinOrbitalCounts(orbitals, alpha, beta));
      if (!irreps.perOrbital) {
        // Beyond PER_ORBITAL_LIMIT the space is counted without symmetry: screening removes nothing.
        const closed = alpha === beta;
        const spinAdapted = closed ? uccsdSpinAdaptedCount(alpha, orbitals - alpha) : null;
        return { kind: 'uccsd', parameters: spinOrbital.total, spinOrbital, spinOrbitalScreened: spinOrbital, spinAdapted, spinAdaptedScreened: spinAdapted };
      }
      const screened = uccsdSpinOrbitalCountWithSymmetry(referenceIrreps(orbitalIrreps, alpha, beta));
      const closed = alpha === beta;
      const reference = referenceIrreps(orbitalIrreps, alpha, beta);
      return {
        kind: 'uccsd',
        parameters: screened.total,
        spinOrbital,
        spinOrbitalScreened: screened,
        spinAdapted: closed ? uccsdSpinAdaptedCount(alpha, orbitals - alpha) : null,
        spinAdaptedScreened: closed ? uccsdSpinAdaptedCountWithSymmetry(reference.occupiedAlpha, reference.virtualAlpha) : null,
      };
    }
    case 'k-upccgsd': {
      const count = kUpccgsdCount(orbitals, input.layers);
      return { kind: 'k-upccgsd', parameters: count.total, layers: input.layers, description: count.description };
    }
    case 'hardware-efficient': {
      const model = hardwareEfficientModel(qubits, input.layers);
      return { kind: 'hardware-efficient', parameters: model.parameters, layers: input.layers, description: model.description };
    }
    default:
      return null;
  }
}

const measurementCache = new Map<string, MeasurementEstimate>();

function measurementFor(irreps: ActiveIrreps, terms: number): MeasurementEstimate {
  const qubits = 2 * irreps.orbitals;
  const orbitalIrreps = irreps.orbitalIrreps;
  if (qubits > EXPLICIT_GROUPING_QUBITS) return { qubits, terms, groups: estimateQubitWiseGroups(terms), exact: false, method: estimatedGroupsMethod() };
  const key = orbitalIrreps.join(',');
  let found = measurementCache.get(key);
  if (!found) {
    found = measurementGroups(symmetryPattern(Uint8Array.from(orbitalIrreps)));
    measurementCache.set(key, found);
  }
  return found;
}

/** The active orbitals' irreps for `orbitals` active orbitals, by the one rule of activeIrreps.ts. */
function irrepsOf(input: PlanInput, orbitals: number): ActiveIrreps {
  return activeIrreps(input.symmetry, orbitals, input.active);
}

function requiredQubits(input: PlanInput, counts: ReturnType<typeof qubitCounts>, tapered: number): number | null {
  if (!input.mapping) return null;
  if (input.taper) return tapered;
  return counts[mappingKey(input.mapping)];
}

/** Qubits the fragment's solver needs for an active space of `orbitals` and the given spin split. */
export function qubitsFor(input: PlanInput, orbitals: number, alpha: number, beta: number): number | null {
  const irreps = irrepsOf(input, orbitals);
  const tapered = taperingOf(irreps, { alpha, beta }).tapered;
  return requiredQubits(input, qubitCounts(orbitals), tapered);
}

/**
 * The largest active space inside the solver's problem whose qubits fit `limit`. Electrons stay as
 * requested when they still fit; otherwise the space is taken half-filled (n electrons in n
 * orbitals, the usual CAS(n,n) choice around the Fermi level), adjusted to the spin's parity;
 * between two equally near counts the larger one is taken.
 */
export function fitActiveSpace(input: PlanInput, limit: number): { electrons: number; orbitals: number; qubits: number } | undefined {
  const problem = problemSizes(input);
  if (!problem || !input.mapping) return undefined;
  const unpaired = problemUnpaired(input, problem);
  const wanted = input.active?.electrons ?? problem.electrons;
  const fits = (electrons: number, orbitals: number) =>
    electrons >= unpaired && electrons <= problem.electrons && (electrons - unpaired) % 2 === 0 && (electrons + unpaired) / 2 <= orbitals;
  for (let orbitals = Math.min(problem.orbitals, Math.floor(limit / 2) + 4); orbitals >= 1; orbitals--) {
    let electrons: number | undefined;
    if (fits(wanted, orbitals)) electrons = wanted;
    for (let delta = 0; electrons === undefined && delta <= orbitals + 1; delta++) {
      for (const candidate of [orbitals + delta, orbitals - delta]) {
        if (electrons === undefined && fits(candidate, orbitals)) electrons = candidate;
      }
    }
    if (electrons === undefined) continue;
    const qubits = qubitsFor(input, orbitals, (electrons + unpaired) / 2, (electrons - unpaired) / 2);
    if (qubits !== null && qubits <= limit) return { electrons, orbitals, qubits };
  }
  return undefined;
}

/**
 * Everything for one fragment; undefined when its charge and multiplicity do not fit, or when its
 * active space does not fit the problem the solver sees (the checks report that): no figure is
 * computed for a part that is rejected, however large the numbers it asks for.
 */
export function estimatePlan(input: PlanInput): PlanEstimate | undefined {
  const problem = problemSizes(input);
  if (!problem) return undefined;
  const notes: string[] = [];
  const unpaired = problemUnpaired(input, problem);
  if (problem.embedding === 'dmet' && unpaired !== input.fragment.multiplicity - 1) {
    notes.push(
      `under DMET the impurity's spin comes from the system's mean field (${problem.alpha}α / ${problem.beta}β, ${unpaired} unpaired), not from the fragment's multiplicity ${input.fragment.multiplicity}; its active space and determinants follow the impurity`,
    );
  }
  let electrons = problem.electrons;
  let orbitals = problem.orbitals;
  if (input.active) {
    if (input.active.orbitals > problem.orbitals || input.active.electrons > problem.electrons) return undefined;
    electrons = input.active.electrons;
    orbitals = input.active.orbitals;
  }
  if (unpaired > electrons || (electrons - unpaired) % 2 !== 0 || (electrons + unpaired) / 2 > orbitals || orbitals < 0) return undefined;
  const alpha = (electrons + unpaired) / 2;
  const beta = (electrons - unpaired) / 2;

  const irreps = irrepsOf(input, orbitals);
  const active: ActiveFigures = { electrons, orbitals, alpha, beta, source: input.active ? 'given' : 'problem', irreps: irreps.irreps, irrepsSource: irreps.source, occupation: irreps.occupation };
  if (!irreps.perOrbital) {
    notes.push(
      `an active space of more than ${PER_ORBITAL_LIMIT.toLocaleString('en-US')} orbitals is counted without point-group symmetry (tapering, Pauli terms, UCCSD screening)${input.ansatz === 'uccsd' && input.tier === 'quantum' && input.method === 'vqe' ? ', and its UCCSD circuit cost is not estimated' : ''}`,
    );
  }
  const determinants = fciDeterminantCount(orbitals, alpha, beta);
  return {
    problem,
    active,
    quantum: input.tier === 'quantum' ? quantumPlan(input, active, irreps) : null,
    classical: { determinants, ciVectorBytes: ciVectorBytes(determinants.determinants), ccsd: ccsdAmplitudeCount(orbitals, alpha, beta) },
    notes,
  };
}

/** Register, Hamiltonian, measurement, ansatz and circuit of a quantum tier's active space. */
function quantumPlan(input: PlanInput, active: ActiveFigures, irreps: ActiveIrreps): QuantumPlan {
  const { orbitals, alpha, beta } = active;
  const orbitalIrreps = irreps.orbitalIrreps;
  const counts = qubitCounts(orbitals);
  const { tapering, pauli } = symmetryCounts(irreps, { alpha, beta });
  const required = requiredQubits(input, counts, tapering.tapered);
  const upperBound = input.symmetry?.fullGroupNonAbelian === true;
  const qubitsForCircuits = required ?? counts.jordanWigner;

  const layout = { orbitals, alpha, beta, order: 'interleaved' as const, irreps: orbitalIrreps };
  let circuit: QuantumPlan['circuit'] = null;
  if (input.method === 'vqe') {
    if (input.ansatz === 'uccsd' && irreps.perOrbital) circuit = { standard: uccsdPauliRotationCircuit(layout), compact: uccsdFermionicExcitationCircuit(layout) };
    else if (input.ansatz === 'hardware-efficient') circuit = { standard: hardwareEfficientCircuit(qubitsForCircuits, input.layers), compact: null };
  }
  return {
    qubits: {
      ...counts,
      tapered: tapering.tapered,
      taperingSymmetries: tapering.independent.map((symmetry) =>
        symmetry.generator !== undefined ? (input.symmetry?.generatorNames[symmetry.generator] ?? symmetry.label) : symmetry.label === 'N_alpha parity' ? 'N_α parity' : symmetry.label === 'N_beta parity' ? 'N_β parity' : symmetry.label,
      ),
      required,
    },
    pauliTerms: {
      jordanWigner: pauli.jordanWigner,
      bravyiKitaev: pauli.bravyiKitaev,
      parity: pauli.parity,
      exact: pauli.exact,
      identityIncluded: true,
      upperBound,
      convention: `distinct Pauli strings, identity included, for generic real integrals allowed by ${input.symmetry?.group ?? 'C1'} selection rules${upperBound ? ` (an upper bound: the full group ${input.symmetry!.fullGroup} forbids more)` : ''}`,
    },
    measurement: measurementFor(irreps, pauli.jordanWigner),
    ansatz: ansatzFigures(input, active, irreps, qubitsForCircuits),
    circuit,
    statevectorBytes: statevectorBytes(qubitsForCircuits),
  };
}
