/**
 * Self-consistent field for restricted (RHF), unrestricted (UHF, J. A. Pople, R. K. Nesbet,
 * J. Chem. Phys. 22, 571 (1954)) and restricted open-shell (ROHF) references, in the
 * Roothaan–Hall form (C. C. J. Roothaan, Rev. Mod. Phys. 23, 69 (1951); A. Szabo, N. S. Ostlund,
 * Modern Quantum Chemistry, Macmillan 1982, §3.4.6 and §3.8).
 *
 * Everything is diagonalised in orthonormal functions grouped in blocks the Fock operator does not
 * mix (space.ts): per irrep when the basis is symmetry-adapted, else one block.
 *
 * Densities per spin Dσ = Σ_occ c cᵀ; J and K from the two-electron integrals' direct build;
 *   RHF:  F = H + 2J(D) − K(D),               E = tr[D (H + F)]
 *   UHF:  Fσ = H + J(Dα) + J(Dβ) − K(Dσ),     E = ½ tr[(Dα + Dβ) H + Dα Fα + Dβ Fβ]
 *   ROHF: the same Fα, Fβ and energy; one set of orbitals diagonalising the effective Fock matrix
 *   that in the current orbitals (closed c, open o, virtual v) has the blocks
 *        c      o      v
 *     c  Fc     Fβ     Fc
 *     o  Fβ     Fc     Fα        with Fc = ½(Fα + Fβ);
 *     v  Fc     Fα     Fc
 *   its off-diagonal blocks are the energy gradient, so any choice of the diagonal blocks gives
 *   the same energy and orbitals; the diagonal ½(Fα + Fβ) fixes the orbital energies (the
 *   canonicalisation of M. F. Guest, V. R. Saunders, Mol. Phys. 28, 819 (1974); the choices are
 *   compared by B. N. Plakhutin, E. V. Gorelik, N. N. Breslavskaya, J. Chem. Phys. 125, 204110
 *   (2006)). ROHF orbital energies are those of this operator and are not comparable with
 *   those of another canonicalisation.
 *
 * Convergence: |ΔE| < energyTolerance and max |FD − DF| < gradientTolerance (orthonormal
 * functions; for ROHF the off-diagonal blocks above). Acceleration by DIIS (diis.ts); when DIIS
 * stalls (the best gradient of the last STALL_WINDOW iterations is not half the best before) the
 * virtual orbitals are level-shifted (V. R. Saunders, I. H. Hillier, Int. J. Quantum Chem. 7, 699
 * (1973)) for up to SHIFT_ITERATIONS iterations, then DIIS starts afresh.
 *
 * J and K are built from the change of the density since the previous step (incremental build),
 * with a full build every INCREMENTAL_REBUILD steps.
 *
 * Occupations: aufbau over all blocks each iteration until the gradient falls below
 * OCCUPATION_FREEZE, then the electrons per block stay fixed (or fixed from the start when given
 * per irrep).
 */
import { type CancelToken, throwIfCancelled } from '../contracts';
import { congruence, dotMatrices, EigenWorkspace, maxAbs, multiply, multiplyTransposeA, symmetricEigen, symmetrize, weightedOuterProducts } from '../linalg';
import { Diis } from './diis';
import { ScfInputError } from './errors';
import { atomicDensityGuess } from './guess';
import { checkNuclei, neutralElectrons, nuclearRepulsion } from './molecule';
import { SCF_DEFAULTS, type ScfOptions, type ScfProblem, type ScfReference } from './options';
import type { OrbitalBlock, OrbitalSpace } from './space';

export const STALL_WINDOW = 8;
export const SHIFT_ITERATIONS = 20;
export const OCCUPATION_FREEZE = 1e-3;
/**
 * Fock builds from density differences between two full builds. Each incremental build adds its
 * own rounding and screening error (below the integral threshold per quartet), so a full build now
 * and then keeps them from piling up; an SCF of 10–20 iterations needs none before it converges,
 * and a full build near convergence costs as much as the first (the interval is a rule of thumb,
 * common practice; the psi4 agreement tests check the energies it gives).
 */
