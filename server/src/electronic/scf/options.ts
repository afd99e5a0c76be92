/** What the SCF is given and how it may be steered. Energies in hartree, lengths in bohr. */
import type { CancelToken, MolecularBasis, TwoElectronIntegrals } from '../contracts';
import type { SymmetryAdaptation } from './symmetry/adapted';

export type ScfReference = 'rhf' | 'uhf' | 'rohf';

/** Integrals of one centre alone (its own nucleus only), for the atomic-density guess. */
export interface AtomIntegrals {
  readonly basis: MolecularBasis;
  readonly overlap: Float64Array;
  readonly coreHamiltonian: Float64Array;
  readonly eri: TwoElectronIntegrals;
}

export interface ScfProblem {
  readonly basis: MolecularBasis;
  /** n×n, row-major, unit diagonal. */
  readonly overlap: Float64Array;
  /** Kinetic + nuclear attraction (+ ECP), n×n. */
  readonly coreHamiltonian: Float64Array;
  readonly eri: TwoElectronIntegrals;
  /** Total charge of the system. */
  readonly charge: number;
  /** 2S + 1. */
  readonly multiplicity: number;
  /** One-centre integrals by centre index; without it the guess is the core Hamiltonian. */
  readonly atomIntegrals?: (center: number) => AtomIntegrals;
}

export interface ScfProgress {
  readonly iteration: number;
  readonly energy: number;
  /** Energy change from the previous iteration (NaN on the first). */
  readonly energyChange: number;
  /** Largest element of the orbital gradient (FD − DF in orthonormal functions). */
  readonly gradient: number;
  readonly accelerator: 'diis' | 'level-shift';
}

export interface ScfOptions {
  /** Default: rhf for singlets, uhf otherwise. */
  readonly reference?: ScfReference;
  /** |ΔE| between iterations, hartree; default 1e-8. */
  readonly energyTolerance?: number;
  /** Largest |FD − DF| element in orthonormal functions; default 1e-6. */
  readonly gradientTolerance?: number;
  /** Fock builds after the guess; default 100. */
  readonly maxIterations?: number;
  /** Default 'atomic' when the problem has atom integrals, else 'core'. */
  readonly guess?: 'atomic' | 'core';
  /** Fock matrices DIIS keeps; default 8. */
  readonly diisSize?: number;
  /** Shift of the virtual orbitals (hartree) used when DIIS stalls; default 0.5. */
  readonly levelShift?: number;
  /** Overlap eigenvalues below this are dropped as linear dependencies; default 1e-7. */
  readonly linearDependencyThreshold?: number;
  /**
   * The basis's transformation under the abelian point group (symmetry/adapted.ts); null: none
   * (C1 labels). Default: detected from the centres.
   */
  readonly symmetry?: SymmetryAdaptation | null;
  /** Electrons per irrep fixed instead of aufbau, e.g. { alpha: { A1: 3, B2: 1 }, beta: {...} }. */
  readonly occupations?: { readonly alpha: Readonly<Record<string, number>>; readonly beta: Readonly<Record<string, number>> };
  /** Schwarz bound passed to the J/K build; default 1e-12. */
  readonly integralThreshold?: number;
  readonly cancel?: CancelToken;
  readonly onProgress?: (progress: ScfProgress) => void;
}

export const SCF_DEFAULTS = {
  energyTolerance: 1e-8,
  gradientTolerance: 1e-6,
  maxIterations: 100,
  diisSize: 8,
  levelShift: 0.5,
  integralThreshold: 1e-12,
} as const;
