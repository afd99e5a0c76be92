/**
 * Explicit operator algebra for the Pauli-term tests, independent of the structural counter:
 * random real integrals with 8-fold permutational symmetry, zeroed where a pattern forbids them;
 * the second-quantized Hamiltonian H = Σ h_pq a†_p a_q + ½ Σ ⟨pq|rs⟩ a†_p a†_q a_s a_r over spin
 * orbitals (T. Helgaker, P. Jørgensen, J. Olsen, Molecular Electronic-Structure Theory, Wiley 2000,
 * ch. 2); every ladder operator written as Pauli strings, products multiplied out with their phases.
 *
 * Ladder operators for a linear encoding b = A f (mod 2) of the occupations f into qubit values b,
 * in the form of Seeley, Richard & Love, J. Chem. Phys. 137, 224109 (2012):
 *   a†_j = ½ X_{U(j)} (X_j Z_{P(j)} − i Y_j Z_{R(j)})
 * with the update set U(j) (qubits other than j whose value contains f_j), the parity set P(j)
 * (qubits whose sum is Σ_{i<j} f_i), the flip set F(j) (qubits other than j whose sum with b_j
 * gives f_j) and the remainder set R(j) = P(j) \ F(j). The matrices: identity (Jordan–Wigner),
 * lower-triangular ones (parity; qubit j holds Σ_{i≤j} f_i), and the Bravyi–Kitaev matrix of Seeley
 * et al. 2012 (β_1 = (1); β_{2m} = [[β_m, 0], [B, β_m]] with B zero except a last row of ones,
 * truncated to the register size).
 */

export type Encoding = 'jordan-wigner' | 'bravyi-kitaev' | 'parity';
export type Ordering = 'block' | 'interleaved';

/** Deterministic pseudo-random numbers (mulberry32, common practice, no source). */
export function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface Integrals {
  readonly n: number;
  /** h[i*n + j] */
  readonly h: Float64Array;
  /** (ij|kl) at ((i*n + j)*n + k)*n + l */
  readonly eri: Float64Array;
}

/** Random real integrals with h_ij = h_ji and 8-fold symmetric (ij|kl), zero where not allowed. */
export function randomIntegrals(
  n: number,
  allowedOneBody: (i: number, j: number) => boolean,
  allowed: (i: number, j: number, k: number, l: number) => boolean,
  seed: number,
): Integrals {
  const next = random(seed);
  const h = new Float64Array(n * n);
  const eri = new Float64Array(n * n * n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      const value = allowedOneBody(i, j) ? next() * 2 - 1 : 0;
      h[i * n + j] = value;
      h[j * n + i] = value;
    }
  }
  const at = (i: number, j: number, k: number, l: number) => ((i * n + j) * n + k) * n + l;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      for (let k = 0; k < n; k++) {
        for (let l = 0; l < n; l++) {
          // Fill each orbit of the eight permutations once, from its first-met member.
          if (eri[at(i, j, k, l)] !== 0) continue;
          const value = allowed(i, j, k, l) ? next() * 2 - 1 : 0;
          if (value === 0) continue;
          for (const [a, b, c, d] of [
            [i, j, k, l],
            [j, i, k, l],
            [i, j, l, k],
            [j, i, l, k],
            [k, l, i, j],
            [l, k, i, j],
            [k, l, j, i],
            [l, k, j, i],
          ] as const) {
            eri[at(a, b, c, d)] = value;
          }
        }
      }
    }
  }
  return { n, h, eri };
}

/** Pauli string with phase: i^phase · Π_q X_q^{x_q} Z_q^{z_q} (Y = i X Z). */
interface Term {
  re: number;
  im: number;
  x: number;
  z: number;
}

function popcount(v: number): number {
  let c = 0;
  while (v !== 0) {
    v &= v - 1;
    c++;
  }
  return c;
}

/** (X^x1 Z^z1)(X^x2 Z^z2) = (−1)^{|z1 ∧ x2|} X^{x1⊕x2} Z^{z1⊕z2}. */
function multiply(a: Term, b: Term): Term {
  const sign = popcount(a.z & b.x) & 1 ? -1 : 1;
  return { re: sign * (a.re * b.re - a.im * b.im), im: sign * (a.re * b.im + a.im * b.re), x: a.x ^ b.x, z: a.z ^ b.z };
}

