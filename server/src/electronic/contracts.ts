/**
 * Shapes shared by the electronic-structure layer (basis functions, integrals, SCF, correlation,
 * active-space Hamiltonians). Everything here is plain data over typed arrays so that the same
 * kernels run in a worker thread, in the command line and in tests.
 *
 * Units: bohr for lengths, hartree for energies, throughout this layer. Conversions from the
 * spec's ångström happen once, where a molecular basis is built.
 *
 * Function order (the same everywhere: integrals, matrices, orbitals, exports):
 * - shells in the order of the atoms, and on each atom in the order of the basis library file;
 * - s: one function; p: x, y, z (for both function kinds);
 * - cartesian l ≥ 2: exponents (a, b, c) of x^a y^b z^c in lexicographic order of a descending,
 *   then b descending (d: xx, xy, xz, yy, yz, zz);
 * - spherical l ≥ 2: real solid harmonics in order of m = −l, …, 0, …, +l.
 * Every basis function has unit norm (overlap diagonal 1), cartesian components included.
 */

/** Spherical (2l+1 real solid harmonics) or cartesian ((l+1)(l+2)/2) functions per shell. */
export type FunctionKind = 'spherical' | 'cartesian';

/** A nucleus as the integrals see it. */
export interface Center {
  readonly symbol: string;
  readonly atomicNumber: number;
  /** Nuclear charge the electrons feel: z less the core electrons an effective core potential replaces. */
  readonly charge: number;
  /** Position (bohr). */
  readonly x: number;
  readonly y: number;
  readonly z: number;
}

/** One contracted shell on one centre, as the integral kernels read it. */
export interface Shell {
  readonly l: number;
  /** Index into `MolecularBasis.centers`. */
  readonly center: number;
  /** Position of the centre (bohr), copied for the kernels. */
  readonly x: number;
  readonly y: number;
  readonly z: number;
  readonly exponents: Float64Array;
  /**
   * Contraction coefficients with the primitive normalisation folded in, so that the contracted
   * function has unit norm (for cartesian shells: the x^l component; the other components carry
   * their own factor inside the kernels so that every function has unit norm).
   */
  readonly coefficients: Float64Array;
  /** Index of the shell's first basis function. */
  readonly offset: number;
  /** Number of functions: 2l+1 spherical, (l+1)(l+2)/2 cartesian (s and p are the same in both). */
  readonly size: number;
  readonly kind: FunctionKind;
}

/** One semi-local channel of an effective core potential: Σ_k d_k r^(n_k − 2) exp(−ζ_k r²). */
export interface EcpChannel {
  /** Angular momentum projected on; −1 for the local (highest, unprojected) channel. */
  readonly l: number;
  readonly powers: Int32Array;
  readonly exponents: Float64Array;
  readonly coefficients: Float64Array;
}

export interface EcpCenter {
  readonly center: number;
  /** Core electrons the potential replaces. */
  readonly coreElectrons: number;
  readonly channels: readonly EcpChannel[];
}

/** The basis functions of one molecule or fragment. */
export interface MolecularBasis {
  /** The basis name of each centre, as resolved from the spec (main basis or override). */
  readonly basisNames: readonly string[];
  readonly kind: FunctionKind;
  readonly centers: readonly Center[];
  readonly shells: readonly Shell[];
  readonly functionCount: number;
  /** Centre index of every basis function. */
  readonly functionCenter: Int32Array;
  /** Angular momentum of every basis function. */
  readonly functionL: Int32Array;
  /** Effective core potentials, one entry per centre that carries one. */
  readonly ecps: readonly EcpCenter[];
}

/** Checked often by long kernels; when `cancelled` turns true they throw `CancelledError`. */
export interface CancelToken {
  readonly cancelled: boolean;
}

export class CancelledError extends Error {
  constructor() {
    super('The computation was cancelled.');
    this.name = 'CancelledError';
  }
}

/** Throws `CancelledError` when the token says so; cheap enough for inner shell loops. */
export function throwIfCancelled(token: CancelToken | undefined): void {
  if (token?.cancelled) throw new CancelledError();
}

/**
 * Two-electron integrals (μν|λσ) in chemists' notation over one molecular basis, computed
 * directly with Schwarz screening; the shell-pair data is computed once per instance.
 */
export interface TwoElectronIntegrals {
  readonly basis: MolecularBasis;
  /**
   * Coulomb J[μν] = Σ (μν|λσ) D[λσ] and exchange K[μν] = Σ (μλ|νσ) D[λσ] of each symmetric density
   * (functionCount² row-major); `J` or `K` may be null when not wanted. Outputs are overwritten.
   * `threshold` bounds the neglected Schwarz products (default 1e-12).
   */
  buildJK(densities: readonly Float64Array[], J: Float64Array[] | null, K: Float64Array[] | null, options?: { threshold?: number; cancel?: CancelToken }): void;
  /** (PQ|RS) of one shell quartet into `out`, indexed [p][q][r][s] over the shells' functions. */
  shellQuartet(p: number, q: number, r: number, s: number, out: Float64Array): void;
  /** sqrt(max |(pq|pq)|) over the functions of shells p and q: the Schwarz factor. */
  schwarz(p: number, q: number): number;
}
