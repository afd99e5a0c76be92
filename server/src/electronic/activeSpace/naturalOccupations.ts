/**
 * Active space from MP2 natural occupation numbers: the natural orbitals whose occupation lies
 * inside a window (by default 0.02 to 1.98, common practice) are active, those above it frozen,
 * those below it left empty. Strongly occupied or nearly empty natural orbitals carry little
 * correlation; the window keeps the ones MP2 finds partly occupied (for the idea: C. D. Sherrill,
 * lecture notes and e.g. M. S. Gordon et al.; in quantum-computing studies the same MP2-based
 * choice is common practice). MP2 here is on RHF only, so the choice needs a closed-shell mean
 * field. Fitted to a limit, the orbitals whose occupation is nearest 0 or 2 are dropped first.
 */
import type { Mp2Outcome } from '../correlation/mp2';
import { assembleSelection } from './describe';
import { fitToOrbitalLimit } from './fit';
import { canonicalOrbitals, type SelectionReference } from './reference';
import { ActiveSelectionError, type ActiveSelection } from './selection';

import { DEFAULT_OCCUPATION_WINDOW } from '../../chemistry/activeSpaceDefaults';
export { DEFAULT_OCCUPATION_WINDOW };

export interface NaturalOccupationOptions {
  readonly window?: { readonly low: number; readonly high: number };
  /** Largest number of active spatial orbitals (from the qubit limit); undefined: no limit. */
  readonly maxOrbitals?: number;
  /** Irrep of each natural orbital (correlation/naturalOrbitals.ts), in their order. */
  readonly irreps?: readonly (string | null)[];
}

export function naturalOccupationSelection(reference: SelectionReference, outcome: Pick<Mp2Outcome, 'naturalOrbitals' | 'result'>, options: NaturalOccupationOptions = {}): ActiveSelection {
  const canonical = canonicalOrbitals(reference);
  if (reference.wavefunction.reference !== 'rhf') throw new ActiveSelectionError('Natural occupations come from MP2 on an RHF mean field; this part is open-shell. Choose its active space by window, by irrep or by atomic shells.');
  const window = options.window ?? DEFAULT_OCCUPATION_WINDOW;
  if (!(window.low >= 0 && window.low < window.high && window.high <= 2)) throw new ActiveSelectionError(`The natural-occupation window ${window.low} to ${window.high} must satisfy 0 ≤ low < high ≤ 2.`);
  const occupations = outcome.result.naturalOccupations;
  const M = occupations.length;
  const N = canonical.functionCount;
  if (outcome.naturalOrbitals.length !== N * M) throw new ActiveSelectionError(`The natural orbitals hold ${outcome.naturalOrbitals.length} numbers for ${N} functions × ${M} orbitals.`);
  const core: number[] = [];
  const inside: number[] = [];
  for (let p = 0; p < M; p++) {
    const n = occupations[p]!;
    if (n > window.high) core.push(p);
    else if (n >= window.low) inside.push(p);
  }
  if (inside.length === 0) throw new ActiveSelectionError(`No MP2 natural occupation lies between ${window.low} and ${window.high}; the largest below the window is ${occupations.find((n) => n <= window.high)?.toFixed(4) ?? 'none'}. Widen the window.`);
  const notes = [`MP2 natural orbitals with occupation from ${window.low} to ${window.high}: ${inside.length} of ${M}.`];
  const fit = fitToOrbitalLimit(inside.map((p) => ({ index: p, importance: Math.min(occupations[p]!, 2 - occupations[p]!), occupied: occupations[p]! > 1 })), options.maxOrbitals);
  if (fit.toCore.length + fit.toVirtual.length > 0) notes.push(`Fitted to ${options.maxOrbitals} orbitals: ${fit.toCore.length} nearly doubly occupied moved to the core, ${fit.toVirtual.length} nearly empty left out.`);
  const active = fit.kept;
  const allCore = [...core, ...fit.toCore].sort((a, b) => a - b);
  const irreps = options.irreps ?? Array<string | null>(M).fill(null);
  return assembleSelection(reference, {
    source: 'natural-occupations',
    orbitalKind: 'natural',
    orbitals: { functionCount: N, orbitalCount: M, coefficients: outcome.naturalOrbitals },
    core: allCore,
    active,
    energies: null,
    occupations,
    irreps,
    totalElectrons: canonical.electrons,
    notes,
  });
}
