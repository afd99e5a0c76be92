/**
 * A second, deliberately simple implementation of the Jordan–Wigner Hamiltonian for the tests:
 * Pauli strings as letter strings in a Map with complex coefficients, the single-qubit product
 * table written out, ladder operators a_p = Z_0 … Z_{p−1} (X_p + iY_p)/2, and the Hamiltonian
 * expanded term by term from the spin-orbital second-quantised form
 *
 *   H = E_c + Σ_{ij,σ} h_ij a†_iσ a_jσ + ½ Σ_{ijkl,στ} (ij|kl) a†_iσ a†_kτ a_lτ a_jσ
 *
 * (block order: mode i is (i, α), mode n + i is (i, β)). Nothing here is shared with the code under
 * test except the packed integral index.
 */
import type { ActiveSpaceIntegrals } from '../../server/src/electronic/hamiltonian/activeSpace';
import { quartetIndex } from '../../server/src/electronic/hamiltonian/pairs';

type Complex = [number, number];
export type Operator = Map<string, Complex>;

/** Single-qubit products: [letter, phase exponent of i]. */
const TABLE: Record<string, [string, number]> = {
  II: ['I', 0], IX: ['X', 0], IY: ['Y', 0], IZ: ['Z', 0],
  XI: ['X', 0], XX: ['I', 0], XY: ['Z', 1], XZ: ['Y', 3],
  YI: ['Y', 0], YX: ['Z', 3], YY: ['I', 0], YZ: ['X', 1],
  ZI: ['Z', 0], ZX: ['Y', 1], ZY: ['X', 3], ZZ: ['I', 0],
};

const I_POWERS: Complex[] = [[1, 0], [0, 1], [-1, 0], [0, -1]];

function add(target: Operator, label: string, value: Complex): void {
  const current = target.get(label);
  if (current) {
    current[0] += value[0];
    current[1] += value[1];
  } else {
    target.set(label, [value[0], value[1]]);
  }
}

export function multiply(a: Operator, b: Operator): Operator {
  const out: Operator = new Map();
  for (const [la, ca] of a) {
    for (const [lb, cb] of b) {
      let label = '';
      let phase = 0;
      for (let q = 0; q < la.length; q++) {
        const [letter, p] = TABLE[la[q]! + lb[q]!]!;
        label += letter;
        phase += p;
      }
      const ip = I_POWERS[phase % 4]!;
      const re = ca[0] * cb[0] - ca[1] * cb[1];
      const im = ca[0] * cb[1] + ca[1] * cb[0];
      add(out, label, [re * ip[0] - im * ip[1], re * ip[1] + im * ip[0]]);
    }
  }
  return out;
}

function ladder(mode: number, qubits: number, create: boolean): Operator {
  const prefix = 'Z'.repeat(mode);
  const suffix = 'I'.repeat(qubits - mode - 1);
  // a = (X + iY)/2, a† = (X − iY)/2 on the mode's qubit.
  return new Map<string, Complex>([
    [`${prefix}X${suffix}`, [0.5, 0]],
    [`${prefix}Y${suffix}`, [0, create ? -0.5 : 0.5]],
  ]);
}

function accumulate(target: Operator, term: Operator, scale: number): void {
  for (const [label, value] of term) add(target, label, [value[0] * scale, value[1] * scale]);
}

export function jordanWignerByExpansion(integrals: ActiveSpaceIntegrals): Operator {
  const n = integrals.orbitals;
  const qubits = 2 * n;
  const create = Array.from({ length: qubits }, (_, p) => ladder(p, qubits, true));
  const destroy = Array.from({ length: qubits }, (_, p) => ladder(p, qubits, false));
  const H: Operator = new Map([['I'.repeat(qubits), [integrals.constant, 0]]]);
  const mode = (i: number, spin: number) => i + spin * n;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const hij = integrals.oneBody[i * n + j]!;
      if (hij === 0) continue;
      for (let s = 0; s < 2; s++) accumulate(H, multiply(create[mode(i, s)]!, destroy[mode(j, s)]!), hij);
    }
  }
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      for (let k = 0; k < n; k++) {
        for (let l = 0; l < n; l++) {
          const value = integrals.twoBody[quartetIndex(i, j, k, l)]!;
          if (value === 0) continue;
          for (let s = 0; s < 2; s++) {
            for (let t = 0; t < 2; t++) {
              const p = mode(i, s), r = mode(k, t), q = mode(l, t), o = mode(j, s);
              if (p === r || q === o) continue; // a†a† or aa on one mode vanishes
              const product = multiply(multiply(create[p]!, create[r]!), multiply(destroy[q]!, destroy[o]!));
              accumulate(H, product, 0.5 * value);
            }
          }
        }
      }
    }
  }
  return H;
}
