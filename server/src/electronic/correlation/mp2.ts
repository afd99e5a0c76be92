/**
 * Second-order Møller–Plesset correlation energy on an RHF reference (and on UHF, energy only, below) (C. Møller, M. S. Plesset,
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

/** Occupied and virtual orbitals of one spin, as the transformation reads them. */
interface OrbitalSet {
  /** n×o and n×v coefficients. */
  readonly occ: Float64Array;
  readonly vir: Float64Array;
  readonly o: number;
  readonly v: number;
  readonly eOcc: Float64Array;
  readonly eVir: Float64Array;
}

function orbitalSet(c: Float64Array, energies: Float64Array, n: number, frozen: number, occupied: number): OrbitalSet {
  const m = energies.length;
  const o = occupied - frozen;
  const v = m - occupied;
  const occ = new Float64Array(n * o);
  const vir = new Float64Array(n * v);
  for (let mu = 0; mu < n; mu++) {
    for (let i = 0; i < o; i++) occ[mu * o + i] = c[mu * m + frozen + i]!;
    for (let a = 0; a < v; a++) vir[mu * v + a] = c[mu * m + occupied + a]!;
  }
  return { occ, vir, o, v, eOcc: energies.slice(frozen, occupied), eVir: energies.slice(occupied) };
}

function resolveFrozen(options: Mp2Options, basis: MolecularBasis, occupied: number): number {
  const frozen = options.frozenCore === true ? frozenCoreOrbitals(basis) : typeof options.frozenCore === 'number' ? options.frozenCore : 0;
  if (!Number.isInteger(frozen) || frozen < 0 || frozen > occupied) throw new Mp2InputError(`Cannot freeze ${frozen} of ${occupied} occupied orbitals.`);
  return frozen;
}

/**
 * Calls `visit(i, blocks)` for every active occupied orbital i of `left`, with blocks[r][j][a][b] =
 * (ia|jb) for a virtual of `left` and j, b occupied and virtual of rights[r]. Batches the occupied
 * orbitals so that the intermediates (plus `extraPerOccupied` bytes the caller holds per orbital)
 * stay within the memory budget.
 */
function transformPairs(
  eri: TwoElectronIntegrals,
  left: OrbitalSet,
  rights: readonly OrbitalSet[],
  options: Mp2Options,
  extraPerOccupied: number,
  visit: (i: number, blocks: readonly Float64Array[]) => void,
): { batchSize: number; batches: number } {
  const n = eri.basis.functionCount;
  const { o, v } = left;
  const npair = (n * (n + 1)) / 2;
  const perOccupied = 8 * (n * npair + v * npair) + rights.reduce((sum, right) => sum + 8 * right.o * v * right.v, 0) + extraPerOccupied;
  const budget = options.memoryBytes ?? DEFAULT_MP2_MEMORY;
  if (o > 0 && perOccupied > budget) {
    throw new Mp2InputError(`MP2 needs at least ${(perOccupied / 2 ** 20).toFixed(1)} MiB for one occupied orbital at a time; the limit is ${(budget / 2 ** 20).toFixed(1)} MiB.`);
  }
  const batchSize = Math.max(1, Math.min(o, Math.floor(budget / perOccupied)));
  const batches = o === 0 ? 0 : Math.ceil(o / batchSize);
  const firstQuarter = new Float64Array(batchSize * n * npair);
  const half = new Float64Array(v * npair); // (ia|λσ) for one i
  const square = new Float64Array(n * n);
  const rightOcc = rights.map((right) => new Float64Array(right.o * n));
  const blocks = rights.map((right) => new Float64Array(right.o * v * right.v));
  const row = new Float64Array(Math.max(1, ...rights.map((right) => right.v)));
  for (let batch = 0; batch < batches; batch++) {
    const first = batch * batchSize;
    const size = Math.min(batchSize, o - first);
    firstQuarterTransform(eri, left.occ, o, first, size, firstQuarter, options.cancel);
    for (let local = 0; local < size; local++) {
      throwIfCancelled(options.cancel);
      // ν → a: half[a][λσ] = Σ_ν C_νa (iν|λσ).
      multiplyTransposeA(left.vir, firstQuarter.subarray(local * n * npair, (local + 1) * n * npair), n, v, npair, half);
      for (let a = 0; a < v; a++) {
        const packed = half.subarray(a * npair, (a + 1) * npair);
        for (let l = 0; l < n; l++) for (let s = 0; s <= l; s++) square[l * n + s] = square[s * n + l] = packed[(l * (l + 1)) / 2 + s]!;
        rights.forEach((right, r) => {
          // (ia|jb) = Σ_λσ C_λj (ia|λσ) C_σb.
          const partial = multiplyTransposeA(right.occ, square, n, right.o, n, rightOcc[r]!); // o×n
          const block = blocks[r]!;
          for (let j = 0; j < right.o; j++) {
            row.fill(0, 0, right.v);
            for (let s = 0; s < n; s++) {
              const factor = partial[j * n + s]!;
              if (factor === 0) continue;
              for (let b = 0; b < right.v; b++) row[b]! += factor * right.vir[s * right.v + b]!;
            }
            block.set(row.subarray(0, right.v), (j * v + a) * right.v);
          }
        });
      }
      visit(first + local, blocks);
    }
    options.onProgress?.({ done: first + size, total: o });
  }
  return { batchSize, batches };
}

