/**
 * What an active-space choice hands on: the orbitals it was made in, which of them are frozen
 * (doubly occupied core) and which are active, the active electrons, how the choice was made, and
 * for each active orbital the figures a chemist checks it by (energy, occupation, irrep, main
 * atomic character). The active-space Hamiltonian (hamiltonian/activeSpace.ts) takes `orbitals`,
 * `core` and `active` as they are.
 */
import type { ElectronCount, RestrictedOrbitals } from '../hamiltonian/activeSpace';

/**
 * How the orbitals were chosen:
 * - `canonical-window`: `Ne No`, the orbitals around the Fermi level in energy order;
 * - `irrep-window`: a number of orbitals per irrep, each irrep's nearest the Fermi level;
 * - `natural-occupations`: MP2 natural orbitals whose occupation lies inside a window;
 * - `atomic-projection`: occupied and virtual orbitals projected onto named atomic shells (AVAS).
 */
export type SelectionSource = 'canonical-window' | 'irrep-window' | 'natural-occupations' | 'atomic-projection';

/** Which orbitals `ActiveSelection.orbitals` holds. */
export type OrbitalKind = 'canonical' | 'natural' | 'projected';

/** The atom and angular momentum carrying the largest Mulliken share of an orbital. */
export interface AtomicCharacter {
  /** Index of the atom among the part's centres. */
  readonly center: number;
  readonly symbol: string;
  /** Angular momentum of the functions (0 s, 1 p, 2 d, …). */
  readonly l: number;
  /** Mulliken gross population of those functions in the orbital (the orbital holds 1 in total). */
  readonly weight: number;
}

export interface ActiveOrbital {
  /** Column of `ActiveSelection.orbitals`. */
  readonly index: number;
  /** Orbital energy (hartree) for canonical orbitals; null for natural or projected orbitals. */
  readonly energy: number | null;
  /**
   * Electrons in the orbital: the reference determinant's 0, 1 or 2 for canonical and projected
   * orbitals, the natural occupation number (between 0 and 2) for natural orbitals.
   */
  readonly occupation: number;
  /** Irrep in the part's abelian point group; null where the orbital belongs to none. */
  readonly irrep: string | null;
  readonly character: AtomicCharacter | null;
  /** Atomic projection only: the eigenvalue of the projector for this orbital (0 to 1). */
  readonly projection?: number;
}

export interface ActiveSelection {
  readonly source: SelectionSource;
  readonly orbitalKind: OrbitalKind;
  readonly orbitals: RestrictedOrbitals;
  /** Doubly occupied orbitals frozen below the active space. */
  readonly core: readonly number[];
  /** Active orbitals in the order they take on the qubit register. */
  readonly active: readonly number[];
  /** Electrons inside the active space. */
  readonly electrons: ElectronCount;
  /** Electrons of the whole part (core included). */
  readonly totalElectrons: ElectronCount;
  /** One entry per active orbital, in the order of `active`. */
  readonly details: readonly ActiveOrbital[];
  /** Point group of the irrep labels. */
  readonly pointGroup: string;
  /** What was adjusted or assumed (fitting to a qubit limit, a threshold), as sentences. */
  readonly notes: readonly string[];
}

export class ActiveSelectionError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ActiveSelectionError';
  }
}

/** Active orbitals per irrep label, in first-seen order; null when an active orbital has no irrep. */
export function activeIrrepCounts(selection: Pick<ActiveSelection, 'details'>): { label: string; count: number }[] | null {
  const counts = new Map<string, number>();
  for (const orbital of selection.details) {
    if (orbital.irrep === null) return null;
    counts.set(orbital.irrep, (counts.get(orbital.irrep) ?? 0) + 1);
  }
  return [...counts].map(([label, count]) => ({ label, count }));
}

/** Spin orbitals, the qubits of a plain Jordan–Wigner register. */
export function activeSpinOrbitals(selection: Pick<ActiveSelection, 'active'>): number {
  return 2 * selection.active.length;
}
