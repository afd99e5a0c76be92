/**
 * Parameter counts of the ansätze (server/src/chemistry/cost/ansatz.ts).
 * Formulas: Romero et al., Quantum Sci. Technol. 4, 014008 (2019) (spin-orbital UCCSD); Scuseria
 * et al., J. Chem. Phys. 86, 2881 (1987) (closed-shell amplitudes); Lee et al., J. Chem. Theory
 * Comput. 15, 311 (2019) (k-UpCCGSD); Kandala et al., Nature 549, 242 (2017) (hardware-efficient).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  hardwareEfficientModel,
  kUpccgsdCount,
  referenceIrreps,
  spinOrbitalCounts,
  uccsdSpinAdaptedCount,
  uccsdSpinAdaptedCountWithSymmetry,
  uccsdSpinOrbitalCount,
  uccsdSpinOrbitalCountWithSymmetry,
} from '../../../server/src/chemistry/cost/ansatz';
import { listExcitations } from './reference';

/** C2v irreps as masks over the generators (C2, σv(xz)): A1 = 0, B1 = 1, B2 = 2, A2 = B1 ⊗ B2 = 3. */
const A1 = 0;
const B1 = 1;
const B2 = 2;
/**
 * Water in STO-3G, canonical orbitals in energy order: 1a1 2a1 1b2 3a1 1b1 | 4a1 2b2 (the usual
 * MO diagram of water, axis convention with the molecule in the yz plane; from memory).
 */
const WATER_IRREPS = [A1, A1, B2, A1, B1, A1, B2];

describe('UCCSD, spin orbitals (Romero et al. 2019)', () => {
  it('H2 in STO-3G: 2 singles and 1 double (O\'Malley et al., Phys. Rev. X 6, 031007 (2016), from memory)', () => {
    // By hand: 2 spatial orbitals σg (occupied) and σu (virtual), one electron of each spin.
    // singles: σgα→σuα and σgβ→σuβ = 2; doubles: C(1,2)C(1,2) = 0 per spin, plus 1·1·1·1 = 1 mixed.
    expect(uccsdSpinOrbitalCount(spinOrbitalCounts(2, 1, 1))).toMatchObject({ singles: 2, doubles: 1, total: 3 });
  });

  it('water in STO-3G: 20 singles, 120 doubles (hand count: o = 5, v = 2)', () => {
    // singles 2·5·2 = 20; same-spin 2·C(5,2)·C(2,2) = 20; mixed 5·5·2·2 = 100
    expect(uccsdSpinOrbitalCount(spinOrbitalCounts(7, 5, 5))).toMatchObject({ singles: 20, doubles: 120, total: 140 });
  });

  it('an open shell counts each spin separately: triplet with 3 alpha, 1 beta in 4 orbitals (hand count)', () => {
    // singles 3·1 + 1·3 = 6; same-spin C(3,2)C(1,2) + C(1,2)C(3,2) = 0; mixed 3·1·1·3 = 9
    expect(uccsdSpinOrbitalCount(spinOrbitalCounts(4, 3, 1))).toMatchObject({ singles: 6, doubles: 9 });
  });

  it('agrees with a one-by-one enumeration of excitations on random spaces (independent reference)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 7 }), fc.integer({ min: 0, max: 7 }), fc.integer({ min: 0, max: 7 }), (n, a, b) => {
        const alpha = Math.min(n, Math.max(a, b));
        const beta = Math.min(n, Math.min(a, b));
        const listed = listExcitations(n, alpha, beta, 'interleaved');
        const count = uccsdSpinOrbitalCount(spinOrbitalCounts(n, alpha, beta));
        expect(count.singles).toBe(listed.filter((e) => e.kind === 'single').length);
        expect(count.doubles).toBe(listed.filter((e) => e.kind === 'double').length);
      }),
      { seed: 20240611, numRuns: 60 },
    );
  });

  it('rejects inputs that are not whole numbers or do not fit', () => {
    expect(() => spinOrbitalCounts(2, 3, 1)).toThrow(RangeError);
    expect(() => uccsdSpinOrbitalCount({ occupiedAlpha: 1.5, occupiedBeta: 1, virtualAlpha: 1, virtualBeta: 1 })).toThrow(RangeError);
  });
});