/** (c X^x Z^z)† = c̄ Z^z X^x = c̄ (−1)^{|x ∧ z|} X^x Z^z. */
function dagger(t: Term): Term {
  const sign = popcount(t.x & t.z) & 1 ? -1 : 1;
  return { re: sign * t.re, im: -sign * t.im, x: t.x, z: t.z };
}

/** Encoding matrix A as rows of bit masks: qubit q holds Σ_i A[q][i] f_i. */
export function encodingMatrix(encoding: Encoding, modes: number): number[] {
  const rows: number[] = [];
  for (let q = 0; q < modes; q++) {
    if (encoding === 'jordan-wigner') rows.push(2 ** q);
    else if (encoding === 'parity') rows.push(2 ** (q + 1) - 1);
    else rows.push(bravyiKitaevRow(q, modes));
  }
  return rows;
}

/** Row q of Seeley et al.'s recursive β matrix of size 2^x ≥ modes (truncation keeps rows < modes). */
function bravyiKitaevRow(q: number, modes: number): number {
  let size = 1;
  while (size < modes) size *= 2;
  // Recursive definition: inside a block of size s starting at `start`, rows of the upper half
  // recurse into the upper half; rows of the lower half recurse into the lower half, and the last
  // row of the block also has ones across the whole upper half.
  let row = 0;
  let start = 0;
  let s = size;
  while (s > 1) {
    const half = s / 2;
    if (q >= start + half) {
      if (q === start + s - 1) for (let i = start; i < start + half; i++) row |= 2 ** i;
      start += half;
    }
    s = half;
  }
  return row | (2 ** q);
}

/** Inverse of a unit lower-triangular matrix over GF(2), as rows. */
function inverseRows(rows: readonly number[]): number[] {
  const m = rows.length;
  const inverse: number[] = [];
  // Forward substitution: f_q = b_q ⊕ Σ_{i<q, A[q][i]=1} f_i.
  for (let q = 0; q < m; q++) {
    let r = 2 ** q;
    const a = rows[q]!;
    for (let i = 0; i < q; i++) if (Math.floor(a / 2 ** i) & 1) r ^= inverse[i]!;
    inverse.push(r);
  }
  return inverse;
}

export interface LadderSets {
  readonly update: number;
  readonly parity: number;
  readonly flip: number;
  readonly remainder: number;
}

/** Update, parity, flip and remainder sets (as qubit masks) of Seeley et al. 2012 for mode j. */
export function ladderSets(encoding: Encoding, modes: number, j: number): LadderSets {
  const rows = encodingMatrix(encoding, modes);
  const inverse = inverseRows(rows);
  let update = 0;
  for (let q = 0; q < modes; q++) if (q !== j && Math.floor(rows[q]! / 2 ** j) & 1) update |= 2 ** q;
  let parity = 0;
  for (let i = 0; i < j; i++) parity ^= inverse[i]!;
  const flip = inverse[j]! & ~(2 ** j);
  return { update, parity, flip, remainder: parity & ~flip };
}

/** a†_j = ½ X^{U+j} Z^{P} + ½ X^{U+j} Z^{R+j}  (from −½ i X_U Y_j Z_R with Y_j = i X_j Z_j). */
function creation(encoding: Encoding, modes: number, j: number): Term[] {
  const sets = ladderSets(encoding, modes, j);
  const x = sets.update | (2 ** j);
  return [
    { re: 0.5, im: 0, x, z: sets.parity },
    { re: 0.5, im: 0, x, z: sets.remainder | (2 ** j) },
  ];
}

function productOf(factors: readonly Term[][]): Term[] {
  let result: Term[] = [{ re: 1, im: 0, x: 0, z: 0 }];
  for (const factor of factors) {
    const next: Term[] = [];
    for (const a of result) for (const b of factor) next.push(multiply(a, b));
    result = next;
  }
  return result;
}

export interface QubitHamiltonian {
  readonly qubits: number;
  /** key x * 2^qubits + z → coefficient of X^x Z^z (phase i^{|x∧z|} of the Y's included). */
  readonly terms: Map<number, { re: number; im: number }>;
}

