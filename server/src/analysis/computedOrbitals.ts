/**
 * The active orbitals of a fragment's computed active space as the estimates read them
 * (estimates.ts, ComputedActiveOrbitals): the irrep of each active orbital and the electrons it
 * holds in the reference determinant. Canonical and projected orbitals carry their determinant's
 * 0, 1 or 2 electrons; MP2 natural orbitals (closed shells only) carry natural occupations, and
 * the reference determinant fills the most occupied of them with the active electrons in pairs —
 * the determinant a solver starting from those orbitals takes (common practice).
 */
import type { ActiveSpaceOutcome } from './computed';
import type { ComputedActiveOrbitals } from './estimates';

const CACHE = new WeakMap<ActiveSpaceOutcome, ComputedActiveOrbitals>();

export function computedActiveOrbitals(outcome: ActiveSpaceOutcome): ComputedActiveOrbitals {
  let found = CACHE.get(outcome);
  if (found) return found;
  const irreps = outcome.details.map((orbital) => orbital.irrep);
  let occupations: number[];
  if (outcome.orbitalKind === 'natural') {
    const { alpha, beta } = outcome.electrons;
    const order = outcome.details.map((orbital, k) => ({ k, n: orbital.occupation })).sort((a, b) => b.n - a.n || a.k - b.k);
    occupations = outcome.details.map(() => 0);
    order.forEach(({ k }, rank) => (occupations[k] = (rank < alpha ? 1 : 0) + (rank < beta ? 1 : 0)));
  } else {
    occupations = outcome.details.map((orbital) => Math.round(orbital.occupation));
  }
  found = { pointGroup: outcome.pointGroup, irreps, occupations };
  CACHE.set(outcome, found);
  return found;
}
