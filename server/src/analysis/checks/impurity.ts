/**
 * A given active space against the DMET impurity it is chosen from. Under DMET the solver sees
 * the impurity (fragment + bath, its electrons and spin from the system's determinant, dmet.ts),
 * not the fragment alone: the active space must fit the impurity's orbitals and electrons and
 * carry its nα − nβ (plan.ts, problemUnpaired). The language checks compare it with the fragment.
 */
import { impurityOf, problemUnpaired } from '../../chemistry/estimate/plan';
import type { EstimateCheckContext } from './context';

export function checkImpurityActiveSpaces(context: EstimateCheckContext): void {
  const { model, estimates, sink } = context;
  for (const fragment of model.fragments) {
    const active = fragment.tier?.active;
    const activeAst = fragment.ast.tier?.active;
    if (!active || !activeAst || fragment.tier?.level === 'mean-field' || !fragment.space.spin || fragment.atoms.length === 0) continue;
    const input = estimates.planInput(fragment.index);
    const impurity = input ? impurityOf(input) : undefined;
    if (!input || !impurity || estimates.plan(fragment.index)) continue;
    const unpaired = problemUnpaired(input, impurity);
    const { electrons, orbitals } = active;
    const reasons: string[] = [];
    if (electrons > impurity.electrons) reasons.push(`${electrons} electrons are more than its ${impurity.electrons}`);
    if (orbitals > impurity.orbitals) reasons.push(`${orbitals} orbitals are more than its ${impurity.orbitals}`);
    if (electrons < unpaired) reasons.push(`${electrons} electrons cannot hold its ${unpaired} unpaired ones`);
    else if ((electrons - unpaired) % 2 !== 0) reasons.push(`with ${unpaired} unpaired electron${unpaired === 1 ? '' : 's'} the active electrons must be ${unpaired % 2 === 0 ? 'even' : 'odd'}`);
    else if ((electrons + unpaired) / 2 > orbitals) reasons.push(`${(electrons + unpaired) / 2} α electrons do not fit in ${orbitals} orbitals`);
    if (reasons.length === 0) continue;
    sink.report(
      'active-space-invalid',
      activeAst.span,
      `The active space ${electrons}e ${orbitals}o of '${fragment.name}' does not fit its DMET impurity (${impurity.electrons}e ${impurity.orbitals}o, ${impurity.alpha}α / ${impurity.beta}β from the system's mean field): ${reasons.join('; ')}.`,
      { data: { kind: 'impurity' } },
    );
  }
}