export const INCREMENTAL_REBUILD = 20;

/** Electron counts of a problem; throws ScfInputError when charge and multiplicity do not fit. */
export function electronCounts(problem: Pick<ScfProblem, 'basis' | 'charge' | 'multiplicity'>): { alpha: number; beta: number } {
  const electrons = neutralElectrons(problem.basis.centers) - problem.charge;
  const unpaired = problem.multiplicity - 1;
  if (!Number.isInteger(problem.charge) || electrons < 0) {
    throw new ScfInputError('invalid-electron-count', `A charge of ${problem.charge} leaves ${electrons} electrons; the charge must be a whole number that leaves at least none.`);
  }
  if (!Number.isInteger(problem.multiplicity) || problem.multiplicity < 1 || unpaired > electrons || (electrons - unpaired) % 2 !== 0) {
    throw new ScfInputError('invalid-multiplicity', `Multiplicity ${problem.multiplicity} does not fit ${electrons} electrons (2S+1 with 2S ≤ N and N − 2S even).`);
  }
  return { alpha: (electrons + unpaired) / 2, beta: (electrons - unpaired) / 2 };
}

/** State of one block: orbitals of each set and the electrons in it. */
interface BlockState {
  readonly block: OrbitalBlock;
  /** Eigenvectors (m×m) per orbital set (UHF: α, β; otherwise one). */
  readonly u: Float64Array[];
  readonly energies: Float64Array[];
  /** Occupied orbitals of each spin in this block (the lowest of its set). */
  alpha: number;
  beta: number;
  // Work arrays.
  readonly fock: Float64Array[]; // per spin, m×m
  readonly density: Float64Array[]; // per spin, m×m (orthonormal functions)
  readonly solve: Float64Array[]; // per orbital set: the matrix diagonalised
  readonly error: Float64Array[]; // per orbital set
  readonly scratch: Float64Array; // m×m
  readonly scratch2: Float64Array; // m×m
  readonly scratch3: Float64Array; // m×m
  readonly moAlpha: Float64Array; // m×m (ROHF)
  readonly moBeta: Float64Array; // m×m (ROHF)
  readonly coefficients: Float64Array; // n×m
  readonly workspace: EigenWorkspace;
}

export interface ScfWavefunction {
  readonly reference: ScfReference;
  readonly space: OrbitalSpace;
  /** Orbital coefficients per spin (n×M, columns ascending in energy); β = α for RHF and ROHF. */
  readonly coefficients: { readonly alpha: Float64Array; readonly beta: Float64Array };
  readonly orbitalEnergies: { readonly alpha: Float64Array; readonly beta: Float64Array };
  /** 1 or 0 per orbital and spin. */
  readonly occupations: { readonly alpha: Float64Array; readonly beta: Float64Array };
  /** Irrep label per orbital and spin. */
  readonly irreps: { readonly alpha: readonly (string | null)[]; readonly beta: readonly (string | null)[] };
  /** AO densities per spin (n×n). */
  readonly densities: { readonly alpha: Float64Array; readonly beta: Float64Array };
  /** AO Fock matrices per spin of the final density (for ROHF: Fα and Fβ, not the effective one). */
  readonly fock: { readonly alpha: Float64Array; readonly beta: Float64Array };
  readonly electrons: { readonly alpha: number; readonly beta: number };
  readonly energy: number;
  readonly electronicEnergy: number;
  readonly nuclearRepulsion: number;
  readonly converged: boolean;
  readonly iterations: number;
  /** Energy change of the last iteration; null after a single iteration. */
  readonly energyChange: number | null;
  readonly gradient: number;
}