describe('UCCSD with point-group screening (irrep product must be totally symmetric)', () => {
  it('H2 in D2h keeps only the double: one parameter (O\'Malley et al., Phys. Rev. X 6, 031007 (2016), from memory)', () => {
    const irreps = referenceIrreps([0, 5], 1, 1); // σg = Ag = 0, σu = B1u: any non-zero mask
    expect(uccsdSpinOrbitalCountWithSymmetry(irreps)).toMatchObject({ singles: 0, doubles: 1 });
    expect(uccsdSpinAdaptedCountWithSymmetry([0], [5])).toMatchObject({ singles: 0, doubles: 1 });
  });

  it('water in STO-3G under C2v: 8 singles, 40 doubles (hand count from the orbital irreps of WATER_IRREPS, from memory)', () => {
    // occupied A1×3, B2, B1; virtual A1, B2.
    // singles per spin: 3·1 (a1→a1) + 1·1 (b2→b2) = 4 → 8.
    // same-spin per spin: the one virtual pair (4a1, 2b2) is B2, occupied pairs of product B2: 3 → 6.
    // mixed: replacements by product irrep S = {A1: 4, B2: 4, B1: 1, A2: 1} → Σ S² = 34.
    const irreps = referenceIrreps(WATER_IRREPS, 5, 5);
    expect(uccsdSpinOrbitalCountWithSymmetry(irreps)).toMatchObject({ singles: 8, doubles: 40, total: 48 });
  });

  it('with every orbital totally symmetric, nothing is screened out (by construction: the same count as without symmetry)', () => {
    const irreps = referenceIrreps(new Array<number>(7).fill(0), 5, 4);
    expect(uccsdSpinOrbitalCountWithSymmetry(irreps).total).toBe(uccsdSpinOrbitalCount(spinOrbitalCounts(7, 5, 4)).total);
  });

  it('agrees with enumeration for random D2h irreps and open shells (independent reference)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 7 }), { minLength: 1, maxLength: 7 }),
        fc.integer({ min: 0, max: 7 }),
        fc.integer({ min: 0, max: 7 }),
        (irreps, a, b) => {
          const n = irreps.length;
          const alpha = Math.min(n, Math.max(a, b));
          const beta = Math.min(n, Math.min(a, b));
          const listed = listExcitations(n, alpha, beta, 'interleaved', irreps);
          const count = uccsdSpinOrbitalCountWithSymmetry(referenceIrreps(irreps, alpha, beta));
          expect(count.singles).toBe(listed.filter((e) => e.kind === 'single').length);
          expect(count.doubles).toBe(listed.filter((e) => e.kind === 'double').length);
        },
      ),
      { seed: 7, numRuns: 80 },
    );
  });

  it('rejects masks outside D2h', () => {
    expect(() => referenceIrreps([0, 8], 1, 1)).toThrow(RangeError);
    expect(() => uccsdSpinAdaptedCountWithSymmetry([0.5], [0])).toThrow(RangeError);
  });
});

