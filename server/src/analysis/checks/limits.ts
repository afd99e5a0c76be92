/**
 * Resource limits: the qubits each quantum-tier fragment's solver needs (its active space inside
 * the DMET impurity or its own orbitals, under its mapping, tapered when `taper on`) against
 * `limits { qubits }`, and the memory of a statevector simulation against `limits { memory }`.
 */
import { compareWithMemoryLimit } from '../../chemistry/cost/classical';
import { formatBytes } from '../../chemistry/cost/format';
import { fitActiveSpace, qubitsFor } from '../../chemistry/estimate/plan';
import { magnitudeOfNumber } from '../../chemistry/cost/magnitude';
import type { EstimateCheckContext } from './context';

export function checkLimits(context: EstimateCheckContext): void {
  const { ast, model, sink, estimates } = context;
  const limit = model.limits.qubits;
  const memory = model.limits.memoryBytes;
  if (limit === undefined && memory === undefined) return;
  for (const fragment of model.fragments) {
    const tier = fragment.tier;
    if (tier?.level !== 'quantum' || !tier.mapping || fragment.atoms.length === 0) continue;
    const plan = estimates.plan(fragment.index);
    const input = estimates.planInput(fragment.index);
    const quantum = plan?.quantum;
    if (!plan || !quantum || !input || quantum.qubits.required === null) continue;
    const needed = quantum.qubits.required;
    const where = fragment.ast.tier?.active?.span ?? fragment.ast.tier?.statement.keyword.span ?? fragment.ast.statement.keyword.span;
    const sizeNote = tier.active
      ? `active space ${tier.active.electrons}e ${tier.active.orbitals}o`
      : `no active space given, so all ${plan.active.orbitals} orbitals of its ${plan.problem.embedding === 'dmet' ? 'DMET impurity' : 'own space'} outside the frozen core are active`;
    const how = `${tier.mapping}${tier.taper ? ', tapered' : ''}`;

    const statevector = quantum.statevectorBytes;
    if (memory !== undefined && statevector && !compareWithMemoryLimit(statevector, memory).fits) {
      const limitSpan = ast.limits?.memory?.span;
      sink.report(
        'memory-limit-exceeded',
        where,
        `Simulating fragment '${fragment.name}' as a statevector of ${needed} qubits (${how}; ${sizeNote}) needs ${formatBytes(statevector)} (2^${needed} amplitudes × 16 bytes), but the memory limit is ${formatBytes(magnitudeOfNumber(Math.round(memory)))}.`,
        { data: { qubits: needed, limit: memory }, ...(limitSpan ? { related: [{ span: limitSpan, message: 'memory limit' }] } : {}) },
      );
    }
    if (limit === undefined || needed <= limit) continue;

    const ideas: string[] = [];
    if (!tier.taper && quantum.qubits.tapered <= limit) ideas.push(`\`taper on\` brings it to ${quantum.qubits.tapered} qubits`);
    if (tier.mapping !== 'parity') {
      const parity = qubitsFor({ ...input, mapping: 'parity' }, plan.active.orbitals, plan.active.alpha, plan.active.beta);
      if (parity !== null && parity <= limit) ideas.push(`\`mapping parity\` needs ${parity}`);
    }
    const fitting = fitActiveSpace(input, limit);
    if (fitting) ideas.push(`the largest active space that fits is \`active ${fitting.electrons}e ${fitting.orbitals}o\` (${fitting.qubits} qubits)`);
    const fromDefault = model.limits.qubitsFromSpec ? '' : ' (a default from the editor or command line; the spec sets none)';
    sink.report(
      'qubit-limit-exceeded',
      where,
      `Fragment '${fragment.name}' needs ${needed} qubits (${how}; ${sizeNote}), but the limit is ${limit}${fromDefault}.${ideas.length > 0 ? ` To fit: ${ideas.join('; or ')}.` : ''}`,
      { data: { needed, limit, ...(fitting ? { active: { electrons: fitting.electrons, orbitals: fitting.orbitals } } : {}) } },
    );
  }
}
