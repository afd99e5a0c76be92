/**
 * Test references in the space of occupation vectors: the fermionic Hamiltonian's matrix elements
 * by applying ladder operators to occupation bit strings (phase (−1)^(occupied modes below p)),
 * the matrix of a Pauli sum over a list of qubit basis states, and the eigenvalues of a real
 * symmetric matrix (Householder reduction to tridiagonal form and the implicit QL iteration,
 * W. H. Press et al., Numerical Recipes, 3rd ed. (Cambridge, 2007), §11.3–11.4).
 */
import type { ActiveSpaceIntegrals } from '../../server/src/electronic/hamiltonian/activeSpace';
import { quartetIndex } from '../../server/src/electronic/hamiltonian/pairs';
import type { PauliSum } from '../../server/src/electronic/hamiltonian/pauli';

/** Occupation vectors (block order) with the given electrons in n orbitals per spin. */
export function sectorStates(n: number, alpha: number, beta: number): number[] {
  const combos = (count: number) => {
    const out: number[] = [];
    for (let mask = 0; mask < 1 << n; mask++) if (bitCount(mask) === count) out.push(mask);
    return out;
  };
  const states: number[] = [];
  for (const a of combos(alpha)) for (const b of combos(beta)) states.push(a | (b << n));
  return states;
}

function bitCount(v: number): number {
  let c = 0;
  for (let x = v; x; x &= x - 1) c++;
  return c;
}

/** a_p or a†_p on an occupation vector: [sign, result] or null when it vanishes. */
function apply(state: number, mode: number, create: boolean): [number, number] | null {
  const occupied = (state >>> mode) & 1;
  if (create === (occupied === 1)) return null;
  const sign = bitCount(state & ((1 << mode) - 1)) % 2 === 0 ? 1 : -1;
  return [sign, state ^ (1 << mode)];
}

/** ⟨f| H |g⟩ over the listed occupation vectors (all with the same particle numbers or not). */
export function fermionicMatrix(integrals: ActiveSpaceIntegrals, states: number[]): Float64Array {
  const n = integrals.orbitals;
  const dim = states.length;
  const index = new Map(states.map((s, i) => [s, i]));
  const H = new Float64Array(dim * dim);
  const add = (column: number, state: number, value: number) => {
    const row = index.get(state);
    if (row !== undefined) H[row * dim + column]! += value;
  };
  const mode = (i: number, spin: number) => i + spin * n;
  states.forEach((g, column) => {
    add(column, g, integrals.constant);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        for (let s = 0; s < 2; s++) {
          const a = apply(g, mode(j, s), false);
          if (!a) continue;
          const b = apply(a[1], mode(i, s), true);
          if (b) add(column, b[1], integrals.oneBody[i * n + j]! * a[0] * b[0]);
        }
      }
    }
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) for (let l = 0; l < n; l++) {
      const value = integrals.twoBody[quartetIndex(i, j, k, l)]!;
      if (value === 0) continue;
      for (let s = 0; s < 2; s++) for (let t = 0; t < 2; t++) {
        // a†_iσ a†_kτ a_lτ a_jσ applied right to left.
        const a = apply(g, mode(j, s), false);
        if (!a) continue;
        const b = apply(a[1], mode(l, t), false);
        if (!b) continue;
        const c = apply(b[1], mode(k, t), true);
        if (!c) continue;
        const d = apply(c[1], mode(i, s), true);
        if (d) add(column, d[1], 0.5 * value * a[0] * b[0] * c[0] * d[0]);
      }
    }
  });
  return H;
}

/**
 * ⟨a| Σ c P |b⟩ over the listed qubit basis states; also the largest weight that leaves the list
 * (zero when the list spans an invariant subspace) and the largest imaginary part (zero for a real
 * Hamiltonian).
 */
