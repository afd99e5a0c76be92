/**
 * Structure of the Pauli strings of the molecular Hamiltonian
 *
 *   H = Σ h_pq a†_p a_q + ½ Σ ⟨pq|rs⟩ a†_p a†_q a_s a_r
 *
 * over 2n spin orbitals built from n real spatial orbitals, without building the operator.
 *
 * Majorana picture. Write a_p = (c_p + i d_p)/2 with Hermitian Majorana operators c_p, d_p. Every
 * product of distinct Majoranas maps to one Pauli string (up to a phase) under Jordan–Wigner
 * (P. Jordan, E. Wigner, Z. Phys. 47, 631 (1928)), Bravyi–Kitaev (S. Bravyi, A. Kitaev, Ann. Phys.
 * 298, 210 (2002)) and the parity mapping (J. T. Seeley, M. J. Richard, P. J. Love, J. Chem. Phys.
 * 137, 224109 (2012)), and distinct products map to distinct strings: each of these mappings sends
 * the 4n Majoranas to Pauli strings that generate the Pauli group on 2n qubits with the same
 * anticommutation pattern. So the number of Pauli strings is the number of Majorana monomials with
 * a nonzero coefficient — the same for the three mappings and for any ordering of the spin
 * orbitals. The tests check this against explicit operator algebra.
 *
 * A monomial is described by its support E (modes carrying exactly one Majorana: the X/Y support
 * under Jordan–Wigner), the set D of modes carrying both (c_p d_p ∝ Z_p) and which Majorana, c or d,
 * sits on each mode of E. The Hamiltonian conserves N_α and N_β and is real, and its monomials are
 * (the derivation expands each operator product into Majoranas; number operators n_q = (1 − Z_q)/2):
 *
 *  • E = ∅ ("diagonal"): the identity, Z_p, Z_p Z_q.
 *  • E = {p, r}, both of spin σ (a "hop"), D = ∅ or D = {q}: two monomials c_p d_r and d_p c_r
 *    (X X and Y Y under Jordan–Wigner) with opposite coefficients, from h_pr a†_p a_r and
 *    ⟨pq|rq⟩ a†_p n_q a_r. For p = (i,σ), r = (k,σ), q = (j,τ) the coefficient of the D = {q} pair
 *    is −½[(ik|jj) − δ_στ (ij|jk)], and of the D = ∅ pair h_ik + ½ Σ_q [(ik|jj) − δ_στ (ij|jk)].
 *  • E = {pα, rα, sβ, tβ} ("pair-pair"), D = ∅: (ab|cd) (a†_a a_b + a†_b a_a)_α (a†_c a_d + a†_d a_c)_β,
 *    four monomials with one c and one d in each spin, all with the one integral (ab|cd).
 *  • E = {a, b, c, d} of one spin ("quartet"), D = ∅: the six monomials with two c and two d. With
 *    X = (ab|cd), Y = (ac|bd), W = (ad|bc) the monomials with d on {a,c} or {b,d} have coefficient
 *    ∝ X − W, on {a,b} or {c,d} ∝ Y − W, on {a,d} or {b,c} ∝ X − Y: the monomial whose d-set pairs
 *    the four orbitals as (T | complement) does not contain that pairing's integral. The two
 *    monomials with four c or four d vanish identically.
 *
 * "Nonzero" is generic: a coefficient counts when at least one of the distinct integrals in it is
 * allowed by the pattern (distinct integrals are taken as independent values).
 */
import type { IntegralPattern } from './integralPattern';

/** Receives the classes of Majorana monomials. Modes use block numbering: (i, α) = i, (i, β) = n + i. */
export interface TermClassVisitor {
  /** E = ∅ with Z on the modes p and q (−1 for none; both −1 is the identity). One string. */
  diagonal(p: number, q: number): void;
  /** Same-spin hop between modes p < r with Z on mode z (−1 for none). Two strings. */
  hop(p: number, r: number, z: number): void;
  /** α modes p < r and β modes s < t. Four strings. */
  pairPair(p: number, r: number, s: number, t: number): void;
  /**
   * Same-spin modes a < b < c < d. `present` bit 0: the two monomials with d on {a,b} or {c,d};
   * bit 1: on {a,c} or {b,d}; bit 2: on {a,d} or {b,c}. Two strings per set bit.
   */
  quartet(a: number, b: number, c: number, d: number, present: number): void;
}

/** Largest table of pair-pair flags kept in memory (32 MB, n ≈ 105); beyond it the predicate is called directly. */
const MAX_TABLE_BYTES = 2 ** 25;

/**
 * Two-electron allowedness for every pair of orbital pairs, (ij|kl) with i ≤ j and k ≤ l, filled
 * once so the loops below call the caller's predicate O(n⁴/8) times and then read a byte array.
 */
