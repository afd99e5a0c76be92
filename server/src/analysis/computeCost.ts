/**
 * What computing one part's mean field is expected to cost, from its basis-function count alone:
 * an estimate, said so wherever it is shown, used to decide which parts run by themselves, to
 * label the offer to compute the others, and to refuse a job that does not fit the memory limit.
 *
 * Time: t ≈ 0.1 s + 4 s × (n / 114)^2.75 for the SCF, fitted to the mean-field benchmark
 * (bench/scf.ts, processor seconds on the development machine with a free core, 2026-12-03:
 * water/cc-pVDZ 24 functions 0.09 s, benzene/6-31G* 102 functions 2.6 s, benzene/cc-pVDZ 114
 * functions 4.2 s, 13 waters/cc-pVDZ 312 functions 66 s); the exponent 2.75 lies between the formal
 * n⁴ and the n² that Schwarz screening approaches in large, spread-out parts. MP2 adds the
 * integral-direct transformation, taken as twice the SCF (benzene/cc-pVDZ: 11.6 s after a 5.7 s
 * SCF in the same run). A busy machine stretches both; the figure is a planning estimate.
 * Memory: a worker's baseline (48 MiB), the SCF's dense matrices (about 40 n² doubles: overlap,
 * core Hamiltonian, Fock, density, Coulomb, exchange and coefficients per spin, DIIS history of 8
 * Fock and error matrices per spin) and the stored two-electron integrals (n⁴/8 values at most,
 * up to the storage limit; beyond it the builds recompute the rest, so a smaller limit costs time,
 * not a refusal). MP2's intermediates are bounded by its own budget (DEFAULT_MP2_MEMORY).
 */

/** The storage limit of the integrals when the memory limit allows it (DEFAULT_STORAGE_LIMIT_BYTES). */
export const STORED_INTEGRALS_BYTES = 512 * 2 ** 20;
/** MP2 transformation budget (DEFAULT_MP2_MEMORY of electronic/correlation). */
export const MP2_BUDGET_BYTES = 512 * 2 ** 20;
/** A worker thread's own memory before any matrix (measured: about 40 MiB of V8 heap and code). */
export const WORKER_BASELINE_BYTES = 48 * 2 ** 20;
/** Default memory limit of one job. */
export const DEFAULT_MEMORY_LIMIT_BYTES = 2 * 2 ** 30;

export interface ComputeCost {
  readonly functions: number;
  /** Expected wall time of the SCF and of MP2 after it, seconds. */
  readonly scfSeconds: number;
  readonly mp2Seconds: number;
  /** Memory the SCF must have (baseline and matrices), and what it takes with stored integrals. */
  readonly requiredBytes: number;
  readonly expectedBytes: number;
  /** Storage for the integrals that fits the memory limit (0: every build direct). */
  readonly storageBytes: number;
  /** True when even direct builds do not fit the memory limit. */
  readonly exceedsLimit: boolean;
  readonly memoryLimitBytes: number;
}

/** The cost of one part's mean field (SCF; MP2 separately) under a memory limit. */
export function computeCost(functions: number, memoryLimitBytes = DEFAULT_MEMORY_LIMIT_BYTES): ComputeCost {
  const n = Math.max(0, functions);
  const scfSeconds = 0.1 + 4 * (n / 114) ** 2.75;
  const matrices = 40 * n * n * 8;
  const requiredBytes = WORKER_BASELINE_BYTES + matrices;
  const allIntegrals = (n ** 4 / 8) * 8;
  const storageBytes = Math.max(0, Math.min(STORED_INTEGRALS_BYTES, allIntegrals, memoryLimitBytes - requiredBytes));
  return {
    functions: n,
    scfSeconds,
    mp2Seconds: 2 * scfSeconds,
    requiredBytes,
    expectedBytes: requiredBytes + storageBytes,
    storageBytes,
    exceedsLimit: requiredBytes > memoryLimitBytes,
    memoryLimitBytes,
  };
}

/** "about 12 s", "about 3 min", "about 2.5 h". */
export function formatDuration(seconds: number): string {
  if (seconds < 1) return 'under 1 s';
  if (seconds < 90) return `about ${Math.round(seconds)} s`;
  if (seconds < 90 * 60) return `about ${Math.round(seconds / 60)} min`;
  return `about ${(seconds / 3600).toFixed(seconds < 36_000 ? 1 : 0)} h`;
}

/** "310 MiB", "2.1 GiB". */
export function formatMemory(bytes: number): string {
  const mib = bytes / 2 ** 20;
  return mib < 1024 ? `${Math.max(1, Math.round(mib))} MiB` : `${(mib / 1024).toFixed(1)} GiB`;
}

/** "about 3 min and 610 MiB (an estimate from 300 functions)". */
export function costText(cost: ComputeCost, withMp2: boolean): string {
  return `${formatDuration(cost.scfSeconds + (withMp2 ? cost.mp2Seconds : 0))} and ${formatMemory(cost.expectedBytes)} (an estimate from ${cost.functions} functions)`;
}
