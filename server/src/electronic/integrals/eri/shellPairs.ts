/**
 * Shell-pair data, computed once per basis: for every pair (P ≥ Q) the primitive pairs that
 * survive screening with their Gaussian-product quantities (ζ, P, P − A, the prefactor
 * c_a c_b exp(−μ |AB|²) / ζ), oriented so that the shell with the higher momentum comes first
 * (the horizontal recurrence moves momentum from the first shell to the second).
 */
import type { MolecularBasis } from '../../contracts';

/** Primitive pairs whose overlap-sized weight falls below this are dropped (far below 1e-12 integrals). */
const PRIMITIVE_PAIR_THRESHOLD = 1e-20;

export interface ShellPairs {
  readonly count: number;
  /** Shells of pair k in kernel order (la ≥ lb): first = pairFirst[k], second = pairSecond[k]. */
  readonly pairFirst: Int32Array;
  readonly pairSecond: Int32Array;
  /** Primitive pairs of pair k are primStart[k] … primStart[k+1]−1. */
  readonly primStart: Int32Array;
  /** Per primitive pair: ζ, 1/ζ, P (x, y, z), P − A (x, y, z), c_a c_b exp(−μ|AB|²)/ζ. */
  readonly zeta: Float64Array;
  readonly inverseZeta: Float64Array;
  readonly px: Float64Array;
  readonly py: Float64Array;
  readonly pz: Float64Array;
  readonly pax: Float64Array;
  readonly pay: Float64Array;
  readonly paz: Float64Array;
  readonly weight: Float64Array;
  /** A − B per pair (for the horizontal recurrence). */
  readonly abx: Float64Array;
  readonly aby: Float64Array;
  readonly abz: Float64Array;
}

/** Index of the unordered pair {p, q}: p(p+1)/2 + q for p ≥ q. */
export function pairIndex(p: number, q: number): number {
  return p >= q ? (p * (p + 1)) / 2 + q : (q * (q + 1)) / 2 + p;
}

export function buildShellPairs(basis: MolecularBasis): ShellPairs {
  const shells = basis.shells;
  const n = shells.length;
  const count = (n * (n + 1)) / 2;
  const pairFirst = new Int32Array(count);
  const pairSecond = new Int32Array(count);
  const primStart = new Int32Array(count + 1);
  const abx = new Float64Array(count);
  const aby = new Float64Array(count);
  const abz = new Float64Array(count);
  let capacity = 0;
  for (let p = 0; p < n; p++) for (let q = 0; q <= p; q++) capacity += shells[p]!.exponents.length * shells[q]!.exponents.length;
  const zeta = new Float64Array(capacity);
  const inverseZeta = new Float64Array(capacity);
  const px = new Float64Array(capacity);
  const py = new Float64Array(capacity);
  const pz = new Float64Array(capacity);
  const pax = new Float64Array(capacity);
  const pay = new Float64Array(capacity);
  const paz = new Float64Array(capacity);
  const weight = new Float64Array(capacity);
  let prim = 0;
  for (let p = 0; p < n; p++) {
    for (let q = 0; q <= p; q++) {
      const k = pairIndex(p, q);
      const swap = shells[q]!.l > shells[p]!.l;
      const first = swap ? q : p;
      const second = swap ? p : q;
      const a = shells[first]!;
      const b = shells[second]!;
      pairFirst[k] = first;
      pairSecond[k] = second;
      const dx = a.x - b.x;
      const dy = a.y - b.y;
      const dz = a.z - b.z;
      abx[k] = dx;
      aby[k] = dy;
      abz[k] = dz;
      const ab2 = dx * dx + dy * dy + dz * dz;
      primStart[k] = prim;
      for (let i = 0; i < a.exponents.length; i++) {
        const alpha = a.exponents[i]!;
        for (let j = 0; j < b.exponents.length; j++) {
          const beta = b.exponents[j]!;
          const z = alpha + beta;
          const w = (a.coefficients[i]! * b.coefficients[j]! * Math.exp((-alpha * beta * ab2) / z)) / z;
          if (Math.abs(w) * (Math.PI / z) ** 1.5 * z < PRIMITIVE_PAIR_THRESHOLD) continue;
          zeta[prim] = z;
          inverseZeta[prim] = 1 / z;
          const x = (alpha * a.x + beta * b.x) / z;
          const y = (alpha * a.y + beta * b.y) / z;
          const zz = (alpha * a.z + beta * b.z) / z;
          px[prim] = x;
          py[prim] = y;
          pz[prim] = zz;
          pax[prim] = x - a.x;
          pay[prim] = y - a.y;
          paz[prim] = zz - a.z;
          weight[prim] = w;
          prim++;
        }
      }
    }
  }
  // Pairs were filled in index order (pairIndex grows with p, then q), so starts are monotone.
  primStart[count] = prim;
  return { count, pairFirst, pairSecond, primStart, zeta, inverseZeta, px, py, pz, pax, pay, paz, weight, abx, aby, abz };
}
