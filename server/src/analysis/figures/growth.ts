/**
 * How qubits and Pauli terms grow with the active space of a fragment: n = 1 … the solver's
 * problem size (at most 60), half filled, with the active irreps of the one rule in
 * chemistry/estimate/activeIrreps.ts — so the point at the fragment's own active space shows the
 * figures its card shows.
 */
import { activeIrreps, symmetryCounts } from '../../chemistry/estimate/activeIrreps';
import { problemUnpaired } from '../../chemistry/estimate/plan';
import type { Estimates } from '../estimates';

export interface GrowthPoint {
  orbitals: number;
  qubits: number;
  tapered: number;
  pauliTerms: number;
}

/** Largest active space the growth series goes to. */
export const GROWTH_MAX_ORBITALS = 60;

export function activeSpaceGrowth(estimates: Estimates, fragmentIndex: number, maxOrbitals = GROWTH_MAX_ORBITALS): GrowthPoint[] {
  const plan = estimates.plan(fragmentIndex);
  const input = estimates.planInput(fragmentIndex);
  if (!plan || !input) return [];
  // The spin of the problem its solver sees (the DMET impurity's, or the fragment's own).
  const unpaired = problemUnpaired(input, plan.problem);
  const points: GrowthPoint[] = [];
  for (let n = 1; n <= Math.min(plan.problem.orbitals, maxOrbitals); n++) {
    let electrons = n + ((n - unpaired) % 2 === 0 ? 0 : 1);
    if ((electrons + unpaired) / 2 > n) electrons -= 2;
    if (electrons < unpaired) continue;
    const alpha = (electrons + unpaired) / 2;
    const beta = (electrons - unpaired) / 2;
    const { tapering, pauli } = symmetryCounts(activeIrreps(input.symmetry, n, input.active), { alpha, beta });
    points.push({ orbitals: n, qubits: 2 * n, tapered: tapering.tapered, pauliTerms: pauli.jordanWigner });
  }
  return points;
}
