/**
 * The inputs that determine a computed result for one fragment (the key a job is queued under and
 * its result kept by): elements and coordinates of its atoms, the basis of each, the function
 * type, charge, multiplicity and frozen core. Two document versions that agree on these share the
 * result; anything else that changes (a comment, another fragment, a label) does not invalidate it.
 */
import type { SpecModel } from '../language/model';

/** Coordinates rounded to 1e-6 Å: edits below that do not change a mean field meaningfully. */
const DECIMALS = 6;

export function fragmentInputKey(model: SpecModel, fragmentIndex: number): string {
  const fragment = model.fragments[fragmentIndex]!;
  const parts: string[] = [model.basis.functions, `q${fragment.charge}`, `m${fragment.multiplicity}`, `fc${fragment.tier?.frozenCore ?? model.frozenCore ? 1 : 0}`];
  for (const atom of fragment.atoms) {
    const element = model.atoms[atom]!.element.symbol;
    const basis = model.basis.atomSets[atom]?.displayName ?? '-';
    const c = model.coordinates;
    parts.push(`${element}/${basis}/${c[3 * atom]!.toFixed(DECIMALS)},${c[3 * atom + 1]!.toFixed(DECIMALS)},${c[3 * atom + 2]!.toFixed(DECIMALS)}`);
  }
  return parts.join(';');
}