interface Resolved {
  readonly reference: ScfReference;
  readonly energyTolerance: number;
  readonly gradientTolerance: number;
  readonly maxIterations: number;
  readonly diisSize: number;
  readonly levelShift: number;
  readonly integralThreshold: number;
  readonly cancel: CancelToken | undefined;
}

/** Runs the SCF in the given orthonormal space. */
export function solveScf(problem: ScfProblem, space: OrbitalSpace, options: ScfOptions = {}): ScfWavefunction {
  const n = problem.basis.functionCount;
  checkNuclei(problem.basis.centers);
  if (n === 0 || space.m === 0) throw new ScfInputError('no-basis-functions', 'The system has no basis functions.');
  if (problem.overlap.length !== n * n || problem.coreHamiltonian.length !== n * n) {
    throw new ScfInputError('shape-mismatch', `Overlap and core Hamiltonian must be ${n}×${n} for ${n} basis functions.`);
  }
  const electrons = electronCounts(problem);
  const multiplicity = problem.multiplicity;
  const reference = options.reference ?? (multiplicity === 1 ? 'rhf' : 'uhf');
  if (reference === 'rhf' && electrons.alpha !== electrons.beta) {
    throw new ScfInputError('reference-mismatch', `RHF needs a closed shell; multiplicity ${multiplicity} has ${electrons.alpha - electrons.beta} unpaired electrons (use UHF or ROHF).`);
  }
  if (electrons.alpha > space.m) {
    throw new ScfInputError('too-many-electrons', `${electrons.alpha} α electrons do not fit in ${space.m} orbitals.`);
  }
  const settings: Resolved = {
    reference,
    energyTolerance: options.energyTolerance ?? SCF_DEFAULTS.energyTolerance,
    gradientTolerance: options.gradientTolerance ?? SCF_DEFAULTS.gradientTolerance,
    maxIterations: Math.max(1, Math.floor(options.maxIterations ?? SCF_DEFAULTS.maxIterations)),
    diisSize: options.diisSize ?? SCF_DEFAULTS.diisSize,
    levelShift: options.levelShift ?? SCF_DEFAULTS.levelShift,
    integralThreshold: options.integralThreshold ?? SCF_DEFAULTS.integralThreshold,
    cancel: options.cancel,
  };
  return new ScfRun(problem, space, electrons, settings, options).run(options);
}

class ScfRun {
  private readonly n: number;
  private readonly sets: number;
  private readonly spins: number;
  private readonly blocks: BlockState[];
  private readonly densityAO: Float64Array[];
  private readonly fockAO: Float64Array[];
  private readonly coulomb: Float64Array[];
  private readonly exchange: Float64Array[];
  private readonly column: Float64Array;
  private readonly previousDensity: Float64Array[];
  private readonly deltaDensity: Float64Array[];
  private readonly deltaCoulomb: Float64Array[];
  private readonly deltaExchange: Float64Array[];
  private buildsSinceFull = 0;
  private readonly nScratch: Float64Array;
  private readonly weights: Float64Array;
  private readonly outer: Float64Array;
  private readonly nuclear: number;
  private frozen = false;

