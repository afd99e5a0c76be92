/**
 * The mean-field reference determinant on a qubit register: the lowest Nα active orbitals occupied
 * by α electrons and the lowest Nβ by β electrons (aufbau in the order of the active space, which
 * for canonical orbitals from a converged SCF is the reference itself; for ROHF the singly occupied
 * orbitals hold the α excess), encoded the way each mapping encodes occupations: b = β f (mod 2)
 * with the mapping's encoding matrix, and for the reduced parity mapping the two parity qubits
 * dropped (hamiltonian/encodings.ts).
 */
import type { Mapping } from '../../chemistry/qubits';
import type { ElectronCount } from '../hamiltonian/activeSpace';
import { applyBinary, encodingMatrix } from '../hamiltonian/encodings';

/** Occupation vector f in block order: bit i is (i, α), bit n + i is (i, β). */
export function referenceOccupation(orbitals: number, electrons: ElectronCount): number {
  const n = orbitals;
  if (n > 16) throw new RangeError(`a reference determinant of ${n} orbitals needs ${2 * n} qubits; the bit masks hold 32`);
  if (electrons.alpha > n || electrons.beta > n || electrons.alpha < 0 || electrons.beta < 0) {
    throw new RangeError(`${electrons.alpha} α and ${electrons.beta} β electrons do not fit ${n} orbitals`);
  }
  const alpha = (1 << electrons.alpha) - 1;
  const beta = (1 << electrons.beta) - 1;
  return (alpha | (beta << n)) >>> 0;
}

/** The reference determinant as a computational basis state of the mapping's register. */
export function encodedReference(mapping: Mapping, orbitals: number, electrons: ElectronCount): number {
  const n = orbitals;
  const f = referenceOccupation(n, electrons);
  const b = applyBinary(encodingMatrix(mapping, 2 * n), f);
  if (mapping !== 'parity') return b;
  const keep = n - 1;
  const low = keep === 0 ? 0 : b & ((1 << keep) - 1);
  const high = (b >>> n) & ((1 << keep) - 1);
  return (low | (high << keep)) >>> 0;
}
