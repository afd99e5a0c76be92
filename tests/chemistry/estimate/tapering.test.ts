/**
 * Z2 tapering counts (server/src/chemistry/estimate/tapering.ts): rank over GF(2) of the number
 * parities and the point-group generator parities (Bravyi, Gambetta, Mezzacapo, Temme,
 * arXiv:1701.08213 (2017); Setia et al., J. Chem. Theory Comput. 16, 6091 (2020)).
 */
import { describe, expect, it } from 'vitest';
import { irrepMasks, symmetryPattern } from '../../../server/src/chemistry/estimate/integralPattern';
import { taperQubits } from '../../../server/src/chemistry/estimate/tapering';
import { nonzeroKeys, qubitHamiltonian, random, randomIntegrals } from './enumerate';

// Every case applies the rule of Bravyi et al. 2017 and Setia et al. 2020 (header); the
// hand-derived ones say so in their titles.
describe('tapering', () => {
  it('H2 in STO-3G (Ag, B1u): 4 qubits, 3 symmetries, 1 qubit left (Bravyi et al. 2017)', () => {
    const result = taperQubits(irrepMasks('D2h', ['Ag', 'B1u']), 3);
    expect(result.qubits).toBe(4);
    expect(result.removable).toBe(3); // Bravyi et al. 2017: H2 in a minimal basis tapered from 4 qubits to 1
    expect(result.tapered).toBe(1); // same source
    // B1u is odd under C2(y) (generator 1) and i (generator 2), even under C2(z) (Cotton 1990 D2h table).
    expect(result.generators).toEqual([1, 2]);
    expect(result.independent.map((s) => s.label)).toEqual(['N_alpha parity', 'N_beta parity', 'generator 1']);
  });

  it('C1: only the two spin parities, 2n − 2 qubits left (Bravyi et al. 2017)', () => {
    const result = taperQubits(new Array<number>(6).fill(0), 0);
    expect(result).toMatchObject({ qubits: 12, removable: 2, tapered: 10, generators: [] }); // Bravyi et al. 2017: N_α and N_β parities
  });

  it('open shell: the count does not depend on the occupation, the sector does (hand-derived, no source)', () => {
    const h2 = irrepMasks('D2h', ['Ag', 'B1u']);
    const closed = taperQubits(h2, 3, { alpha: 1, beta: 1 });
    const triplet = taperQubits(h2, 3, { alpha: 2, beta: 0 }); // σg¹σu¹, both α
    const cation = taperQubits(h2, 3, { alpha: 1, beta: 0 }); // H2+ doublet
    expect(triplet.tapered).toBe(closed.tapered);
    expect(cation.tapered).toBe(closed.tapered);
    // Eigenvalues on the reference determinant, (−1)^(electrons in the set), counted by hand:
    expect(closed.independent.map((s) => s.eigenvalue)).toEqual([-1, -1, 1]);
    expect(triplet.independent.map((s) => s.eigenvalue)).toEqual([1, 1, -1]);
    expect(cation.independent.map((s) => s.eigenvalue)).toEqual([-1, 1, 1]);
  });

  it('open shell: triplet O2 π space in D2h (πu and πg pairs): 8 qubits, 4 left (hand-derived, no source)', () => {
    // Orbitals 1πu(x) B3u, 1πu(y) B2u, 1πg(x) B2g, 1πg(y) B3g (Cotton 1990 D2h table for x, y
    // functions); the triplet ground state πu⁴ πg² has 4 α and 2 β electrons here.
    const masks = irrepMasks('D2h', ['B3u', 'B2u', 'B2g', 'B3g']);
    const result = taperQubits(masks, 3, { alpha: 4, beta: 2 });
    // Generators: masks 7, 5, 1, 3 set bits 0, 1 and 2, all non-trivial. Vectors on one spin:
    // g0 = all four orbitals (equals α ⊕ β together with the other spin), g1 = {B3u, B3g},
    // g2 = {B3u, B2u}: rank 2 + 2 = 4, so 8 − 4 = 4 qubits.
    expect(result.generators).toEqual([0, 1, 2]);
    expect(result.removable).toBe(4);
    expect(result.tapered).toBe(4);
    expect(result.independent.map((s) => s.label)).toEqual(['N_alpha parity', 'N_beta parity', 'generator 1', 'generator 2']);
    // Reference: α in all four, β in the two πu; electrons in {all α}, {all β}, g1 = {B3u, B3g},
    // g2 = {B3u, B2u}: 4, 2, 3, 4 (counted by hand).
    expect(result.independent.map((s) => s.eigenvalue)).toEqual([1, 1, -1, 1]);
  });

  it('a generator under which every orbital is odd adds nothing: it is the total parity (hand-derived)', () => {
    const result = taperQubits([6, 6, 6], 3);
    expect(result.generators).toEqual([1, 2]);
    expect(result.removable).toBe(2);
  });

  it('water in STO-3G, C2v (1a1 2a1 1b2 3a1 1b1 4a1 2b2, orbital irreps from memory): 14 qubits, 10 after tapering', () => {
    const result = taperQubits(irrepMasks('C2v', ['A1', 'A1', 'B2', 'A1', 'B1', 'A1', 'B2']), 2);
    // Hand count: α, β, g0 = {b1, b2 orbitals}, g1 = {b2 orbitals}, independent: rank 4.
    expect(result.removable).toBe(4);
    expect(result.tapered).toBe(10);
  });

  it('the symmetries are symmetries: their Z strings commute with every Jordan–Wigner string of H (operator algebra)', () => {
    for (const n of [3, 4, 5]) {
      const next = random(40 + n);
      const irreps = Array.from({ length: n }, () => Math.floor(next() * 8));
      const pattern = symmetryPattern(irreps);
      const integrals = randomIntegrals(n, pattern.allowedOneBody, pattern.allowed, n);
      const keys = nonzeroKeys(qubitHamiltonian(integrals, 'jordan-wigner', 'block'));
      const result = taperQubits(irreps, 3);
      expect(result.removable).toBeGreaterThanOrEqual(2);
      for (const symmetry of result.independent) {
        const mask = symmetry.modes.reduce((m, bit, p) => m + bit * 2 ** p, 0);
        for (const key of keys) {
          const x = Math.floor(key / 2 ** (2 * n));
          let overlap = 0;
          for (let q = 0; q < 2 * n; q++) overlap += Math.floor(x / 2 ** q) & Math.floor(mask / 2 ** q) & 1;
          expect(overlap % 2).toBe(0);
        }
      }
    }
  });

  it('rejects masks that do not fit the generator count', () => {
    expect(() => taperQubits([4], 2)).toThrow(RangeError);
    expect(() => taperQubits([0], 4)).toThrow(RangeError);
  });
});