class PairPairTable {
  readonly pairs: number;
  private readonly bits: Uint8Array | undefined;

  constructor(private readonly pattern: IntegralPattern) {
    const n = pattern.orbitals;
    this.pairs = (n * (n + 1)) / 2;
    if (this.pairs * this.pairs > MAX_TABLE_BYTES) {
      this.bits = undefined;
      return;
    }
    const bits = new Uint8Array(this.pairs * this.pairs);
    this.bits = bits;
    for (let j = 0; j < n; j++) {
      for (let i = 0; i <= j; i++) {
        const left = PairPairTable.index(i, j);
        for (let l = 0; l < n; l++) {
          for (let k = 0; k <= l; k++) {
            const right = PairPairTable.index(k, l);
            if (right < left) continue;
            const value = pattern.allowed(i, j, k, l) ? 1 : 0;
            bits[left * this.pairs + right] = value;
            bits[right * this.pairs + left] = value;
          }
        }
      }
    }
  }

  static index(i: number, j: number): number {
    return i <= j ? (j * (j + 1)) / 2 + i : (i * (i + 1)) / 2 + j;
  }

  /** (ij|kl) allowed. */
  get(i: number, j: number, k: number, l: number): boolean {
    if (this.bits === undefined) return this.pattern.allowed(i, j, k, l);
    return this.bits[PairPairTable.index(i, j) * this.pairs + PairPairTable.index(k, l)] === 1;
  }
}

/** Visits every class of nonzero monomials of the Hamiltonian for the given integral pattern. */
export function walkTermClasses(pattern: IntegralPattern, visitor: TermClassVisitor): void {
  const n = pattern.orbitals;
  if (n <= 0) return;
  const eri = new PairPairTable(pattern);
  const oneBody = (i: number, j: number) => pattern.allowedOneBody(i, j);

  // E = ∅. Coefficients (n_p = (1 − Z_p)/2): identity ½Σh_ii + ¼Σ[(ii|jj)…]; Z_p with p = (i,σ):
  // −½h_ii − ¼[(ii|ii) + Σ_{j≠i} (2(ii|jj) − (ij|ji))]; Z_p Z_q: ¼[(ii|jj) − δ_στ (ij|ji)].
  let anyDiagonal = false;
  const zSingle = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    let z = oneBody(i, i) || eri.get(i, i, i, i);
    for (let j = 0; j < n && !z; j++) if (j !== i && (eri.get(i, i, j, j) || eri.get(i, j, j, i))) z = true;
    zSingle[i] = z ? 1 : 0;
    if (z) anyDiagonal = true;
  }
  if (anyDiagonal) visitor.diagonal(-1, -1);
  for (let i = 0; i < n; i++) {
    if (zSingle[i] === 1) {
      visitor.diagonal(i, -1);
      visitor.diagonal(n + i, -1);
    }
  }
  for (let i = 0; i < n; i++) {
    if (eri.get(i, i, i, i)) visitor.diagonal(i, n + i);
    for (let j = i + 1; j < n; j++) {
      const coulomb = eri.get(i, i, j, j);
      const sameSpin = coulomb || eri.get(i, j, j, i);
      if (coulomb) {
        visitor.diagonal(i, n + j);
        visitor.diagonal(n + i, j);
      }
      if (sameSpin) {
        visitor.diagonal(i, j);
        visitor.diagonal(n + i, n + j);
      }
    }
  }

  // Hops: E = {(i,σ), (k,σ)}, i < k.
  for (let i = 0; i < n; i++) {
    for (let k = i + 1; k < n; k++) {
      let plain = oneBody(i, k);
      for (let j = 0; j < n && !plain; j++) if (eri.get(i, k, j, j) || (j !== i && j !== k && eri.get(i, j, j, k))) plain = true;
      for (let spin = 0; spin < 2; spin++) {
        const p = spin * n + i;
        const r = spin * n + k;
        const other = (1 - spin) * n;
        if (plain) visitor.hop(p, r, -1);
        for (let j = 0; j < n; j++) {
          const coulomb = eri.get(i, k, j, j);
          if (coulomb) visitor.hop(p, r, other + j);
          if (j !== i && j !== k && (coulomb || eri.get(i, j, j, k))) visitor.hop(p, r, spin * n + j);
        }
      }
    }
  }

  // Pair-pair: α orbitals a < b, β orbitals c < d (they may share orbitals), integral (ab|cd).
  for (let a = 0; a < n; a++) {
    for (let b = a + 1; b < n; b++) {
      for (let c = 0; c < n; c++) {
        for (let d = c + 1; d < n; d++) {
          if (eri.get(a, b, c, d)) visitor.pairPair(a, b, n + c, n + d);
        }
      }
    }
  }

  // Quartets: four distinct orbitals of one spin.
  for (let a = 0; a < n; a++) {
    for (let b = a + 1; b < n; b++) {
      for (let c = b + 1; c < n; c++) {
        for (let d = c + 1; d < n; d++) {
          const x = eri.get(a, b, c, d);
          const y = eri.get(a, c, b, d);
          const w = eri.get(a, d, b, c);
          const present = (y || w ? 1 : 0) | (x || w ? 2 : 0) | (x || y ? 4 : 0);
          if (present !== 0) {
            visitor.quartet(a, b, c, d, present);
            visitor.quartet(n + a, n + b, n + c, n + d, present);
          }
        }
      }
    }
  }
}

