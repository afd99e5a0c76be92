/**
 * A mean-field calculation from atoms and a basis name: builds the molecular basis and the
 * integrals (electronic/basis, electronic/integrals) and runs the SCF (run.ts). Every refusal is a
 * typed error that names what and where: UnknownBasisError, BasisDataUnavailableError,
 * MissingBasisDataError (an element the basis does not define), InvalidAtomError,
 * UnsupportedEcpError (an effective core potential the integrals cannot handle), ScfInputError
 * (nuclei on top of each other, charge or multiplicity that do not fit), CancelledError.
 */
import { throwIfCancelled, type FunctionKind } from '../contracts';
import { buildMolecularBasis, type BasisAtom } from '../basis';
import { coreHamiltonian, createTwoElectronIntegrals, overlapMatrix } from '../integrals';
import { checkNuclei } from './molecule';
import type { AtomIntegrals, ScfOptions, ScfProblem } from './options';
import { runScf, type ScfOutcome } from './run';

export interface MeanFieldInput {
  /** Element symbols and positions in bohr. */
  readonly atoms: readonly BasisAtom[];
  /** One basis name for every atom, or one per atom. */
  readonly basis: string | readonly string[];
  readonly kind: FunctionKind;
  readonly charge: number;
  readonly multiplicity: number;
}

export interface ProblemOptions {
  /** Memory for stored two-electron integrals (createTwoElectronIntegrals; default 512 MiB, 0: direct). */
  readonly storageLimitBytes?: number;
}

/** The integrals of a system, ready for runScf (and for correlation methods after it). */
export function buildScfProblem(input: MeanFieldInput, options: ProblemOptions = {}): ScfProblem {
  const basis = buildMolecularBasis(input.atoms, input.basis, input.kind);
  checkNuclei(basis.centers);
  const names = typeof input.basis === 'string' ? input.atoms.map(() => input.basis as string) : input.basis;
  const atomIntegrals = (center: number): AtomIntegrals => {
    const atom = input.atoms[center]!;
    const atomBasis = buildMolecularBasis([{ symbol: atom.symbol, x: 0, y: 0, z: 0 }], [names[center]!], input.kind);
    return { basis: atomBasis, overlap: overlapMatrix(atomBasis), coreHamiltonian: coreHamiltonian(atomBasis), eri: createTwoElectronIntegrals(atomBasis) };
  };
  return {
    basis,
    overlap: overlapMatrix(basis),
    coreHamiltonian: coreHamiltonian(basis),
    eri: createTwoElectronIntegrals(basis, options.storageLimitBytes !== undefined ? { storageLimitBytes: options.storageLimitBytes } : {}),
    charge: input.charge,
    multiplicity: input.multiplicity,
    atomIntegrals,
  };
}

/** Builds the integrals and runs the SCF. */
export function computeMeanField(input: MeanFieldInput, options: ScfOptions & ProblemOptions = {}): ScfOutcome & { readonly problem: ScfProblem } {
  throwIfCancelled(options.cancel);
  const problem = buildScfProblem(input, options);
  return { ...runScf(problem, options), problem };
}
