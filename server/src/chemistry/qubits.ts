/**
 * Qubits needed to encode a fermionic problem of n spatial orbitals (2n spin orbitals).
 * Jordan–Wigner (Z. Phys. 47, 631 (1928)) and Bravyi–Kitaev (Ann. Phys. 298, 210 (2002)) use one
 * qubit per spin orbital; the parity mapping with the two-qubit reduction removes the two qubits
 * that hold the total and the spin-up particle-number parities (Bravyi, Gambetta, Mezzacapo,
 * Temme, arXiv:1701.08213 (2017)).
 */

export type Mapping = 'jordan-wigner' | 'bravyi-kitaev' | 'parity';

export const MAPPINGS: readonly Mapping[] = ['jordan-wigner', 'bravyi-kitaev', 'parity'];

export interface QubitCounts {
  readonly jordanWigner: number;
  readonly bravyiKitaev: number;
  /** Parity mapping after the two-qubit reduction: 2n − 2. */
  readonly parity: number;
}

export function qubitCounts(spatialOrbitals: number): QubitCounts {
  const spinOrbitals = 2 * Math.max(0, spatialOrbitals);
  return { jordanWigner: spinOrbitals, bravyiKitaev: spinOrbitals, parity: Math.max(0, spinOrbitals - 2) };
}

/** The key under which per-mapping figures are stored (`jordanWigner`, `bravyiKitaev`, `parity`). */
export type MappingKey = keyof QubitCounts;

export function mappingKey(mapping: Mapping): MappingKey {
  return mapping === 'jordan-wigner' ? 'jordanWigner' : mapping === 'bravyi-kitaev' ? 'bravyiKitaev' : 'parity';
}

export function qubitsUnder(mapping: Mapping, spatialOrbitals: number): number {
  return qubitCounts(spatialOrbitals)[mappingKey(mapping)];
}
