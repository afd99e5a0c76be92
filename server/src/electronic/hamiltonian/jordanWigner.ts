/**
 * The Jordan–Wigner qubit Hamiltonian of an active space (P. Jordan, E. Wigner, Z. Phys. 47, 631
 * (1928)), built from symmetric spin-summed excitation operators so that every two-electron term
 * is one product of two short Pauli sums.
 *
 * Spin-orbital order (block): mode i is (orbital i, α) and mode n + i is (orbital i, β), orbitals
 * in the order of the active space; qubit q holds mode q. Under Jordan–Wigner
 *   a†_p a_q + a†_q a_p = ½ (X_p Z…Z X_q + Y_p Z…Z Y_q)   (p < q, Z on the modes between),
 *   2 a†_p a_p − 1      = −Z_p.
 *
 * Derivation. With spin-summed E_ij = Σ_σ a†_iσ a_jσ and real integrals, the Hamiltonian
 *   H = E_c + Σ h_ij E_ij + ½ Σ (ij|kl) (E_ij E_kl − δ_jk E_il)
 * only ever meets E_ij through its symmetric part, because h_ij = h_ji and (ij|kl) = (ji|kl) =
 * (ij|lk). Write ½(E_ij + E_ji) = F_ij + δ_ij, where
 *   F_ij = ½ Σ_σ (a†_iσ a_jσ + a†_jσ a_iσ) − δ_ij
 * is a sum of two (i = j: −½ Z_iα − ½ Z_iβ) or four (i ≠ j: ¼ XZ…ZX + ¼ YZ…ZY per spin) Hermitian
 * Pauli strings. Substituting and collecting:
 *   H = E′ + Σ_ij g_ij F_ij + ½ Σ_ijkl (ij|kl) F_ij F_kl
 *   E′   = E_c + Σ_i h_ii + ½ Σ_ik (ii|kk) − ½ Σ_ij (ij|ji)
 *   g_ij = h_ij + Σ_k (kk|ij) − ½ Σ_k (ik|kj)
 * With pairs P = (i ≥ j), weights w_P = 2 − δ_ij and (P|Q) = (Q|P), the two-electron part is
 *   Σ_{P<Q} w_P w_Q (P|Q) ½{F_P, F_Q} + ½ Σ_P w_P² (P|P) F_P²,
 * and for Pauli strings ½{A, B} is AB when they commute and 0 when they anticommute. So each pair of
 * pairs contributes at most 16 products of strings: O(n⁴/8) work and no operator algebra beyond
 * the product rule of pauli.ts.
 */
import type { ActiveSpaceIntegrals } from './activeSpace';
import { commutes, commutingProductSign } from './pauli';
import { PauliAccumulator } from './pauliTable';
import { pairIndex, pairPairIndex } from './pairs';

/** F_P of every pair P = (i ≥ j) as up to four strings. */
interface PairStrings {
  readonly count: Uint8Array;
  readonly x: Uint32Array;
  readonly z: Uint32Array;
  readonly c: Float64Array;
}

function pairStrings(n: number): PairStrings {
  const pairs = (n * (n + 1)) / 2;
  const count = new Uint8Array(pairs);
  const x = new Uint32Array(4 * pairs);
  const z = new Uint32Array(4 * pairs);
  const c = new Float64Array(4 * pairs);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      const P = pairIndex(i, j);
      let k = 4 * P;
      for (let spin = 0; spin < 2; spin++) {
        const low = j + spin * n;
        const high = i + spin * n;
        if (i === j) {
          x[k] = 0;
          z[k] = (1 << low) >>> 0;
          c[k++] = -0.5;
        } else {
          const between = (((1 << high) >>> 0) - ((1 << (low + 1)) >>> 0)) >>> 0;
          const ends = ((1 << low) | (1 << high)) >>> 0;
          x[k] = ends;
          z[k] = between;
          c[k++] = 0.25;
          x[k] = ends;
          z[k] = (between | ends) >>> 0;
          c[k++] = 0.25;
        }
      }
      count[P] = k - 4 * P;
    }
  }
  return { count, x, z, c };
}

/**
 * Accumulates the Jordan–Wigner strings of the active-space Hamiltonian (identity included) into
 * a table on 2n qubits; n ≤ 16.
 */
export function jordanWignerTable(integrals: ActiveSpaceIntegrals): PauliAccumulator {
  const n = integrals.orbitals;
  if (2 * n > 32) throw new RangeError(`Jordan–Wigner strings of ${n} orbitals need ${2 * n} qubits; the bit masks hold 32`);
  const h = integrals.oneBody;
  const eri = integrals.twoBody;
  const g = (i: number, j: number, k: number, l: number) => eri[pairPairIndex(pairIndex(i, j), pairIndex(k, l))]!;
  const pairs = (n * (n + 1)) / 2;
  const table = new PauliAccumulator(2 * n, Math.max(64, (pairs * pairs) / 2));

  // Constant E′ and the one-body coefficients g_ij.
  let constant = integrals.constant;
  for (let i = 0; i < n; i++) {
    constant += h[i * n + i]!;
    for (let k = 0; k < n; k++) constant += 0.5 * g(i, i, k, k) - 0.5 * g(i, k, k, i);
  }
  table.add(0, 0, constant);

  const F = pairStrings(n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let coefficient = h[i * n + j]!;
      for (let k = 0; k < n; k++) coefficient += g(k, k, i, j) - 0.5 * g(i, k, k, j);
      const P = pairIndex(i, j);
      const weight = i === j ? 1 : 2;
      for (let a = 4 * P; a < 4 * P + F.count[P]!; a++) table.add(F.x[a]!, F.z[a]!, weight * coefficient * F.c[a]!);
    }
  }

  // Two-electron part: pairs of pairs P ≤ Q.
  const weights = new Float64Array(pairs);
  for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) weights[pairIndex(i, j)] = i === j ? 1 : 2;
  for (let P = 0; P < pairs; P++) {
    const aEnd = 4 * P + F.count[P]!;
    for (let Q = P; Q < pairs; Q++) {
      const value = eri[pairPairIndex(P, Q)]!;
      if (value === 0) continue;
      const factor = (P === Q ? 0.5 : 1) * weights[P]! * weights[Q]! * value;
      const bEnd = 4 * Q + F.count[Q]!;
      for (let a = 4 * P; a < aEnd; a++) {
        const xa = F.x[a]!;
        const za = F.z[a]!;
        const ca = factor * F.c[a]!;
        for (let b = 4 * Q; b < bEnd; b++) {
          const xb = F.x[b]!;
          const zb = F.z[b]!;
          if (!commutes(xa, za, xb, zb)) continue;
          table.add((xa ^ xb) >>> 0, (za ^ zb) >>> 0, ca * F.c[b]! * commutingProductSign(xa, za, xb, zb));
        }
      }
    }
  }
  return table;
}
