/** Resource limits: the qubits and statevector memory each quantum-tier fragment needs against `limits { qubits; memory }`. */
import { largestActiveSpaceWithin } from '../../chemistry/counting';
import { qubitsUnder, type Mapping } from '../../chemistry/qubits';
import { formatBytes } from '../../chemistry/units';
import type { CheckContext } from './context';

/** Spatial orbitals that fit a qubit budget: 2n qubits, or 2n − 2 under the reduced parity mapping. */
export function orbitalsWithinQubits(limit: number, mapping: Mapping): number {
  return mapping === 'parity' ? Math.floor((limit + 2) / 2) : Math.floor(limit / 2);
}

/** Bytes of a statevector of n qubits: 2^n double-precision complex amplitudes of 16 bytes each (common practice, no source). */
export function statevectorBytes(qubits: number): number {
  return 16 * 2 ** qubits;
}

export function checkLimits(context: CheckContext): void {
  const { ast, model, sink } = context;
  const limit = model.limits.qubits;
  const memory = model.limits.memoryBytes;
  if (limit === undefined && memory === undefined) return;
  for (const fragment of model.fragments) {
    const tier = fragment.tier;
    if (tier?.level !== 'quantum' || !tier.mapping || fragment.atoms.length === 0) continue;
    const needed = qubitsUnder(tier.mapping, fragment.space.active.orbitals);
    const where = fragment.ast.tier?.active?.span ?? fragment.ast.tier?.statement.keyword.span ?? fragment.ast.statement.keyword.span;
    const activeNote = tier.active ? `active space ${tier.active.electrons}e ${tier.active.orbitals}o` : `no active space given, so all ${fragment.space.active.orbitals} orbitals outside the frozen core are active`;
    if (memory !== undefined && statevectorBytes(needed) > memory) {
      const bytes = statevectorBytes(needed);
      const limitSpan = ast.limits?.memory?.span;
      sink.report(
        'memory-limit-exceeded',
        where,
        `Simulating fragment '${fragment.name}' as a statevector of ${needed} qubits under ${tier.mapping} (${activeNote}) needs ${formatBytes(bytes)} (2^${needed} amplitudes × 16 bytes), but the memory limit is ${formatBytes(memory)}.`,
        { data: { bytes, limit: memory }, ...(limitSpan ? { related: [{ span: limitSpan, message: 'memory limit' }] } : {}) },
      );
    }
    if (limit === undefined || needed <= limit) continue;
    const fitting = largestActiveSpaceWithin(fragment.space, orbitalsWithinQubits(limit, tier.mapping));
    const suggestion = fitting ? ` The largest active space that fits is \`active ${fitting.electrons}e ${fitting.orbitals}o\`.` : '';
    sink.report(
      'qubit-limit-exceeded',
      where,
      `Fragment '${fragment.name}' needs ${needed} qubits under ${tier.mapping} (${activeNote}), but the limit is ${limit}${model.limits.qubitsFromSpec ? "" : " (a default from the editor or command line; the spec sets none)"}.${suggestion}`,
      fitting ? { data: { active: fitting, needed, limit } } : { data: { needed, limit } },
    );
  }
}
