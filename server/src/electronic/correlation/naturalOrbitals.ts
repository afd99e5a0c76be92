/**
 * Irrep labels of MP2 natural orbitals. The density of a symmetric molecule is symmetric, so its
 * eigenvectors belong to irreps, except that a diagonaliser mixes degenerate ones: labelOrbitals
 * (scf/symmetry/adapted.ts) rotates each set of equal occupation numbers onto the irreps first
 * (changing `outcome.naturalOrbitals` within such sets only) and leaves null where an orbital
 * belongs to no single irrep.
 */
import type { MolecularBasis } from '../contracts';
import { adaptBasis, labelOrbitals, type SymmetryAdaptation } from '../scf/symmetry/adapted';
import type { Mp2Outcome } from './mp2';

export function naturalOrbitalIrreps(outcome: Mp2Outcome, basis: MolecularBasis, overlap: Float64Array, adaptation: SymmetryAdaptation = adaptBasis(basis)): (string | null)[] {
  const occupations = outcome.result.naturalOccupations;
  // Descending occupations as ascending "energies"; one common occupation so that only the
  // numbers decide what counts as degenerate.
  return labelOrbitals(adaptation, overlap, outcome.naturalOrbitals, occupations.map((value) => -value), new Float64Array(occupations.length));
}
