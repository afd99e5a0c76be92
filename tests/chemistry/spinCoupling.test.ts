/**
 * Spins that add up: the multiplicities fragments can couple to (angular-momentum addition, S from
 * |S1 − S2| to S1 + S2 in whole steps, applied one spin at a time; e.g. Atkins & Friedman,
 * Molecular Quantum Mechanics, the Clebsch–Gordan series, from memory), and the valid
 * multiplicities near a wrong one (2S ≤ N and N − 2S even; Szabo & Ostlund 1989, §2.4).
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { coupledMultiplicities, nearbyValidMultiplicities } from '../../server/src/chemistry/spin';

// Angular-momentum addition (the Clebsch–Gordan series; Atkins & Friedman, Molecular Quantum Mechanics, 2011; from memory).
describe('coupling fragment spins', () => {
  it('two doublets: singlet or triplet (S = 1/2 + 1/2 gives 0 or 1)', () => {
    expect(coupledMultiplicities([2, 2])).toEqual({ lowest: 1, highest: 3 });
  });
  it('a quintet and two singlets: only a quintet (S = 2 + 0 + 0)', () => {
    expect(coupledMultiplicities([5, 1, 1])).toEqual({ lowest: 5, highest: 5 });
  });
  it('three doublets: doublet or quartet (1/2 ⊗ 1/2 ⊗ 1/2 = 1/2 ⊕ 1/2 ⊕ 3/2)', () => {
    expect(coupledMultiplicities([2, 2, 2])).toEqual({ lowest: 2, highest: 4 });
  });
  it('a quintet and a doublet: quartet or sextet (|2 − 1/2| to 2 + 1/2)', () => {
    expect(coupledMultiplicities([5, 2])).toEqual({ lowest: 4, highest: 6 });
  });
  it('a sextet, a triplet and a triplet: S from 5/2 − 1 − 1 = 1/2 to 9/2', () => {
    expect(coupledMultiplicities([6, 3, 3])).toEqual({ lowest: 2, highest: 10 });
  });
});

// 2S ≤ N and N − 2S even (Szabo & Ostlund 1989, §2.4).
describe('valid multiplicities near a wrong one', () => {
  it('an even count written as 2: 1 and 3', () => {
    expect(nearbyValidMultiplicities(54, 2)).toEqual([1, 3]);
  });
  it('an odd count written as 1: only 2 (0 is no multiplicity)', () => {
    expect(nearbyValidMultiplicities(9, 1)).toEqual([2]);
  });
  it('too many unpaired electrons: the highest possible, N + 1', () => {
    expect(nearbyValidMultiplicities(10, 13)).toEqual([11]);
  });
  it('one electron written as 3: only the doublet', () => {
    expect(nearbyValidMultiplicities(1, 3)).toEqual([2]);
  });
});

// Angular-momentum addition as above (from memory); electrons from the atomic numbers (IUPAC periodic table, 2021).
describe('the spin-coupling check', () => {
  // An invented iron(II) site (26 electrons, a quintet) beside two waters (10 electrons each,
  // singlets), in a triplet system of 46 electrons: the spins add up only to a quintet.
  const text = (system: number, site: number) => `multiplicity ${system}
basis def2-svp
structure {
  Fe fe 0 0 0
  O o 4 0 0
  H h1 4 0.756950 0.585882
  H h2 4 -0.756950 0.585882
  O p -4 0 0
  H g1 -4 0.756950 0.585882
  H g2 -4 -0.756950 0.585882
}
fragment site { atoms fe; multiplicity ${site}; tier mean-field { method uhf } }
fragment a { atoms o h1 h2; tier mean-field { method rhf } }
fragment b { atoms p g1 g2; tier mean-field { method rhf } }
`;
  it('flags a triplet system made of a quintet and two singlets, and says a quintet is possible', () => {
    const found = analyzeDocument(text(3, 5)).diagnostics.filter((d) => d.code === 'spin-coupling');
    expect(found).toHaveLength(1);
    expect(found[0]!.message).toContain("couple only to multiplicity 5, not to the system's 3");
    expect(found[0]!.data).toMatchObject({ multiplicities: [5] });
  });
  it('accepts the quintet system, and a triplet site in a triplet system', () => {
    expect(analyzeDocument(text(5, 5)).diagnostics.map((d) => d.code)).not.toContain('spin-coupling');
    expect(analyzeDocument(text(3, 3)).diagnostics.map((d) => d.code)).not.toContain('spin-coupling');
  });
});
