/** `active 6e A1=3 B2=1`: labels of the fragment's own group, counts it has, a sum that matches `6o`. */
import { CHARACTER_TABLES, findIrrep } from '../../chemistry/symmetry';
import type { FragmentModel } from '../../language/model';
import type { EstimateCheckContext } from './context';

export function checkActiveIrreps(context: EstimateCheckContext): void {
  for (const fragment of context.model.fragments) {
    const activeAst = fragment.ast.tier?.active;
    if (!fragment.tier?.active || !activeAst || fragment.tier.level === 'mean-field') continue;
    // Counts are not trustworthy while the spin is wrong; that error comes first.
    if (!fragment.space.spin || fragment.atoms.length === 0) continue;
    if (activeAst.irreps.length > 0) checkFragment(context, fragment);
  }
}

function checkFragment(context: EstimateCheckContext, fragment: FragmentModel): void {
  const { sink, estimates } = context;
  const activeAst = fragment.ast.tier!.active!;
  const symmetry = estimates.countedSymmetry(fragment.index);
  if (!symmetry) return;
  const inSystem = estimates.symmetryScope().scope === 'in-system';
  const which = inSystem
    ? `${symmetry.group}, the point group fragment '${fragment.name}' keeps inside the system (the operations of the system's group that map it onto itself; full group ${symmetry.symmetry.fullGroup})`
    : `${symmetry.group}, the point group of fragment '${fragment.name}' (full group ${symmetry.symmetry.fullGroup})`;
  const labels = CHARACTER_TABLES[symmetry.group].irreps.map((irrep) => irrep.label);
  for (const entry of activeAst.irreps) {
    const irrep = findIrrep(symmetry.group, entry.label.value);
    if (!irrep) {
      sink.report('active-space-invalid', entry.label.span, `'${entry.label.value}' is not an irrep of ${which}; its irreps are ${labels.join(', ')}.`, { data: { kind: 'unknown-irrep' } });
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
