/**
 * The recurrence relations of the Head-Gordon–Pople scheme, unrolled once per angular-momentum
 * class into flat instruction lists (Int32Array) that the kernel (engine.ts) runs for every
 * primitive quartet without looking anything up.
 *
 * Vertical recurrence (Obara–Saika; S. Obara and A. Saika, J. Chem. Phys. 84, 3963 (1986), eq. 39;
 * M. Head-Gordon and J. A. Pople, J. Chem. Phys. 89, 5777 (1988), eq. 6), building
 * [e0|f0]^(m) from [00|00]^(m) = prefactor · F_m(T):
 *   bra: [e+1ᵢ,0|00]^(m) = PAᵢ [e0|00]^(m) + WPᵢ [e0|00]^(m+1)
 *                          + eᵢ/(2ζ) ([e−1ᵢ,0|00]^(m) − ρ/ζ [e−1ᵢ,0|00]^(m+1))
 *   ket: [e0|f+1ᵢ,0]^(m) = QCᵢ [e0|f0]^(m) + WQᵢ [e0|f0]^(m+1)
 *                          + fᵢ/(2η) ([e0|f−1ᵢ,0]^(m) − ρ/η [e0|f−1ᵢ,0]^(m+1))
 *                          + eᵢ/(2(ζ+η)) [e−1ᵢ,0|f0]^(m+1)
 * Horizontal recurrence (Head-Gordon & Pople eq. 18), after contraction:
 *   (a, b+1ᵢ| = (a+1ᵢ, b| + ABᵢ (a, b|   and likewise on the ket with CD.
 *
 * Cartesian functions are numbered as in cartesian.ts; a "cumulative" index runs over all momenta
 * 0 … n in turn (cartesianCountUpTo(n−1) + cartesianIndex).
 */
import { cartesianCount, cartesianCountUpTo, cartesianIndex } from '../../basis/cartesian';

/** Fields of one instruction, in this order, in VrrProgram.ops. */
export const OP_FIELDS = 8;
// [direction, destination, source 1, source 2 (−1: none), source 3 (−1: none), a, b, m count]

export interface VrrProgram {
  readonly La: number;
  readonly Lc: number;
  /** La + Lc: the highest Boys order. */
  readonly L: number;
  /** Entries (e, f) are blocks of L+1 orders m at ((e·nF) + f)·(L+1). */
  readonly nF: number;
  readonly size: number;
  /** Bra steps (f = 0) first, then ket steps. */
  readonly ops: Int32Array;
  readonly braOps: number;
  readonly ketOps: number;
  /** Offsets in the VRR buffer of [e0|f0]^(0) for e of momenta la … La and f of lc … Lc, e outer. */
  readonly targets: Int32Array;
  readonly eFirst: number;
  readonly eCount: number;
  readonly fFirst: number;
  readonly fCount: number;
}

function cumulative(a: number, b: number, c: number): number {
  return cartesianCountUpTo(a + b + c - 1) + cartesianIndex(a, b, c);
}

/** Every cartesian triple of momentum n, in cartesian order. */
function triples(n: number): [number, number, number][] {
  const out: [number, number, number][] = [];
  for (let a = n; a >= 0; a--) for (let b = n - a; b >= 0; b--) out.push([a, b, n - a - b]);
  return out;
}

/** The direction to lower: the smallest positive component (so that the e−2 term often drops). */
function lowering(t: readonly number[]): number {
  let best = -1;
  for (let i = 0; i < 3; i++) if (t[i]! > 0 && (best < 0 || t[i]! < t[best]!)) best = i;
  return best;
}

