/**
 * The symmetry a fragment keeps inside its system: the stabiliser of the fragment's atoms in the
 * system's point group. Checked against group theory — the stabiliser of a subset under a group
 * action (site symmetry, F. A. Cotton, Chemical Applications of Group Theory, 3rd ed. 1990, from
 * memory) and the orbit–stabiliser theorem |G| = |orbit of F| × |Stab(F)| (any algebra text, e.g.
 * M. Artin, Algebra, 1991, §6.9 — from memory) — on idealised molecules whose orbits can be
 * counted by hand.
 */
import { describe, expect, it } from 'vitest';
import { findBasisSet } from '../../../server/src/chemistry/basis/library';
import { detectSymmetry, embeddedOrbitalSymmetry, orbitalSymmetry } from '../../../server/src/chemistry/symmetry';
import * as M from './molecules';

function atomsOf(molecule: M.TestMolecule, basis = 'STO-3G') {
  const set = findBasisSet(basis)!;
  return {
    numbers: molecule.numbers,
    positions: molecule.coordinates,
    shells: molecule.symbols.map((symbol) => set.shellsFor(symbol)),
    coreShells: undefined,
    functions: 'spherical' as const,
  };
}

function subset(molecule: M.TestMolecule, members: readonly number[]) {
  return {
    numbers: members.map((i) => molecule.numbers[i]!),
    coordinates: members.flatMap((i) => [0, 1, 2].map((c) => molecule.coordinates[3 * i + c]!)),
  };
}

// Each row: molecule, fragment atoms, the stabiliser (full and counting group), the orbit of the
// fragment under the molecule's group (counted by hand from the construction in molecules.ts).
const CASES = [
  { molecule: M.water, members: [1], full: 'Cs', abelian: 'Cs', orbit: 2, why: 'one H of water: only the molecular plane keeps it (group theory, by hand)' },
  { molecule: M.water, members: [0], full: 'C2v', abelian: 'C2v', orbit: 1, why: 'the O of water lies on every element (by hand)' },
  { molecule: M.benzene, members: [0, 6], full: 'C2v', abelian: 'C2v', orbit: 6, why: 'one C–H of benzene: the C2 through it and two planes (by hand)' },
  { molecule: M.benzene, members: [0, 1, 2, 3, 4, 5], full: 'D6h', abelian: 'D2h', orbit: 1, why: 'the C6 ring is kept by all of D6h (by hand)' },
  { molecule: M.methane, members: [0, 1], full: 'C3v', abelian: 'Cs', orbit: 4, why: 'one C–H of methane: the C3 along it and three planes (by hand)' },
  { molecule: M.xenonTetrafluoride, members: [0, 1, 2], full: 'D2h', abelian: 'D2h', orbit: 2, why: 'Xe with the trans F pair on x: the operations of D4h that keep the x axis (by hand)' },
] as const;

describe('the stabiliser of a fragment in its system (group theory of stabiliser subgroups)', () => {
  it.each(CASES)('$why', ({ molecule, members, full, abelian, orbit }) => {
    const system = detectSymmetry(molecule.numbers, molecule.coordinates);
    const embedded = embeddedOrbitalSymmetry(atomsOf(molecule, 'def2-SVP'), members)!;
    expect(embedded.symmetry.fullGroup).toBe(full);
    expect(embedded.group).toBe(abelian);
    // Orbit–stabiliser theorem (Artin 1991, from memory): |G| = |orbit| × |Stab|.
    expect(system.order! / embedded.symmetry.order!).toBe(orbit);
    // A subgroup of the fragment's own group: the order of the fragment alone is a multiple (Lagrange).
    const own = subset(molecule, members);
    const ownGroup = detectSymmetry(own.numbers, own.coordinates, { nearTolerance: 0 });
    if (ownGroup.order !== null) expect(ownGroup.order % embedded.symmetry.order!).toBe(0);
  });

  it('counts the fragment\'s functions only, in the stabiliser: one H 1s of water is A′ of Cs (STO-3G; by construction, an s function on the mirror plane is symmetric)', () => {
    const embedded = embeddedOrbitalSymmetry(atomsOf(M.water), [1])!;
    expect(embedded.orbitals.total).toBe(1);
    expect(Object.fromEntries(embedded.orbitals.irreps.map((irrep) => [irrep.label, irrep.count]))).toEqual({ "A'": 1, 'A"': 0 });
  });

  it('the fragment alone may be more symmetric: F–Xe–F alone is D∞h (non-abelian, counted in D2h), inside XeF4 it keeps D2h, which is abelian (group theory; by hand)', () => {
    const own = subset(M.xenonTetrafluoride, [0, 1, 2]);
    expect(detectSymmetry(own.numbers, own.coordinates, { nearTolerance: 0 }).fullGroup).toBe('D∞h');
    expect(embeddedOrbitalSymmetry(atomsOf(M.xenonTetrafluoride, 'def2-SVP'), [0, 1, 2])!.symmetry.fullGroup).toBe('D2h');
  });

  it('in a system without symmetry every fragment keeps only E (C1; a subgroup of C1 is C1, by definition)', () => {
    const skewed = M.bromochlorofluoromethane;
    expect(detectSymmetry(skewed.numbers, skewed.coordinates).fullGroup).toBe('C1');
    const pairAtoms = [skewed.symbols.indexOf('H'), skewed.symbols.indexOf('C')];
    expect(embeddedOrbitalSymmetry(atomsOf(skewed, 'def2-SVP'), pairAtoms)!.group).toBe('C1');
    // The C–H pair alone is C∞v, whatever its neighbours (by construction).
    const pair = subset(skewed, pairAtoms);
    expect(orbitalSymmetry({ numbers: pair.numbers, positions: pair.coordinates, shells: [[1], [1]], coreShells: undefined, functions: 'spherical' }, { nearTolerance: 0 })!.symmetry.fullGroup).toBe('C∞v');
  });
});