describe('UCCSD, closed-shell spin-adapted (Scuseria et al. 1987)', () => {
  it('H2 in STO-3G: 1 singlet single and 1 double (hand count)', () => {
    expect(uccsdSpinAdaptedCount(1, 1)).toMatchObject({ singles: 1, doubles: 1 });
  });

  it('water in STO-3G: 10 singles and 55 doubles, o·v(o·v+1)/2 with o·v = 10 (hand count)', () => {
    expect(uccsdSpinAdaptedCount(5, 2)).toMatchObject({ singles: 10, doubles: 55, total: 65 });
  });

  it('equals the number of independent singlet double-excitation operators, counted case by case', () => {
    // i≠j, a≠b: two spin couplings; i=j or a=b: one (Sokolov et al., J. Chem. Phys. 152, 124107 (2020))
    const c2 = (n: number) => (n * (n - 1)) / 2;
    for (let o = 0; o <= 12; o++) {
      for (let v = 0; v <= 12; v++) {
        const byCase = 2 * c2(o) * c2(v) + o * c2(v) + c2(o) * v + o * v;
        expect(uccsdSpinAdaptedCount(o, v).doubles, `o=${o} v=${v}`).toBe(byCase);
      }
    }
  });

  it('with symmetry: unordered pairs of replacements with a totally symmetric product, checked by listing them', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 7 }), { minLength: 0, maxLength: 5 }), fc.array(fc.integer({ min: 0, max: 7 }), { minLength: 0, maxLength: 5 }), (occ, vir) => {
        const replacements: number[] = [];
        for (const i of occ) for (const a of vir) replacements.push(i ^ a);
        let pairs = 0;
        for (let x = 0; x < replacements.length; x++) {
          for (let y = x; y < replacements.length; y++) if ((replacements[x]! ^ replacements[y]!) === 0) pairs++;
        }
        const count = uccsdSpinAdaptedCountWithSymmetry(occ, vir);
        expect(count.doubles).toBe(pairs);
        expect(count.singles).toBe(replacements.filter((g) => g === 0).length);
      }),
      { seed: 99, numRuns: 100 },
    );
  });
});

describe('k-UpCCGSD (Lee et al. 2019)', () => {
  it('H2 (n = 2): 2 spin-conserving generalized singles + 1 paired double per layer (hand count)', () => {
    expect(kUpccgsdCount(2, 1)).toMatchObject({ singlesPerLayer: 2, doublesPerLayer: 1, perLayer: 3, total: 3 });
    expect(kUpccgsdCount(2, 3).total).toBe(9);
  });

  it('water in STO-3G (n = 7), k = 2: 2 × 3·7·6/2 = 126 (hand count); 84 with spin-paired singles', () => {
    expect(kUpccgsdCount(7, 2).total).toBe(126);
    expect(kUpccgsdCount(7, 2, { spinPairedSingles: true }).total).toBe(84);
  });

  it('grows as k·n² (the paper\'s O(kN²)): doubling n roughly quadruples the count', () => {
    const small = kUpccgsdCount(50, 4).total;
    const large = kUpccgsdCount(100, 4).total;
    expect(large / small).toBeGreaterThan(3.9);
    expect(large / small).toBeLessThan(4.1);
  });
});

describe('hardware-efficient ansatz', () => {
  it('Kandala et al. 2017 layout: q(3d + 2) angles (the paper\'s count, from memory)', () => {
    const model = hardwareEfficientModel(6, 1, 'euler');
    expect(model.parameters).toBe(30);
    expect(model.twoQubitGates).toBe(5); // one CNOT chain (our model of the entangler)
    expect(model.depth).toBe(2 + 1 * (3 + 5));
  });

  it('RY layers with CNOT chains: q(d+1) angles, d(q−1) CNOTs (common practice, no source)', () => {
    expect(hardwareEfficientModel(4, 3, 'ry')).toMatchObject({ parameters: 16, twoQubitGates: 9, depth: 4 + 9 });
  });

  it('one qubit has no entangler; zero blocks leave the first rotation layer only (the counts above at q = 1 and d = 0: Kandala et al. 2017; RY layers common practice)', () => {
    expect(hardwareEfficientModel(1, 4, 'euler')).toMatchObject({ twoQubitGates: 0, parameters: 14, depth: 14 });
    expect(hardwareEfficientModel(5, 0, 'ry')).toMatchObject({ twoQubitGates: 0, parameters: 5, depth: 1 });
  });
});
