/**
 * The one rule for the irreps of an active space, used by every figure that needs them (a
 * fragment's plan, the qubit-limit suggestions, the system's counts, the growth series):
 *
 *  1. as given (`active 6e A1=3 B2=1`) when the spec gives them for this many orbitals;
 *  2. otherwise apportioned in proportion to the orbitals of each irrep outside the frozen core
 *     (largest remainder) — an assumption when the orbital energies are unknown;
 *  3. without a point group, all orbitals in the totally symmetric irrep of C1.
 *
 * The orbitals of each irrep are then spread evenly over the register, which fixes the irreps the
 * reference determinant fills (an assumption, said as `occupation: 'assumed'`); tapering and the
 * Pauli-term count read that order. When the spec gives the reference occupation per irrep
 * (`occupied A1=2 open B1=1`), the doubly occupied orbitals come first in the register, then the
 * singly occupied ones, then the rest (`occupation: 'given'`). A computed mean field, where there
 * is one, is a third source for the same order: the irreps and occupations of the active orbitals
 * it chose come in through the same per-irrep form, marked `origin: 'computed'` (`source` and
 * `occupation` then say `computed`).
 */
import { ABELIAN_GROUPS, CHARACTER_TABLES, findIrrep, type AbelianGroupName } from '../symmetry/characterTables';
import type { OrbitalSymmetry } from '../symmetry/orbitalSymmetry';
import { symmetryPattern } from './integralPattern';
import { countByIrrepCountsExact, countPauliTerms, type ElectronCount, type PauliTermCounts } from './pauliTerms';
import { taperNumberParities, taperQubits, type TaperingResult } from './tapering';

/** Orbitals of one irrep (mask as in symmetry/characterTables.ts). */
export interface IrrepShare {
  readonly label: string;
  readonly mask: number;
  readonly count: number;
}

/** What the estimates need of a point group. */
export interface PlanSymmetry {
  /** The abelian group used (D2h or a subgroup). */
  readonly group: string;
  readonly generatorCount: number;
  /** Names of the generators (bit g of a mask refers to generator g), for messages. */
  readonly generatorNames: readonly string[];
  /** Orbitals per irrep outside the frozen core, of the orbital space the solver sees. */
  readonly available: readonly IrrepShare[];
  /** The full group is non-abelian: abelian selection rules then only bound the integral count. */
  readonly fullGroupNonAbelian: boolean;
  readonly fullGroup: string;
}

export function planSymmetryOf(symmetry: OrbitalSymmetry | undefined): PlanSymmetry | undefined {
  if (!symmetry) return undefined;
  const table = CHARACTER_TABLES[symmetry.group];
  const full = symmetry.symmetry.fullGroup;
  return {
    group: symmetry.group,
    generatorCount: table.generators.length,
    generatorNames: table.generators,
    available: symmetry.available,
    fullGroupNonAbelian: !(ABELIAN_GROUPS as readonly string[]).includes(full),
    fullGroup: full,
  };
}

/** Per-irrep active orbitals as written (`A1=3 B2=1`), resolved against the group; undefined when a label is not one of its irreps. */
export function resolveGivenIrreps(group: string, given: readonly { label: string; count: number }[]): IrrepShare[] | undefined {
  if (!(ABELIAN_GROUPS as readonly string[]).includes(group)) return undefined;
  const shares: IrrepShare[] = [];
  for (const entry of given) {
    const irrep = findIrrep(group as AbelianGroupName, entry.label);
    if (!irrep) return undefined;
    shares.push({ label: irrep.label, mask: irrep.mask, count: entry.count });
  }
  return shares;
}

/**
 * Largest-remainder apportionment of `total` orbitals over the irreps in proportion to `shares`
 * (ties go to the earlier irrep). With total at most the shares' sum no irrep gets more than it has.
 */
export function apportion(shares: readonly IrrepShare[], total: number): IrrepShare[] {
  const available = shares.reduce((sum, share) => sum + share.count, 0);
  if (available === 0 || total <= 0) return shares.map((share) => ({ ...share, count: 0 }));
  const exact = shares.map((share) => (share.count * total) / available);
  const counts = exact.map(Math.floor);
  let left = total - counts.reduce((sum, count) => sum + count, 0);
  const order = exact.map((value, i) => ({ i, remainder: value - Math.floor(value) })).sort((a, b) => b.remainder - a.remainder || a.i - b.i);
  for (const { i } of order) {
    if (left === 0) break;
    counts[i]!++;
    left--;
  }
  return shares.map((share, i) => ({ ...share, count: counts[i]! }));
}

/**
 * One irrep per active orbital, spread evenly: the orbitals of each irrep take the positions
 * (k + ½)/count_g, merged in order. The reference determinant fills them in this order, a planning
 * assumption when the orbital energies are unknown.
 */
export function spreadIrreps(shares: readonly IrrepShare[]): number[] {
  const positions: { at: number; mask: number }[] = [];
  for (const share of shares) for (let k = 0; k < share.count; k++) positions.push({ at: (k + 0.5) / share.count, mask: share.mask });
  positions.sort((a, b) => a.at - b.at || a.mask - b.mask);
  return positions.map((position) => position.mask);
}

