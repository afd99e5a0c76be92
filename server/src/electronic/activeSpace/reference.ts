/**
 * The mean field an active space is chosen from. Active spaces are chosen in restricted orbitals
 * (one set of spatial orbitals for both spins), as the frozen-core Hamiltonian needs them: RHF for
 * closed shells, ROHF for open shells. A UHF mean field has two sets and no single active space,
 * so it is refused with a message saying to choose from ROHF orbitals.
 *
 * In ROHF orbitals the singly occupied orbitals are always active: the frozen core holds only
 * doubly occupied orbitals, and an orbital left out of the active space must be empty or doubly
 * occupied for the frozen-core Hamiltonian to hold.
 */
import type { MolecularBasis } from '../contracts';
import type { ScfReference } from '../scf/options';
import { ActiveSelectionError } from './selection';

/** The parts of an SCF wavefunction a selection reads (scf/engine.ts ScfWavefunction has them all). */
export interface RestrictedWavefunction {
  readonly reference: ScfReference;
  /** N × M, columns ascending in energy (alpha; the same spatial orbitals for beta in RHF and ROHF). */
  readonly coefficients: { readonly alpha: Float64Array };
  readonly orbitalEnergies: { readonly alpha: ArrayLike<number> };
  /** 1 or 0 per orbital and spin. */
  readonly occupations: { readonly alpha: ArrayLike<number>; readonly beta: ArrayLike<number> };
  readonly irreps: { readonly alpha: readonly (string | null)[] };
  readonly electrons: { readonly alpha: number; readonly beta: number };
}

export interface SelectionReference {
  readonly basis: MolecularBasis;
  /** Atomic-orbital overlap S (N × N). */
  readonly overlap: Float64Array;
  readonly wavefunction: RestrictedWavefunction;
  /** Abelian point group of the orbital irreps (MeanFieldResult.pointGroup). */
  readonly pointGroup: string;
}

/** The canonical orbitals of a restricted mean field, as the selections read them. */
export interface CanonicalOrbitals {
  readonly functionCount: number;
  readonly orbitalCount: number;
  /** N × M, columns ascending in energy. */
  readonly coefficients: Float64Array;
  readonly energies: ArrayLike<number>;
  /** 2, 1 or 0 electrons per orbital. */
  readonly occupations: Float64Array;
  readonly irreps: readonly (string | null)[];
  readonly electrons: { readonly alpha: number; readonly beta: number };
}

export function canonicalOrbitals(reference: SelectionReference): CanonicalOrbitals {
  const w = reference.wavefunction;
  if (w.reference === 'uhf') {
    throw new ActiveSelectionError('An active space is chosen from restricted orbitals; this mean field is UHF (separate alpha and beta orbitals). Choose it from an ROHF mean field of the same part.');
  }
  const M = w.orbitalEnergies.alpha.length;
  if (w.coefficients.alpha.length !== reference.basis.functionCount * M) throw new ActiveSelectionError(`The orbitals hold ${w.coefficients.alpha.length} coefficients for ${reference.basis.functionCount} functions × ${M} orbitals.`);
  const N = reference.basis.functionCount;
  const occupations = new Float64Array(M);
  for (let p = 0; p < M; p++) occupations[p] = w.occupations.alpha[p]! + w.occupations.beta[p]!;
  return { functionCount: N, orbitalCount: M, coefficients: w.coefficients.alpha, energies: w.orbitalEnergies.alpha, occupations, irreps: w.irreps.alpha, electrons: w.electrons };
}

/** Indices of the orbitals holding `electrons` electrons (2, 1 or 0), ascending. */
export function orbitalsHolding(orbitals: CanonicalOrbitals, electrons: number): number[] {
  const out: number[] = [];
  for (let p = 0; p < orbitals.orbitalCount; p++) if (orbitals.occupations[p] === electrons) out.push(p);
  return out;
}
