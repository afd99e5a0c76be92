/**
 * The DMET bath of a fragment from the system's mean field: the Schmidt decomposition of a
 * single determinant between the fragment's orbitals and the rest (G. Knizia, G. K.-L. Chan,
 * Phys. Rev. Lett. 109, 186404 (2012); S. Wouters, C. A. Jiménez-Hoyos, Q. Sun, G. K.-L. Chan,
 * J. Chem. Theory Comput. 12, 2706 (2016), §2.1).
 *
 * Orbitals: Löwdin's symmetrically orthogonalised atomic orbitals φ S^−½ (P.-O. Löwdin, J. Chem.
 * Phys. 18, 365 (1950)), the ones closest to the basis functions in the least-squares sense, each
 * belonging to the atom of its basis function. A spin's density in them is D = S^½ P_σ S^½, with
 * P_σ = Σ_occ c cᵀ the AO density of that spin; only S^½ is needed, so near-linear dependencies
 * of the basis do not blow anything up. For a determinant D is idempotent (D² = D).
 *
 * Per spin, with F the fragment's orbitals (those on its atoms, L of them) and E the others:
 * the singular values σ of the environment–fragment block D[E, F] lie in [0, ½]: σ² = λ(1 − λ)
 * for the eigenvalues λ of the fragment block D[F, F] (from D² = D). A fragment orbital with
 * 0 < λ < 1 is entangled with exactly one environment orbital, the left singular vector of its σ:
 * that vector is a bath orbital. The impurity is F plus the bath; its electrons of that spin are
 * tr D[F, F] + Σ_b u_bᵀ D[E, E] u_b, which equals the number of bath orbitals plus the fragment's
 * fully occupied orbitals (λ = 1); the environment's other occupied orbitals form the core.
 *
 * Threshold: a bath orbital is kept when σ > 1e-6 (DEFAULT_BATH_THRESHOLD). A mode below it
 * carries a number fluctuation σ² < 1e-12 electrons: it is not entangled with the fragment at any
 * precision that matters to a solver. Singular values that are exactly zero in theory (more
 * fragment orbitals than occupied ones: rank D[E, F] ≤ N_σ) come out near 1e-17 from an SCF
 * converged to 1e-8 in the density, and the smallest genuine ones of small molecules in double-ζ
 * bases are near 1e-4 (tests/fixtures/dmet-bath.psi4.json), so 1e-6 sits orders of magnitude from
 * both. The threshold is a setting (`--bath-threshold` on the command line).
 *
 * Intrinsic atomic orbitals (iao.ts) may replace Löwdin's for closed shells: the same
 * decomposition over the density in the IAOs, which span the occupied space exactly.
 */
import type { CancelToken } from '../contracts';
import { throwIfCancelled } from '../contracts';
import { multiply, singularPairs, symmetricEigen, weightedOuterProducts } from '../linalg';
import { overlapSquareRoot } from '../scf/population';
import { iaoDensity, intrinsicAtomicOrbitals } from './iao';

export const DEFAULT_BATH_THRESHOLD = 1e-6;

/** One spin's Schmidt decomposition. */
export interface SpinBath {
  /** Singular values of D[E, F], descending: min(L, n − L) of them. */
  readonly singularValues: Float64Array;
  /** Singular values above the threshold: bath orbitals of this spin. */
  readonly bathOrbitals: number;
  /** Electrons of this spin on the impurity (fragment + bath), from the projected density. */
  readonly impurityElectrons: number;
  /** Fragment orbitals with occupation λ > 1 − threshold: fully occupied, with no bath partner. */
  readonly occupiedFragmentOrbitals: number;
  /** max |D² − D|: zero for a single determinant up to rounding. */
  readonly idempotencyError: number;
  /** The bath orbitals in the environment's orthogonalised orbitals (E×bath, row-major). */
  readonly bathVectors: Float64Array;
}

/** A spin's density in Löwdin-orthogonalised orbitals, S^½ P S^½ (all n×n). */
export function lowdinDensity(overlapRoot: Float64Array, density: Float64Array, n: number): Float64Array {
  const half = multiply(density, overlapRoot, n, n, n, new Float64Array(n * n));
  const out = multiply(overlapRoot, half, n, n, n, new Float64Array(n * n));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const mean = 0.5 * (out[i * n + j]! + out[j * n + i]!);
      out[i * n + j] = mean;
      out[j * n + i] = mean;
    }
  }
  return out;
}

