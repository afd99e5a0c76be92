/** Electron, orbital and qubit counting (server/src/chemistry/counting.ts, spin.ts, qubits.ts). */
import { describe, expect, it } from 'vitest';
import { findBasisSet } from '../../server/src/chemistry/basis/library';
import { checkActiveSpace, countOrbitalSpace, type CountedAtom } from '../../server/src/chemistry/counting';
import { fitActiveSpace } from '../../server/src/chemistry/estimate/plan';
import { elementBySymbol } from '../../server/src/chemistry/elements';
import { qubitCounts, qubitsUnder } from '../../server/src/chemistry/qubits';
import { lowestMultiplicity, nearestValidMultiplicity, spinState } from '../../server/src/chemistry/spin';

function atoms(basisName: string, symbols: string[]): CountedAtom[] {
  const basis = findBasisSet(basisName)!;
  return symbols.map((symbol) => ({ z: elementBySymbol(symbol)!.z, shells: basis.shellsFor(symbol), ecpCoreElectrons: basis.ecpCoreElectrons(symbol) }));
}

describe('spin rules (2S <= N, N - 2S even; Szabo & Ostlund 1989)', () => {
  it('splits electrons into alpha and beta', () => {
    expect(spinState(16, 3)).toEqual({ ok: true, state: { alpha: 9, beta: 7, unpaired: 2 } }); // triplet O2
    expect(spinState(10, 1)).toEqual({ ok: true, state: { alpha: 5, beta: 5, unpaired: 0 } });
  });
  it('rejects wrong parity, too many unpaired electrons and bad values', () => {
    expect(spinState(10, 2)).toMatchObject({ ok: false, problem: { kind: 'parity' } });
    expect(spinState(1, 3)).toMatchObject({ ok: false, problem: { kind: 'too-high' } });
    expect(spinState(2, 0)).toMatchObject({ ok: false, problem: { kind: 'multiplicity-not-positive-integer' } });
    expect(spinState(-1, 1)).toMatchObject({ ok: false, problem: { kind: 'no-electrons' } });
  });
  it('suggests the nearest valid multiplicity, lower spin on ties', () => {
    expect(nearestValidMultiplicity(10, 2)).toBe(1);
    expect(nearestValidMultiplicity(10, 4)).toBe(3);
    expect(nearestValidMultiplicity(11, 1)).toBe(2);
    expect(nearestValidMultiplicity(11, 3)).toBe(2);
    expect(nearestValidMultiplicity(1, 5)).toBe(2);
    expect(nearestValidMultiplicity(0, 3)).toBe(1);
    expect(lowestMultiplicity(9)).toBe(2);
  });
});