  constructor(
    private readonly problem: ScfProblem,
    private readonly space: OrbitalSpace,
    private readonly electrons: { alpha: number; beta: number },
    private readonly settings: Resolved,
    options: ScfOptions,
  ) {
    const n = problem.basis.functionCount;
    this.n = n;
    this.sets = settings.reference === 'uhf' ? 2 : 1;
    this.spins = settings.reference === 'rhf' ? 1 : 2;
    const maxM = Math.max(...space.blocks.map((block) => block.m));
    this.blocks = space.blocks.map((block) => {
      const m = block.m;
      const square = () => new Float64Array(m * m);
      return {
        block,
        u: Array.from({ length: this.sets }, square),
        energies: Array.from({ length: this.sets }, () => new Float64Array(m)),
        alpha: 0,
        beta: 0,
        fock: Array.from({ length: this.spins }, square),
        density: Array.from({ length: this.spins }, square),
        solve: Array.from({ length: this.sets }, square),
        error: Array.from({ length: this.sets }, square),
        scratch: square(),
        scratch2: square(),
        scratch3: square(),
        moAlpha: square(),
        moBeta: square(),
        coefficients: new Float64Array(n * m),
        workspace: new EigenWorkspace(m),
      };
    });
    const nn = () => new Float64Array(n * n);
    this.densityAO = Array.from({ length: this.spins }, nn);
    this.fockAO = Array.from({ length: this.spins }, nn);
    this.coulomb = Array.from({ length: this.spins }, nn);
    this.exchange = Array.from({ length: this.spins }, nn);
    this.column = new Float64Array(n);
    this.previousDensity = Array.from({ length: this.spins }, nn);
    this.deltaDensity = Array.from({ length: this.spins }, nn);
    this.deltaCoulomb = Array.from({ length: this.spins }, nn);
    this.deltaExchange = Array.from({ length: this.spins }, nn);
    this.nScratch = new Float64Array(n * maxM);
    this.weights = new Float64Array(maxM);
    this.outer = new Float64Array(n * n);
    this.nuclear = nuclearRepulsion(problem.basis.centers);
    if (options.occupations) this.fixOccupations(options.occupations);
  }

  private fixOccupations(occupations: NonNullable<ScfOptions['occupations']>): void {
    let alpha = 0;
    let beta = 0;
    for (const state of this.blocks) {
      state.alpha = occupations.alpha[state.block.irrep] ?? 0;
      state.beta = occupations.beta[state.block.irrep] ?? 0;
      if (state.alpha > state.block.m || state.beta > state.block.m) throw new ScfInputError('too-many-electrons', `More electrons in ${state.block.irrep} than its ${state.block.m} orbitals.`);
      if (this.settings.reference !== 'uhf' && state.beta > state.alpha) throw new ScfInputError('reference-mismatch', `${this.settings.reference.toUpperCase()} needs at least as many α as β electrons in ${state.block.irrep}.`);
      alpha += state.alpha;
      beta += state.beta;
    }
    if (alpha !== this.electrons.alpha || beta !== this.electrons.beta) {
      throw new ScfInputError('invalid-electron-count', `The occupations per irrep hold ${alpha} α and ${beta} β electrons; the system has ${this.electrons.alpha} and ${this.electrons.beta}.`);
    }
    this.frozen = true;
  }

  run(options: ScfOptions): ScfWavefunction {
    const { settings } = this;
    const length = this.blocks.reduce((sum, state) => sum + state.block.m * state.block.m, 0) * this.sets;
    const diis = new Diis(length, settings.diisSize);
    const packedFock = new Float64Array(length);
    const packedError = new Float64Array(length);
    this.guess(options.guess ?? (this.problem.atomIntegrals ? 'atomic' : 'core'));

    let energy = NaN;
    let previous = NaN;
    let gradient = Infinity;
    let lastChange: number | null = null;
    let converged = false;
    let iterations = 0;
    let shiftLeft = 0;
    const history: number[] = [];
    let bestBeforeWindow = Infinity;
    for (let iteration = 1; iteration <= settings.maxIterations; iteration++) {
      throwIfCancelled(settings.cancel);
      iterations = iteration;
      this.buildDensities();
      energy = this.buildFock();
      gradient = this.buildSolveMatrices();
      const change = energy - previous;
      previous = energy;
      lastChange = Number.isNaN(change) ? null : change;
      const accelerator = shiftLeft > 0 ? 'level-shift' : 'diis';
      options.onProgress?.({ iteration, energy, energyChange: change, gradient, accelerator });
      if (Math.abs(change) < settings.energyTolerance && gradient < settings.gradientTolerance) {
        converged = true;
        break;
      }
      if (gradient < OCCUPATION_FREEZE) this.frozen = true;
      // Stall detection over the gradient history.
      history.push(gradient);
      if (history.length > STALL_WINDOW) bestBeforeWindow = Math.min(bestBeforeWindow, history[history.length - STALL_WINDOW - 1]!);
      let bestInWindow = Infinity;
      for (let k = Math.max(0, history.length - STALL_WINDOW); k < history.length; k++) bestInWindow = Math.min(bestInWindow, history[k]!);
      if (shiftLeft === 0 && history.length > STALL_WINDOW + 4 && bestInWindow > 0.5 * bestBeforeWindow) {
        shiftLeft = SHIFT_ITERATIONS;
        diis.clear();
        history.length = 0;
        bestBeforeWindow = Infinity;
      }
      if (shiftLeft > 0) {
        shiftLeft--;
        if (shiftLeft === 0 || gradient < 1e-4) {
          shiftLeft = 0;
          diis.clear();
          history.length = 0;
          bestBeforeWindow = Infinity;
        }
        this.levelShift(settings.levelShift);
      } else {
        this.pack(packedFock, packedError);
        diis.push(packedFock, packedError);
        if (diis.extrapolate(packedFock)) this.unpack(packedFock);
      }
      this.diagonalize();
      if (!this.frozen) this.aufbau();
    }
    // Orbitals of the final Fock matrix, without extrapolation or shift.
    this.buildSolveMatrices();
    this.diagonalize();
    return this.wavefunction(energy, converged, iterations, lastChange, gradient);
  }

