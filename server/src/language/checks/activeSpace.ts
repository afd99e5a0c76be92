/**
 * Active spaces against the fragment they are chosen from. The per-irrep counts need the
 * fragment's point group and are checked with the estimates (analysis/checks/activeIrreps.ts).
 */
import { checkActiveSpace } from '../../chemistry/counting';
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
  }
}
