/**
 * The qubit Hamiltonian of an active space under Jordan–Wigner, Bravyi–Kitaev and the parity
 * mapping with its two-qubit reduction, from the actual integrals.
 *
 * Register: block spin-orbital order — qubit i is (active orbital i, α), qubit n + i is
 * (active orbital i, β), orbitals in the order of the active space (energy order for canonical
 * orbitals). Bravyi–Kitaev and parity encode the same modes in the same order; the reduced parity
 * register drops qubits n−1 and 2n−1 and renumbers the β qubits 0-based after the α ones
 * (qubit n−1 + i is β orbital i for i < n−1). Measurement groups and reference states use the
 * same registers.
 *
 * Coefficients with |c| ≤ 1e-8 Ha are dropped (COEFFICIENT_THRESHOLD); the identity string is
 * kept like any other and its coefficient is the constant of the qubit Hamiltonian (nuclear
 * repulsion + frozen-core energy + the scalar parts of the electronic terms).
 */
import type { Mapping } from '../../chemistry/qubits';
import type { ActiveSpaceIntegrals, ElectronCount } from './activeSpace';
import { reencode, taperParity } from './encodings';
import { jordanWignerTable } from './jordanWigner';
import type { PauliSum } from './pauli';

export const COEFFICIENT_THRESHOLD = 1e-8;

/** Largest active space built explicitly: 16 orbitals, 32 qubits (one 32-bit mask per string). */
export const MAX_EXPLICIT_ORBITALS = 16;

export interface QubitHamiltonian extends PauliSum {
  readonly mapping: Mapping;
  /** Active spatial orbitals n. */
  readonly orbitals: number;
  readonly electrons: ElectronCount;
  /** |c| ≤ threshold was dropped (hartree). */
  readonly threshold: number;
  /** Qubits removed by the parity reduction (indices on the 2n register), empty otherwise. */
  readonly removedQubits: readonly number[];
}

export class ActiveSpaceTooLarge extends Error {
  constructor(readonly orbitals: number) {
    super(explicitLimitNote(orbitals));
    this.name = 'ActiveSpaceTooLarge';
  }
}

/** Why a space of this many orbitals is not built explicitly, in words a report can show. */
export function explicitLimitNote(orbitals: number): string {
  return `${orbitals} active orbitals need ${2 * orbitals} qubits; Tessera builds the qubit Hamiltonian explicitly up to ${MAX_EXPLICIT_ORBITALS} orbitals (${2 * MAX_EXPLICIT_ORBITALS} qubits), so this figure falls back to the combinatorial bound`;
}

export function canBuildExplicitly(orbitals: number): boolean {
  return orbitals >= 1 && orbitals <= MAX_EXPLICIT_ORBITALS;
}

export interface QubitHamiltonianOptions {
  readonly threshold?: number;
}

/** The three mappings, Jordan–Wigner built once and re-encoded for the others. */
export interface QubitHamiltonians {
  readonly jordanWigner: QubitHamiltonian;
  readonly bravyiKitaev: QubitHamiltonian;
  readonly parity: QubitHamiltonian;
}

export function qubitHamiltonians(integrals: ActiveSpaceIntegrals, options: QubitHamiltonianOptions = {}): QubitHamiltonians {
  const jw = jordanWignerStrings(integrals, options);
  return {
    jordanWigner: mapped(jw, 'jordan-wigner', integrals, options),
    bravyiKitaev: mapped(jw, 'bravyi-kitaev', integrals, options),
    parity: mapped(jw, 'parity', integrals, options),
  };
}

/** One mapping. */
export function qubitHamiltonian(integrals: ActiveSpaceIntegrals, mapping: Mapping, options: QubitHamiltonianOptions = {}): QubitHamiltonian {
  return mapped(jordanWignerStrings(integrals, options), mapping, integrals, options);
}

function jordanWignerStrings(integrals: ActiveSpaceIntegrals, options: QubitHamiltonianOptions): PauliSum {
  if (!canBuildExplicitly(integrals.orbitals)) throw new ActiveSpaceTooLarge(integrals.orbitals);
  return jordanWignerTable(integrals).toSum(options.threshold ?? COEFFICIENT_THRESHOLD);
}

/**
 * Re-encoding only changes signs, so Bravyi–Kitaev and unreduced parity keep exactly the
 * Jordan–Wigner strings above the threshold; the reduction merges strings and thresholds again.
 */
function mapped(jw: PauliSum, mapping: Mapping, integrals: ActiveSpaceIntegrals, options: QubitHamiltonianOptions): QubitHamiltonian {
  const threshold = options.threshold ?? COEFFICIENT_THRESHOLD;
  const n = integrals.orbitals;
  const sum = mapping === 'parity' ? taperParity(reencode(jw, 'parity'), n, integrals.electrons, threshold) : reencode(jw, mapping);
  return { ...sum, mapping, orbitals: n, electrons: integrals.electrons, threshold, removedQubits: mapping === 'parity' ? [n - 1, 2 * n - 1] : [] };
}

/** The parity strings before the two-qubit reduction (2n qubits), for checks and exports. */
export function unreducedParity(integrals: ActiveSpaceIntegrals, options: QubitHamiltonianOptions = {}): PauliSum {
  return reencode(jordanWignerStrings(integrals, options), 'parity');
}
