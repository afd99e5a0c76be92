/**
 * Plans side by side: one summary per plan (a spec, or one of its variants) of what it costs and
 * what it was made from, the inputs that differ between the plans, and the best plan under the
 * limits. Every number comes from the plan's own DocumentAnalysis (its fragment figures), so the
 * comparison shows what the report of each plan shows.
 *
 * Totals over the fragments with a quantum tier: qubits needed (the largest, since fragments run one
 * after another), Pauli terms (Jordan–Wigner, summed), measurement groups, ansatz parameters and
 * CNOTs per Trotter step (summed). Classical memory: the largest of the fragments' statevector
 * (quantum tier), CI vector (fci, casci, casscf) or CCSD amplitudes at 8 bytes (ccsd, ccsd(t)).
 * Classical time: the SCF time estimate of every fragment with a tier (analysis/computeCost.ts,
 * fitted to this machine's benchmark), summed. Shots are not counted: they need the computed
 * Hamiltonian's coefficients, which counting does not give.
 *
 * Best plan: among plans without errors whose qubits and memory are within the limits of the plan,
 * the fewest CNOTs, then the fewest qubits, then the fewest Pauli terms (a rule of ours).
 */
import { computeCost } from '../computeCost';
import type { DocumentAnalysis } from '../document';
import { countValue } from './space';
import type { Count, FragmentFigures } from './types';

export interface PlanSummary {
  /** `spec` or `spec / variant`. */
  label: string;
  spec: string;
  variant: string | null;
  errors: number;
  qubits: number | null;
  pauliTerms: number | null;
  measurementGroups: number | null;
  /** Always null: shots need the computed Hamiltonian. */
  shots: null;
  parameters: number | null;
  cnots: number | null;
  /** log10 of the bytes of the largest classical object of any fragment. */
  memoryLog10Bytes: number | null;
  /** Estimated SCF seconds, summed over the fragments with a tier. */
  classicalSeconds: number | null;
  limits: { qubits: number | null; memoryBytes: number | null };
  withinLimits: boolean;
  /** What the plan is made of, by a stable key (`embedding`, `caps`, `fragment left: active`, …). */
  inputs: Record<string, string>;
  best: boolean;
}

export interface PlanComparison {
  plans: PlanSummary[];
  /** Input keys whose values are not the same in every plan. */
  differingInputs: string[];
  /** Index into `plans` of the best plan under the limits, or null when none qualifies. */
  best: number | null;
  rule: string;
}

export const BEST_PLAN_RULE = 'among plans without errors whose qubits and memory fit their limits: the fewest CNOTs per Trotter step, then the fewest qubits, then the fewest Pauli terms';

const CI_METHODS = new Set(['fci', 'casci', 'casscf']);

/** A sum of counts as a double (beyond 2^53 an approximation, like every plotted count). */
function sumOf(values: readonly (Count | null)[]): number | null {
  const known = values.filter((value): value is Count => value !== null).map(countValue);
  return known.length === 0 ? null : known.reduce((a, b) => a + b, 0);
}

function maxOf(values: readonly (number | null)[]): number | null {
  const known = values.filter((value): value is number => value !== null);
  return known.length === 0 ? null : Math.max(...known);
}

function memoryLog10(figures: FragmentFigures): number | null {
  const classical = figures.classical;
  if (!classical) return null;
  if (figures.tier === 'quantum') return classical.statevectorBytes?.log10 ?? null;
  if (figures.method && CI_METHODS.has(figures.method)) return classical.ciVectorBytes.log10;
  if (figures.method?.startsWith('ccsd')) return classical.ccsdAmplitudes.log10 + Math.log10(8);
  return null;
}

