/** Resource limits: the qubits each quantum-tier fragment needs against `limits { qubits }`. */
import { largestActiveSpaceWithin } from '../../chemistry/counting';
import { qubitsUnder, type Mapping } from '../../chemistry/qubits';
import type { CheckContext } from './context';

/** Spatial orbitals that fit a qubit budget: 2n qubits, or 2n − 2 under the reduced parity mapping. */
export function orbitalsWithinQubits(limit: number, mapping: Mapping): number {
  return mapping === 'parity' ? Math.floor((limit + 2) / 2) : Math.floor(limit / 2);
}

export function checkLimits(context: CheckContext): void {
  const { model, sink } = context;
  const limit = model.limits.qubits;
  if (limit === undefined) return;
  for (const fragment of model.fragments) {
    const tier = fragment.tier;
    if (tier?.level !== 'quantum' || !tier.mapping || fragment.atoms.length === 0) continue;
    const needed = qubitsUnder(tier.mapping, fragment.space.active.orbitals);
    if (needed <= limit) continue;
    const fitting = largestActiveSpaceWithin(fragment.space, orbitalsWithinQubits(limit, tier.mapping));
    const where = fragment.ast.tier?.active?.span ?? fragment.ast.tier?.statement.keyword.span ?? fragment.ast.statement.keyword.span;
    const activeNote = tier.active ? `active space ${tier.active.electrons}e ${tier.active.orbitals}o` : `no active space given, so all ${fragment.space.active.orbitals} orbitals outside the frozen core are active`;
    const suggestion = fitting ? ` The largest active space that fits is \`active ${fitting.electrons}e ${fitting.orbitals}o\`.` : '';
    sink.report(
      'qubit-limit-exceeded',
      where,
      `Fragment '${fragment.name}' needs ${needed} qubits under ${tier.mapping} (${activeNote}), but the limit is ${limit}.${suggestion}`,
      fitting ? { data: { active: fitting, needed, limit } } : { data: { needed, limit } },
    );
  }
}
