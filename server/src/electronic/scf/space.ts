/**
 * The orthonormal functions the SCF diagonalises in, grouped in blocks that the Fock operator
 * cannot mix: one block per irrep of the abelian point group when the basis transforms exactly
 * under it (symmetry/adapted.ts), otherwise one block holding everything.
 */
import type { AbelianGroupName } from '../../chemistry/symmetry';
import { canonicalOrthogonalization, DEFAULT_LINEAR_DEPENDENCY_THRESHOLD } from '../linalg';

export interface OrbitalBlock {
  /** Irrep label, or the totally symmetric label of C1 ('A') for an unblocked space. */
  readonly irrep: string;
  /** n×m row-major: column k is orthonormal function k of the block (XᵀSX = 1). */
  readonly x: Float64Array;
  readonly m: number;
}

export interface OrbitalSpace {
  readonly n: number;
  readonly blocks: readonly OrbitalBlock[];
  /** Total orthonormal functions (= molecular orbitals). */
  readonly m: number;
  readonly linearDependencies: { readonly dropped: number; readonly threshold: number; readonly smallestEigenvalue: number };
}

/** One block: canonical orthogonalisation of the whole overlap. */
export function unblockedSpace(overlap: Float64Array, n: number, threshold = DEFAULT_LINEAR_DEPENDENCY_THRESHOLD): OrbitalSpace {
  const orthogonal = canonicalOrthogonalization(overlap, n, threshold);
  return {
    n,
    blocks: [{ irrep: 'A', x: orthogonal.x, m: orthogonal.m }],
    m: orthogonal.m,
    linearDependencies: { dropped: orthogonal.dropped, threshold, smallestEigenvalue: orthogonal.smallestEigenvalue },
  };
}

export type { AbelianGroupName };
