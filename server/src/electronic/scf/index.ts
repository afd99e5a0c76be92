/** Hartree–Fock (RHF, UHF, ROHF): see engine.ts for the equations and run.ts for the entry point. */
export { electronCounts, solveScf } from './engine';
export type { ScfWavefunction } from './engine';
export { ScfInputError } from './errors';
export type { ScfInputErrorCode } from './errors';
export { atomicDensityGuess, fractionalAtomDensity } from './guess';
export { checkNuclei, MINIMUM_NUCLEAR_DISTANCE, neutralElectrons, nuclearRepulsion } from './molecule';
export { SCF_DEFAULTS } from './options';
export type { AtomIntegrals, ScfOptions, ScfProblem, ScfProgress, ScfReference } from './options';
export { lowdinCharges, mullikenCharges, mullikenSpinPopulations, sumPerFragment } from './population';
export type { MeanFieldResult } from './result';
export { buildScfProblem, computeMeanField } from './meanField';
export type { MeanFieldInput, ProblemOptions } from './meanField';
export { runScf } from './run';
export type { ScfOutcome } from './run';
export type { OrbitalBlock, OrbitalSpace } from './space';
export { adaptBasis, labelOrbitals, symmetryAdaptedSpace, trivialAdaptation } from './symmetry/adapted';
export type { SymmetryAdaptation } from './symmetry/adapted';
export { TensorIntegrals } from './tensorIntegrals';
