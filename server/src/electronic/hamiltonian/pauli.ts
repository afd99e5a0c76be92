/**
 * Pauli strings on up to 32 qubits as two bit masks (x, z): qubit q carries X when only bit q of x
 * is set, Z when only bit q of z, Y when both, I when neither. The Hermitian string is
 *
 *   P(x, z) = i^|x∧z| X^x Z^z            (|·| counts set bits; Y = iXZ on each qubit)
 *
 * so that a string with real coefficient is a Hermitian operator. Products:
 *
 *   P(x1,z1) P(x2,z2) = i^e P(x1⊕x2, z1⊕z2),
 *   e = |x1∧z1| + |x2∧z2| − |x3∧z3| + 2|z1∧x2|   (mod 4)
 *
 * (moving Z^z1 past X^x2 gives (−1)^|z1∧x2|). Two strings commute when |x1∧z2| + |z1∧x2| is even;
 * then e is 0 or 2 and the product is ± a Hermitian string.
 */

export const MAX_MASK_QUBITS = 32;

/** Set bits of a 32-bit value. */
export function popcount(value: number): number {
  let v = value >>> 0;
  v = v - ((v >>> 1) & 0x55555555);
  v = (v & 0x33333333) + ((v >>> 2) & 0x33333333);
  return (Math.imul((v + (v >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24) & 0xff;
}

/** Parity (0 or 1) of the set bits of a 32-bit value. */
export function parity(value: number): number {
  let v = value >>> 0;
  v ^= v >>> 16;
  v ^= v >>> 8;
  v ^= v >>> 4;
  v ^= v >>> 2;
  v ^= v >>> 1;
  return v & 1;
}

export function commutes(x1: number, z1: number, x2: number, z2: number): boolean {
  return parity((x1 & z2) ^ (z1 & x2)) === 0;
}

/** Sign (+1 or −1) of the product of two commuting Hermitian strings. */
export function commutingProductSign(x1: number, z1: number, x2: number, z2: number): number {
  const e = popcount(x1 & z1) + popcount(x2 & z2) - popcount((x1 ^ x2) & (z1 ^ z2)) + 2 * popcount(z1 & x2);
  return (e & 3) === 0 ? 1 : -1;
}

/** Exponent e (mod 4) of i in the product of two strings, commuting or not. */
export function productPhase(x1: number, z1: number, x2: number, z2: number): number {
  const e = popcount(x1 & z1) + popcount(x2 & z2) - popcount((x1 ^ x2) & (z1 ^ z2)) + 2 * popcount(z1 & x2);
  return ((e % 4) + 4) % 4;
}

/** The string as letters, qubit 0 first: "XZZX" has X on qubits 0 and 3. */
export function pauliLabel(x: number, z: number, qubits: number): string {
  let label = '';
  for (let q = 0; q < qubits; q++) {
    const xb = (x >>> q) & 1;
    const zb = (z >>> q) & 1;
    label += xb ? (zb ? 'Y' : 'X') : zb ? 'Z' : 'I';
  }
  return label;
}

/** Inverse of pauliLabel. */
export function parsePauliLabel(label: string): { x: number; z: number } {
  if (label.length > MAX_MASK_QUBITS) throw new RangeError(`a Pauli string of ${label.length} qubits: at most ${MAX_MASK_QUBITS}`);
  let x = 0;
  let z = 0;
  for (let q = 0; q < label.length; q++) {
    const letter = label[q];
    if (letter === 'X' || letter === 'Y') x |= 1 << q;
    if (letter === 'Z' || letter === 'Y') z |= 1 << q;
    if (letter !== 'X' && letter !== 'Y' && letter !== 'Z' && letter !== 'I') throw new RangeError(`"${letter}" at position ${q} of "${label}" is not one of I, X, Y, Z`);
  }
  return { x: x >>> 0, z: z >>> 0 };
}

/** Strings with real coefficients, stored column-wise. */
export interface PauliSum {
  readonly qubits: number;
  readonly length: number;
  readonly x: Uint32Array;
  readonly z: Uint32Array;
  readonly coefficients: Float64Array;
}