  /** Starting orbitals from the guess density's RHF-like Fock matrix (or from H). */
  private guess(kind: 'atomic' | 'core'): void {
    const n = this.n;
    const fock = this.fockAO[0]!;
    if (kind === 'atomic' && this.problem.atomIntegrals) {
      const total = atomicDensityGuess(this.problem.basis, this.problem.atomIntegrals, this.settings.cancel);
      const half = total.map((value) => value / 2);
      this.problem.eri.buildJK([half], [this.coulomb[0]!], [this.exchange[0]!], { threshold: this.settings.integralThreshold, cancel: this.settings.cancel });
      for (let k = 0; k < n * n; k++) fock[k] = this.problem.coreHamiltonian[k]! + 2 * this.coulomb[0]![k]! - this.exchange[0]![k]!;
    } else {
      fock.set(this.problem.coreHamiltonian);
    }
    for (const state of this.blocks) {
      const m = state.block.m;
      congruence(state.block.x, fock, n, m, state.solve[0]!, this.nScratch);
      for (let set = 1; set < this.sets; set++) state.solve[set]!.set(state.solve[0]!);
    }
    this.diagonalize();
    if (!this.frozen) this.aufbau();
  }

  /** AO densities per spin and orthonormal densities per block from the orbitals and occupations. */
  private buildDensities(): void {
    const n = this.n;
    for (let spin = 0; spin < this.spins; spin++) this.densityAO[spin]!.fill(0);
    for (const state of this.blocks) {
      const m = state.block.m;
      for (let spin = 0; spin < this.spins; spin++) {
        const set = Math.min(spin, this.sets - 1);
        const count = spin === 0 ? state.alpha : state.beta;
        const u = state.u[set]!;
        this.weights.fill(0);
        for (let k = 0; k < count; k++) this.weights[k] = 1;
        // Orthonormal density U_occ U_occᵀ, then the AO density C_occ C_occᵀ with C = X U.
        weightedOuterProducts(u, m, m, this.weights, count, state.density[spin]!, this.column);
        if (count === 0) continue;
        multiply(state.block.x, u, n, m, m, state.coefficients);
        weightedOuterProducts(state.coefficients, n, m, this.weights, count, this.outer, this.column);
        const target = this.densityAO[spin]!;
        for (let k = 0; k < n * n; k++) target[k]! += this.outer[k]!;
      }
    }
  }

