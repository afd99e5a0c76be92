/** Builds an ActiveSelection's per-orbital details from the orbitals it was made in. */
import { mainCharacters } from './character';
import type { SelectionReference } from './reference';
import type { ActiveOrbital, ActiveSelection, OrbitalKind, SelectionSource } from './selection';
import type { RestrictedOrbitals } from '../hamiltonian/activeSpace';

export interface SelectionParts {
  readonly source: SelectionSource;
  readonly orbitalKind: OrbitalKind;
  readonly orbitals: RestrictedOrbitals;
  readonly core: readonly number[];
  readonly active: readonly number[];
  /** Per orbital of `orbitals`: energy (null when not canonical), electrons, irrep. */
  readonly energies: ArrayLike<number> | null;
  readonly occupations: ArrayLike<number>;
  readonly irreps: readonly (string | null)[];
  readonly projections?: ArrayLike<number>;
  readonly totalElectrons: { readonly alpha: number; readonly beta: number };
  readonly notes?: readonly string[];
}

export function assembleSelection(reference: SelectionReference, parts: SelectionParts): ActiveSelection {
  const { orbitals, active, core } = parts;
  const characters = mainCharacters(reference.basis, reference.overlap, orbitals.coefficients, orbitals.orbitalCount, active);
  const details: ActiveOrbital[] = active.map((index, k) => ({
    index,
    energy: parts.energies ? parts.energies[index]! : null,
    occupation: parts.occupations[index]!,
    irrep: parts.irreps[index] ?? null,
    character: characters[k] ?? null,
    ...(parts.projections ? { projection: parts.projections[index]! } : {}),
  }));
  const nc = core.length;
  return {
    source: parts.source,
    orbitalKind: parts.orbitalKind,
    orbitals,
    core: [...core],
    active: [...active],
    electrons: { alpha: parts.totalElectrons.alpha - nc, beta: parts.totalElectrons.beta - nc },
    totalElectrons: parts.totalElectrons,
    details,
    pointGroup: reference.pointGroup,
    notes: parts.notes ?? [],
  };
}