export function mp2(wavefunction: ScfWavefunction, eri: TwoElectronIntegrals, options: Mp2Options = {}): Mp2Outcome {
  if (wavefunction.reference !== 'rhf') {
    throw new Mp2InputError(`This MP2 needs an RHF reference, not ${wavefunction.reference.toUpperCase()}${wavefunction.reference === 'uhf' ? ' (use unrestrictedMp2 for the energy)' : ''}.`);
  }
  const basis = eri.basis;
  const n = basis.functionCount;
  const mAll = wavefunction.orbitalEnergies.alpha.length;
  const occupied = wavefunction.electrons.alpha;
  const frozen = resolveFrozen(options, basis, occupied);
  const set = orbitalSet(wavefunction.coefficients.alpha, wavefunction.orbitalEnergies.alpha, n, frozen, occupied);
  const { o, v, eOcc, eVir } = set;
  let oppositeSpin = 0;
  let sameSpin = 0;
  const occupiedDensity = new Float64Array(o * o); // correction to 2δ_ij
  const virtualDensity = new Float64Array(v * v);
  const t = new Float64Array(o * v * v); // amplitudes t_ij^ab for one i: [j][a][b]
  const tTilde = new Float64Array(o * v * v);
  const width = v * v;
  const { batchSize, batches } = transformPairs(eri, set, [set], options, 16 * o * v * v, (i, [iajb]) => {
    const ei = eOcc[i]!;
    for (let j = 0; j < o; j++) {
      const ej = eOcc[j]!;
      for (let a = 0; a < v; a++) {
        const ea = eVir[a]!;
        for (let b = 0; b < v; b++) {
          const index = (j * v + a) * v + b;
          t[index] = iajb![index]! / (ei + ej - ea - eVir[b]!);
        }
      }
    }
    for (let j = 0; j < o; j++) {
      for (let a = 0; a < v; a++) {
        for (let b = 0; b < v; b++) {
          const ab = (j * v + a) * v + b;
          const ba = (j * v + b) * v + a;
          oppositeSpin += t[ab]! * iajb![ab]!;
          sameSpin += (t[ab]! - t[ba]!) * iajb![ab]!;
          tTilde[ab] = 2 * t[ab]! - t[ba]!;
        }
      }
    }
    // Occupied block: D_jl −= 2 Σ_ab t_ij^ab t̃_il^ab (i plays k of the header).
    for (let j = 0; j < o; j++) {
      for (let l = 0; l < o; l++) {
        let sum = 0;
        for (let x = 0; x < width; x++) sum += t[j * width + x]! * tTilde[l * width + x]!;
        occupiedDensity[j * o + l]! -= 2 * sum;
      }
    }
    // Virtual block: D_ab += 2 Σ_jc t_ij^ac t̃_ij^bc.
    for (let j = 0; j < o; j++) multiplyTransposeBAccumulate(t.subarray(j * width, (j + 1) * width), tTilde.subarray(j * width, (j + 1) * width), v, virtualDensity, 2);
  });
  const correlationEnergy = oppositeSpin + sameSpin;

  // Full spin-summed density in the canonical orbitals.
  const density = new Float64Array(mAll * mAll);
  for (let k = 0; k < occupied; k++) density[k * mAll + k] = 2;
  for (let i = 0; i < o; i++) for (let j = 0; j < o; j++) density[(frozen + i) * mAll + frozen + j]! += 0.5 * (occupiedDensity[i * o + j]! + occupiedDensity[j * o + i]!);
  for (let a = 0; a < v; a++) for (let b = 0; b < v; b++) density[(occupied + a) * mAll + occupied + b] = 0.5 * (virtualDensity[a * v + b]! + virtualDensity[b * v + a]!);
  const negated = density.map((value) => -value);
  const { values, vectors } = symmetricEigen(negated, mAll);
  const naturalOccupations = Array.from(values, (value) => -value);
  const naturalOrbitals = multiply(wavefunction.coefficients.alpha, vectors, n, mAll, mAll, new Float64Array(n * mAll));
  return {
    result: { correlationEnergy, totalEnergy: wavefunction.energy + correlationEnergy, oppositeSpin, sameSpin, frozenCore: frozen, batchSize, batches, naturalOccupations },
    density,
    naturalOrbitals,
  };
}