  /** J, K and the Fock matrices per spin; returns the total energy. */
  private buildFock(): number {
    const n = this.n;
    const h = this.problem.coreHamiltonian;
    const options = { threshold: this.settings.integralThreshold, cancel: this.settings.cancel };
    if (this.buildsSinceFull > 0 && this.buildsSinceFull < INCREMENTAL_REBUILD) {
      // Incremental build: J(D) = J(D_prev) + J(D − D_prev), the same for K; the integral
      // screening weighs each quartet by the density it multiplies, so the difference costs less
      // the closer the SCF is to convergence (J. Almlöf, K. Faegri, K. Korsell, J. Comput. Chem.
      // 3, 385 (1982)). A full build every INCREMENTAL_REBUILD steps keeps rounding from piling up.
      for (let spin = 0; spin < this.spins; spin++) {
        const delta = this.deltaDensity[spin]!;
        const current = this.densityAO[spin]!;
        const previous = this.previousDensity[spin]!;
        for (let i = 0; i < n * n; i++) delta[i] = current[i]! - previous[i]!;
      }
      this.problem.eri.buildJK(this.deltaDensity, this.deltaCoulomb, this.deltaExchange, options);
      for (let spin = 0; spin < this.spins; spin++) {
        const j = this.coulomb[spin]!;
        const k = this.exchange[spin]!;
        const dj = this.deltaCoulomb[spin]!;
        const dk = this.deltaExchange[spin]!;
        for (let i = 0; i < n * n; i++) {
          j[i]! += dj[i]!;
          k[i]! += dk[i]!;
        }
      }
      this.buildsSinceFull++;
    } else {
      this.problem.eri.buildJK(this.densityAO, this.coulomb, this.exchange, options);
      this.buildsSinceFull = 1;
    }
    for (let spin = 0; spin < this.spins; spin++) this.previousDensity[spin]!.set(this.densityAO[spin]!);
    let electronic: number;
    if (this.spins === 1) {
      const f = this.fockAO[0]!;
      const j = this.coulomb[0]!;
      const k = this.exchange[0]!;
      for (let i = 0; i < n * n; i++) f[i] = h[i]! + 2 * j[i]! - k[i]!;
      symmetrize(f, n);
      electronic = dotMatrices(this.densityAO[0]!, h, n * n) + dotMatrices(this.densityAO[0]!, f, n * n);
    } else {
      const [fa, fb] = this.fockAO as [Float64Array, Float64Array];
      const [ja, jb] = this.coulomb as [Float64Array, Float64Array];
      const [ka, kb] = this.exchange as [Float64Array, Float64Array];
      for (let i = 0; i < n * n; i++) {
        const common = h[i]! + ja[i]! + jb[i]!;
        fa[i] = common - ka[i]!;
        fb[i] = common - kb[i]!;
      }
      symmetrize(fa, n);
      symmetrize(fb, n);
      const [da, db] = this.densityAO as [Float64Array, Float64Array];
      electronic = 0.5 * (dotMatrices(da, h, n * n) + dotMatrices(db, h, n * n) + dotMatrices(da, fa, n * n) + dotMatrices(db, fb, n * n));
    }
    if (!Number.isFinite(electronic)) throw new ScfInputError('non-finite-integrals', 'The energy is not a finite number: the integrals hold non-finite values.');
    this.electronicEnergy = electronic;
    return electronic + this.nuclear;
  }

  private electronicEnergy = 0;

