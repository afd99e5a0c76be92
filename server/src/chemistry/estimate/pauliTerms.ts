/**
 * Number of distinct Pauli strings with a nonzero coefficient in the qubit Hamiltonian of an active
 * space, identity included, counted from the structure of the Hamiltonian (see termClasses.ts)
 * without building the operator.
 *
 * Mappings:
 *  • Jordan–Wigner (Jordan & Wigner, Z. Phys. 47, 631 (1928)), Bravyi–Kitaev (Bravyi & Kitaev,
 *    Ann. Phys. 298, 210 (2002); Seeley, Richard & Love, J. Chem. Phys. 137, 224109 (2012)) and the
 *    unreduced parity mapping (Seeley et al. 2012) on 2n qubits give the same count, and the count
 *    does not depend on the order of the spin orbitals on the register: each mapping sends every
 *    product of Majorana operators to one Pauli string and distinct products to distinct strings,
 *    so all of them count the Majorana monomials of H. (The three are related by CNOT networks of
 *    the same mode order, Seeley et al. 2012.) Block order — all α then all β — is used throughout.
 *  • Parity mapping with the two-qubit reduction (S. Bravyi, J. M. Gambetta, A. Mezzacapo,
 *    K. Temme, arXiv:1701.08213 (2017)): in block order qubits n−1 and 2n−1 hold the parities of
 *    N_α and N, every string has I or Z on them, and fixing their eigenvalues merges strings that
 *    differ only there. Under the CNOT change of basis those two Z's are the Jordan–Wigner parity
 *    strings P_α = Π_{α} Z and P_α P_β, so the reduced strings are the classes of monomials under
 *    multiplication by {1, P_α, P_β, P_α P_β}. A monomial of H has at most four Majoranas, and
 *    multiplying by P_σ replaces its σ part (at most four of the 2n σ-Majoranas) by the complement,
 *    so two monomials of H can share a class only when 2n ≤ 8, i.e. n ≤ 4 (n ≤ 2 for P_α P_β).
 *    For n ≥ 5 the reduced count equals the full count. For n ≤ 4 classes do merge, and a merged
 *    class can cancel in a given sector: when a monomial's support covers every mode of spin σ,
 *    its partner monomial in the class differs from it by P_σ, and the pair survives only when
 *    N_σ has the parity the term needs (odd for a hop, n = 2; even for a quartet, n = 4). With
 *    n = 1 the reduced register is empty and the single term is the sector's energy, zero in the
 *    empty sector. With n = 3 and explicit predicates a hop class can also vanish when N_σ is odd
 *    (see hopSurvivesOddSector); the selection rule never allows that. The tests check all four
 *    sectors against explicit operator algebra.
 *
 * Counts assume generic integrals: every integral the pattern allows is nonzero and distinct
 * integrals do not cancel each other. For n ≤ 4 the reduced-parity count also assumes nonzero
 * diagonal integrals h_ii and (ii|ii), as real orbitals always have (without them a few more
 * classes can cancel in small sectors). The full-register counts need no such assumption.
 */
import { mappingKey, type Mapping } from '../qubits';
import type { IntegralPattern } from './integralPattern';
import { jordanWignerStrings, walkTermClasses } from './termClasses';

export interface ElectronCount {
  readonly alpha: number;
  readonly beta: number;
}

export interface PauliTermCounts {
  /** Spatial orbitals n. */
  readonly orbitals: number;
  /** Jordan–Wigner, 2n qubits; distinct Pauli strings with nonzero coefficient, identity included. */
  readonly jordanWigner: number;
  /** Bravyi–Kitaev, 2n qubits; equal to Jordan–Wigner. */
  readonly bravyiKitaev: number;
  /** Parity mapping before the two-qubit reduction, 2n qubits; equal to Jordan–Wigner. */
  readonly parityUnreduced: number;
  /**
   * Parity mapping with the two-qubit reduction, 2n − 2 qubits, in the sector of the electron count
   * given; without one, the largest over the four sectors. Equals the full count for n ≥ 5.
   */
  readonly parity: number;
  /** Reduced parity count per sector, indexed (N_α mod 2) + 2 (N_β mod 2). */
  readonly paritySectors: readonly [number, number, number, number];
  /**
   * The full-register and the reduced parity counts exactly: the numbers above are the nearest
   * doubles, exact only up to 2^53 (reached near n = 10,000 orbitals without symmetry).
   */
  readonly exact: { readonly full: bigint; readonly parity: bigint };
}