export function pauliMatrix(sum: PauliSum, states: number[]): { matrix: Float64Array; leak: number; imaginary: number } {
  const dim = states.length;
  const index = new Map(states.map((s, i) => [s >>> 0, i]));
  const re = new Float64Array(dim * dim);
  const im = new Float64Array(dim * dim);
  const outside = new Map<number, number>();
  states.forEach((b, column) => {
    for (let k = 0; k < sum.length; k++) {
      const x = sum.x[k]!;
      const z = sum.z[k]!;
      // P|b⟩ = i^|x∧z| (−1)^|z∧b| |b ⊕ x⟩
      const power = (bitCount(x & z) + 2 * bitCount(z & b)) % 4;
      const c = sum.coefficients[k]!;
      const target = (b ^ x) >>> 0;
      const row = index.get(target);
      if (row === undefined) {
        const key = target * 4096 + column;
        outside.set(key, (outside.get(key) ?? 0) + c * (power === 0 ? 1 : power === 2 ? -1 : 0));
        continue;
      }
      if (power === 0) re[row * dim + column]! += c;
      else if (power === 2) re[row * dim + column]! -= c;
      else if (power === 1) im[row * dim + column]! += c;
      else im[row * dim + column]! -= c;
    }
  });
  let leak = 0;
  for (const v of outside.values()) leak = Math.max(leak, Math.abs(v));
  let imaginary = 0;
  for (const v of im) imaginary = Math.max(imaginary, Math.abs(v));
  return { matrix: re, leak, imaginary };
}

/** Eigenvalues of a real symmetric matrix (row-major), ascending. */
export function symmetricEigenvalues(matrix: Float64Array, dim: number): number[] {
  const a = Array.from({ length: dim }, (_, i) => Array.from(matrix.subarray(i * dim, (i + 1) * dim)));
  const d = new Array<number>(dim).fill(0);
  const e = new Array<number>(dim).fill(0);
  // Householder reduction (tred2 without eigenvectors).
  for (let i = dim - 1; i > 0; i--) {
    const l = i - 1;
    let h = 0;
    if (l > 0) {
      let scale = 0;
      for (let k = 0; k <= l; k++) scale += Math.abs(a[i]![k]!);
      if (scale === 0) {
        e[i] = a[i]![l]!;
      } else {
        for (let k = 0; k <= l; k++) {
          a[i]![k]! /= scale;
          h += a[i]![k]! * a[i]![k]!;
        }
        let f = a[i]![l]!;
        const g = f >= 0 ? -Math.sqrt(h) : Math.sqrt(h);
        e[i] = scale * g;
        h -= f * g;
        a[i]![l] = f - g;
        f = 0;
        for (let j = 0; j <= l; j++) {
          let gg = 0;
          for (let k = 0; k <= j; k++) gg += a[j]![k]! * a[i]![k]!;
          for (let k = j + 1; k <= l; k++) gg += a[k]![j]! * a[i]![k]!;
          e[j] = gg / h;
          f += e[j]! * a[i]![j]!;
        }
        const hh = f / (h + h);
        for (let j = 0; j <= l; j++) {
          const fj = a[i]![j]!;
          const gj = e[j]! - hh * fj;
          e[j] = gj;
          for (let k = 0; k <= j; k++) a[j]![k]! -= fj * e[k]! + gj * a[i]![k]!;
        }
      }
    } else {
      e[i] = a[i]![l]!;
    }
    d[i] = h;
  }
  for (let i = 0; i < dim; i++) d[i] = a[i]![i]!;
  // Implicit QL on the tridiagonal matrix (tqli without eigenvectors).
  for (let i = 1; i < dim; i++) e[i - 1] = e[i]!;
  if (dim > 0) e[dim - 1] = 0;
  for (let l = 0; l < dim; l++) {
    let iterations = 0;
    for (;;) {
      let m = l;
      for (; m < dim - 1; m++) {
        const dd = Math.abs(d[m]!) + Math.abs(d[m + 1]!);
        if (Math.abs(e[m]!) <= Number.EPSILON * dd) break;
      }
      if (m === l) break;
      if (++iterations > 60) throw new Error('QL iteration did not converge');
      let g = (d[l + 1]! - d[l]!) / (2 * e[l]!);
      let r = Math.hypot(g, 1);
      g = d[m]! - d[l]! + e[l]! / (g + (g >= 0 ? Math.abs(r) : -Math.abs(r)));
      let s = 1;
      let c = 1;
      let p = 0;
      let i = m - 1;
      for (; i >= l; i--) {
        let f = s * e[i]!;
        const b = c * e[i]!;
        r = Math.hypot(f, g);
        e[i + 1] = r;
        if (r === 0) {
          d[i + 1]! -= p;
          e[m] = 0;
          break;
        }
        s = f / r;
        c = g / r;
        g = d[i + 1]! - p;
        r = (d[i]! - g) * s + 2 * c * b;
        p = s * r;
        d[i + 1] = g + p;
        g = c * r - b;
        f = 0;
      }
      if (r === 0 && i >= l) continue;
      d[l]! -= p;
      e[l] = g;
      e[m] = 0;
    }
  }
  return d.sort((x, y) => x - y);
}