/** max |D² − D| of a symmetric n×n matrix. */
export function idempotencyError(d: Float64Array, n: number): number {
  const square = multiply(d, d, n, n, n, new Float64Array(n * n));
  let worst = 0;
  for (let k = 0; k < n * n; k++) worst = Math.max(worst, Math.abs(square[k]! - d[k]!));
  return worst;
}

/**
 * The bath of one spin: `d` is that spin's orthogonalised density (n×n), `inFragment[i]` says
 * whether orthogonalised orbital i belongs to the fragment.
 */
export function schmidtBath(d: Float64Array, n: number, inFragment: ArrayLike<boolean>, threshold = DEFAULT_BATH_THRESHOLD, cancel?: CancelToken): SpinBath {
  const fragment: number[] = [];
  const environment: number[] = [];
  for (let i = 0; i < n; i++) (inFragment[i] ? fragment : environment).push(i);
  const L = fragment.length;
  const E = environment.length;
  const block = new Float64Array(E * L);
  for (let e = 0; e < E; e++) for (let f = 0; f < L; f++) block[e * L + f] = d[environment[e]! * n + fragment[f]!]!;
  throwIfCancelled(cancel);
  const { values, left } = singularPairs(block, E, L);
  const rank = values.length;
  let bath = 0;
  while (bath < rank && values[bath]! > threshold) bath++;
  throwIfCancelled(cancel);

  const bathVectors = new Float64Array(E * bath);
  for (let e = 0; e < E; e++) for (let b = 0; b < bath; b++) bathVectors[e * bath + b] = left[e * rank + b]!;
  // Electrons on the impurity: tr D[F, F] + Σ_b u_bᵀ D[E, E] u_b.
  let electrons = 0;
  for (const f of fragment) electrons += d[f * n + f]!;
  const du = new Float64Array(E);
  for (let b = 0; b < bath; b++) {
    du.fill(0);
    for (let x = 0; x < E; x++) {
      const row = environment[x]! * n;
      let sum = 0;
      for (let y = 0; y < E; y++) sum += d[row + environment[y]!]! * bathVectors[y * bath + b]!;
      du[x] = sum;
    }
    for (let x = 0; x < E; x++) electrons += bathVectors[x * bath + b]! * du[x]!;
  }
  throwIfCancelled(cancel);

  const fragmentBlock = new Float64Array(L * L);
  for (let i = 0; i < L; i++) for (let j = 0; j < L; j++) fragmentBlock[i * L + j] = d[fragment[i]! * n + fragment[j]!]!;
  const occupations = symmetricEigen(fragmentBlock, L).values;
  let occupied = 0;
  for (const value of occupations) if (value > 1 - threshold) occupied++;
  return { singularValues: values, bathOrbitals: bath, impurityElectrons: electrons, occupiedFragmentOrbitals: occupied, idempotencyError: idempotencyError(d, n), bathVectors };
}

export interface DmetBathInput {
  /** AO overlap, n×n. */
  readonly overlap: Float64Array;
  /** The atom of every basis function (n). */
  readonly functionCenter: ArrayLike<number>;
  /** Per-spin AO densities P_σ (n×n); `beta` may be the same array as `alpha` (closed shell). */
  readonly density: { readonly alpha: Float64Array; readonly beta: Float64Array };
  /** Electrons of each spin in the system. */
  readonly electrons: { readonly alpha: number; readonly beta: number };
  /** The fragment's atoms (indices into the system's atoms). */
  readonly fragmentAtoms: readonly number[];
  readonly threshold?: number;
  readonly cancel?: CancelToken;
  /**
   * Cut the bath in intrinsic atomic orbitals (iao.ts) instead of Löwdin's: the minimal basis's
   * overlaps and the occupied orbitals of the (closed-shell) determinant.
   */
  readonly iao?: {
    readonly minimalOverlap: Float64Array;
    readonly mixedOverlap: Float64Array;
    readonly minimalFunctionCenter: ArrayLike<number>;
    /** n × occupiedCount, row-major. */
    readonly occupied: Float64Array;
    readonly occupiedCount: number;
  };
}

