/**
 * Figures that scale with the active space stay bounded: a rejected active space gets no figures
 * at all, and beyond PER_ORBITAL_LIMIT orbitals the counts come from closed forms that agree with
 * the orbital-by-orbital ones (checked here just past the limit, where both can run).
 */
import { describe, expect, it } from 'vitest';
import { findBasisSet } from '../../../server/src/chemistry/basis/library';
import { countOrbitalSpace, type CountedAtom } from '../../../server/src/chemistry/counting';
import { activeIrreps, PER_ORBITAL_LIMIT, symmetryCounts } from '../../../server/src/chemistry/estimate/activeIrreps';
import { symmetryPattern } from '../../../server/src/chemistry/estimate/integralPattern';
import { countByIrrepCounts, countBySymmetry, countPauliTerms } from '../../../server/src/chemistry/estimate/pauliTerms';
import { estimatePlan, type PlanInput } from '../../../server/src/chemistry/estimate/plan';
import { taperNumberParities, taperQubits } from '../../../server/src/chemistry/estimate/tapering';

/** A fragment of `count` hydrogen atoms in a basis, its own orbitals the whole problem. */
function hydrogenFragment(count: number, basis: string, active?: { electrons: number; orbitals: number }): PlanInput {
  const shells = findBasisSet(basis)!.shellsFor('H')!;
  const atoms: CountedAtom[] = Array.from({ length: count }, () => ({ z: 1, shells, ecpCoreElectrons: 0 }));
  const space = countOrbitalSpace({ atoms, charge: 0, multiplicity: 1, functions: 'spherical', frozenCore: false, ...(active ? { active } : {}) });
  return { fragment: space, system: space, embedding: 'none', tier: 'quantum', method: 'vqe', ansatz: 'uccsd', mapping: 'jordan-wigner', taper: false, layers: 1, ...(active ? { active } : {}) };
}

describe('no figures for a rejected active space', () => {
  it('4 electrons in 1,000,000 orbitals of H2, and 10^20 of each: no plan, at once', () => {
    expect(estimatePlan(hydrogenFragment(2, 'sto-3g', { electrons: 4, orbitals: 1_000_000 }))).toBeUndefined();
    expect(estimatePlan(hydrogenFragment(2, 'sto-3g', { electrons: 1e20, orbitals: 1e20 }))).toBeUndefined();
    // The same H2 with an active space that fits: 2n qubits under Jordan–Wigner (Jordan & Wigner 1928).
    expect(estimatePlan(hydrogenFragment(2, 'sto-3g', { electrons: 2, orbitals: 2 }))?.quantum!.qubits.jordanWigner).toBe(4);
  });
});

describe('beyond PER_ORBITAL_LIMIT active orbitals', () => {
  it('the closed forms give what the orbital-by-orbital counts give just past the limit (C1)', () => {
    const n = PER_ORBITAL_LIMIT + 1;
    const electrons = { alpha: 7, beta: 6 };
    const closed = symmetryCounts(activeIrreps(undefined, n), electrons);
    const zeros = new Uint8Array(n);
    const explicit = { tapering: taperQubits(zeros, 0, electrons), pauli: countPauliTerms(symmetryPattern(zeros), electrons) };
    expect(closed.pauli).toEqual(explicit.pauli);
    expect(closed.tapering.tapered).toBe(explicit.tapering.tapered);
    expect(closed.tapering.independent.map((s) => [s.label, s.eigenvalue])).toEqual(explicit.tapering.independent.map((s) => [s.label, s.eigenvalue]));
  });

  it('taperNumberParities equals taperQubits without generators, modes included, for n = 1 … 12', () => {
    for (let n = 1; n <= 12; n++) {
      for (const electrons of [undefined, { alpha: 0, beta: 0 }, { alpha: n, beta: n - 1 }, { alpha: 3, beta: 1 }]) {
        const closed = taperNumberParities(n, electrons);
        const explicit = taperQubits(new Uint8Array(n), 0, electrons);
        expect({ ...closed, independent: closed.independent.map((s) => ({ ...s, modes: s.modes })) }).toEqual(explicit);
      }
    }
  });

  it('the Pauli count from irrep counts equals the count from per-orbital irreps', () => {
    const irreps = [0, 1, 1, 2, 3, 3, 3, 0, 5, 7, 7, 6];
    const counts = [0, 0, 0, 0, 0, 0, 0, 0];
    for (const g of irreps) counts[g]! += 1;
    expect(countByIrrepCounts(counts)).toBe(countBySymmetry(irreps));
  });

  it('a 2,000-atom hydrogen fragment in cc-pVQZ (60,000 orbitals, no active space): bounded, with a note', () => {
    const plan = estimatePlan(hydrogenFragment(2000, 'cc-pvqz'))!;
    const n = 60_000;
    expect(plan.active.orbitals).toBe(n);
    // 2n qubits (Jordan & Wigner 1928); the two number parities taper two (Bravyi et al. 2017).
    expect(plan.quantum!.qubits.jordanWigner).toBe(2 * n);
    expect(plan.quantum!.qubits.tapered).toBe(2 * n - 2);
    expect(plan.active.irrepsSource).toBe('none');
    expect(plan.quantum!.circuit).toBeNull();
    // The limit by construction (PER_ORBITAL_LIMIT).
    expect(plan.notes.join(' ')).toContain('more than 10,000 orbitals is counted without point-group symmetry');
    expect(plan.notes.join(' ')).toContain('UCCSD circuit cost is not estimated');
    // C1 closed form of pauliTerms.ts with one irrep: S = P₀ = C(n,2), Q = C(n,4).
    const pairs = (n * (n - 1)) / 2;
    const quartets = (n * (n - 1) * (n - 2) * (n - 3)) / 24;
    const expected = 1 + 2 * n + n * (2 * n - 1) + 4 * pairs * (2 * n - 1) + 4 * pairs * pairs + 12 * quartets;
    expect(plan.quantum!.pauliTerms.jordanWigner / expected).toBeCloseTo(1, 12); // the closed form by construction
    expect(plan.quantum!.measurement.exact).toBe(false);
    expect(plan.quantum!.ansatz?.kind).toBe('uccsd');
    // Spin-orbital UCCSD without screening, Romero et al. 2019: o = v = ... here 1000 α and β in 60,000.
    const o = 1000;
    const v = n - o;
    expect(plan.quantum!.ansatz?.parameters).toBe(2 * o * v + 2 * ((o * (o - 1)) / 2) * ((v * (v - 1)) / 2) + o * o * v * v);
  });
});
