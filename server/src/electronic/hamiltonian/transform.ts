/**
 * Active-space two-electron integrals (pq|rs) = Σ C_μp C_νq C_λr C_σs (μν|λσ) by four quarter
 * transformations, integral-direct and batched over shells, so that the N⁴ atomic-orbital tensor
 * is never stored:
 *
 *   1. for one bra shell pair (P ≥ Q), every ket shell pair (R ≥ S) that survives Schwarz
 *      screening is computed and its last index transformed at once:
 *        T[μν][λ][s] = Σ_σ (μν|λσ) C_σs                           (cost N⁴·n/2 in all)
 *   2. still inside the bra shell pair, the third index:
 *        X[μν][rs] = Σ_λ C_λr T[μν][λ][s],  r ≥ s, μ ≥ ν            (N³·n²/2)
 *   3–4. for each active pair rs, X[·][rs] is a symmetric N × N matrix M and
 *        (pq|rs) = (Cᵀ M C)_pq                                     (N²·n³/2)
 *
 * This is the textbook ordering of an integral-direct transformation (each quarter step contracts
 * one index, so the operation count is O(N⁴n) instead of O(N⁴n⁴) for a direct four-index sum).
 * Memory: T takes |P||Q|·N·n_s doubles for the current shell pair, X takes N(N+1)/2 · m doubles
 * for m active pairs; when X would exceed the memory budget, the active index s is processed in
 * batches and the integrals are recomputed per batch.
 *
 * Symmetry used: μ ↔ ν through bra shell pairs P ≥ Q, λ ↔ σ through ket shell pairs R ≥ S, and
 * r ≥ s, p ≥ q in the transformed pairs. The bra–ket symmetry is not used in step 1 (each unique
 * shell quartet is computed twice, as PQ|RS and as RS|PQ): using it would need T for every bra
 * pair at once, N³n/2 doubles. The active integrals are stored packed (pairs.ts).
 */
import { throwIfCancelled, type CancelToken } from '../contracts';
import { multiply, multiplyTransposeA } from '../linalg';
import type { AoSource } from './aoSource';
import { pairCount, pairIndex, pairPairIndex, packedLength } from './pairs';

export interface TransformOptions {
  /** Largest size of the half-transformed batch X, in bytes (default 256 MiB). */
  readonly memoryBytes?: number;
  /** Shell quartets with Schwarz product below this are skipped (default 1e-12). */
  readonly screening?: number;
  readonly cancel?: CancelToken;
}

export const DEFAULT_TRANSFORM_MEMORY = 256 * 1024 * 1024;

export interface TransformStatistics {
  /** Passes over the atomic-orbital integrals (1 unless the memory budget forced batches). */
  readonly passes: number;
  /** Shell quartets computed, over all passes. */
  readonly quartets: number;
  /** Shell quartets skipped by Schwarz screening. */
  readonly screened: number;
}

/**
 * Packed active (pq|rs) from the source and the active coefficients `ca` (N × n, row-major:
 * ca[μ·n + p]).
 */
