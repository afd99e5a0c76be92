/**
 * Brute-force references for the cost tests: every excitation listed one by one, its Jordan–Wigner
 * Pauli weight found by applying the mapping's definition qubit by qubit, and the symmetry rule
 * applied to each excitation. Slow but independent of the closed forms under test.
 */

export type Order = 'interleaved' | 'blocked';

export interface Excitation {
  readonly kind: 'single' | 'double';
  /** Spin-orbital qubits: the orbitals emptied and filled. */
  readonly qubits: readonly number[];
  /** Spatial orbitals involved, for the symmetry rule. */
  readonly orbitals: readonly number[];
}

function qubit(orbital: number, alpha: boolean, n: number, order: Order): number {
  return order === 'interleaved' ? 2 * orbital + (alpha ? 0 : 1) : orbital + (alpha ? 0 : n);
}

/**
 * Every spin-conserving single and double excitation out of the reference that fills orbitals
 * 0..beta−1 twice and beta..alpha−1 with alpha only; with irreps, only those whose irrep XOR is 0.
 */
export function listExcitations(n: number, alpha: number, beta: number, order: Order, irreps?: readonly number[]): Excitation[] {
  const spinOrbitals: { q: number; orbital: number; alpha: boolean; occupied: boolean }[] = [];
  for (let p = 0; p < n; p++) {
    spinOrbitals.push({ q: qubit(p, true, n, order), orbital: p, alpha: true, occupied: p < alpha });
    spinOrbitals.push({ q: qubit(p, false, n, order), orbital: p, alpha: false, occupied: p < beta });
  }
  const occ = spinOrbitals.filter((s) => s.occupied);
  const vir = spinOrbitals.filter((s) => !s.occupied);
  const allowed = (orbitals: number[]) => !irreps || orbitals.reduce((x, p) => x ^ (irreps[p] ?? 0), 0) === 0;
  const result: Excitation[] = [];
  for (const i of occ) {
    for (const a of vir) {
      if (i.alpha !== a.alpha) continue;
      const orbitals = [i.orbital, a.orbital];
      if (allowed(orbitals)) result.push({ kind: 'single', qubits: [i.q, a.q], orbitals });
    }
  }
  for (let x = 0; x < occ.length; x++) {
    for (let y = x + 1; y < occ.length; y++) {
      for (let u = 0; u < vir.length; u++) {
        for (let v = u + 1; v < vir.length; v++) {
          const i = occ[x]!;
          const j = occ[y]!;
          const a = vir[u]!;
          const b = vir[v]!;
          // spin conserved: the alpha count emptied equals the alpha count filled
          if (Number(i.alpha) + Number(j.alpha) !== Number(a.alpha) + Number(b.alpha)) continue;
          const orbitals = [i.orbital, j.orbital, a.orbital, b.orbital];
          if (allowed(orbitals)) result.push({ kind: 'double', qubits: [i.q, j.q, a.q, b.q], orbitals });
        }
      }
    }
  }
  return result;
}

/**
 * Jordan–Wigner weight from the definition a_p = Z_0 ⋯ Z_{p−1} σ_p (Jordan & Wigner, Z. Phys. 47,
 * 631 (1928)): a qubit carries a non-identity factor when an operator acts on it directly, or when
 * an odd number of the operators lie above it (their Z strings pass through it).
 */
export function jordanWignerWeight(qubits: readonly number[], register: number): number {
  let weight = 0;
  for (let t = 0; t < register; t++) {
    if (qubits.includes(t)) weight++;
    else if (qubits.filter((q) => q > t).length % 2 === 1) weight++;
  }
  return weight;
}

/** Deterministic pseudo-random numbers in [0, 1) (mulberry32; common practice, no source). */
export function seeded(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