describe('orbital spaces', () => {
  // STO-3G is a minimal basis: O 1s 2s 2p = 5 functions, H 1s = 1 (Hehre, Stewart & Pople, J. Chem.
  // Phys. 51, 2657 (1969)), so 7 orbitals for 10 electrons; 2n qubits under Jordan–Wigner and
  // Bravyi–Kitaev, 2n − 2 under the reduced parity mapping (Seeley, Richard & Love 2012; Bravyi et al. 2017).
  it('water in STO-3G: 10 electrons, 7 orbitals, 5 occupied, 2 virtual, 14 qubits under Jordan–Wigner', () => {
    const space = countOrbitalSpace({ atoms: atoms('sto-3g', ['O', 'H', 'H']), charge: 0, multiplicity: 1, functions: 'spherical', frozenCore: false });
    expect(space).toMatchObject({ electrons: 10, orbitals: 7, occupied: 5, virtual: 2, frozenCore: { orbitals: 0 } });
    expect(space.qubits).toEqual({ jordanWigner: 14, bravyiKitaev: 14, parity: 12 });
  });

  it('H2 in STO-3G needs 4 qubits under Jordan–Wigner (Bravyi et al. 2017, arXiv:1701.08213) and 2 under the reduced parity mapping', () => {
    const space = countOrbitalSpace({ atoms: atoms('sto-3g', ['H', 'H']), charge: 0, multiplicity: 1, functions: 'spherical', frozenCore: true });
    expect(space.orbitals).toBe(2);
    expect(space.qubits.jordanWigner).toBe(4);
    expect(space.qubits.parity).toBe(2);
  });

  it('frozen core: the noble-gas core of each element (common practice), active space outside it', () => {
    const space = countOrbitalSpace({ atoms: atoms('cc-pvdz', ['O', 'H', 'H']), charge: 0, multiplicity: 1, functions: 'spherical', frozenCore: true });
    expect(space.orbitals).toBe(24);
    expect(space.frozenCore).toEqual({ orbitals: 1, electrons: 2 });
    expect(space.active).toMatchObject({ electrons: 8, orbitals: 23, alpha: 4, beta: 4, source: 'outside-frozen-core' });
  });

  it('an effective core potential removes its electrons and the frozen orbitals it covers: HI in def2-SVP', () => {
    const space = countOrbitalSpace({ atoms: atoms('def2-svp', ['H', 'I']), charge: 0, multiplicity: 1, functions: 'spherical', frozenCore: true });
    // def2 bases put a 28-electron effective core potential on iodine (Peterson et al., J. Chem. Phys.
    // 119, 11113 (2003); Weigend & Ahlrichs, Phys. Chem. Chem. Phys. 7, 3297 (2005)).
    expect(space.ecpCoreElectrons).toBe(28);
    expect(space.electrons).toBe(1 + 53 - 28);
    // [Kr] core is 18 orbitals (noble-gas frozen core, common practice); the 28-electron potential
    // covers 14 (1s–3d), leaving 4 frozen (4s 4p).
    expect(space.frozenCore.orbitals).toBe(4);
  });

  // cc-pVDZ O is [3s2p1d] = 14 functions (Dunning, J. Chem. Phys. 90, 1007 (1989)), 28 for O2;
  // 16 electrons as a triplet: α = (16 + 2)/2 = 9, β = 7 (the spin rule above, Szabo & Ostlund 1989).
  it('open shell: triplet O2 in cc-pVDZ has 9 alpha, 7 beta, 2 singly occupied orbitals', () => {
    const space = countOrbitalSpace({ atoms: atoms('cc-pvdz', ['O', 'O']), charge: 0, multiplicity: 3, functions: 'spherical', frozenCore: false });
    expect(space).toMatchObject({ electrons: 16, occupied: 9, doublyOccupied: 7, singlyOccupied: 2, orbitals: 28, virtual: 19 });
  });

  it('a charged fragment: Zn2+ in def2-TZVP has 28 electrons', () => {
    const space = countOrbitalSpace({ atoms: atoms('def2-tzvp', ['Zn']), charge: 2, multiplicity: 1, functions: 'spherical', frozenCore: true });
    // 30 − 2 electrons: def2 is all-electron up to Kr, its core potentials start at Rb (Weigend &
    // Ahlrichs 2005); the [Ar] core, 9 orbitals, is frozen (noble-gas core, common practice).
    expect(space.electrons).toBe(28);
    expect(space.frozenCore.orbitals).toBe(9);
  });

  it('counts atoms the basis does not define separately', () => {
    // The library's 6-31G (psi4 1.3.2's 6-31g.gbs via scripts/data/generate_basis_library.py) covers
    // H–Kr, so not iodine; H has two s functions, its 31G split (Ditchfield, Hehre & Pople, J. Chem.
    // Phys. 54, 724 (1971)).
    const space = countOrbitalSpace({ atoms: atoms('6-31g', ['H', 'I']), charge: 0, multiplicity: 1, functions: 'cartesian', frozenCore: false });
    expect(space.atomsWithoutBasis).toBe(1);
    expect(space.basisFunctions.cartesian).toBe(2);
  });
});

describe('active spaces', () => {
  const water = countOrbitalSpace({ atoms: atoms('cc-pvdz', ['O', 'H', 'H']), charge: 0, multiplicity: 1, functions: 'spherical', frozenCore: true });
  it('accepts a valid space and names each problem of an invalid one', () => {
    expect(checkActiveSpace(water, { electrons: 4, orbitals: 4 })).toEqual([]);
    expect(checkActiveSpace(water, { electrons: 9, orbitals: 4 }).map((p) => p.kind)).toEqual(['electrons-exceed-capacity', 'electrons-exceed-available']);
    expect(checkActiveSpace(water, { electrons: 4, orbitals: 30 }).map((p) => p.kind)).toEqual(['orbitals-exceed-available']);
    expect(checkActiveSpace(water, { electrons: 3, orbitals: 4 }).map((p) => p.kind)).toEqual(['parity']);
  });
  it('finds the largest space within a qubit budget (Jordan–Wigner: 2 qubits per orbital, Seeley, Richard & Love 2012)', () => {
    const input = { fragment: water, system: water, embedding: 'none' as const, tier: 'quantum' as const, method: 'vqe', ansatz: undefined, mapping: 'jordan-wigner' as const, taper: false, layers: 1 };
    expect(fitActiveSpace(input, 12)).toEqual({ electrons: 8, orbitals: 6, qubits: 12 });
    expect(fitActiveSpace(input, 6)).toEqual({ electrons: 4, orbitals: 3, qubits: 6 });
  });
});

describe('qubit counts (Seeley, Richard & Love, J. Chem. Phys. 137, 224109 (2012); Bravyi et al. 2017, arXiv:1701.08213)', () => {
  it('2n under Jordan–Wigner and Bravyi–Kitaev, 2n − 2 under the reduced parity mapping', () => {
    expect(qubitCounts(6)).toEqual({ jordanWigner: 12, bravyiKitaev: 12, parity: 10 });
    expect(qubitsUnder('parity', 1)).toBe(0);
    expect(qubitsUnder('bravyi-kitaev', 0)).toBe(0);
  });
});