/** Maps the Hamiltonian of the integrals with the encoding and spin-orbital ordering given. */
export function qubitHamiltonian(integrals: Integrals, encoding: Encoding, ordering: Ordering): QubitHamiltonian {
  const n = integrals.n;
  const modes = 2 * n;
  const qubitOf = (i: number, spin: number) => (ordering === 'block' ? i + spin * n : 2 * i + spin);
  const up: Term[][] = [];
  const down: Term[][] = [];
  for (let q = 0; q < modes; q++) {
    up.push(creation(encoding, modes, q));
    down.push(creation(encoding, modes, q).map(dagger));
  }
  const terms = new Map<number, { re: number; im: number }>();
  const add = (coefficient: number, factors: Term[][]) => {
    if (coefficient === 0) return;
    for (const t of productOf(factors)) {
      const key = t.x * 2 ** modes + t.z;
      const entry = terms.get(key);
      if (entry === undefined) terms.set(key, { re: coefficient * t.re, im: coefficient * t.im });
      else {
        entry.re += coefficient * t.re;
        entry.im += coefficient * t.im;
      }
    }
  };
  const { h, eri } = integrals;
  for (let s = 0; s < 2; s++) {
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) add(h[i * n + j]!, [up[qubitOf(i, s)]!, down[qubitOf(j, s)]!]);
  }
  // ⟨pq|rs⟩ = (ik|jl) δ(σp, σr) δ(σq, σs) for p = (i,σp), q = (j,σq), r = (k,σr), s = (l,σs).
  for (let sp = 0; sp < 2; sp++) {
    for (let sq = 0; sq < 2; sq++) {
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          for (let k = 0; k < n; k++) {
            for (let l = 0; l < n; l++) {
              const p = qubitOf(i, sp);
              const q = qubitOf(j, sq);
              const r = qubitOf(k, sp);
              const s = qubitOf(l, sq);
              if (p === q || r === s) continue;
              add(0.5 * eri[((i * n + k) * n + j) * n + l]!, [up[p]!, up[q]!, down[s]!, down[r]!]);
            }
          }
        }
      }
    }
  }
  return { qubits: modes, terms };
}

export const THRESHOLD = 1e-10;

/** Keys of the strings with |coefficient| > 1e-10. */
export function nonzeroKeys(hamiltonian: QubitHamiltonian): Set<number> {
  const keys = new Set<number>();
  for (const [key, c] of hamiltonian.terms) if (Math.hypot(c.re, c.im) > THRESHOLD) keys.add(key);
  return keys;
}

export function countNonzero(hamiltonian: QubitHamiltonian): number {
  return nonzeroKeys(hamiltonian).size;
}

/**
 * Two-qubit reduction of a block-ordered parity-mapped Hamiltonian (Bravyi et al.,
 * arXiv:1701.08213): qubit n−1 holds N_α mod 2 and qubit 2n−1 holds N mod 2; Z there is replaced by
 * (−1)^{N_α} and (−1)^{N}, and the two qubits are dropped. Throws if a string has X or Y there.
 */
export function reduceParity(hamiltonian: QubitHamiltonian, alpha: number, beta: number): QubitHamiltonian {
  const modes = hamiltonian.qubits;
  const n = modes / 2;
  const first = n - 1;
  const last = modes - 1;
  const alphaSign = alpha % 2 === 0 ? 1 : -1;
  const totalSign = (alpha + beta) % 2 === 0 ? 1 : -1;
  const drop = (mask: number) => {
    let out = 0;
    let target = 0;
    for (let q = 0; q < modes; q++) {
      if (q === first || q === last) continue;
      if (Math.floor(mask / 2 ** q) & 1) out += 2 ** target;
      target++;
    }
    return out;
  };
  const reduced = new Map<number, { re: number; im: number }>();
  const width = modes - 2;
  for (const [key, c] of hamiltonian.terms) {
    const x = Math.floor(key / 2 ** modes);
    const z = key % 2 ** modes;
    if ((Math.floor(x / 2 ** first) & 1) || (Math.floor(x / 2 ** last) & 1)) throw new Error('string acts with X or Y on a parity qubit');
    let sign = 1;
    if (Math.floor(z / 2 ** first) & 1) sign *= alphaSign;
    if (Math.floor(z / 2 ** last) & 1) sign *= totalSign;
    const newKey = drop(x) * 2 ** width + drop(z);
    const entry = reduced.get(newKey);
    if (entry === undefined) reduced.set(newKey, { re: sign * c.re, im: sign * c.im });
    else {
      entry.re += sign * c.re;
      entry.im += sign * c.im;
    }
  }
  return { qubits: width, terms: reduced };
}
