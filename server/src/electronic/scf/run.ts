/**
 * One mean-field calculation from integrals: symmetry adaptation, SCF, labels and the plain-data
 * summary. This is the entry point for callers that already hold the integrals (the job layer
 * builds them from a part's geometry and basis).
 */
import { DEFAULT_LINEAR_DEPENDENCY_THRESHOLD } from '../linalg';
import { solveScf, type ScfWavefunction } from './engine';
import { SCF_DEFAULTS, type ScfOptions, type ScfProblem } from './options';
import { summarize, type MeanFieldResult } from './result';
import { unblockedSpace } from './space';
import { adaptBasis, labelOrbitals, symmetryAdaptedSpace, trivialAdaptation } from './symmetry/adapted';

export interface ScfOutcome {
  /** Plain data for reports and views. */
  readonly result: MeanFieldResult;
  /** Typed arrays for the correlation and active-space code. */
  readonly wavefunction: ScfWavefunction;
}

export function runScf(problem: ScfProblem, options: ScfOptions = {}): ScfOutcome {
  const threshold = options.linearDependencyThreshold ?? DEFAULT_LINEAR_DEPENDENCY_THRESHOLD;
  const adaptation = options.symmetry === null ? trivialAdaptation(problem.basis) : (options.symmetry ?? adaptBasis(problem.basis));
  const n = problem.basis.functionCount;
  const blocked = n > 0 ? symmetryAdaptedSpace(adaptation, problem.overlap, problem.coreHamiltonian, threshold) : undefined;
  const space = blocked ?? unblockedSpace(problem.overlap, n, threshold);
  const wavefunction = solveScf(problem, space, options);
  let irreps = wavefunction.irreps;
  if (!blocked && adaptation.group !== 'C1') {
    const alpha = labelOrbitals(adaptation, problem.overlap, wavefunction.coefficients.alpha, wavefunction.orbitalEnergies.alpha, wavefunction.occupations.alpha);
    const beta =
      wavefunction.coefficients.beta === wavefunction.coefficients.alpha
        ? alpha
        : labelOrbitals(adaptation, problem.overlap, wavefunction.coefficients.beta, wavefunction.orbitalEnergies.beta, wavefunction.occupations.beta);
    irreps = { alpha, beta };
  }
  const labelled: ScfWavefunction = { ...wavefunction, irreps };
  const result = summarize(labelled, problem.basis, problem.overlap, {
    pointGroup: adaptation.group,
    symmetryBlocked: blocked !== undefined,
    energyTolerance: options.energyTolerance ?? SCF_DEFAULTS.energyTolerance,
    gradientTolerance: options.gradientTolerance ?? SCF_DEFAULTS.gradientTolerance,
    irreps,
  });
  return { result, wavefunction: labelled };
}