export type FragmentOrbitalKind = 'lowdin' | 'iao';

export interface DmetBath {
  readonly orbitals: FragmentOrbitalKind;
  readonly threshold: number;
  /** Orthogonalised orbitals (Löwdin: one per basis function; IAO: one per minimal-basis function) on the fragment's atoms (L) and on the others. */
  readonly fragmentOrbitals: number;
  readonly environmentOrbitals: number;
  /** True when one spatial bath serves both spins (the same density for α and β). */
  readonly restricted: boolean;
  readonly alpha: SpinBath;
  readonly beta: SpinBath;
  /** Spatial orbitals of the impurity: L + the larger bath. */
  readonly impurityOrbitals: number;
  /** Electrons on the impurity, both spins, from the projected density. */
  readonly impurityElectrons: number;
  /** The system's electrons outside the impurity (the environment's core). */
  readonly coreElectrons: number;
}

/** The DMET bath of one fragment from the system's mean-field densities (see the file comment). */
export function dmetBath(input: DmetBathInput): DmetBath {
  const n = input.functionCenter.length;
  const threshold = input.threshold ?? DEFAULT_BATH_THRESHOLD;
  if (!(threshold > 0 && threshold < 0.5)) throw new RangeError(`The bath threshold must lie between 0 and 0.5 (singular values of a spin density do not exceed ½); got ${threshold}.`);
  const atoms = new Set(input.fragmentAtoms);
  const restricted = input.density.alpha === input.density.beta;
  let densities: (spin: Float64Array) => Float64Array;
  let centers: ArrayLike<number>;
  if (input.iao) {
    if (!restricted) {
      throw new RangeError('Intrinsic atomic orbitals are built here for closed-shell (RHF) mean fields only: for UHF and ROHF one set of them cannot span both spins\' occupied orbitals. Use Löwdin orbitals (the default) for an open-shell system.');
    }
    const iao = input.iao;
    const n2 = iao.minimalFunctionCenter.length;
    const a = intrinsicAtomicOrbitals({ overlap: input.overlap, minimalOverlap: iao.minimalOverlap, mixedOverlap: iao.mixedOverlap, occupied: iao.occupied, n1: n, n2, occupiedCount: iao.occupiedCount });
    densities = (spin) => iaoDensity(a, input.overlap, spin, n, n2);
    centers = iao.minimalFunctionCenter;
  } else {
    const root = overlapSquareRoot(input.overlap, n);
    densities = (spin) => lowdinDensity(root, spin, n);
    centers = input.functionCenter;
  }
  throwIfCancelled(input.cancel);
  const size = centers.length;
  const inFragment = Array.from({ length: size }, (_, i) => atoms.has(centers[i]!));
  const L = inFragment.filter(Boolean).length;
  const alpha = schmidtBath(densities(input.density.alpha), size, inFragment, threshold, input.cancel);
  const beta = restricted ? alpha : schmidtBath(densities(input.density.beta), size, inFragment, threshold, input.cancel);
  const impurityElectrons = alpha.impurityElectrons + beta.impurityElectrons;
  return {
    orbitals: input.iao ? 'iao' : 'lowdin',
    threshold,
    fragmentOrbitals: L,
    environmentOrbitals: size - L,
    restricted,
    alpha,
    beta,
    impurityOrbitals: L + Math.max(alpha.bathOrbitals, beta.bathOrbitals),
    impurityElectrons,
    coreElectrons: input.electrons.alpha + input.electrons.beta - impurityElectrons,
  };
}

/** A spin's AO density Σ_k w_k c_k c_kᵀ from orbital coefficients C (n×M, row-major) and occupations (0 or 1). */
export function spinDensity(coefficients: Float64Array, n: number, orbitals: number, occupations: ArrayLike<number>): Float64Array {
  return weightedOuterProducts(coefficients, n, orbitals, occupations, Math.min(orbitals, occupations.length), new Float64Array(n * n), new Float64Array(n));
}
