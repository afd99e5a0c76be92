/**
 * Every computed figure of one active space in one call, in the shape the estimate report's
 * `hamiltonian` object takes: per mapping the strings, λ, identity, largest coefficients, QWC
 * groups and measurement budget; the fault-tolerant estimate from the Jordan–Wigner strings. Spaces
 * too large to build explicitly come back as a note, so that the caller keeps the combinatorial
 * bound of chemistry/estimate/.
 */
import type { MappingKey } from '../../chemistry/qubits';
import type { ActiveSpaceIntegrals, ElectronCount } from '../hamiltonian/activeSpace';
import { qubitWiseCommutingGroups } from '../hamiltonian/grouping';
import { canBuildExplicitly, COEFFICIENT_THRESHOLD, explicitLimitNote, qubitHamiltonians, type QubitHamiltonian } from '../hamiltonian/qubitHamiltonian';
import { summarizeQubitHamiltonian, type QubitHamiltonianSummary } from '../hamiltonian/summary';
import { qubitizedPhaseEstimation, type QubitizationEstimate } from './qubitization';
import { encodedReference } from './referenceState';
import { budgetAtAccuracy, CHEMICAL_ACCURACY, measurementBudget, type MeasurementBudget } from './shots';

export interface MappingFigures extends QubitHamiltonianSummary {
  readonly shots: MeasurementBudget;
}

export interface ActiveSpaceFigures {
  readonly status: 'computed';
  readonly orbitals: number;
  readonly electrons: ElectronCount;
  /** Coefficient of the Jordan–Wigner identity string: V_nn + frozen-core energy + scalar parts (hartree). */
  readonly constant: number;
  readonly threshold: number;
  readonly epsilon: number;
  readonly mappings: Readonly<Record<MappingKey, MappingFigures>>;
  readonly faultTolerant: QubitizationEstimate;
  readonly conventions: {
    readonly spinOrbitalOrder: string;
    readonly groups: string;
    readonly shots: string;
  };
}

export interface ActiveSpaceTooLargeFigures {
  readonly status: 'too-large';
  readonly orbitals: number;
  readonly note: string;
}

export const SPIN_ORBITAL_ORDER =
  'block: qubit i is (active orbital i, α), qubit n + i is (active orbital i, β); reduced parity drops qubits n−1 and 2n−1 and numbers the β qubits after the α ones';

export interface FigureOptions {
  /** Target accuracy ε (hartree); default chemical accuracy, 1.6 mHa. */
  readonly epsilon?: number;
  /** How many of the largest coefficients to list; default 10. */
  readonly largest?: number;
}

export function activeSpaceFigures(integrals: ActiveSpaceIntegrals, options: FigureOptions = {}): ActiveSpaceFigures | ActiveSpaceTooLargeFigures {
  const n = integrals.orbitals;
  if (!canBuildExplicitly(n)) return { status: 'too-large', orbitals: n, note: explicitLimitNote(n) };
  const epsilon = options.epsilon ?? CHEMICAL_ACCURACY;
  const hamiltonians = qubitHamiltonians(integrals);
  const describe = (h: QubitHamiltonian): MappingFigures => {
    const groups = qubitWiseCommutingGroups(h);
    const summary = summarizeQubitHamiltonian(h, { groups, ...(options.largest !== undefined ? { largest: options.largest } : {}) });
    const reference = encodedReference(h.mapping, n, integrals.electrons);
    return { ...summary, shots: measurementBudget(h, groups, reference, epsilon) };
  };
  const mappings = {
    jordanWigner: describe(hamiltonians.jordanWigner),
    bravyiKitaev: describe(hamiltonians.bravyiKitaev),
    parity: describe(hamiltonians.parity),
  };
  const jw = mappings.jordanWigner;
  return {
    status: 'computed',
    orbitals: n,
    electrons: integrals.electrons,
    constant: jw.identity,
    threshold: COEFFICIENT_THRESHOLD,
    epsilon,
    mappings,
    faultTolerant: faultTolerantOf(jw, epsilon),
    conventions: { spinOrbitalOrder: SPIN_ORBITAL_ORDER, groups: jw.groupMethod, shots: jw.shots.convention },
  };
}

/** The figures of a space at another target accuracy ε (hartree): shots and the phase-estimation cost change, nothing else. */
export function figuresAtAccuracy(figures: ActiveSpaceFigures, epsilon: number): ActiveSpaceFigures {
  if (epsilon === figures.epsilon) return figures;
  const at = (m: MappingFigures): MappingFigures => ({ ...m, shots: budgetAtAccuracy(m.shots, epsilon) });
  const mappings = { jordanWigner: at(figures.mappings.jordanWigner), bravyiKitaev: at(figures.mappings.bravyiKitaev), parity: at(figures.mappings.parity) };
  const jw = mappings.jordanWigner;
  return { ...figures, epsilon, mappings, faultTolerant: faultTolerantOf(jw, epsilon) };
}

function faultTolerantOf(jw: MappingFigures, epsilon: number): QubitizationEstimate {
  return qubitizedPhaseEstimation({ systemQubits: jw.qubits, terms: jw.terms - (jw.identity !== 0 ? 1 : 0), oneNorm: jw.oneNorm, epsilon });
}