/**
 * Active spaces beyond this many orbitals (20,000 qubits, far past any device or exact classical
 * solver) are counted without the point group, from closed forms in n alone: no per-orbital
 * irreps, tapering of the two number parities, the C1 Pauli-term count; UCCSD circuit costs,
 * summed orbital by orbital, are not estimated (plan.ts). This keeps the largest supported spec
 * (about 2 × 10^7 orbitals) bounded in time and memory, whatever its tiers say.
 */
export const PER_ORBITAL_LIMIT = 10_000;

export interface ActiveIrreps {
  /** Orbitals per irrep of the active space. */
  readonly irreps: readonly IrrepShare[];
  readonly source: 'given' | 'computed' | 'proportional' | 'none';
  /** Active orbitals. */
  readonly orbitals: number;
  /** False beyond PER_ORBITAL_LIMIT: counted without symmetry, and orbitalIrreps is empty. */
  readonly perOrbital: boolean;
  /** The irrep mask of each active orbital in register order (empty when not perOrbital). */
  readonly orbitalIrreps: readonly number[];
  /** Generators of the group the masks refer to (0 without symmetry). */
  readonly generatorCount: number;
  /** Where the reference determinant's irreps come from. */
  readonly occupation: 'given' | 'computed' | 'assumed';
}

/** The reference occupation per irrep as given: doubly and singly occupied orbitals. */
export interface GivenOccupation {
  readonly doubly: readonly IrrepShare[];
  readonly singly: readonly IrrepShare[];
}

/**
 * Register order for a given occupation: doubly occupied orbitals, singly occupied, the rest, each
 * group spread evenly; undefined when an irrep holds more occupied orbitals than it has.
 */
function occupiedFirst(shares: readonly IrrepShare[], occupation: GivenOccupation): number[] | undefined {
  const left = new Map(shares.map((share) => [share.mask, share.count]));
  for (const share of [...occupation.doubly, ...occupation.singly]) {
    const count = (left.get(share.mask) ?? 0) - share.count;
    if (count < 0) return undefined;
    left.set(share.mask, count);
  }
  const rest = shares.map((share) => ({ ...share, count: left.get(share.mask) ?? 0 }));
  return [...spreadIrreps(occupation.doubly), ...spreadIrreps(occupation.singly), ...spreadIrreps(rest)];
}

/** The active orbitals per irrep, by the rule in the module comment. */
export function activeIrreps(
  symmetry: PlanSymmetry | undefined,
  orbitals: number,
  given?: { readonly orbitals: number; readonly perIrrep?: readonly IrrepShare[]; readonly occupation?: GivenOccupation; readonly origin?: 'spec' | 'computed' },
): ActiveIrreps {
  if (orbitals > PER_ORBITAL_LIMIT) {
    return { irreps: [{ label: 'A', mask: 0, count: orbitals }], source: 'none', orbitals, perOrbital: false, orbitalIrreps: [], generatorCount: 0, occupation: 'assumed' };
  }
  if (given?.perIrrep && given.orbitals === orbitals) {
    const ordered = given.occupation ? occupiedFirst(given.perIrrep, given.occupation) : undefined;
    const computed = given.origin === 'computed';
    return {
      irreps: [...given.perIrrep],
      source: computed ? 'computed' : 'given',
      orbitals,
      perOrbital: true,
      orbitalIrreps: ordered ?? spreadIrreps(given.perIrrep),
      generatorCount: symmetry?.generatorCount ?? 0,
      occupation: ordered ? (computed ? 'computed' : 'given') : 'assumed',
    };
  }
  // Also for a DMET impurity, whose bath orbitals are taken to split like the fragment's own.
  if (symmetry && symmetry.generatorCount > 0) {
    const irreps = apportion(symmetry.available, orbitals);
    return { irreps, source: 'proportional', orbitals, perOrbital: true, orbitalIrreps: spreadIrreps(irreps), generatorCount: symmetry.generatorCount, occupation: 'assumed' };
  }
  const irreps = [{ label: 'A', mask: 0, count: orbitals }];
  return { irreps, source: 'none', orbitals, perOrbital: true, orbitalIrreps: spreadIrreps(irreps), generatorCount: 0, occupation: 'assumed' };
}

/** Tapering of an active space with these irreps and electrons. */
export function taperingOf(active: ActiveIrreps, electrons?: ElectronCount): TaperingResult {
  if (!active.perOrbital) return taperNumberParities(active.orbitals, electrons);
  return taperQubits(Uint8Array.from(active.orbitalIrreps), active.generatorCount, electrons);
}

/** Tapering and Pauli terms of an active space with these irreps and electrons. */
export function symmetryCounts(active: ActiveIrreps, electrons: ElectronCount): { tapering: TaperingResult; pauli: PauliTermCounts } {
  if (!active.perOrbital) {
    // n > PER_ORBITAL_LIMIT ≥ 5, so the reduced parity count equals the full one (pauliTerms.ts).
    const exact = countByIrrepCountsExact([active.orbitals, 0, 0, 0, 0, 0, 0, 0]);
    const full = Number(exact);
    const pauli: PauliTermCounts = { orbitals: active.orbitals, jordanWigner: full, bravyiKitaev: full, parityUnreduced: full, parity: full, paritySectors: [full, full, full, full], exact: { full: exact, parity: exact } };
    return { tapering: taperNumberParities(active.orbitals, electrons), pauli };
  }
  const masks = Uint8Array.from(active.orbitalIrreps);
  return { tapering: taperQubits(masks, active.generatorCount, electrons), pauli: countPauliTerms(symmetryPattern(masks), electrons) };
}