/** All counts for an active space. Takes O(n) under the symmetry rule, O(n⁴) for explicit predicates. */
export function countPauliTerms(pattern: IntegralPattern, electrons?: ElectronCount): PauliTermCounts {
  const n = pattern.orbitals;
  const exactFull = pattern.irreps !== undefined ? countBySymmetryExact(pattern.irreps) : BigInt(countByClasses(pattern));
  const full = Number(exactFull);
  const sectors: [number, number, number, number] = n >= 5 ? [full, full, full, full] : reducedParitySmall(pattern);
  let parity: number;
  if (electrons !== undefined) {
    const sector = (electrons.alpha & 1) + 2 * (electrons.beta & 1);
    parity = sectors[sector]!;
  } else {
    parity = Math.max(...sectors);
  }
  return { orbitals: n, jordanWigner: full, bravyiKitaev: full, parityUnreduced: full, parity, paritySectors: sectors, exact: { full: exactFull, parity: n >= 5 ? exactFull : BigInt(parity) } };
}

/** The count for one mapping (the parity mapping is the reduced one, as in qubits.ts). */
export function pauliTermsUnder(mapping: Mapping, pattern: IntegralPattern, electrons?: ElectronCount): number {
  return countPauliTerms(pattern, electrons)[mappingKey(mapping)];
}

/** Full-register count from the class walk, for any pattern. */
export function countByClasses(pattern: IntegralPattern): number {
  let count = 0;
  walkTermClasses(pattern, {
    diagonal() {
      count += 1;
    },
    hop() {
      count += 2;
    },
    pairPair() {
      count += 4;
    },
    quartet(_a, _b, _c, _d, present) {
      count += 2 * ((present & 1) + ((present >> 1) & 1) + ((present >> 2) & 1));
    },
  });
  return count;
}

/**
 * Closed form under the point-group selection rule, with c_g orbitals of irrep g:
 *   1 + 2n + n(2n − 1)                 identity, Z_p, Z_p Z_q (diagonal integrals always allowed)
 * + 4 S (2n − 1)                       hops: S = Σ_g C(c_g, 2) same-irrep pairs, 2 spins × 2 strings
 *                                      × (D = ∅, D = any of the n modes of the other spin, or any of
 *                                      the n − 2 other modes of the same spin)
 * + 4 Σ_x P_x²                         pair-pairs: P_x orbital pairs whose irrep product is x
 * + 12 Q                               quartets: Q sets of four orbitals with product 0, 2 spins × 6.
 */
export function countBySymmetry(irreps: ArrayLike<number>): number {
  return Number(countBySymmetryExact(irreps));
}

/** The closed form in exact integer arithmetic. */
export function countBySymmetryExact(irreps: ArrayLike<number>): bigint {
  const counts = new Float64Array(8);
  for (let i = 0; i < irreps.length; i++) counts[irreps[i]!]! += 1;
  return countByIrrepCountsExact(counts);
}

/** The same closed form from the number of orbitals of each irrep (index = mask 0–7) alone. */
export function countByIrrepCounts(counts: ArrayLike<number>): number {
  return Number(countByIrrepCountsExact(counts));
}

/**
 * The closed form in BigInt arithmetic: its terms grow as n⁴ and pass 2^53 near n = 10,000
 * orbitals without symmetry, beyond which doubles would drop the last digits.
 */
export function countByIrrepCountsExact(counts: ArrayLike<number>): bigint {
  const c = Array.from({ length: 8 }, (_, g) => BigInt(counts[g] ?? 0));
  let n = 0n;
  for (let g = 0; g < 8; g++) n += c[g]!;
  if (n === 0n) return 0n;
  const present: number[] = [];
  for (let g = 0; g < 8; g++) if (c[g]! > 0n) present.push(g);

  let sameIrrepPairs = 0n;
  for (const g of present) sameIrrepPairs += (c[g]! * (c[g]! - 1n)) / 2n;

  // Orbital pairs a < b by product irrep.
  const pairsByProduct = Array.from({ length: 8 }, () => 0n);
  for (let s = 0; s < present.length; s++) {
    const g = present[s]!;
    pairsByProduct[0] = pairsByProduct[0]! + (c[g]! * (c[g]! - 1n)) / 2n;
    for (let t = s + 1; t < present.length; t++) {
      const h = present[t]!;
      pairsByProduct[g ^ h] = pairsByProduct[g ^ h]! + c[g]! * c[h]!;
    }
  }
  let pairPairs = 0n;
  for (let x = 0; x < 8; x++) pairPairs += pairsByProduct[x]! * pairsByProduct[x]!;

  // Four-orbital subsets with product 0: choose t orbitals of each irrep, Σt = 4, XOR of the irreps
  // taken an odd number of times = 0.
  let ways = Array.from({ length: 5 * 8 }, () => 0n);
  ways[0] = 1n;
  for (const g of present) {
    const next = Array.from({ length: 5 * 8 }, () => 0n);
    const cg = c[g]!;
    for (let size = 0; size <= 4; size++) {
      for (let x = 0; x < 8; x++) {
        const w = ways[size * 8 + x]!;
        if (w === 0n) continue;
        let choose = 1n;
        for (let t = 0; t + size <= 4 && BigInt(t) <= cg; t++) {
          if (t > 0) choose = (choose * (cg - BigInt(t) + 1n)) / BigInt(t);
          const at = (size + t) * 8 + (t & 1 ? x ^ g : x);
          next[at] = next[at]! + w * choose;
        }
      }
    }
    ways = next;
  }
  const quartets = ways[4 * 8]!;

  return 1n + 2n * n + n * (2n * n - 1n) + 4n * sameIrrepPairs * (2n * n - 1n) + 4n * pairPairs + 12n * quartets;
}

