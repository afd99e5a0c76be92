/**
 * Whether a window of canonical orbitals cuts through a set of degenerate orbitals (the three 2p
 * of an atom, the π pair of a linear molecule): the Hartree–Fock solution is invariant under any
 * rotation within such a set, so which of its members a window takes is arbitrary, and the
 * active-space Hamiltonian (its strings, λ, groups) depends on that arbitrary choice. Orbitals count
 * as degenerate when their energies differ by less than the tolerance (well above the spread an SCF
 * converged to 1e-8 Ha leaves in a degenerate set, well below real splittings) and they hold the same
 * number of electrons.
 */

/** Orbital energies closer than this (Ha) count as degenerate. */
export const DEGENERACY_TOLERANCE = 1e-5;

export interface DegenerateSplit {
  /** Energy of the set (its lowest member), Ha. */
  readonly energy: number;
  /** Members of the set inside the active space, and in all. */
  readonly taken: number;
  readonly size: number;
}

/** The degenerate sets the active orbitals share with orbitals outside them, in ascending energy. */
export function degenerateSplits(energies: ArrayLike<number>, occupations: ArrayLike<number>, active: readonly number[], tolerance = DEGENERACY_TOLERANCE): DegenerateSplit[] {
  const inside = new Set(active);
  const seen = new Set<number>();
  const splits: DegenerateSplit[] = [];
  for (const p of [...active].sort((a, b) => energies[a]! - energies[b]!)) {
    if (seen.has(p)) continue;
    const members: number[] = [];
    for (let q = 0; q < energies.length; q++) {
      if (occupations[q] === occupations[p] && Math.abs(energies[q]! - energies[p]!) < tolerance) members.push(q);
    }
    for (const q of members) seen.add(q);
    const taken = members.filter((q) => inside.has(q)).length;
    if (taken < members.length) splits.push({ energy: Math.min(...members.map((q) => energies[q]!)), taken, size: members.length });
  }
  return splits;
}

/** "the window takes 2 of the 3 degenerate orbitals at −0.8320 Ha: …", or null when it cuts none. */
export function degenerateSplitNote(splits: readonly DegenerateSplit[]): string | null {
  if (splits.length === 0) return null;
  const sets = splits.map((s) => `${s.taken} of the ${s.size} degenerate orbitals at ${s.energy.toFixed(4).replace('-', '−')} Ha`).join(' and ');
  return `The active space takes ${sets}: which of them it holds is arbitrary, and the Hamiltonian's figures depend on it. Widen or narrow the active space to hold each set whole.`;
}
