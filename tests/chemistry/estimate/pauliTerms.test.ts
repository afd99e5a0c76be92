/**
 * Pauli-term counts (server/src/chemistry/estimate/pauliTerms.ts) against explicit operator algebra
 * (enumerate.ts): random integrals with 8-fold symmetry and the point-group selection rule, mapped
 * with Jordan–Wigner, Bravyi–Kitaev and parity encodings (Seeley, Richard & Love, J. Chem. Phys.
 * 137, 224109 (2012)) and the two-qubit reduction (Bravyi, Gambetta, Mezzacapo, Temme,
 * arXiv:1701.08213 (2017)), strings counted with |coefficient| > 1e-10.
 */
import { describe, expect, it } from 'vitest';
import { explicitPattern, irrepMasks, noSymmetryPattern, symmetryPattern, type IntegralPattern } from '../../../server/src/chemistry/estimate/integralPattern';
import { countByClasses, countByIrrepCountsExact, countBySymmetry, countPauliTerms, pauliTermsUnder } from '../../../server/src/chemistry/estimate/pauliTerms';
import { jordanWignerStrings } from '../../../server/src/chemistry/estimate/termClasses';
import {
  countNonzero,
  encodingMatrix,
  ladderSets,
  nonzeroKeys,
  qubitHamiltonian,
  random,
  randomIntegrals,
  reduceParity,
  type Encoding,
  type Integrals,
} from './enumerate';

function integralsFor(pattern: IntegralPattern, seed: number): Integrals {
  return randomIntegrals(pattern.orbitals, (i, j) => pattern.allowedOneBody(i, j), (i, j, k, l) => pattern.allowed(i, j, k, l), seed);
}

function randomIrreps(n: number, generators: number, seed: number): number[] {
  const next = random(seed);
  return Array.from({ length: n }, () => Math.floor(next() * 2 ** generators));
}

/** Irrep patterns tried for each size: C1, two C2v-like (2 generators) and two D2h (3 generators). */
function patternsFor(n: number): { name: string; irreps: number[] }[] {
  return [
    { name: 'C1', irreps: new Array<number>(n).fill(0) },
    { name: 'C2v-like a', irreps: randomIrreps(n, 2, 100 + n) },
    { name: 'C2v-like b', irreps: randomIrreps(n, 2, 200 + n) },
    { name: 'D2h a', irreps: randomIrreps(n, 3, 300 + n) },
    { name: 'D2h b', irreps: Array.from({ length: n }, (_, i) => (i * 5) % 8) },
  ];
}

const SECTORS: readonly [number, number][] = [
  [0, 0],
  [1, 0],
  [0, 1],
  [1, 1],
];

describe('H2 in STO-3G (orbitals Ag and B1u of D2h)', () => {
  const h2 = symmetryPattern(irrepMasks('D2h', ['Ag', 'B1u']));

  it('has 15 Pauli strings under Jordan–Wigner, identity included (Seeley, Richard & Love 2012)', () => {
    expect(countPauliTerms(h2).jordanWigner).toBe(15); // Seeley, Richard & Love, J. Chem. Phys. 137, 224109 (2012), H2 example
    expect(countNonzero(qubitHamiltonian(integralsFor(h2, 1), 'jordan-wigner', 'block'))).toBe(15); // same source
  });

  it('has 15 under Bravyi–Kitaev as well (Seeley, Richard & Love 2012 list the 15 Bravyi–Kitaev terms of H2)', () => {
    expect(countPauliTerms(h2).bravyiKitaev).toBe(15); // Seeley et al. 2012, H2 under Bravyi–Kitaev
    expect(countNonzero(qubitHamiltonian(integralsFor(h2, 2), 'bravyi-kitaev', 'block'))).toBe(15); // same source
  });

  it('has 5 on the two qubits of the reduced parity mapping in the 1α 1β sector: I, Z0, Z1, Z0Z1, X0X1', () => {
    // 5 strings: from memory (Kandala et al., Nature 549, 242 (2017), the two-qubit H2 Hamiltonian).
    expect(pauliTermsUnder('parity', h2, { alpha: 1, beta: 1 })).toBe(5);
    const reduced = reduceParity(qubitHamiltonian(integralsFor(h2, 3), 'parity', 'block'), 1, 1);
    expect(countNonzero(reduced)).toBe(5);
    // X0X1: x = 0b11, z = 0 in the key x·2^2 + z of the enumerator.
    expect(nonzeroKeys(reduced).has(3 * 4 + 0)).toBe(true);
  });
});

