/** Active spaces against the fragment (or system) they are chosen from. */
import { checkActiveSpace } from '../../chemistry/counting';
import type { CheckContext } from './context';

export function checkActiveSpaces(context: CheckContext): void {
  const { model, sink } = context;
  for (const fragment of model.fragments) {
    const active = fragment.tier?.active;
    const activeAst = fragment.ast.tier?.active;
    if (!active || !activeAst || fragment.tier?.level === 'mean-field') continue;
    const space = fragment.space;
    // Counts are not trustworthy while the spin or the basis is wrong; those errors come first.
    if (!space.spin || space.atomsWithoutBasis > 0 || fragment.atoms.length === 0) continue;
    for (const problem of checkActiveSpace(space, active)) {
      sink.report('active-space-invalid', activeAst.span, `Active space of '${fragment.name}': ${problem.message}`, { data: { kind: problem.kind } });
    }
  }
}
