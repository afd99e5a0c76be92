/**
 * Measurement budgets and the fault-tolerant estimate: hand-computed small cases (worked out in the
 * comments), the reference determinant in each encoding against psi4's SCF energy (the
 * determinant's energy ⟨b|H|b⟩ is the SCF energy for canonical orbitals, tests/fixtures/
 * hamiltonian.psi4.json), and the shape of the one-call figures.
 */
import { describe, expect, it } from 'vitest';
import { qubitWiseCommutingGroups } from '../../../server/src/electronic/hamiltonian/grouping';
import { parsePauliLabel, popcount, type PauliSum } from '../../../server/src/electronic/hamiltonian/pauli';
import { qubitHamiltonians } from '../../../server/src/electronic/hamiltonian/qubitHamiltonian';
import { activeSpaceFigures } from '../../../server/src/electronic/measurement/figures';
import { qubitizedPhaseEstimation } from '../../../server/src/electronic/measurement/qubitization';
import { encodedReference, referenceOccupation } from '../../../server/src/electronic/measurement/referenceState';
import { accuracyInHartree, groupedShots, groupVariances, measurementBudget, separateMeasurementBound, vqeRun } from '../../../server/src/electronic/measurement/shots';
import { psi4Cases, psi4Space, referenceIntegrals } from '../psi4Fixture';

function sumOf(terms: Array<[string, number]>): PauliSum {
  const parsed = terms.map(([label]) => parsePauliLabel(label));
  return {
    qubits: terms[0]![0].length,
    length: terms.length,
    x: Uint32Array.from(parsed.map((p) => p.x)),
    z: Uint32Array.from(parsed.map((p) => p.z)),
    coefficients: Float64Array.from(terms.map(([, c]) => c)),
  };
}

describe('shots, hand-computed', () => {
  it('separate measurement bound (λ/ε)²: λ = 0.8 Ha, ε = 1.6 mHa gives 500² = 250000', () => {
    expect(separateMeasurementBound(0.8, 1.6e-3)).toBe(250000);
  });

  it('H = 0.5 Z + 0.3 X in |0⟩: Z is diagonal (variance 0), X alone has variance 0.3² → (0.3/ε)² shots', () => {
    const sum = sumOf([['Z', 0.5], ['X', 0.3]]);
    const groups = qubitWiseCommutingGroups(sum);
    expect(groups.count).toBe(2);
    expect(Array.from(groupVariances(sum, groups, 0))).toEqual([0, 0.09]);
    expect(groupedShots(Float64Array.of(0, 0.09), 0.01).shots).toBe(900);
  });

  it('covariance inside a group: 0.4 XZ + 0.2 XI share x; in |00⟩ Var = (0.4 + 0.2)² = 0.36, with qubit 1 set (0.2 − 0.4)² = 0.04', () => {
    const sum = sumOf([['XZ', 0.4], ['XI', 0.2]]);
    const groups = qubitWiseCommutingGroups(sum);
    expect(groups.count).toBe(1);
    expect(groupVariances(sum, groups, 0b00)[0]).toBeCloseTo(0.36, 15);
    expect(groupVariances(sum, groups, 0b10)[0]).toBeCloseTo(0.04, 15);
  });

  it('optimal allocation: shots per group ∝ √Var_g and they add up to the total', () => {
    const { shots, perGroup } = groupedShots(Float64Array.of(0.04, 0.09, 0.01), 0.1);
    // (0.2 + 0.3 + 0.1)² / 0.01 = 36; shares 0.2·0.6/0.01 = 12, 18, 6.
    expect(shots).toBe(36);
    expect(Array.from(perGroup).map((v) => Math.round(v * 1e9) / 1e9)).toEqual([12, 18, 6]);
  });

  it('H2 STO-3G, Jordan–Wigner, Hartree–Fock reference: the four pair-pair strings each form a group of variance c², the Z strings one silent group → (4|c|/ε)²', () => {
    const { case: c, space } = psi4Space('h2-sto3g', 0, 2);
    const jw = qubitHamiltonians(referenceIntegrals(space, c.nuclearRepulsion)).jordanWigner;
    const groups = qubitWiseCommutingGroups(jw);
    const pairPair = Math.abs(jw.coefficients[jw.length - 1]!); // the smallest |c|: the XXXX-type strings
    const budget = measurementBudget(jw, groups, encodedReference('jordan-wigner', 2, { alpha: 1, beta: 1 }), 1.6e-3);
    expect(budget.groups).toBe(5);
    expect(budget.silentGroups).toBe(1);
    expect(budget.groupedEstimate).toBe(Math.ceil((4 * pairPair) ** 2 / 1.6e-3 ** 2));
    expect(budget.separateBound).toBe(Math.ceil((budget.oneNorm / 1.6e-3) ** 2));
    expect(budget.groupedEstimate).toBeLessThan(budget.separateBound);
  });
});