describe('larger molecules in STO-3G (Jordan–Wigner)', () => {
  it('LiH (C2v: 4 a1, 1 b1, 1 b2) has 631 strings and H2O (1a1 2a1 1b2 3a1 1b1 4a1 2b2) has 1086', () => {
    // 631 and 1086: from memory (Verteletskyi, Yen & Izmaylov, J. Chem. Phys. 152, 124114 (2020),
    // their table of molecular Hamiltonians); orbital irreps from memory.
    expect(countPauliTerms(symmetryPattern(irrepMasks('C2v', ['A1', 'A1', 'A1', 'B1', 'B2', 'A1']))).jordanWigner).toBe(631);
    expect(countPauliTerms(symmetryPattern(irrepMasks('C2v', ['A1', 'A1', 'B2', 'A1', 'B1', 'A1', 'B2']))).jordanWigner).toBe(1086);
  });
});

describe('Bravyi–Kitaev sets (Seeley, Richard & Love 2012)', () => {
  it('gives the update, parity and flip sets for 8 modes', () => {
    const mask = (qubits: number[]) => qubits.reduce((m, q) => m | (1 << q), 0);
    // Update / parity / flip sets for n = 8: from memory of Seeley et al. 2012 (their table of sets),
    // re-derived by hand from the β-matrix definition.
    const expected: [number[], number[], number[]][] = [
      [[1, 3, 7], [], []],
      [[3, 7], [0], [0]],
      [[3, 7], [1], []],
      [[7], [1, 2], [1, 2]],
      [[5, 7], [3], []],
      [[7], [3, 4], [4]],
      [[7], [3, 5], []],
      [[], [3, 5, 6], [3, 5, 6]],
    ];
    expected.forEach(([update, parity, flip], j) => {
      expect(ladderSets('bravyi-kitaev', 8, j)).toEqual({ update: mask(update), parity: mask(parity), flip: mask(flip), remainder: mask(parity) & ~mask(flip) });
    });
  });

  it('parity encoding: update set above j, parity set {j − 1} (Seeley et al. 2012)', () => {
    expect(ladderSets('parity', 6, 3)).toEqual({ update: 0b110000, parity: 0b000100, flip: 0b000100, remainder: 0 }); // Seeley et al. 2012, parity basis
    expect(encodingMatrix('jordan-wigner', 3)).toEqual([1, 2, 4]); // Jordan–Wigner stores occupations (Seeley et al. 2012)
  });
});

describe('counts against explicit operator algebra', () => {
  for (let n = 1; n <= 5; n++) {
    for (const { name, irreps } of patternsFor(n)) {
      it(`n = ${n}, ${name} [${irreps.join(' ')}]: all mappings, both orderings, all reduced-parity sectors`, () => {
        const pattern = symmetryPattern(irreps);
        const counts = countPauliTerms(pattern);
        const integrals = integralsFor(pattern, 1000 * n + irreps.reduce((a, b) => 3 * a + b, 0));
        const jw = qubitHamiltonian(integrals, 'jordan-wigner', 'block');
        expect(countNonzero(jw)).toBe(counts.jordanWigner);
        expect(countNonzero(qubitHamiltonian(integrals, 'jordan-wigner', 'interleaved'))).toBe(counts.jordanWigner);
        expect(countNonzero(qubitHamiltonian(integrals, 'bravyi-kitaev', 'block'))).toBe(counts.bravyiKitaev);
        expect(countNonzero(qubitHamiltonian(integrals, 'bravyi-kitaev', 'interleaved'))).toBe(counts.bravyiKitaev);
        const parity = qubitHamiltonian(integrals, 'parity', 'block');
        expect(countNonzero(parity)).toBe(counts.parityUnreduced);
        for (const [alpha, beta] of SECTORS) {
          const expected = countNonzero(reduceParity(parity, alpha, beta));
          expect(countPauliTerms(pattern, { alpha, beta }).parity).toBe(expected);
          expect(countPauliTerms(pattern, { alpha: alpha + 2, beta: beta + 2 }).parity).toBe(expected);
        }
        expect(countByClasses(pattern)).toBe(counts.jordanWigner);
      });
    }
  }

  for (const { name, irreps } of patternsFor(6).filter((_, index) => index !== 2)) {
    it(`n = 6, ${name}: Jordan–Wigner, Bravyi–Kitaev, parity and reduced parity`, () => {
      const pattern = symmetryPattern(irreps);
      const counts = countPauliTerms(pattern, { alpha: 3, beta: 2 });
      const integrals = integralsFor(pattern, 6000 + irreps.reduce((a, b) => 3 * a + b, 0));
      expect(countNonzero(qubitHamiltonian(integrals, 'jordan-wigner', 'block'))).toBe(counts.jordanWigner);
      expect(countNonzero(qubitHamiltonian(integrals, 'bravyi-kitaev', 'block'))).toBe(counts.bravyiKitaev);
      const parity = qubitHamiltonian(integrals, 'parity', 'block');
      expect(countNonzero(parity)).toBe(counts.parityUnreduced);
      expect(countNonzero(reduceParity(parity, 3, 2))).toBe(counts.parity);
    });
  }
});

