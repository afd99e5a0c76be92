/**
 * Second-order Møller–Plesset correlation energy on an RHF reference (C. Møller, M. S. Plesset,
 * Phys. Rev. 46, 618 (1934); closed-shell form as in A. Szabo, N. S. Ostlund, Modern Quantum
 * Chemistry, Macmillan 1982, eq. 6.74):
 *   E(2) = Σ_ijab (ia|jb) [2(ia|jb) − (ib|ja)] / (ε_i + ε_j − ε_a − ε_b),
 * with opposite- and same-spin parts Σ t (ia|jb) and Σ (t_ij^ab − t_ij^ba)(ia|jb), where
 * t_ij^ab = (ia|jb)/(ε_i + ε_j − ε_a − ε_b), and the unrelaxed one-particle density (spin-summed,
 * molecular orbitals; the closed-shell reduction of the spin-orbital expressions
 * D_ij = δ_ij − ½ Σ t_ik^ab t_jk^ab, D_ab = ½ Σ t_ij^ac t_ij^bc, T. Helgaker, P. Jørgensen,
 * J. Olsen, Molecular Electronic-Structure Theory, Wiley 2000, §14.7 — section from memory):
 *   D_ij = 2δ_ij − 2 Σ_kab t_ki^ab t̃_kj^ab,   D_ab = 2 Σ_kjc t_kj^ac t̃_kj^bc,   t̃ = 2t − tᵀ(ab),
 * zero between occupied and virtual orbitals (no orbital relaxation) and 2 on frozen-core
 * orbitals. Its eigenvectors are the MP2 natural orbitals, its eigenvalues their occupation
 * numbers (between 0 and 2; they sum to the number of electrons).
 *
 * Integral transformation (integral-direct, batched over occupied orbitals): for a batch of
 * occupied i, every unique AO shell quartet (from `shellQuartet`, Schwarz-screened) is added into
 * (iν|λσ) with 8-fold symmetry, then ν → a, then per (i, a) the pair λσ → (j, b). Memory per batch
 * is about 2·B·n·n(n+1)/2 doubles, so the batch size B follows the memory budget and the AO
 * integrals are recomputed once per batch; nothing of size n⁴ is stored. Everything else needed
 * per occupied orbital (its amplitudes t_i·^·· , o·v² doubles) is used at once for the energy and
 * both density blocks and then dropped.
 */
import { nobleGasCoreOrbitals } from '../../chemistry/elements';
import { type CancelToken, type MolecularBasis, throwIfCancelled, type TwoElectronIntegrals } from '../contracts';
import { multiply, multiplyTransposeA, symmetricEigen } from '../linalg';
import type { ScfWavefunction } from '../scf/engine';

/** Default memory for the transformation intermediates: 512 MiB. */
export const DEFAULT_MP2_MEMORY = 512 * 1024 * 1024;
/** Schwarz bound below which AO quartets are skipped. */
const SCREENING = 1e-12;

export class Mp2InputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'Mp2InputError';
  }
}

export interface Mp2Options {
  /** true: the noble-gas core of every atom (less ECP cores); a number: that many orbitals; default false. */
  readonly frozenCore?: boolean | number;
  /** Bytes the transformation may hold at once; default 512 MiB. */
  readonly memoryBytes?: number;
  readonly cancel?: CancelToken;
  /** Called after each batch of occupied orbitals. */
  readonly onProgress?: (progress: { readonly done: number; readonly total: number }) => void;
}

export interface Mp2Result {
  readonly correlationEnergy: number;
  /** SCF energy + correlation energy. */
  readonly totalEnergy: number;
  readonly oppositeSpin: number;
  readonly sameSpin: number;
  /** Orbitals left uncorrelated (lowest in energy). */
  readonly frozenCore: number;
  /** Occupied orbitals batched together, and batches (each one pass over the AO integrals). */
  readonly batchSize: number;
  readonly batches: number;
  /** Natural occupation numbers, descending (sum = electrons). */
  readonly naturalOccupations: readonly number[];
}

