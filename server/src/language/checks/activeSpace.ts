/** Active spaces against the fragment they are chosen from, including per-irrep counts. */
import { checkActiveSpace } from '../../chemistry/counting';
import { CHARACTER_TABLES } from '../../chemistry/symmetry';
import { estimatesOf } from '../estimates';
import type { FragmentModel } from '../model';
import type { CheckContext } from './context';

export function checkActiveSpaces(context: CheckContext): void {
  const { model, sink } = context;
  for (const fragment of model.fragments) {
    const active = fragment.tier?.active;
    const activeAst = fragment.ast.tier?.active;
    if (!active || !activeAst || fragment.tier?.level === 'mean-field') continue;
    const space = fragment.space;
    // Counts are not trustworthy while the spin is wrong; that error comes first. Without a basis
    // for every atom the orbital total is unknown, but capacity and spin can still be checked.
    if (!space.spin || fragment.atoms.length === 0) continue;
    for (const problem of checkActiveSpace(space, active, space.atomsWithoutBasis === 0)) {
      sink.report('active-space-invalid', activeAst.span, `The active space of '${fragment.name}' does not fit: ${problem.message.charAt(0).toLowerCase()}${problem.message.slice(1)}`, { data: { kind: problem.kind } });
    }
    if (activeAst.irreps.length > 0) checkActiveIrreps(context, fragment);
  }
}

/** `active 6e A1=3 B2=1`: labels of the fragment's own group, counts it has, a sum that matches `6o`. */
function checkActiveIrreps(context: CheckContext, fragment: FragmentModel): void {
  const { sink, model } = context;
  const activeAst = fragment.ast.tier!.active!;
  const symmetry = estimatesOf(model).fragmentSymmetry(fragment.index);
  if (!symmetry) return;
  const table = CHARACTER_TABLES[symmetry.group];
  const labels = table.irreps.map((irrep) => irrep.label);
  for (const entry of activeAst.irreps) {
    const label = entry.label.value.replace(/''$/, '"');
    const irrep = table.irreps.find((candidate) => candidate.label.toLowerCase() === label.toLowerCase());
    if (!irrep) {
      sink.report('active-space-invalid', entry.label.span, `'${entry.label.value}' is not an irrep of ${symmetry.group}, the point group of fragment '${fragment.name}' (full group ${symmetry.symmetry.fullGroup}); its irreps are ${labels.join(', ')}.`, { data: { kind: 'unknown-irrep' } });
      continue;
    }
    const available = symmetry.available.find((share) => share.mask === irrep.mask)?.count ?? 0;
    if (entry.count.value > available) {
      sink.report('active-space-invalid', entry.span, `Fragment '${fragment.name}' has ${available} ${irrep.label} orbitals outside the frozen core; ${entry.count.value} cannot be active.`, { data: { kind: 'irrep-exceeds-available' } });
    }
  }
  const sum = activeAst.irreps.reduce((total, entry) => total + entry.count.value, 0);
  const given = activeAst.orbitals;
  const derived = given?.span.start === activeAst.irreps[0]!.span.start;
  if (given && !derived && given.value !== sum) {
    sink.report('active-space-invalid', given.span, `The active orbitals per irrep add up to ${sum}, not ${given.value}.`, { data: { kind: 'irrep-sum' } });
  }
}
