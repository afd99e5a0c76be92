/**
 * Packed storage of two-electron integrals with their eightfold permutational symmetry
 * (real orbitals): (ij|kl) = (ji|kl) = (ij|lk) = (kl|ij) = …
 *
 * A pair i ≥ j has index ij = i(i+1)/2 + j; a quartet with ij ≥ kl has index ij(ij+1)/2 + kl.
 * The packed array of n orbitals holds P(P+1)/2 values with P = n(n+1)/2, in increasing quartet
 * index — the same order as nested loops i, j ≤ i, k, l ≤ k with kl ≤ ij.
 */

/** Index of the pair (i, j) in either order. */
export function pairIndex(i: number, j: number): number {
  return i >= j ? (i * (i + 1)) / 2 + j : (j * (j + 1)) / 2 + i;
}

/** Number of pairs i ≥ j of n orbitals. */
export function pairCount(n: number): number {
  return (n * (n + 1)) / 2;
}

/** Length of the packed array of n orbitals. */
export function packedLength(n: number): number {
  const pairs = pairCount(n);
  return (pairs * (pairs + 1)) / 2;
}

/** Index of (ij|kl) in the packed array, for indices in any order. */
export function quartetIndex(i: number, j: number, k: number, l: number): number {
  const ij = pairIndex(i, j);
  const kl = pairIndex(k, l);
  return ij >= kl ? (ij * (ij + 1)) / 2 + kl : (kl * (kl + 1)) / 2 + ij;
}

/** Index of the pair-of-pairs (P, Q) for pair indices in any order. */
export function pairPairIndex(p: number, q: number): number {
  return p >= q ? (p * (p + 1)) / 2 + q : (q * (q + 1)) / 2 + p;
}
