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
    expect(space.ecpCoreElectrons).toBe(28);
    expect(space.electrons).toBe(1 + 53 - 28);
    // [Kr] core is 18 orbitals; the 28-electron potential covers 14, leaving 4 frozen (4s 4p).
    expect(space.frozenCore.orbitals).toBe(4);
  });

  it('open shell: triplet O2 in cc-pVDZ has 9 alpha, 7 beta, 2 singly occupied orbitals', () => {
    const space = countOrbitalSpace({ atoms: atoms('cc-pvdz', ['O', 'O']), charge: 0, multiplicity: 3, functions: 'spherical', frozenCore: false });
    expect(space).toMatchObject({ electrons: 16, occupied: 9, doublyOccupied: 7, singlyOccupied: 2, orbitals: 28, virtual: 19 });
  });

  it('a charged fragment: Zn2+ in def2-TZVP has 28 electrons', () => {
    const space = countOrbitalSpace({ atoms: atoms('def2-tzvp', ['Zn']), charge: 2, multiplicity: 1, functions: 'spherical', frozenCore: true });
    expect(space.electrons).toBe(28);
    expect(space.frozenCore.orbitals).toBe(9);
  });

  it('counts atoms the basis does not define separately', () => {
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
  it('finds the largest space within a qubit budget (Jordan–Wigner: 2 qubits per orbital)', () => {
    const input = { fragment: water, system: water, embedding: 'none' as const, tier: 'quantum' as const, method: 'vqe', ansatz: undefined, mapping: 'jordan-wigner' as const, taper: false, layers: 1 };
    expect(fitActiveSpace(input, 12)).toEqual({ electrons: 8, orbitals: 6, qubits: 12 });
    expect(fitActiveSpace(input, 6)).toEqual({ electrons: 4, orbitals: 3, qubits: 6 });
  });
});

describe('qubit counts', () => {
  it('2n under Jordan–Wigner and Bravyi–Kitaev, 2n − 2 under the reduced parity mapping', () => {
    expect(qubitCounts(6)).toEqual({ jordanWigner: 12, bravyiKitaev: 12, parity: 10 });
    expect(qubitsUnder('parity', 1)).toBe(0);
    expect(qubitsUnder('bravyi-kitaev', 0)).toBe(0);
  });
});