/**
 * Reduced parity counts for n ≤ 4 in the four sectors, from the explicit Jordan–Wigner strings
 * (at most 8 qubits): classes under z ↦ z ⊕ P_α, z ⊕ P_β; a class counts in a sector when one of
 * its strings survives there (see the module comment).
 */
function reducedParitySmall(pattern: IntegralPattern): [number, number, number, number] {
  const n = pattern.orbitals;
  if (n <= 0) return [0, 0, 0, 0];
  const strings = jordanWignerStrings(pattern, 'block');
  if (n === 1) {
    // Zero qubits: one term, the energy of the sector's only determinant; the empty one has none.
    const one = strings.length > 0 ? 1 : 0;
    return [0, one, one, one];
  }
  const alphaModes = 2 ** n - 1;
  const betaModes = alphaModes * 2 ** n;
  const result: [number, number, number, number] = [0, 0, 0, 0];
  for (let sector = 0; sector < 4; sector++) {
    const alphaOdd = sector & 1;
    const betaOdd = sector >> 1;
    const classes = new Set<number>();
    for (let s = 0; s < strings.length; s++) {
      const x = strings.x[s]!;
      const z = strings.z[s]!;
      // A support covering every mode of spin σ pairs this string with its P_σ partner; the pair
      // survives only when N_σ mod 2 equals (n/2) mod 2 (odd for a hop when n = 2, even for a
      // quartet when n = 4).
      const need = (n / 2) & 1;
      if ((x & alphaModes) === alphaModes && alphaOdd !== need) continue;
      if ((x & betaModes) === betaModes && betaOdd !== need) continue;
      if (n === 3 && !hopSurvivesOddSector(pattern, x, z, alphaOdd, betaOdd)) continue;
      const key = Math.min(z, z ^ alphaModes, z ^ betaModes, z ^ alphaModes ^ betaModes);
      classes.add(x * 256 + key);
    }
    result[sector] = classes.size;
  }
  return result;
}

/**
 * n = 3: a hop between orbitals i and k of spin σ with D = ∅ shares its class with the same hop
 * with Z on the third σ mode l (P_σ = Z_i Z_k Z_l). On the hop's support Z_i Z_k = −1, so Z_l is
 * fixed by N_σ, and with N_σ odd (l empty) the class coefficient is the D = ∅ coefficient minus
 * the n_l part: h_ik + ½ Σ_j (ik|jj), the sum from the other spin. It vanishes when the pattern
 * forbids all of these, which the selection rule never does (they share the irrep product Γi ⊕ Γk
 * with the (il|lk) that put the strings there) but an explicit predicate can.
 */
function hopSurvivesOddSector(pattern: IntegralPattern, x: number, z: number, alphaOdd: number, betaOdd: number): boolean {
  const alphaModes = 0b000111;
  const betaModes = 0b111000;
  for (const [modes, odd, other] of [
    [alphaModes, alphaOdd, betaModes],
    [betaModes, betaOdd, alphaModes],
  ] as const) {
    if (odd === 0 || (x & modes) !== x || (z & other) !== 0 || x === 0) continue;
    const orbitals = modes === alphaModes ? x : x >> 3;
    if (orbitals === 0b111 || (orbitals & (orbitals - 1)) === 0) continue;
    const i = orbitals & 1 ? 0 : 1;
    const k = orbitals & 4 ? 2 : 1;
    if (pattern.allowedOneBody(i, k)) return true;
    for (let j = 0; j < 3; j++) if (pattern.allowed(i, k, j, j)) return true;
    return false;
  }
  return true;
}
