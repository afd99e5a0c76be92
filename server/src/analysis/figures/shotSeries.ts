/**
 * The active-space sizes whose Hamiltonians are computed for the plot of shots against
 * active-space size: canonical windows of n = 2, 4, … orbitals up to the explicit limit (16
 * orbitals, qubitHamiltonian.ts) and the problem's size, each about half filled with the problem's
 * spin (the rule of growth.ts) or holding all the problem's electrons when it has fewer, plus the
 * fragment's own active space. Only for a quantum fragment
 * computed alone (not under DMET, whose active space lies in the impurity).
 */
import { problemUnpaired } from '../../chemistry/estimate/plan';
import { MAX_EXPLICIT_ORBITALS } from '../../electronic/hamiltonian/qubitHamiltonian';
import type { Estimates } from '../estimates';

export interface SeriesWindow {
  readonly electrons: number;
  readonly orbitals: number;
}

/** Every this many orbitals a point of the series (common practice for a readable plot, ours). */
export const SHOT_SERIES_STEP = 2;

export function shotSeriesWindows(estimates: Estimates, fragmentIndex: number): SeriesWindow[] {
  const fragment = estimates.model.fragments[fragmentIndex];
  if (fragment?.tier?.level !== 'quantum') return [];
  const plan = estimates.plan(fragmentIndex);
  const input = estimates.planInput(fragmentIndex);
  if (!plan || !input || plan.problem.embedding === 'dmet') return [];
  const problem = plan.problem;
  const unpaired = problemUnpaired(input, problem);
  const sizes = new Set<number>();
  for (let n = SHOT_SERIES_STEP; n <= Math.min(problem.orbitals, MAX_EXPLICIT_ORBITALS); n += SHOT_SERIES_STEP) sizes.add(n);
  if (plan.active.orbitals <= MAX_EXPLICIT_ORBITALS) sizes.add(plan.active.orbitals);
  const windows: SeriesWindow[] = [];
  for (const n of [...sizes].sort((a, b) => a - b)) {
    let electrons = n === plan.active.orbitals ? plan.active.electrons : n + ((n - unpaired) % 2 === 0 ? 0 : 1);
    if ((electrons + unpaired) / 2 > n) electrons -= 2;
    // Past half filling of the problem's electrons, every electron of the problem is active.
    if (electrons > problem.electrons) electrons = problem.electrons;
    if (electrons < unpaired) continue;
    const alpha = (electrons + unpaired) / 2;
    const doubly = (electrons - unpaired) / 2;
    // The window's doubly occupied orbitals come from the problem's, its virtual ones from its empty ones.
    if (doubly > problem.beta || n - alpha > problem.orbitals - problem.alpha) continue;
    windows.push({ electrons, orbitals: n });
  }
  return windows;
}
