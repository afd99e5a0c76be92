/**
 * The classical solver cost of a fragment (chemistry/cost/solvers.ts) on what its solver sees: a
 * correlated tier on its active space inside its problem (the DMET impurity or its own orbitals,
 * with the impurity's orbitals as the basis of the transformation), a mean-field tier on the
 * fragment's own basis functions. The time is taken at `limits { rate }`, or at DEFAULT_FLOPS.
 */
import { DEFAULT_FLOPS, solverCost, solverTime, type SolverSpace } from '../../chemistry/cost/solvers';
import type { PlanEstimate } from '../../chemistry/estimate/plan';
import type { Estimates } from '../estimates';
import { bigFigure } from './space';
import type { SolverCostFigures } from './types';

/** The rate a spec's times are taken at, and where it comes from. */
export function solverRate(estimates: Estimates): { flopsPerSecond: number; from: 'limits' | 'default' } {
  const given = estimates.model.limits.flopsPerSecond;
  return given !== undefined ? { flopsPerSecond: given, from: 'limits' } : { flopsPerSecond: DEFAULT_FLOPS, from: 'default' };
}

function solverSpace(estimates: Estimates, index: number, given?: PlanEstimate): { space: SolverSpace; on: SolverCostFigures['on'] } | undefined {
  const fragment = estimates.model.fragments[index]!;
  const tier = fragment.tier;
  if (!tier || fragment.atoms.length === 0 || fragment.space.atomsWithoutBasis > 0) return undefined;
  if (tier.level === 'mean-field') {
    const spin = fragment.space.spin;
    if (!spin) return undefined;
    return {
      space: { basisFunctions: fragment.space.orbitals, orbitals: fragment.space.orbitals, alpha: spin.alpha, beta: spin.beta, atoms: fragment.space.atomCount },
      on: 'fragment',
    };
  }
  if (tier.level !== 'correlated') return undefined;
  const plan = given ?? estimates.plan(index);
  if (!plan) return undefined;
  const basis = plan.problem.orbitals + fragment.space.frozenCore.orbitals;
  return {
    space: { basisFunctions: basis, orbitals: plan.active.orbitals, alpha: plan.active.alpha, beta: plan.active.beta, atoms: fragment.space.atomCount },
    // A computed active space (its size from the mean field) is given too.
    on: plan.active.source === 'given' ? 'active-space' : plan.problem.embedding === 'dmet' ? 'dmet-impurity' : 'fragment',
  };
}

/** The solver cost figures of a classical-tier fragment; null for quantum tiers and parts that cannot be sized. */
/** `plan`: the plan the fragment's other figures use (built on computed active orbitals, when they are there). */
export function solverCostFigures(estimates: Estimates, index: number, plan?: PlanEstimate): SolverCostFigures | null {
  const fragment = estimates.model.fragments[index]!;
  const found = solverSpace(estimates, index, plan);
  if (!found) return null;
  const cost = solverCost(fragment.tier!.method, found.space);
  if (!cost) return null;
  const rate = solverRate(estimates);
  const time = solverTime(cost.operations, rate.flopsPerSecond);
  return {
    method: cost.method,
    scaling: cost.scaling,
    on: found.on,
    basisFunctions: cost.sizes.N,
    orbitals: cost.sizes.n,
    occupied: cost.sizes.o,
    virtual: cost.sizes.v,
    determinants: cost.sizes.determinants ? bigFigure(cost.sizes.determinants) : null,
    operations: bigFigure(cost.operations),
    operationsPerIteration: cost.operationsPerIteration ? bigFigure(cost.operationsPerIteration) : null,
    iterations: cost.iterations,
    memoryBytes: bigFigure(cost.memoryBytes, true),
    time: { seconds: time.seconds, log10Seconds: time.log10Seconds, text: time.text, flopsPerSecond: rate.flopsPerSecond, rateFrom: rate.from },
    formula: cost.formula,
    references: [...cost.references],
  };
}