describe('the reference determinant in each encoding', () => {
  it('H2 (1α, 1β in 2 orbitals), by hand: f = 0101; BK qubits hold f0, f0+f1, f2, f0+…+f3 → 0111; parity prefix sums → 0011, reduced (drop qubits 1 and 3) → 01', () => {
    expect(referenceOccupation(2, { alpha: 1, beta: 1 })).toBe(0b0101);
    expect(encodedReference('jordan-wigner', 2, { alpha: 1, beta: 1 })).toBe(0b0101);
    expect(encodedReference('bravyi-kitaev', 2, { alpha: 1, beta: 1 })).toBe(0b0111);
    expect(encodedReference('parity', 2, { alpha: 1, beta: 1 })).toBe(0b01);
  });

  const spaces = psi4Cases().flatMap((c) => c.spaces.map((space) => ({ label: `${c.name} ${space.active}o`, c, space })));
  it.each(spaces)('$label: ⟨b|H|b⟩ in every mapping equals psi4’s SCF energy', ({ c, space }) => {
    const h = qubitHamiltonians(referenceIntegrals(space, c.nuclearRepulsion));
    for (const sum of [h.jordanWigner, h.bravyiKitaev, h.parity]) {
      const b = encodedReference(sum.mapping, space.active, space.electrons);
      let energy = 0;
      for (let k = 0; k < sum.length; k++) if (sum.x[k] === 0) energy += sum.coefficients[k]! * (popcount(sum.z[k]! & b) & 1 ? -1 : 1);
      expect(Math.abs(energy - c.scfEnergy), sum.mapping).toBeLessThan(1e-9);
    }
  });
});

describe('VQE run, hand-computed', () => {
  it('3 parameters → 7 evaluations per step; 100 steps × 5 scan points × 10⁴ shots = 3.5·10⁷ shots, 3500 s at 10⁴ shots/s', () => {
    const run = vqeRun({ shotsPerEvaluation: 1e4, parameters: 3, steps: 100, scanPoints: 5, shotRate: 1e4 });
    expect(run.evaluationsPerStep).toBe(7);
    expect(run.evaluations).toBe(3500);
    expect(run.shots).toBe(3.5e7);
    expect(run.seconds).toBe(3500);
    expect(vqeRun({ shotsPerEvaluation: 10, parameters: 0, steps: 1, scanPoints: 1 }).seconds).toBeUndefined();
  });
  it('refuses a negative count and a zero shot rate with the name of the setting', () => {
    expect(() => vqeRun({ shotsPerEvaluation: 1, parameters: -1, steps: 1, scanPoints: 1 })).toThrow(/parameters must be a non-negative number/);
    expect(() => vqeRun({ shotsPerEvaluation: 1, parameters: 1, steps: 1, scanPoints: 1, shotRate: 0 })).toThrow(/shot rate must be positive/);
  });
});

describe('qubitized phase estimation, hand-computed', () => {
  it('N = 4, L = 14, λ = 1.2 Ha, ε = 1.6 mHa', () => {
    // K = ⌈π·1.2/(2·0.0016)⌉ = ⌈1178.10⌉ = 1179; μ = ⌈log₂(1.2·16/0.0016)⌉ = ⌈log₂ 12000⌉ = 14;
    // ⌈log₂ 14⌉ = 4; per step 14 + 2(13 + 14 + 12) + (4 + 14 − 1) = 109; total 1179 · 109 = 128511.
    // Ancillas: phase ⌈log₂ 1179⌉ + 1 = 12, index + alternate 8, keep + random 28, comparison and
    // signs 3, AND ancillas 3 → 54; logical qubits 58.
    const estimate = qubitizedPhaseEstimation({ systemQubits: 4, terms: 14, oneNorm: 1.2, epsilon: 1.6e-3 });
    expect(estimate.walkSteps).toBe(1179);
    expect(estimate.precisionBits).toBe(14);
    expect(estimate.toffolisPerStep).toBe(109);
    expect(estimate.toffolis).toBe(128511);
    expect(estimate.ancillaQubits).toBe(54);
    expect(estimate.logicalQubits).toBe(58);
    expect(estimate.label).toBe('estimate');
    expect(estimate.references.join(' ')).toMatch(/Phys\. Rev\. X 8, 041015 \(2018\)/);
  });
});

describe('one call for the report', () => {
  it('H2 STO-3G: 15 strings under JW and BK, the constant is the JW identity, the QPE estimate uses JW', () => {
    const { case: c, space } = psi4Space('h2-sto3g', 0, 2);
    const figures = activeSpaceFigures(referenceIntegrals(space, c.nuclearRepulsion));
    expect(figures.status).toBe('computed');
    if (figures.status !== 'computed') return;
    expect(figures.mappings.jordanWigner.terms).toBe(15);
    expect(figures.mappings.bravyiKitaev.terms).toBe(15);
    expect(figures.mappings.parity.qubits).toBe(2);
    expect(figures.constant).toBe(figures.mappings.jordanWigner.identity);
    expect(figures.faultTolerant.walkSteps).toBe(Math.ceil((Math.PI * figures.mappings.jordanWigner.oneNorm) / (2 * 1.6e-3)));
    expect(figures.epsilon).toBe(1.6e-3);
  });
  it('a 20-orbital space comes back as a note, not a number', () => {
    const figures = activeSpaceFigures({ orbitals: 20, electrons: { alpha: 2, beta: 2 }, constant: 0, nuclearRepulsion: 0, coreEnergy: 0, oneBody: new Float64Array(400), twoBody: new Float64Array(0) });
    expect(figures).toEqual({ status: 'too-large', orbitals: 20, note: expect.stringMatching(/20 active orbitals need 40 qubits/) });
  });
  it('accuracy units: 1 kcal/mol is 1.5936 mHa and 1 eV 36.749 mHa (CODATA 2018)', () => {
    expect(accuracyInHartree(1, 'kcal/mol')).toBeCloseTo(1.5936e-3, 7);
    expect(accuracyInHartree(1, 'eV')).toBeCloseTo(3.6749e-2, 6);
    expect(accuracyInHartree(1.6, 'mHa')).toBeCloseTo(1.6e-3, 15);
  });
});
