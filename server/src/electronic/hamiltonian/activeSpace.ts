/**
 * Active-space integrals in the frozen-core approximation.
 *
 * With restricted orbitals, core orbitals c (doubly occupied, below the active space) and active
 * orbitals p, q, r, s, the electronic Hamiltonian restricted to determinants with every core
 * orbital doubly occupied is (e.g. Helgaker, Jørgensen & Olsen, Molecular Electronic-Structure
 * Theory (Wiley, 2000), §10.1; the same partition as the CASCI energy expression)
 *
 *   H = E_c + Σ_pq h^eff_pq E_pq + ½ Σ_pqrs (pq|rs) (E_pq E_rs − δ_qr E_ps)
 *
 *   E_c       = V_nn + Σ_μν D_μν (2 h_μν + 2 J_μν − K_μν)      (nuclear repulsion + core energy)
 *   h^eff_pq  = Σ_μν C_μp C_νq (h + 2J − K)_μν
 *
 * with the core density D = Σ_c C_c C_cᵀ (per spin), J[μν] = Σ (μν|λσ) D_λσ and
 * K[μν] = Σ (μλ|νσ) D_λσ. h is the core Hamiltonian T + V in the atomic-orbital basis.
 */
import { type CancelToken } from '../contracts';
import { multiply, multiplyTransposeA } from '../linalg';
import { aoSource, type AoTwoElectronInput } from './aoSource';
import { transformTwoElectron, type TransformStatistics } from './transform';

/** Restricted molecular orbitals: the same spatial orbitals for both spins. */
export interface RestrictedOrbitals {
  /** Basis functions N. */
  readonly functionCount: number;
  /** Molecular orbitals M. */
  readonly orbitalCount: number;
  /** C[μ·M + p]: coefficient of basis function μ in orbital p (N × M, row-major). */
  readonly coefficients: Float64Array;
}

export interface ElectronCount {
  readonly alpha: number;
  readonly beta: number;
}

export interface ActiveSpaceInput {
  /** Core Hamiltonian T + V in the atomic-orbital basis (N × N, row-major, symmetric). */
  readonly hCore: Float64Array;
  readonly twoElectron: AoTwoElectronInput;
  readonly orbitals: RestrictedOrbitals;
  /** Nuclear repulsion V_nn (hartree). */
  readonly nuclearRepulsion: number;
  /** Indices of the doubly occupied orbitals kept frozen below the active space. */
  readonly core: readonly number[];
  /** Indices of the active orbitals, in the order they take on the qubit register. */
  readonly active: readonly number[];
  /** Electrons of the whole part (core included). */
  readonly electrons: ElectronCount;
  readonly memoryBytes?: number;
  readonly screening?: number;
  readonly cancel?: CancelToken;
}

/** The integrals of an active space: everything the qubit Hamiltonian and the exports need. */
export interface ActiveSpaceIntegrals {
  /** Active spatial orbitals n. */
  readonly orbitals: number;
  /** Active electrons. */
  readonly electrons: ElectronCount;
  /** V_nn + core energy (hartree). */
  readonly constant: number;
  readonly nuclearRepulsion: number;
  readonly coreEnergy: number;
  /** h^eff (n × n, row-major, symmetric). */
  readonly oneBody: Float64Array;
  /** Active (pq|rs), packed with eightfold symmetry (pairs.ts). */
  readonly twoBody: Float64Array;
}

export class ActiveSpaceError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ActiveSpaceError';
  }
}

export function activeSpaceIntegrals(input: ActiveSpaceInput): ActiveSpaceIntegrals & { statistics: TransformStatistics } {
  const { orbitals, core, active } = input;
  const N = orbitals.functionCount;
  const M = orbitals.orbitalCount;
  checkInput(input);
  const n = active.length;
  const source = aoSource(input.twoElectron);
  if (source.functionCount !== N) throw new ActiveSpaceError(`the two-electron integrals have ${source.functionCount} basis functions, the orbitals ${N}`);

  const ca = columns(orbitals.coefficients, N, M, active);
  const cc = columns(orbitals.coefficients, N, M, core);
  const density = new Float64Array(N * N);
  const nc = core.length;
  for (let mu = 0; mu < N; mu++) {
    for (let nu = 0; nu <= mu; nu++) {
      let sum = 0;
      for (let c = 0; c < nc; c++) sum += cc[mu * nc + c]! * cc[nu * nc + c]!;
      density[mu * N + nu] = density[nu * N + mu] = sum;
    }
  }

  // Fock operator of the core, h + 2J − K, and the core energy.
  const fock = Float64Array.from(input.hCore);
  let coreEnergy = 0;
  if (nc > 0) {
    const J = new Float64Array(N * N);
    const K = new Float64Array(N * N);
    source.coulombExchange(density, J, K, input.cancel);
    for (let i = 0; i < N * N; i++) {
      fock[i] = input.hCore[i]! + 2 * J[i]! - K[i]!;
      coreEnergy += density[i]! * (2 * input.hCore[i]! + 2 * J[i]! - K[i]!);
    }
  }

  const oneBody = congruence(fock, ca, N, n);
  const { values: twoBody, statistics } = transformTwoElectron(source, ca, n, {
    ...(input.memoryBytes !== undefined ? { memoryBytes: input.memoryBytes } : {}),
    ...(input.screening !== undefined ? { screening: input.screening } : {}),
    ...(input.cancel !== undefined ? { cancel: input.cancel } : {}),
  });
  return {
    orbitals: n,
    electrons: { alpha: input.electrons.alpha - nc, beta: input.electrons.beta - nc },
    constant: input.nuclearRepulsion + coreEnergy,
    nuclearRepulsion: input.nuclearRepulsion,
    coreEnergy,
    oneBody,
    twoBody,
    statistics,
  };
}