export function buildVrrProgram(la: number, lb: number, lc: number, ld: number): VrrProgram {
  const La = la + lb;
  const Lc = lc + ld;
  const L = La + Lc;
  const M = L + 1;
  const nE = cartesianCountUpTo(La);
  const nF = cartesianCountUpTo(Lc);
  const at = (e: number, f: number): number => (e * nF + f) * M;
  const ops: number[] = [];
  let braOps = 0;
  for (let n = 1; n <= La; n++) {
    for (const e of triples(n)) {
      const i = lowering(e);
      const e1 = [...e];
      e1[i]! -= 1;
      const e2 = [...e1];
      e2[i]! -= 1;
      const mCount = L - n + 1;
      ops.push(i, at(cumulative(e[0], e[1], e[2]), 0), at(cumulative(e1[0]!, e1[1]!, e1[2]!), 0), e2[i]! >= 0 ? at(cumulative(e2[0]!, e2[1]!, e2[2]!), 0) : -1, -1, e1[i]!, 0, mCount);
      braOps++;
    }
  }
  let ketOps = 0;
  for (let k = 1; k <= Lc; k++) {
    // Only e that can still reach momentum la by the end of the ket steps are needed.
    const eMin = Math.max(0, la - (Lc - k));
    for (const f of triples(k)) {
      const i = lowering(f);
      const f1 = [...f];
      f1[i]! -= 1;
      const f2 = [...f1];
      f2[i]! -= 1;
      const fIndex = cumulative(f[0], f[1], f[2]);
      const f1Index = cumulative(f1[0]!, f1[1]!, f1[2]!);
      const f2Index = f2[i]! >= 0 ? cumulative(f2[0]!, f2[1]!, f2[2]!) : -1;
      for (let n = eMin; n <= La; n++) {
        for (const e of triples(n)) {
          const eIndex = cumulative(e[0], e[1], e[2]);
          const mCount = L - n - k + 1;
          let coupling = -1;
          if (e[i]! > 0) {
            const e1 = [...e];
            e1[i]! -= 1;
            coupling = at(cumulative(e1[0]!, e1[1]!, e1[2]!), f1Index);
          }
          ops.push(i, at(eIndex, fIndex), at(eIndex, f1Index), f2Index >= 0 ? at(eIndex, f2Index) : -1, coupling, f1[i]!, e[i]!, mCount);
          ketOps++;
        }
      }
    }
  }
  const eFirst = cartesianCountUpTo(la - 1);
  const eCount = nE - eFirst;
  const fFirst = cartesianCountUpTo(lc - 1);
  const fCount = nF - fFirst;
  const targets = new Int32Array(eCount * fCount);
  for (let e = 0; e < eCount; e++) for (let f = 0; f < fCount; f++) targets[e * fCount + f] = at(eFirst + e, fFirst + f);
  return { La, Lc, L, nF, size: nE * nF * M, ops: Int32Array.from(ops), braOps, ketOps, targets, eFirst, eCount, fFirst, fCount };
}

/**
 * A horizontal-recurrence program over rows of a buffer: rows 0 … inputs−1 are (e, 0) for e of
 * momenta la … la+lb (cumulative order from momentum la); each op sets row dst = row s1 + AB[dir]·row s2;
 * `outputs` lists the rows holding (a, b) for |a| = la, |b| = lb, a outer, in cartesian order.
 */
export interface HrrProgram {
  readonly inputs: number;
  readonly rows: number;
  /** [direction, destination, source 1, source 2] per op. */
  readonly ops: Int32Array;
  readonly outputs: Int32Array;
}

export function buildHrrProgram(la: number, lb: number): HrrProgram {
  const rowOf = new Map<string, number>();
  const key = (a: readonly number[], b: readonly number[]): string => `${a.join(',')}|${b.join(',')}`;
  let rows = 0;
  for (let n = la; n <= la + lb; n++) for (const e of triples(n)) rowOf.set(key(e, [0, 0, 0]), rows++);
  const inputs = rows;
  const ops: number[] = [];
  // Build (a, b) for |b| = 1 … lb, for every a with la ≤ |a| ≤ la + lb − |b|.
  for (let nb = 1; nb <= lb; nb++) {
    for (const b of triples(nb)) {
      const i = lowering(b);
      const b1 = [...b];
      b1[i]! -= 1;
      for (let na = la; na <= la + lb - nb; na++) {
        for (const a of triples(na)) {
          const a1 = [...a];
          a1[i]! += 1;
          const s1 = rowOf.get(key(a1, b1));
          const s2 = rowOf.get(key(a, b1));
          if (s1 === undefined || s2 === undefined) throw new Error('HRR program: missing source row');
          rowOf.set(key(a, b), rows);
          ops.push(i, rows, s1, s2);
          rows++;
        }
      }
    }
  }
  const outputs: number[] = [];
  for (const a of triples(la)) for (const b of triples(lb)) outputs.push(rowOf.get(key(a, b))!);
  return { inputs, rows, ops: Int32Array.from(ops), outputs: Int32Array.from(outputs) };
}

/** Number of cartesian (a, b) pairs of a shell pair. */
export function pairCartesians(la: number, lb: number): number {
  return cartesianCount(la) * cartesianCount(lb);
}