describe('structure of the strings', () => {
  it('the generated Jordan–Wigner strings are exactly the nonzero strings of the operator, in both orderings', () => {
    for (const n of [2, 3, 4]) {
      for (const { irreps } of patternsFor(n)) {
        const pattern = symmetryPattern(irreps);
        const integrals = integralsFor(pattern, 77 + n);
        for (const ordering of ['block', 'interleaved'] as const) {
          const strings = jordanWignerStrings(pattern, ordering);
          const generated = new Set<number>();
          for (let s = 0; s < strings.length; s++) generated.add(strings.x[s]! * 2 ** strings.qubits + strings.z[s]!);
          expect(generated.size).toBe(strings.length); // no string generated twice
          expect([...generated].sort((a, b) => a - b)).toEqual([...nonzeroKeys(qubitHamiltonian(integrals, 'jordan-wigner', ordering))].sort((a, b) => a - b));
        }
      }
    }
  });

  it('Jordan–Wigner strings of one Hamiltonian differ between orderings while their number does not', () => {
    const pattern = noSymmetryPattern(3);
    const block = jordanWignerStrings(pattern, 'block');
    const interleaved = jordanWignerStrings(pattern, 'interleaved');
    const keys = (s: typeof block) => new Set(Array.from(s.x, (x, i) => x * 64 + s.z[i]!));
    expect(block.length).toBe(interleaved.length);
    expect(keys(block)).not.toEqual(keys(interleaved));
  });

  it('explicit predicates: random sparsity with 8-fold symmetry matches the operator algebra', () => {
    for (const n of [2, 3, 4, 5]) {
      for (const seed of [1, 2, 3]) {
        // A random 8-fold-symmetric sparsity: (ij|kl) kept when a hash of its canonical index set
        // passes; diagonal h_ii and (ii|ii) always kept, as for real orbitals.
        const keep = (values: number[]) => {
          const next = random(values.reduce((a, b) => a * 31 + b, seed * 977));
          next();
          return next() < 0.6;
        };
        const canonical = (i: number, j: number, k: number, l: number) => {
          const a = [Math.min(i, j), Math.max(i, j)];
          const b = [Math.min(k, l), Math.max(k, l)];
          return a[0]! < b[0]! || (a[0] === b[0] && a[1]! <= b[1]!) ? [...a, ...b] : [...b, ...a];
        };
        const pattern = explicitPattern(
          n,
          (i, j) => i === j || keep([Math.min(i, j), Math.max(i, j), 99]),
          (i, j, k, l) => (i === j && j === k && k === l) || keep(canonical(i, j, k, l)),
        );
        const integrals = integralsFor(pattern, seed * 13 + n);
        const counts = countPauliTerms(pattern);
        expect(countNonzero(qubitHamiltonian(integrals, 'jordan-wigner', 'block'))).toBe(counts.jordanWigner);
        expect(countNonzero(qubitHamiltonian(integrals, 'bravyi-kitaev', 'interleaved'))).toBe(counts.jordanWigner);
        const parity = qubitHamiltonian(integrals, 'parity', 'block');
        for (const [alpha, beta] of SECTORS) {
          expect(countPauliTerms(pattern, { alpha, beta }).parity).toBe(countNonzero(reduceParity(parity, alpha, beta)));
        }
      }
    }
  });

  it('the closed form under the selection rule equals the class walk', () => {
    for (let n = 1; n <= 14; n++) {
      for (const generators of [0, 1, 2, 3]) {
        const irreps = randomIrreps(n, generators, 17 * n + generators);
        expect(countBySymmetry(irreps)).toBe(countByClasses(explicitPattern(n, symmetryPattern(irreps).allowedOneBody, symmetryPattern(irreps).allowed)));
      }
    }
  });

  it('C1 follows 1 + 2n + n(2n−1) + 4·C(n,2)(2n−1) + 4·C(n,2)² + 12·C(n,4) (derived in pauliTerms.ts)', () => {
    const choose = (m: number, k: number) => {
      let r = 1;
      for (let i = 0; i < k; i++) r = (r * (m - i)) / (i + 1);
      return r;
    };
    for (const n of [1, 2, 7, 50]) {
      const pairs = choose(n, 2);
      const formula = 1 + 2 * n + n * (2 * n - 1) + 4 * pairs * (2 * n - 1) + 4 * pairs * pairs + 12 * choose(n, 4);
      expect(countPauliTerms(noSymmetryPattern(n)).jordanWigner).toBe(formula);
    }
    // n = 2: 27 strings, checked against the operator algebra above (the fixture of this file,
    // enumerate.ts); by construction also a hand count (no outside source):
    // 11 diagonal + 12 hops (2 spins × 2 strings × 3 Z choices) + 4 pair-pair strings.
    expect(countPauliTerms(noSymmetryPattern(2)).jordanWigner).toBe(27);
  });

  it('large registers: 100 qubits (n = 50) by closed form and by class walk agree', () => {
    const irreps = Array.from({ length: 50 }, (_, i) => i % 8);
    const pattern = symmetryPattern(irreps);
    const viaWalk = countByClasses(explicitPattern(50, pattern.allowedOneBody, pattern.allowed));
    expect(countPauliTerms(pattern).jordanWigner).toBe(viaWalk);
    expect(countPauliTerms(pattern, { alpha: 5, beta: 5 }).parity).toBe(viaWalk);
  });
});