function checkInput(input: ActiveSpaceInput): void {
  const { orbitals, core, active, electrons } = input;
  const N = orbitals.functionCount;
  const M = orbitals.orbitalCount;
  if (orbitals.coefficients.length !== N * M) throw new ActiveSpaceError(`orbital coefficients: ${orbitals.coefficients.length} numbers for ${N} functions × ${M} orbitals`);
  if (input.hCore.length !== N * N) throw new ActiveSpaceError(`core Hamiltonian: ${input.hCore.length} numbers for ${N} × ${N} functions`);
  if (active.length === 0) throw new ActiveSpaceError('the active space has no orbitals');
  const seen = new Set<number>();
  for (const [label, list] of [['core', core], ['active', active]] as const) {
    for (const index of list) {
      if (!Number.isInteger(index) || index < 0 || index >= M) throw new ActiveSpaceError(`${label} orbital ${index} is not one of the ${M} orbitals (0 to ${M - 1})`);
      if (seen.has(index)) throw new ActiveSpaceError(`orbital ${index} is listed twice among the core and active orbitals`);
      seen.add(index);
    }
  }
  const nc = core.length;
  const n = active.length;
  for (const spin of ['alpha', 'beta'] as const) {
    const count = electrons[spin] - nc;
    if (!Number.isInteger(electrons[spin]) || count < 0 || count > n) {
      throw new ActiveSpaceError(`${electrons[spin]} ${spin} electrons do not fit ${nc} core orbitals plus ${n} active orbitals (0 to ${n} ${spin} electrons in the active space)`);
    }
  }
}

/** The chosen columns of C as an N × k row-major matrix. */
function columns(coefficients: Float64Array, N: number, M: number, indices: readonly number[]): Float64Array {
  const k = indices.length;
  const out = new Float64Array(N * k);
  for (let mu = 0; mu < N; mu++) for (let c = 0; c < k; c++) out[mu * k + c] = coefficients[mu * M + indices[c]!]!;
  return out;
}

/** Cᵀ A C for symmetric A (N × N) and C (N × n); result n × n, made exactly symmetric from its lower triangle. */
function congruence(A: Float64Array, C: Float64Array, N: number, n: number): Float64Array {
  const AC = multiply(A, C, N, N, n, new Float64Array(N * n));
  const out = multiplyTransposeA(C, AC, N, n, n, new Float64Array(n * n));
  for (let p = 0; p < n; p++) for (let q = 0; q < p; q++) out[q * n + p] = out[p * n + q]!;
  return out;
}

/**
 * The active window the command line uses for `--active Ne No`: the orbitals below it doubly
 * occupied, then `activeOrbitals` orbitals in energy order holding `activeElectrons` electrons —
 * for a closed shell the Ne/2 highest occupied and the lowest virtual orbitals.
 */
export function activeWindow(orbitalCount: number, electrons: ElectronCount, activeElectrons: number, activeOrbitals: number): { core: number[]; active: number[] } {
  const total = electrons.alpha + electrons.beta;
  const coreElectrons = total - activeElectrons;
  if (!Number.isInteger(activeElectrons) || activeElectrons < 0 || activeElectrons > total) throw new ActiveSpaceError(`${activeElectrons} active electrons: the part has ${total}`);
  if (coreElectrons % 2 !== 0) throw new ActiveSpaceError(`${activeElectrons} active electrons leave ${coreElectrons} below the active space, an odd number that cannot fill doubly occupied orbitals`);
  const nc = coreElectrons / 2;
  if (electrons.beta < nc) throw new ActiveSpaceError(`${activeElectrons} active electrons leave ${nc} doubly occupied orbitals below the active space, but only ${electrons.beta} beta electrons`);
  if (!Number.isInteger(activeOrbitals) || activeOrbitals < 1 || nc + activeOrbitals > orbitalCount) {
    throw new ActiveSpaceError(`${activeOrbitals} active orbitals above ${nc} core orbitals: the part has ${orbitalCount} orbitals`);
  }
  if (electrons.alpha - nc > activeOrbitals) throw new ActiveSpaceError(`${electrons.alpha - nc} active alpha electrons do not fit ${activeOrbitals} active orbitals`);
  return { core: range(0, nc), active: range(nc, nc + activeOrbitals) };
}

function range(from: number, to: number): number[] {
  return Array.from({ length: to - from }, (_, i) => from + i);
}