export interface Mp2Outcome {
  readonly result: Mp2Result;
  /** Spin-summed unrelaxed density in the canonical orbitals (M×M). */
  readonly density: Float64Array;
  /** Natural orbitals in the AO basis (n×M), columns in order of naturalOccupations. */
  readonly naturalOrbitals: Float64Array;
}

/** Frozen-core orbitals by the noble-gas rule (chemistry/elements.ts), less the cores an ECP replaces. */
export function frozenCoreOrbitals(basis: MolecularBasis): number {
  let count = 0;
  basis.centers.forEach((center, index) => {
    const ecp = basis.ecps.find((entry) => entry.center === index);
    count += Math.max(0, nobleGasCoreOrbitals(center.atomicNumber) - (ecp ? ecp.coreElectrons / 2 : 0));
  });
  return count;
}

const pairIndex = (i: number, j: number) => (i >= j ? (i * (i + 1)) / 2 + j : (j * (j + 1)) / 2 + i);

export function mp2(wavefunction: ScfWavefunction, eri: TwoElectronIntegrals, options: Mp2Options = {}): Mp2Outcome {
  if (wavefunction.reference !== 'rhf') throw new Mp2InputError(`MP2 here needs an RHF reference, not ${wavefunction.reference.toUpperCase()}.`);
  const basis = eri.basis;
  const n = basis.functionCount;
  const mAll = wavefunction.orbitalEnergies.alpha.length;
  const occupied = wavefunction.electrons.alpha;
  const frozen = options.frozenCore === true ? frozenCoreOrbitals(basis) : typeof options.frozenCore === 'number' ? options.frozenCore : 0;
  if (!Number.isInteger(frozen) || frozen < 0 || frozen > occupied) throw new Mp2InputError(`Cannot freeze ${frozen} of ${occupied} occupied orbitals.`);
  const o = occupied - frozen;
  const v = mAll - occupied;
  const c = wavefunction.coefficients.alpha;
  const eps = wavefunction.orbitalEnergies.alpha;
  // Coefficients of the active occupied and the virtual orbitals (n×o, n×v).
  const cOcc = new Float64Array(n * o);
  const cVir = new Float64Array(n * v);
  for (let mu = 0; mu < n; mu++) {
    for (let i = 0; i < o; i++) cOcc[mu * o + i] = c[mu * mAll + frozen + i]!;
    for (let a = 0; a < v; a++) cVir[mu * v + a] = c[mu * mAll + occupied + a]!;
  }
  const npair = (n * (n + 1)) / 2;
  const perOccupied = 8 * (n * npair + v * npair) + 8 * o * v * v * 3;
  const budget = options.memoryBytes ?? DEFAULT_MP2_MEMORY;
  const batchSize = Math.max(1, Math.min(o, Math.floor(budget / perOccupied)));
  if (o > 0 && perOccupied > budget) {
    throw new Mp2InputError(`MP2 needs at least ${(perOccupied / 2 ** 20).toFixed(0)} MiB for one occupied orbital at a time; the limit is ${(budget / 2 ** 20).toFixed(0)} MiB.`);
  }
  const batches = o === 0 ? 0 : Math.ceil(o / batchSize);

  let oppositeSpin = 0;
  let sameSpin = 0;
  const occupiedDensity = new Float64Array(o * o); // correction to 2δ_ij
  const virtualDensity = new Float64Array(v * v);
  const firstQuarter = new Float64Array(batchSize * n * npair);
  const half = new Float64Array(v * npair); // (ia|λσ) for one i
  const square = new Float64Array(n * n);
  const mOcc = new Float64Array(n * o);
  const iajb = new Float64Array(o * v * v); // for one i: [j][a][b]
  const t = new Float64Array(o * v * v); // amplitudes t_ij^ab for one i: [j][a][b]
  const tTilde = new Float64Array(o * v * v);
  const row = new Float64Array(v);

  for (let batch = 0; batch < batches; batch++) {
    const first = batch * batchSize;
    const size = Math.min(batchSize, o - first);
    firstQuarterTransform(eri, cOcc, o, first, size, firstQuarter, options.cancel);
    for (let local = 0; local < size; local++) {
      throwIfCancelled(options.cancel);
      const i = first + local;
      // ν → a: half[a][λσ] = Σ_ν C_νa (iν|λσ).
      multiplyTransposeA(cVir, firstQuarter.subarray(local * n * npair, (local + 1) * n * npair), n, v, npair, half);
      for (let a = 0; a < v; a++) {
        // (ia|jb) = Σ_λσ C_λj (ia|λσ) C_σb.
        const packed = half.subarray(a * npair, (a + 1) * npair);
        for (let l = 0; l < n; l++) for (let s = 0; s <= l; s++) square[l * n + s] = square[s * n + l] = packed[(l * (l + 1)) / 2 + s]!;
        const left = multiplyTransposeA(cOcc, square, n, o, n, mOcc); // o×n: Σ_λ C_λj M_λσ
        for (let j = 0; j < o; j++) {
          for (let b = 0; b < v; b++) row[b] = 0;
          for (let s = 0; s < n; s++) {
            const factor = left[j * n + s]!;
            if (factor === 0) continue;
            for (let b = 0; b < v; b++) row[b]! += factor * cVir[s * v + b]!;
          }
          iajb.set(row, (j * v + a) * v);
        }
      }
      const ei = eps[frozen + i]!;
      for (let j = 0; j < o; j++) {
        const ej = eps[frozen + j]!;
        for (let a = 0; a < v; a++) {
          const ea = eps[occupied + a]!;
          for (let b = 0; b < v; b++) {
            const index = (j * v + a) * v + b;
            t[index] = iajb[index]! / (ei + ej - ea - eps[occupied + b]!);
          }
        }
      }
      for (let j = 0; j < o; j++) {
        for (let a = 0; a < v; a++) {
          for (let b = 0; b < v; b++) {
            const ab = (j * v + a) * v + b;
            const ba = (j * v + b) * v + a;
            oppositeSpin += t[ab]! * iajb[ab]!;
            sameSpin += (t[ab]! - t[ba]!) * iajb[ab]!;
            tTilde[ab] = 2 * t[ab]! - t[ba]!;
          }
        }
      }
      // Occupied block: D_jl −= 2 Σ_ab t_ij^ab t̃_il^ab (i plays k of the header).
      const width = v * v;
      for (let j = 0; j < o; j++) {
        for (let l = 0; l < o; l++) {
          let sum = 0;
          for (let x = 0; x < width; x++) sum += t[j * width + x]! * tTilde[l * width + x]!;
          occupiedDensity[j * o + l]! -= 2 * sum;
        }
      }
      // Virtual block: D_ab += 2 Σ_jc t_ij^ac t̃_ij^bc.
      for (let j = 0; j < o; j++) {
        const tj = t.subarray(j * width, (j + 1) * width);
        const ttj = tTilde.subarray(j * width, (j + 1) * width);
        multiplyTransposeBAccumulate(tj, ttj, v, virtualDensity, 2);
      }
    }
    options.onProgress?.({ done: first + size, total: o });
  }
  const correlationEnergy = oppositeSpin + sameSpin;

  // Full spin-summed density in the canonical orbitals.
  const density = new Float64Array(mAll * mAll);
  for (let k = 0; k < occupied; k++) density[k * mAll + k] = 2;
  for (let i = 0; i < o; i++) for (let j = 0; j < o; j++) density[(frozen + i) * mAll + frozen + j]! += 0.5 * (occupiedDensity[i * o + j]! + occupiedDensity[j * o + i]!);
  for (let a = 0; a < v; a++) for (let b = 0; b < v; b++) density[(occupied + a) * mAll + occupied + b] = 0.5 * (virtualDensity[a * v + b]! + virtualDensity[b * v + a]!);
  const negated = density.map((value) => -value);
  const { values, vectors } = symmetricEigen(negated, mAll);
  const naturalOccupations = Array.from(values, (value) => -value);
  const naturalOrbitals = multiply(c, vectors, n, mAll, mAll, new Float64Array(n * mAll));
  return {
    result: {
      correlationEnergy,
      totalEnergy: wavefunction.energy + correlationEnergy,
      oppositeSpin,
      sameSpin,
      frozenCore: frozen,
      batchSize,
      batches,
      naturalOccupations,
    },
    density,
    naturalOrbitals,
  };
}

