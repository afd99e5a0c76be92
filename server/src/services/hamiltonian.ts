/**
 * What the editor shows of a quantum fragment's computed active-space Hamiltonian: the hover
 * section (strings, λ, constant, groups and the largest coefficients, computed; shots, the VQE run
 * and the phase-estimation cost at the fragment's target accuracy, estimates built on them), and
 * the computed figures the fragment card puts in place of the counted ones. Reads the document's
 * analysis (the request it describes and the late results); computes nothing.
 */
import { HAMILTONIAN_KIND, hamiltonianFigures, type DocumentAnalysis, type HamiltonianOutcome, type PartRef } from '../analysis';
import type { ActiveSpaceFigures } from '../electronic/measurement/figures';
import { vqeRun } from '../electronic/measurement/shots';
import { hartree } from '../jobs/progressText';

export type HamiltonianState =
  | { readonly kind: 'none' }
  | { readonly kind: 'bound'; readonly note: string }
  | { readonly kind: 'pending'; readonly detail: string }
  | { readonly kind: 'failed'; readonly message: string }
  | { readonly kind: 'ready'; readonly outcome: HamiltonianOutcome; readonly figures: ActiveSpaceFigures | null; readonly epsilon: number };

/** The target accuracy of a fragment (its tier's, else the spec's; hartree). */
export function fragmentAccuracy(analysis: DocumentAnalysis, index: number): number {
  return analysis.model.fragments[index]?.tier?.accuracy ?? analysis.model.accuracy;
}

export function hamiltonianState(analysis: DocumentAnalysis, part: PartRef): HamiltonianState {
  if (part.kind !== 'fragment') return { kind: 'none' };
  const computation = analysis.computation(part);
  if (computation.hamiltonianNote) return { kind: 'bound', note: computation.hamiltonianNote };
  if (!computation.hamiltonianKey) return { kind: 'none' };
  const result = analysis.late.get<HamiltonianOutcome>(HAMILTONIAN_KIND, computation.hamiltonianKey);
  switch (result.state) {
    case 'absent':
      return { kind: 'none' };
    case 'pending':
      return { kind: 'pending', detail: result.detail ?? 'queued' };
    case 'failed':
      return { kind: 'failed', message: result.message };
    case 'ready': {
      const epsilon = fragmentAccuracy(analysis, part.index);
      const figures = hamiltonianFigures(result.value, epsilon);
      return { kind: 'ready', outcome: result.value, figures: figures.status === 'computed' ? figures : null, epsilon };
    }
  }
}

function count(value: number): string {
  return value.toLocaleString('en-US');
}

function seconds(value: number): string {
  if (value < 120) return `${value.toPrecision(3)} s`;
  if (value < 7200) return `${(value / 60).toPrecision(3)} min`;
  if (value < 172800) return `${(value / 3600).toPrecision(3)} h`;
  return `${(value / 86400).toPrecision(3)} days`;
}

/** Which orbitals the Hamiltonian is in: canonical ones by number, or the kind a selection chose. */
function orbitalsText(outcome: HamiltonianOutcome): string {
  const reference = outcome.reference.toUpperCase();
  if (outcome.orbitalKind === 'natural') return `MP2 natural orbitals of the ${reference} mean field`;
  if (outcome.orbitalKind === 'projected') return `${reference} orbitals projected onto the named shells`;
  const sorted = [...outcome.active].sort((a, b) => a - b);
  const contiguous = sorted.every((p, k) => k === 0 || p === sorted[k - 1]! + 1);
  return `${reference} orbitals ${contiguous ? `${sorted[0]! + 1}–${sorted[sorted.length - 1]! + 1}` : sorted.map((p) => p + 1).join(', ')}`;
}

