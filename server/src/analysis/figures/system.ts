/** The system's figures: what every part has, with the system's point group and symmetry-reduced counts. */
import type { Estimates } from '../estimates';
import { exactCount, spaceFigures } from './space';
import { SYSTEM_QUBITS_SCOPE, type SystemFigures } from './types';

export function systemFigures(estimates: Estimates): SystemFigures {
  const model = estimates.model;
  const symmetry = model.atoms.length > 0 && model.system.atomsWithoutBasis === 0 ? estimates.systemSymmetry() : undefined;
  const base = spaceFigures(model.system, model.atoms.map((atom) => atom.element.symbol), symmetry);
  const counts = model.atoms.length > 0 ? estimates.systemCounts() : undefined;
  const near = symmetry?.symmetry.nearGroup;
  return {
    ...base,
    qubits: { ...base.qubits!, tapered: counts?.taperedQubits ?? null },
    pauliTerms: counts?.pauliTerms
      ? { jordanWigner: exactCount(counts.pauliTerms.exact.full), bravyiKitaev: exactCount(counts.pauliTerms.exact.full), parity: exactCount(counts.pauliTerms.exact.parity), identityIncluded: true, upperBound: counts.upperBound }
      : null,
    nearSymmetry: near ? { group: near.group, within: near.within } : null,
    qubitsScope: SYSTEM_QUBITS_SCOPE,
  };
}