/** Spin-orbital order on the register. */
export type SpinOrbitalOrdering = 'block' | 'interleaved';

/** Qubit of block-numbered mode m: block keeps it; interleaved puts (i,σ) on 2i + σ. */
export function qubitOf(mode: number, orbitals: number, ordering: SpinOrbitalOrdering): number {
  if (ordering === 'block') return mode;
  return mode < orbitals ? 2 * mode : 2 * (mode - orbitals) + 1;
}

/** Jordan–Wigner strings as bit masks: bit q of `x` set for X or Y on qubit q, of `z` for Z or Y. */
export interface PauliStrings {
  readonly qubits: number;
  readonly length: number;
  readonly x: Uint32Array;
  readonly z: Uint32Array;
}

/** Largest register the 32-bit masks hold. */
export const MAX_MASK_QUBITS = 32;

/**
 * Every Jordan–Wigner string of the Hamiltonian, from the classes above. Under Jordan–Wigner
 * c_p = X_p Z_{<p} and d_p = Y_p Z_{<p} (Jordan & Wigner 1928), so a monomial has X/Y on E, and
 * Z on qubit q when q ∈ D, or when an odd number of E's qubits lie above q; on q ∈ E that Z turns X
 * into Y (up to phase), as does a d Majorana.
 */
export function jordanWignerStrings(pattern: IntegralPattern, ordering: SpinOrbitalOrdering = 'block'): PauliStrings {
  const n = pattern.orbitals;
  const qubits = 2 * n;
  if (qubits > MAX_MASK_QUBITS) throw new RangeError(`${qubits} qubits do not fit 32-bit masks; use the counts instead`);
  const bit = new Uint32Array(Math.max(1, qubits));
  const below = new Uint32Array(Math.max(1, qubits));
  for (let m = 0; m < qubits; m++) {
    const q = qubitOf(m, n, ordering);
    bit[m] = 2 ** q;
    below[m] = 2 ** q - 1;
  }
  let capacity = 1024;
  let x = new Uint32Array(capacity);
  let z = new Uint32Array(capacity);
  let length = 0;
  const push = (xs: number, zs: number) => {
    if (length === capacity) {
      capacity *= 2;
      const nx = new Uint32Array(capacity);
      nx.set(x);
      x = nx;
      const nz = new Uint32Array(capacity);
      nz.set(z);
      z = nz;
    }
    x[length] = xs >>> 0;
    z[length] = zs >>> 0;
    length++;
  };
  walkTermClasses(pattern, {
    diagonal(p, q) {
      push(0, (p >= 0 ? bit[p]! : 0) | (q >= 0 ? bit[q]! : 0));
    },
    hop(p, r, zMode) {
      const xs = bit[p]! | bit[r]!;
      const zs = below[p]! ^ below[r]! ^ (zMode >= 0 ? bit[zMode]! : 0);
      push(xs, zs ^ bit[p]!);
      push(xs, zs ^ bit[r]!);
    },
    pairPair(p, r, s, t) {
      const xs = bit[p]! | bit[r]! | bit[s]! | bit[t]!;
      const zs = below[p]! ^ below[r]! ^ below[s]! ^ below[t]!;
      push(xs, zs ^ bit[p]! ^ bit[s]!);
      push(xs, zs ^ bit[p]! ^ bit[t]!);
      push(xs, zs ^ bit[r]! ^ bit[s]!);
      push(xs, zs ^ bit[r]! ^ bit[t]!);
    },
    quartet(a, b, c, d, present) {
      const xs = bit[a]! | bit[b]! | bit[c]! | bit[d]!;
      const zs = below[a]! ^ below[b]! ^ below[c]! ^ below[d]!;
      if (present & 1) {
        push(xs, zs ^ bit[a]! ^ bit[b]!);
        push(xs, zs ^ bit[c]! ^ bit[d]!);
      }
      if (present & 2) {
        push(xs, zs ^ bit[a]! ^ bit[c]!);
        push(xs, zs ^ bit[b]! ^ bit[d]!);
      }
      if (present & 4) {
        push(xs, zs ^ bit[a]! ^ bit[d]!);
        push(xs, zs ^ bit[b]! ^ bit[c]!);
      }
    },
  });
  return { qubits, length, x: x.subarray(0, length), z: z.subarray(0, length) };
}