describe('class walk without the pair-pair table', () => {
  it('n = 110 (past the 32 MB table limit) calls the predicate directly and still matches the closed form', () => {
    const irreps = Array.from({ length: 110 }, (_, i) => (i * 3) % 8);
    const pattern = symmetryPattern(irreps);
    expect(countByClasses(explicitPattern(110, pattern.allowedOneBody, pattern.allowed))).toBe(countBySymmetry(irreps));
  });
});

describe('two-qubit reduction of the parity mapping', () => {
  it('merges strings only for n ≤ 4: reduced = full for n ≥ 5 in every sector (operator algebra, n = 5)', () => {
    const pattern = noSymmetryPattern(5);
    const parity = qubitHamiltonian(integralsFor(pattern, 5), 'parity', 'block');
    const full = countNonzero(parity);
    for (const [alpha, beta] of SECTORS) expect(countNonzero(reduceParity(parity, alpha, beta))).toBe(full);
  });

  // Observed with the operator algebra (enumerate.ts, the reference of this file) when the
  // reduction was written; by construction of the Bravyi et al. 2017 reduction for n ≤ 4.
  it('does merge for n = 3 and n = 4, and for n = 2 and 4 the count depends on the sector', () => {
    const n3 = countPauliTerms(noSymmetryPattern(3));
    expect(Math.max(...n3.paritySectors)).toBeLessThan(n3.jordanWigner);
    expect(new Set(n3.paritySectors).size).toBe(1);
    const n4 = countPauliTerms(noSymmetryPattern(4));
    expect(Math.max(...n4.paritySectors)).toBeLessThan(n4.jordanWigner);
    expect(new Set(n4.paritySectors).size).toBeGreaterThan(1);
    const n2 = countPauliTerms(noSymmetryPattern(2));
    expect(new Set(n2.paritySectors).size).toBeGreaterThan(1);
  });

  it('every parity-mapped string has I or Z on the two parity qubits (else reduceParity throws)', () => {
    const pattern = symmetryPattern([0, 1, 0]);
    const parity = qubitHamiltonian(integralsFor(pattern, 9), 'parity', 'block');
    expect(() => reduceParity(parity, 2, 2)).not.toThrow();
    // The same check fails on Bravyi–Kitaev strings for n = 3, where qubits 2 and 5 hold f_2 and
    // f_4 + f_5 rather than the N_α and N parities (Seeley et al. 2012 β matrix).
    const bk = qubitHamiltonian(integralsFor(pattern, 9), 'bravyi-kitaev', 'block');
    expect(() => reduceParity(bk, 2, 2)).toThrow();
  });
});

describe('counts beyond 2^53', () => {
  // By construction: the closed form 1 + 2n + n(2n − 1) + 4 C(n,2)(2n − 1) + 4 C(n,2)² + 12 C(n,4) in
  // exact integers for n = 10,000 orbitals without symmetry (checked with Python's math.comb).
  it('are exact: n = 10,000 orbitals in C1 have 14,999,000,250,000,001 terms, not the nearest double', () => {
    const exact = countByIrrepCountsExact([10_000, 0, 0, 0, 0, 0, 0, 0]);
    expect(exact).toBe(14_999_000_250_000_001n);
    expect(exact > BigInt(Number.MAX_SAFE_INTEGER)).toBe(true);
    expect(countPauliTerms(symmetryPattern(new Uint8Array(12))).exact.full).toBe(BigInt(countBySymmetry(new Uint8Array(12))));
  });
});
