/** `active 6e A1=3 B2=1 occupied A1=2 B2=1`: labels of the fragment's own group, counts it has, a sum that matches `6o`, an occupation that fits. */
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
    else if (activeAst.occupied || activeAst.open) {
      const first = (activeAst.occupied ?? activeAst.open)![0]!;
      context.sink.report('active-space-invalid', first.span, `A reference occupation per irrep needs the active orbitals per irrep first: \`active 6e A1=3 B1=1 B2=2 occupied A1=2 B2=1\`.`, { data: { kind: 'occupation-without-irreps' } });
    }
  }
}

/**
 * `occupied A1=2 open B1=1`: irreps of the group, no more occupied orbitals in an irrep than are
 * active there, 2 × doubly + singly = the active electrons, and as many singly occupied orbitals
 * as the problem has unpaired electrons (nα − nβ).
 */
function checkOccupation(context: EstimateCheckContext, fragment: FragmentModel, group: string, activeCounts: ReadonlyMap<number, number>): void {
  const { sink, estimates } = context;
  const activeAst = fragment.ast.tier!.active!;
  const doubly = activeAst.occupied ?? [];
  const singly = activeAst.open ?? [];
  if (doubly.length === 0 && singly.length === 0) return;
  const used = new Map<number, number>();
  let known = true;
  for (const entry of [...doubly, ...singly]) {
    const irrep = findIrrep(group as Parameters<typeof findIrrep>[0], entry.label.value);
    if (!irrep) {
      known = false;
      sink.report('active-space-invalid', entry.label.span, `'${entry.label.value}' is not an irrep of ${group}.`, { data: { kind: 'unknown-irrep' } });
      continue;
    }
    const total = (used.get(irrep.mask) ?? 0) + entry.count.value;
    used.set(irrep.mask, total);
    const available = activeCounts.get(irrep.mask) ?? 0;
    if (total > available) sink.report('active-space-invalid', entry.span, `${total} occupied ${irrep.label} orbitals, but the active space has ${available} ${irrep.label} orbitals.`, { data: { kind: 'occupation-exceeds-irrep' } });
  }
  if (!known) return;
  const sumDoubly = doubly.reduce((sum, entry) => sum + entry.count.value, 0);
  const sumSingly = singly.reduce((sum, entry) => sum + entry.count.value, 0);
  const electrons = fragment.tier?.active?.electrons;
  const where = activeAst.occupied?.[0]?.span ?? activeAst.open![0]!.span;
  if (electrons !== undefined && 2 * sumDoubly + sumSingly !== electrons) {
    sink.report('active-space-invalid', where, `The occupation holds 2 × ${sumDoubly} + ${sumSingly} = ${2 * sumDoubly + sumSingly} electrons, but the active space has ${electrons}.`, { data: { kind: 'occupation-electrons' } });
    return;
  }
  const plan = estimates.plan(fragment.index);
  if (plan && plan.active.alpha - plan.active.beta !== sumSingly) {
    sink.report('active-space-invalid', where, `The occupation has ${sumSingly} singly occupied orbital${sumSingly === 1 ? '' : 's'}, but the active space has ${plan.active.alpha - plan.active.beta} unpaired electrons (${plan.active.alpha}α / ${plan.active.beta}β).`, { data: { kind: 'occupation-spin' } });
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
  const activeCounts = new Map<number, number>();
  for (const entry of activeAst.irreps) {
    const irrep = findIrrep(symmetry.group, entry.label.value);
    if (irrep) activeCounts.set(irrep.mask, (activeCounts.get(irrep.mask) ?? 0) + entry.count.value);
  }
  checkOccupation(context, fragment, symmetry.group, activeCounts);
  const sum = activeAst.irreps.reduce((total, entry) => total + entry.count.value, 0);
  const given = activeAst.orbitals;
  const derived = given?.span.start === activeAst.irreps[0]!.span.start;
  if (given && !derived && given.value !== sum) {
    sink.report('active-space-invalid', given.span, `The active orbitals per irrep add up to ${sum}, not ${given.value}.`, { data: { kind: 'irrep-sum' } });
  }
}
