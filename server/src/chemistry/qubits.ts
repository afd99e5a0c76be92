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

const MAPPING_KEYS: Readonly<Record<Mapping, MappingKey>> = { 'jordan-wigner': 'jordanWigner', 'bravyi-kitaev': 'bravyiKitaev', parity: 'parity' };

/** Throws on a name that is not a mapping: no figure is ever filed under another mapping's key. */
export function mappingKey(mapping: Mapping): MappingKey {
  const key = Object.hasOwn(MAPPING_KEYS, mapping) ? MAPPING_KEYS[mapping] : undefined;
  if (key === undefined) throw new RangeError(`'${String(mapping)}' is not a fermion-to-qubit mapping (${MAPPINGS.join(', ')})`);
  return key;
}

export function qubitsUnder(mapping: Mapping, spatialOrbitals: number): number {
  return qubitCounts(spatialOrbitals)[mappingKey(mapping)];
}