/** The hover section of a fragment's Hamiltonian, or '' when it has none and none is coming. */
export function hamiltonianSection(analysis: DocumentAnalysis, part: PartRef): string {
  const state = hamiltonianState(analysis, part);
  switch (state.kind) {
    case 'none':
      return '';
    case 'bound':
      return `**Hamiltonian** · counted, not computed: ${state.note}.`;
    case 'pending':
      return `**Hamiltonian** · computing: ${state.detail}. The Pauli terms above are counted (the combinatorial bound) until it arrives.`;
    case 'failed':
      return `**Hamiltonian** · not computed: ${state.message}`;
    case 'ready':
      break;
  }
  const { outcome, figures, epsilon } = state;
  const space = `${outcome.integrals.electrons.alpha + outcome.integrals.electrons.beta}e ${outcome.integrals.orbitals}o`;
  if (!figures) return `**Hamiltonian** · ${space}: ${outcome.figures.status === 'too-large' ? outcome.figures.note : 'too large to build'}.`;
  const jw = figures.mappings.jordanWigner;
  const rows = [
    `| Pauli strings | **${count(jw.terms)}** JW · ${count(figures.mappings.bravyiKitaev.terms)} BK · ${count(figures.mappings.parity.terms)} parity (computed, \\|c\\| > ${figures.threshold} Ha, identity included) |`,
    `| λ | ${jw.oneNorm.toFixed(4)} Ha (computed) |`,
    `| constant | ${hartree(figures.constant)} (identity: nuclear repulsion + frozen core ${hartree(outcome.integrals.constant)} + scalar terms) |`,
    `| QWC groups | ${count(jw.groups)} JW (computed from the strings, sorted insertion) |`,
    `| largest | ${jw.largest.slice(0, 3).map((term) => `${term.label} ${term.coefficient.toFixed(4)}`).join(' · ')} |`,
    `| shots per energy | ≤ ${count(jw.shots.separateBound)} ((λ/ε)², any state) · ≈ ${count(jw.shots.groupedEstimate)} (QWC groups, reference-state variances) at ε = ${(epsilon * 1000).toPrecision(3)} mHa (estimates) |`,
  ];
  const fragment = analysis.model.fragments[part.kind === 'fragment' ? part.index : -1];
  const tier = fragment?.tier;
  if (tier?.method === 'vqe') {
    const parameters = analysis.fragmentPlan(fragment!.index)?.quantum?.ansatz?.parameters;
    if (parameters !== undefined) {
      const shotRate = analysis.model.limits.shotRate;
      const run = vqeRun({ parameters, steps: tier.steps, scanPoints: analysis.model.scan?.values.length ?? 1, shotsPerEvaluation: jw.shots.groupedEstimate, ...(shotRate ? { shotRate } : {}) });
      rows.push(
        `| VQE run | ${run.evaluationsPerStep} evaluations per step × ${tier.steps} steps${tier.stepsGiven ? '' : ' (default, an assumption)'} × ${analysis.model.scan?.values.length ?? 1} scan points ≈ ${run.shots.toExponential(2)} shots${run.seconds !== undefined ? `, ${seconds(run.seconds)} at ${count(shotRate!)} shots/s` : ' (a `shot-rate` in `limits` gives the time)'} (estimate) |`,
      );
    }
  }
  const ft = figures.faultTolerant;
  rows.push(`| phase estimation | ${count(ft.logicalQubits)} logical qubits (${jw.qubits} system + ${ft.ancillaQubits} ancillas) · ${ft.toffolis.toExponential(2)} Toffolis (${count(ft.walkSteps)} walk steps) — an estimate: ${ft.formula}; ${ft.references.join('; ')} |`);
  return [
    `**Hamiltonian (computed)** · ${space} on ${orbitalsText(outcome)}`,
    '',
    '| | |',
    '| --- | --- |',
    ...rows,
    '',
    `_${outcome.source}. Strings, λ, constant and groups are computed from the part's own mean field (no embedding); shots and costs are estimates built on them._`,
  ].join('\n');
}

/** The computed string count of a fragment, for the card's Pauli-terms row; null until there is one. */
export function computedPauliTerms(analysis: DocumentAnalysis, index: number): { jordanWigner: number; groups: number } | null {
  const state = hamiltonianState(analysis, { kind: 'fragment', index });
  if (state.kind !== 'ready' || !state.figures) return null;
  return { jordanWigner: state.figures.mappings.jordanWigner.terms, groups: state.figures.mappings.jordanWigner.groups };
}
