/**
 * Which fragment owns which atom: `rest` takes every atom the other fragments leave (with two
 * claimants the first one takes them and the fragment checks report the second); the first
 * fragment that claims an atom owns it, and atoms claimed twice are kept with all claimants.
 */
import type { Selection } from './selectors';
import type { SpecModel } from './types';

export interface Ownership {
  /** Per atom: the first fragment that claims it, or -1 when none does. */
  readonly owner: Int32Array;
  readonly sharedAtoms: Map<number, number[]>;
}

/** Completes the selection that claims `rest` (in place) and assigns every atom its owner. */
export function assignOwners(selections: readonly Selection[], atomCount: number): Ownership {
  const restOwner = selections.find((selection) => selection.claimsRest);
  if (restOwner) {
    const claimedElsewhere = new Uint8Array(atomCount);
    for (const selection of selections) {
      if (selection !== restOwner) for (const atom of selection.atoms) claimedElsewhere[atom] = 1;
    }
    const own = new Uint8Array(atomCount);
    for (const atom of restOwner.atoms) own[atom] = 1;
    const merged: number[] = [];
    for (let atom = 0; atom < atomCount; atom++) if (own[atom] || !claimedElsewhere[atom]) merged.push(atom);
    restOwner.atoms = merged;
  }
  const owner = new Int32Array(atomCount).fill(-1);
  const sharedAtoms = new Map<number, number[]>();
  selections.forEach((selection, index) => {
    for (const atom of selection.atoms) {
      const first = owner[atom]!;
      if (first < 0) owner[atom] = index;
      else {
        const claimants = sharedAtoms.get(atom);
        if (claimants) claimants.push(index);
        else sharedAtoms.set(atom, [first, index]);
      }
    }
  });
  return { owner, sharedAtoms };
}

/** The fragments that claim an atom, in fragment order (usually one). */
export function claimsOf(model: Pick<SpecModel, 'owner' | 'sharedAtoms'>, atom: number): number[] {
  const shared = model.sharedAtoms.get(atom);
  if (shared) return shared;
  const first = model.owner[atom] ?? -1;
  return first >= 0 ? [first] : [];
}
