/**
 * Near symmetry: a geometry that misses a higher point group by a small distance (typing or
 * rounding, usually) is reported with the group and the distance, so that it can be symmetrized.
 * Only for geometries up to SYMMETRY_ATOM_LIMIT atoms, the limit the figures use as well.
 */
import type { EstimateCheckContext } from './context';

export function checkNearSymmetry(context: EstimateCheckContext): void {
  const { ast, model, sink, estimates } = context;
  if (!ast.geometry || model.atoms.length < 2) return;
  if (model.atoms.some((atom) => atom.element.weight === null)) return;
  const figures = estimates.systemSymmetry();
  const near = figures?.symmetry.nearGroup;
  if (!figures || !near) return;
  sink.report(
    'near-symmetry',
    ast.geometry.statement.keyword.span,
    `The geometry is ${near.group} within ${near.within.toFixed(3)} Å, but ${figures.symmetry.fullGroup} at the ${figures.symmetry.tolerance} Å tolerance: symmetrize it if the higher symmetry is meant (the estimates use ${figures.group}).`,
    { data: { group: near.group, within: near.within } },
  );
}