  /** Per block: the matrices to diagonalise and the orbital gradient; returns max |gradient|. */
  private buildSolveMatrices(): number {
    const n = this.n;
    let gradient = 0;
    for (const state of this.blocks) {
      const m = state.block.m;
      for (let spin = 0; spin < this.spins; spin++) congruence(state.block.x, this.fockAO[spin]!, n, m, state.fock[spin]!, this.nScratch);
      if (this.settings.reference === 'rohf') {
        this.effectiveFock(state);
      } else {
        for (let set = 0; set < this.sets; set++) {
          const f = state.fock[set]!;
          const d = state.density[set]!;
          state.solve[set]!.set(f);
          // error = F·D − D·F = F·D − (F·D)ᵀ for symmetric F and D.
          multiply(f, d, m, m, m, state.scratch);
          const error = state.error[set]!;
          for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) error[i * m + j] = state.scratch[i * m + j]! - state.scratch[j * m + i]!;
        }
      }
      for (let set = 0; set < this.sets; set++) gradient = Math.max(gradient, maxAbs(state.error[set]!, m * m));
    }
    return gradient;
  }

  /** ROHF effective Fock matrix and gradient of one block in its orthonormal functions. */
  private effectiveFock(state: BlockState): void {
    const m = state.block.m;
    const u = state.u[0]!;
    const { scratch, scratch2 } = state;
    // MO-basis Fα and Fβ.
    multiply(state.fock[0]!, u, m, m, m, scratch);
    const fa = multiplyTransposeA(u, scratch, m, m, m, state.moAlpha);
    multiply(state.fock[1]!, u, m, m, m, scratch);
    const fb = multiplyTransposeA(u, scratch, m, m, m, state.moBeta);
    const cls = (k: number) => (k < state.beta ? 0 : k < state.alpha ? 1 : 2);
    const gradientMo = scratch2;
    const effective = scratch;
    for (let i = 0; i < m; i++) {
      const ci = cls(i);
      for (let j = 0; j < m; j++) {
        const cj = cls(j);
        const index = i * m + j;
        const average = 0.5 * (fa[index]! + fb[index]!);
        let value: number;
        if (ci === cj || ci + cj === 2) value = average; // cc, oo, vv, cv
        else if (ci + cj === 1) value = fb[index]!; // co
        else value = fa[index]!; // ov
        effective[index] = value;
        gradientMo[index] = ci === cj ? 0 : value;
      }
    }
    // Back to orthonormal functions: U·A·Uᵀ.
    const temp = state.scratch3;
    multiply(u, effective, m, m, m, temp);
    multiplyTransposeBInto(temp, u, m, state.solve[0]!);
    multiply(u, gradientMo, m, m, m, temp);
    multiplyTransposeBInto(temp, u, m, state.error[0]!);
    symmetrize(state.solve[0]!, m);
  }

  private levelShift(shift: number): void {
    for (const state of this.blocks) {
      const m = state.block.m;
      for (let set = 0; set < this.sets; set++) {
        const target = state.solve[set]!;
        // Shift every orbital outside the occupied space of the spin(s) this set describes.
        const spins = this.settings.reference === 'uhf' ? [set] : this.settings.reference === 'rohf' ? [0, 1] : [0];
        const weight = shift / spins.length;
        for (const spin of spins) {
          const d = state.density[Math.min(spin, this.spins - 1)]!;
          for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) target[i * m + j]! += weight * ((i === j ? 1 : 0) - d[i * m + j]!);
        }
      }
    }
  }

  private pack(fock: Float64Array, error: Float64Array): void {
    let offset = 0;
    for (let set = 0; set < this.sets; set++) {
      for (const state of this.blocks) {
        const size = state.block.m * state.block.m;
        fock.set(state.solve[set]!.subarray(0, size), offset);
        error.set(state.error[set]!.subarray(0, size), offset);
        offset += size;
      }
    }
  }

  private unpack(fock: Float64Array): void {
    let offset = 0;
    for (let set = 0; set < this.sets; set++) {
      for (const state of this.blocks) {
        const size = state.block.m * state.block.m;
        state.solve[set]!.set(fock.subarray(offset, offset + size));
        offset += size;
      }
    }
  }

  private diagonalize(): void {
    for (const state of this.blocks) {
      const m = state.block.m;
      for (let set = 0; set < this.sets; set++) {
        symmetricEigen(state.solve[set]!, m, { values: state.energies[set]!, vectors: state.u[set]!, workspace: state.workspace });
      }
    }
  }

  /** Lowest orbitals over all blocks; for RHF/ROHF closed shells first, then the open ones. */
  private aufbau(): void {
    const pick = (set: number, count: number): Int32Array => {
      const entries: { energy: number; block: number }[] = [];
      this.blocks.forEach((state, b) => state.energies[set]!.forEach((energy) => entries.push({ energy, block: b })));
      entries.sort((a, b) => a.energy - b.energy);
      const counts = new Int32Array(this.blocks.length);
      for (let k = 0; k < count; k++) counts[entries[k]!.block]!++;
      return counts;
    };
    const alpha = pick(0, this.electrons.alpha);
    const beta = this.sets === 2 ? pick(1, this.electrons.beta) : pick(0, this.electrons.beta);
    this.blocks.forEach((state, b) => {
      state.alpha = alpha[b]!;
      state.beta = beta[b]!;
    });
  }

  private wavefunction(energy: number, converged: boolean, iterations: number, energyChange: number | null, gradient: number): ScfWavefunction {
    const n = this.n;
    const mTotal = this.space.m;
    const spinData = (spin: 0 | 1) => {
      const set = Math.min(spin, this.sets - 1);
      const entries: { energy: number; block: number; k: number }[] = [];
      this.blocks.forEach((state, b) => state.energies[set]!.forEach((value, k) => entries.push({ energy: value, block: b, k })));
      entries.sort((a, b) => a.energy - b.energy || a.block - b.block || a.k - b.k);
      const coefficients = new Float64Array(n * mTotal);
      const energies = new Float64Array(mTotal);
      const occupations = new Float64Array(mTotal);
      const irreps: string[] = [];
      const cache = new Map<number, Float64Array>();
      entries.forEach((entry, column) => {
        const state = this.blocks[entry.block]!;
        const m = state.block.m;
        let c = cache.get(entry.block);
        if (!c) {
          c = multiply(state.block.x, state.u[set]!, n, m, m, new Float64Array(n * m));
          cache.set(entry.block, c);
        }
        for (let i = 0; i < n; i++) coefficients[i * mTotal + column] = c[i * m + entry.k]!;
        energies[column] = entry.energy;
        occupations[column] = entry.k < (spin === 0 ? state.alpha : state.beta) ? 1 : 0;
        irreps.push(state.block.irrep);
      });
      return { coefficients, energies, occupations, irreps };
    };
    const alpha = spinData(0);
    const beta = this.settings.reference === 'rhf' ? alpha : spinData(1);
    const densities = this.settings.reference === 'rhf' ? { alpha: this.densityAO[0]!, beta: this.densityAO[0]! } : { alpha: this.densityAO[0]!, beta: this.densityAO[1]! };
    const fock = this.settings.reference === 'rhf' ? { alpha: this.fockAO[0]!, beta: this.fockAO[0]! } : { alpha: this.fockAO[0]!, beta: this.fockAO[1]! };
    return {
      reference: this.settings.reference,
      space: this.space,
      coefficients: { alpha: alpha.coefficients, beta: beta.coefficients },
      orbitalEnergies: { alpha: alpha.energies, beta: beta.energies },
      occupations: { alpha: alpha.occupations, beta: beta.occupations },
      irreps: { alpha: alpha.irreps, beta: beta.irreps },
      densities,
      fock,
      electrons: this.electrons,
      energy,
      electronicEnergy: this.electronicEnergy,
      nuclearRepulsion: this.nuclear,
      converged,
      iterations,
      energyChange,
      gradient,
    };
  }
}

/** out (m×m) = A·Bᵀ for square m×m matrices. */
function multiplyTransposeBInto(a: Float64Array, b: Float64Array, m: number, out: Float64Array): void {
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++) {
      let sum = 0;
      for (let p = 0; p < m; p++) sum += a[i * m + p]! * b[j * m + p]!;
      out[i * m + j] = sum;
    }
  }
}