export function transformTwoElectron(source: AoSource, ca: Float64Array, n: number, options: TransformOptions = {}): { values: Float64Array; statistics: TransformStatistics } {
  const N = source.functionCount;
  const memory = options.memoryBytes ?? DEFAULT_TRANSFORM_MEMORY;
  const screening = options.screening ?? 1e-12;
  const cancel = options.cancel;
  const out = new Float64Array(packedLength(n));
  if (n === 0) return { values: out, statistics: { passes: 0, quartets: 0, screened: 0 } };

  const aoPairs = pairCount(N);
  const batches = batchesOverS(n, aoPairs, memory);
  const maxShell = source.maxShellSize;
  const buffer = new Float64Array(maxShell ** 4);
  const M = new Float64Array(N * N);
  const MC = new Float64Array(N * n);
  const G = new Float64Array(n * n);
  let quartets = 0;
  let screened = 0;

  for (const [s0, s1] of batches) {
    const nb = s1 - s0;
    // Column of each (r, s) with s in the batch and r ≥ s, and the pair list for the last step.
    const columns = activeColumns(n, s0, s1);
    const width = columns.count;
    const X = new Float64Array(aoPairs * width);
    const T = new Float64Array(maxShell * maxShell * N * nb);

    for (let P = 0; P < source.shellCount; P++) {
      const p0 = source.shellOffset[P]!;
      const np = source.shellSize[P]!;
      for (let Q = 0; Q <= P; Q++) {
        throwIfCancelled(cancel);
        const q0 = source.shellOffset[Q]!;
        const nq = source.shellSize[Q]!;
        const braSchwarz = source.schwarz(P, Q);
        T.fill(0, 0, np * nq * N * nb);
        for (let R = 0; R < source.shellCount; R++) {
          const r0 = source.shellOffset[R]!;
          const nr = source.shellSize[R]!;
          for (let S = 0; S <= R; S++) {
            if (braSchwarz * source.schwarz(R, S) < screening) {
              screened++;
              continue;
            }
            quartets++;
            const sOffset = source.shellOffset[S]!;
            const ns = source.shellSize[S]!;
            source.quartet(P, Q, R, S, buffer);
            quarterKet(buffer, T, ca, n, N, s0, nb, np * nq, r0, nr, sOffset, ns, R !== S);
          }
        }
        // Third index: X[μν][rs] = Σ_λ C_λr T[μν][λ][s].
        for (let a = 0; a < np; a++) {
          const mu = p0 + a;
          for (let b = 0; b < nq; b++) {
            const nu = q0 + b;
            if (nu > mu) continue;
            const tBase = (a * nq + b) * N * nb;
            const xBase = pairIndex(mu, nu) * width;
            for (let c = 0; c < width; c++) {
              const r = columns.r[c]!;
              const sLocal = columns.s[c]! - s0;
              let sum = 0;
              for (let lambda = 0; lambda < N; lambda++) sum += ca[lambda * n + r]! * T[tBase + lambda * nb + sLocal]!;
              X[xBase + c] = sum;
            }
          }
        }
      }
    }

    // Last two indices, one active pair rs at a time.
    for (let c = 0; c < width; c++) {
      throwIfCancelled(cancel);
      for (let mu = 0; mu < N; mu++) {
        for (let nu = 0; nu <= mu; nu++) {
          const value = X[pairIndex(mu, nu) * width + c]!;
          M[mu * N + nu] = value;
          M[nu * N + mu] = value;
        }
      }
      // (pq|rs) = (Cᵀ M C)_pq.
      multiply(M, ca, N, N, n, MC);
      multiplyTransposeA(ca, MC, N, n, n, G);
      const rs = pairIndex(columns.r[c]!, columns.s[c]!);
      for (let p = 0; p < n; p++) {
        for (let q = 0; q <= p; q++) {
          const pq = pairIndex(p, q);
          if (pq >= rs) out[pairPairIndex(pq, rs)] = G[p * n + q]!;
        }
      }
    }
  }
  // Every packed slot (pq ≥ rs) has been written once: by the batch that holds the pair rs.
  return { values: out, statistics: { passes: batches.length, quartets, screened } };
}

/**
 * First quarter for one shell quartet: T[μν][λ][s] += (μν|λσ) C_σs, and with λσ swapped when the
 * ket shells differ (the quartet R ≥ S stands for S R too).
 */
function quarterKet(buffer: Float64Array, T: Float64Array, ca: Float64Array, n: number, N: number, s0: number, nb: number, braCount: number, r0: number, nr: number, sOffset: number, ns: number, swap: boolean): void {
  const ketCount = nr * ns;
  for (let braLocal = 0; braLocal < braCount; braLocal++) {
    const tBase = braLocal * N * nb;
    const bBase = braLocal * ketCount;
    for (let c = 0; c < nr; c++) {
      const lambda = r0 + c;
      for (let d = 0; d < ns; d++) {
        const v = buffer[bBase + c * ns + d]!;
        if (v === 0) continue;
        const sigma = sOffset + d;
        const tLambda = tBase + lambda * nb;
        const cSigma = sigma * n + s0;
        for (let s = 0; s < nb; s++) T[tLambda + s]! += v * ca[cSigma + s]!;
        if (swap) {
          const tSigma = tBase + sigma * nb;
          const cLambda = lambda * n + s0;
          for (let s = 0; s < nb; s++) T[tSigma + s]! += v * ca[cLambda + s]!;
        }
      }
    }
  }
}

interface Columns {
  readonly count: number;
  readonly r: Int32Array;
  readonly s: Int32Array;
}

function activeColumns(n: number, s0: number, s1: number): Columns {
  let count = 0;
  for (let s = s0; s < s1; s++) count += n - s;
  const r = new Int32Array(count);
  const sIndex = new Int32Array(count);
  let c = 0;
  for (let s = s0; s < s1; s++) {
    for (let rr = s; rr < n; rr++) {
      r[c] = rr;
      sIndex[c] = s;
      c++;
    }
  }
  return { count, r, s: sIndex };
}

/** Ranges [s0, s1) of the active index s such that X (aoPairs × pairs with r ≥ s) fits in memory. */
function batchesOverS(n: number, aoPairs: number, memoryBytes: number): Array<[number, number]> {
  const batches: Array<[number, number]> = [];
  let s0 = 0;
  while (s0 < n) {
    let s1 = s0 + 1;
    let columns = n - s0;
    while (s1 < n && (columns + (n - s1)) * aoPairs * 8 <= memoryBytes) {
      columns += n - s1;
      s1++;
    }
    batches.push([s0, s1]);
    s0 = s1;
  }
  return batches;
}