/** out (v×v) += factor · A·Bᵀ for v×v matrices A and B. */
function multiplyTransposeBAccumulate(a: Float64Array, b: Float64Array, v: number, out: Float64Array, factor: number): void {
  for (let i = 0; i < v; i++) {
    for (let j = 0; j < v; j++) {
      let sum = 0;
      for (let k = 0; k < v; k++) sum += a[i * v + k]! * b[j * v + k]!;
      out[i * v + j]! += factor * sum;
    }
  }
}

/**
 * (iν|λσ) = Σ_μ C_μi (μν|λσ) for occupied i in [first, first + size), into out[i][ν][pair(λ, σ)],
 * from every unique shell quartet (PQ|RS), P ≥ Q, R ≥ S, PQ ≥ RS, screened by Schwarz.
 */
function firstQuarterTransform(eri: TwoElectronIntegrals, cOcc: Float64Array, o: number, first: number, size: number, out: Float64Array, cancel: CancelToken | undefined): void {
  const basis = eri.basis;
  const n = basis.functionCount;
  const npair = (n * (n + 1)) / 2;
  out.fill(0, 0, size * n * npair);
  const shells = basis.shells;
  let largest = 0;
  for (const shell of shells) largest = Math.max(largest, shell.size);
  const block = new Float64Array(largest ** 4);
  const stride = n * npair;
  const add = (mu: number, nu: number, lambdaSigma: number, value: number) => {
    for (let k = 0; k < size; k++) out[k * stride + nu * npair + lambdaSigma]! += cOcc[mu * o + first + k]! * value;
  };
  for (let p = 0; p < shells.length; p++) {
    throwIfCancelled(cancel);
    for (let q = 0; q <= p; q++) {
      const pq = pairIndex(p, q);
      const bound = eri.schwarz(p, q);
      for (let r = 0; r <= p; r++) {
        for (let s = 0; s <= r; s++) {
          if (pairIndex(r, s) > pq) continue;
          const samePair = pairIndex(r, s) === pq;
          if (bound * eri.schwarz(r, s) < SCREENING) continue;
          const [sp, sq, sr, ss] = [shells[p]!, shells[q]!, shells[r]!, shells[s]!];
          eri.shellQuartet(p, q, r, s, block);
          let w = 0;
          for (let a = 0; a < sp.size; a++) {
            const fp = sp.offset + a;
            for (let b = 0; b < sq.size; b++) {
              const fq = sq.offset + b;
              for (let cc = 0; cc < sr.size; cc++) {
                const fr = sr.offset + cc;
                for (let d = 0; d < ss.size; d++, w++) {
                  const fs = ss.offset + d;
                  // Unique function quartets only: within a diagonal shell pair fp ≥ fq (and
                  // fr ≥ fs), within a diagonal pair of pairs (fp fq) ≥ (fr fs).
                  if (fq > fp || fs > fr) continue;
                  const left = pairIndex(fp, fq);
                  const right = pairIndex(fr, fs);
                  if (samePair && right > left) continue;
                  const value = block[w]!;
                  if (value === 0) continue;
                  add(fp, fq, right, value);
                  if (fp !== fq) add(fq, fp, right, value);
                  if (left !== right) {
                    add(fr, fs, left, value);
                    if (fr !== fs) add(fs, fr, left, value);
                  }
                }
              }
            }
          }
        }
      }
    }
  }
}
