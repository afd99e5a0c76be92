/**
 * Near symmetry: a geometry that misses a higher point group by a small distance (typing or
 * rounding, usually) is reported with the group and the distance, so that it can be symmetrized.
 * Only for geometries up to SYMMETRY_CHECK_ATOM_LIMIT atoms, to keep checking fast on clusters.
 */
import { estimatesOf, SYMMETRY_CHECK_ATOM_LIMIT } from '../estimates';
import type { CheckContext } from './context';

export function checkSymmetry(context: CheckContext): void {
  const { ast, model, sink } = context;
  if (!ast.geometry || model.atoms.length < 2 || model.atoms.length > SYMMETRY_CHECK_ATOM_LIMIT) return;
  if (model.atoms.some((atom) => atom.element.weight === null)) return;
  const figures = estimatesOf(model).systemSymmetry();
  const near = figures?.symmetry.nearGroup;
  if (!figures || !near) return;
  sink.report(
    'near-symmetry',
    ast.geometry.statement.keyword.span,
    `The geometry is ${near.group} within ${near.within.toFixed(3)} Å, but ${figures.symmetry.fullGroup} at the ${figures.symmetry.tolerance} Å tolerance: symmetrize it if the higher symmetry is meant (the estimates use ${figures.group}).`,
    { data: { group: near.group, within: near.within } },
  );
}