function inputsOf(analysis: DocumentAnalysis, figures: readonly FragmentFigures[]): Record<string, string> {
  const { model } = analysis;
  const inputs: Record<string, string> = {
    basis: model.basis.main?.displayName ?? '(none)',
    embedding: model.embedding,
  };
  model.fragments.forEach((fragment, index) => {
    const f = figures[index]!;
    const tier = fragment.tier;
    const key = (what: string) => `fragment ${fragment.name}: ${what}`;
    inputs[key('atoms')] = `${fragment.atoms.length} (${f.formula})`;
    inputs[key('caps')] = fragment.capRule ? `${fragment.caps.length} ${fragment.capRule}` : 'none';
    inputs[key('tier')] = tier ? `${tier.level} ${tier.method}` : 'none';
    if (tier?.level === 'quantum') {
      inputs[key('active')] = f.active ? `${f.active.electrons}e ${f.active.orbitals}o` : '–';
      inputs[key('mapping')] = tier.mapping ?? 'jordan-wigner';
      inputs[key('taper')] = tier.taper ? 'on' : 'off';
      inputs[key('ansatz')] = tier.ansatz ?? '(default)';
      inputs[key('layers')] = String(tier.layers);
    }
  });
  return inputs;
}

/** The summary of one plan. */
export function planSummary(analysis: DocumentAnalysis, spec: string, variant: string | null): PlanSummary {
  const { model } = analysis;
  const figures = model.fragments.map((_, index) => analysis.fragmentFigures(index));
  const quantum = figures.filter((f) => f.tier === 'quantum');
  const qubits = maxOf(quantum.map((f) => f.qubitsRequired));
  const memory = maxOf(figures.map(memoryLog10));
  const seconds = sumOf(figures.map((f) => (f.tier ? computeCost(f.basisFunctions[f.functions]).scfSeconds : null)));
  const limits = { qubits: model.limits.qubits ?? null, memoryBytes: model.limits.memoryBytes ?? null };
  const errors = analysis.counts().errors;
  const withinLimits =
    errors === 0 && (limits.qubits === null || (qubits ?? 0) <= limits.qubits) && (limits.memoryBytes === null || memory === null || memory <= Math.log10(limits.memoryBytes));
  return {
    label: variant === null ? spec : `${spec} / ${variant}`,
    spec,
    variant,
    errors,
    qubits,
    pauliTerms: sumOf(quantum.map((f) => f.pauliTerms?.jordanWigner ?? null)),
    measurementGroups: sumOf(quantum.map((f) => f.measurement?.groups ?? null)),
    shots: null,
    parameters: sumOf(quantum.map((f) => f.ansatzCost?.parameters ?? null)),
    cnots: sumOf(quantum.map((f) => f.circuit?.cnots ?? null)),
    memoryLog10Bytes: memory,
    classicalSeconds: seconds,
    limits,
    withinLimits,
    inputs: inputsOf(analysis, figures),
    best: false,
  };
}

/** The plans of a spec: itself, then each of its variants. */
export function specPlans(analysis: DocumentAnalysis, spec: string): PlanSummary[] {
  return [planSummary(analysis, spec, null), ...analysis.variants().map((variant) => planSummary(variant.analysis, spec, variant.name))];
}

const rank = (value: number | null) => value ?? Number.POSITIVE_INFINITY;

export function comparePlans(plans: PlanSummary[]): PlanComparison {
  const keys = [...new Set(plans.flatMap((plan) => Object.keys(plan.inputs)))];
  const differingInputs = keys.filter((key) => new Set(plans.map((plan) => plan.inputs[key] ?? '—')).size > 1);
  let best: number | null = null;
  plans.forEach((plan, index) => {
    if (!plan.withinLimits) return;
    if (best === null) {
      best = index;
      return;
    }
    const current = plans[best]!;
    const order = rank(plan.cnots) - rank(current.cnots) || rank(plan.qubits) - rank(current.qubits) || rank(plan.pauliTerms) - rank(current.pauliTerms);
    if (order < 0) best = index;
  });
  const marked = plans.map((plan, index) => ({ ...plan, best: index === best }));
  return { plans: marked, differingInputs, best, rule: BEST_PLAN_RULE };
}
