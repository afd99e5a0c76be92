/**
 * Two-electron integrals held as a full stored tensor: for small systems and tests (for example
 * integrals dumped by another program), never for production sizes. Memory n⁴ doubles (a 48-function
 * basis takes 42 MB); the constructor refuses more than MAX_TENSOR_FUNCTIONS functions.
 */
import { type CancelToken, type MolecularBasis, type TwoElectronIntegrals, throwIfCancelled } from '../contracts';

export const MAX_TENSOR_FUNCTIONS = 48;

/** Index of the unique pair (i ≥ j): i(i+1)/2 + j. */
export function pairIndex(i: number, j: number): number {
  return i >= j ? (i * (i + 1)) / 2 + j : (j * (j + 1)) / 2 + i;
}

/**
 * The unique integrals of a basis read through another source's `shellQuartet` (one pass over the
 * unique shell quartets), for a small basis whose J and K are then needed many times (the atoms of
 * the density guess).
 */
export function uniqueIntegralsFrom(source: TwoElectronIntegrals, cancel?: CancelToken): Float64Array {
  const basis = source.basis;
  const n = basis.functionCount;
  if (n > MAX_TENSOR_FUNCTIONS) throw new RangeError(`A stored integral tensor is meant for at most ${MAX_TENSOR_FUNCTIONS} functions, not ${n}.`);
  const pairs = (n * (n + 1)) / 2;
  const unique = new Float64Array((pairs * (pairs + 1)) / 2);
  const shells = basis.shells;
  let largest = 0;
  for (const shell of shells) largest = Math.max(largest, shell.size);
  const out = new Float64Array(largest ** 4);
  for (let p = 0; p < shells.length; p++) {
    throwIfCancelled(cancel);
    for (let q = 0; q <= p; q++) {
      for (let r = 0; r <= p; r++) {
        for (let s = 0; s <= (r === p ? q : r); s++) {
          const [sp, sq, sr, ss] = [shells[p]!, shells[q]!, shells[r]!, shells[s]!];
          source.shellQuartet(p, q, r, s, out);
          let w = 0;
          for (let a = 0; a < sp.size; a++) for (let b = 0; b < sq.size; b++) for (let c = 0; c < sr.size; c++) for (let d = 0; d < ss.size; d++) {
            unique[pairIndex(pairIndex(sp.offset + a, sq.offset + b), pairIndex(sr.offset + c, ss.offset + d))] = out[w++]!;
          }
        }
      }
    }
  }
  return unique;
}

export class TensorIntegrals implements TwoElectronIntegrals {
  /** (ij|kl) at ((i·n + j)·n + k)·n + l. */
  readonly tensor: Float64Array;
  private readonly schwarzFactors: Float64Array;

  /**
   * @param unique (ij|kl) for i ≥ j, k ≥ l, ij ≥ kl in the order of pairIndex(pairIndex(i, j), pairIndex(k, l))
   */
  constructor(
    readonly basis: MolecularBasis,
    unique: Float64Array,
  ) {
    const n = basis.functionCount;
    if (n > MAX_TENSOR_FUNCTIONS) throw new RangeError(`A stored integral tensor is meant for at most ${MAX_TENSOR_FUNCTIONS} functions, not ${n}.`);
    const pairs = (n * (n + 1)) / 2;
    if (unique.length !== (pairs * (pairs + 1)) / 2) throw new RangeError(`Expected ${(pairs * (pairs + 1)) / 2} unique integrals for ${n} functions, got ${unique.length}.`);
    const tensor = new Float64Array(n ** 4);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const ij = pairIndex(i, j);
        for (let k = 0; k < n; k++) {
          for (let l = 0; l < n; l++) tensor[((i * n + j) * n + k) * n + l] = unique[pairIndex(ij, pairIndex(k, l))]!;
        }
      }
    }
    this.tensor = tensor;
    const shells = basis.shells.length;
    this.schwarzFactors = new Float64Array(shells * shells);
    for (let p = 0; p < shells; p++) {
      for (let q = 0; q < shells; q++) {
        let max = 0;
        const sp = basis.shells[p]!;
        const sq = basis.shells[q]!;
        for (let a = sp.offset; a < sp.offset + sp.size; a++) {
          for (let b = sq.offset; b < sq.offset + sq.size; b++) max = Math.max(max, Math.abs(tensor[((a * n + b) * n + a) * n + b]!));
        }
        this.schwarzFactors[p * shells + q] = Math.sqrt(max);
      }
    }
  }

  buildJK(densities: readonly Float64Array[], J: Float64Array[] | null, K: Float64Array[] | null, options: { threshold?: number; cancel?: CancelToken } = {}): void {
    const n = this.basis.functionCount;
    const t = this.tensor;
    densities.forEach((density, d) => {
      throwIfCancelled(options.cancel);
      const j = J?.[d];
      const k = K?.[d];
      if (j) {
        for (let mu = 0; mu < n; mu++) {
          for (let nu = 0; nu < n; nu++) {
            const base = (mu * n + nu) * n * n;
            let sum = 0;
            for (let ls = 0; ls < n * n; ls++) sum += t[base + ls]! * density[ls]!;
            j[mu * n + nu] = sum;
          }
        }
      }
      if (k) {
        k.fill(0, 0, n * n);
        for (let mu = 0; mu < n; mu++) {
          for (let lambda = 0; lambda < n; lambda++) {
            const base = (mu * n + lambda) * n * n;
            for (let nu = 0; nu < n; nu++) {
              let sum = 0;
              for (let sigma = 0; sigma < n; sigma++) sum += t[base + nu * n + sigma]! * density[lambda * n + sigma]!;
              k[mu * n + nu]! += sum;
            }
          }
        }
      }
    });
  }

  shellQuartet(p: number, q: number, r: number, s: number, out: Float64Array): void {
    const n = this.basis.functionCount;
    const [sp, sq, sr, ss] = [p, q, r, s].map((index) => this.basis.shells[index]!);
    let w = 0;
    for (let a = 0; a < sp!.size; a++) {
      for (let b = 0; b < sq!.size; b++) {
        for (let c = 0; c < sr!.size; c++) {
          for (let d = 0; d < ss!.size; d++) out[w++] = this.tensor[(((sp!.offset + a) * n + sq!.offset + b) * n + sr!.offset + c) * n + ss!.offset + d]!;
        }
      }
    }
  }

  schwarz(p: number, q: number): number {
    return this.schwarzFactors[p * this.basis.shells.length + q]!;
  }
}