export interface UnrestrictedMp2Result {
  readonly correlationEnergy: number;
  readonly totalEnergy: number;
  /** αβ part. */
  readonly oppositeSpin: number;
  /** αα + ββ parts. */
  readonly sameSpin: number;
  /** Orbitals of each spin left uncorrelated. */
  readonly frozenCore: number;
}

/**
 * MP2 energy on a UHF reference (J. A. Pople, J. S. Binkley, R. Seeger, Int. J. Quantum Chem.
 * Symp. 10, 1 (1976)): E = ¼ Σ_σ Σ_ijab |⟨ij||ab⟩|²/D over same-spin pairs + Σ (ia|jb)²/D over
 * α–β pairs, D = ε_i + ε_j − ε_a − ε_b. Two passes over the integrals (α and β on the left);
 * frozen core removes the same number of the lowest orbitals of each spin.
 */
export function unrestrictedMp2(wavefunction: ScfWavefunction, eri: TwoElectronIntegrals, options: Mp2Options = {}): UnrestrictedMp2Result {
  if (wavefunction.reference !== 'uhf') throw new Mp2InputError(`unrestrictedMp2 needs a UHF reference, not ${wavefunction.reference.toUpperCase()}.`);
  const basis = eri.basis;
  const n = basis.functionCount;
  const frozen = resolveFrozen(options, basis, wavefunction.electrons.beta);
  const alpha = orbitalSet(wavefunction.coefficients.alpha, wavefunction.orbitalEnergies.alpha, n, frozen, wavefunction.electrons.alpha);
  const beta = orbitalSet(wavefunction.coefficients.beta, wavefunction.orbitalEnergies.beta, n, frozen, wavefunction.electrons.beta);
  let sameSpin = 0;
  let oppositeSpin = 0;
  const sameSpinPart = (set: OrbitalSet, i: number, iajb: Float64Array) => {
    const { o, v, eOcc, eVir } = set;
    let sum = 0;
    for (let j = 0; j < o; j++) {
      for (let a = 0; a < v; a++) {
        for (let b = 0; b < v; b++) {
          const anti = iajb[(j * v + a) * v + b]! - iajb[(j * v + b) * v + a]!;
          sum += (anti * anti) / (eOcc[i]! + eOcc[j]! - eVir[a]! - eVir[b]!);
        }
      }
    }
    return 0.25 * sum;
  };
  transformPairs(eri, alpha, [alpha, beta], options, 0, (i, [aa, ab]) => {
    sameSpin += sameSpinPart(alpha, i, aa!);
    for (let j = 0; j < beta.o; j++) {
      for (let a = 0; a < alpha.v; a++) {
        for (let b = 0; b < beta.v; b++) {
          const value = ab![(j * alpha.v + a) * beta.v + b]!;
          oppositeSpin += (value * value) / (alpha.eOcc[i]! + beta.eOcc[j]! - alpha.eVir[a]! - beta.eVir[b]!);
        }
      }
    }
  });
  transformPairs(eri, beta, [beta], options, 0, (i, [bb]) => {
    sameSpin += sameSpinPart(beta, i, bb!);
  });
  const correlationEnergy = sameSpin + oppositeSpin;
  return { correlationEnergy, totalEnergy: wavefunction.energy + correlationEnergy, oppositeSpin, sameSpin, frozenCore: frozen };
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
