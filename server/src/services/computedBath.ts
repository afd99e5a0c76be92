/**
 * The hover section of a fragment's computed DMET bath (spec with `embedding dmet`): where its
 * computation stands (it waits for the system's mean field), or the singular values, the bath
 * computed beside the bath counted by the planning rule, and the impurity's electrons.
 */
import { DMET_BATH_KIND, MEAN_FIELD_KIND, type DmetBathSummary, type DocumentAnalysis, type MeanFieldOutcome } from '../analysis';
import { electronsText, orbitalsText, perSpin, singularValuesText } from '../report/format/dmetBath';

export const BATH_HOVER_NOTE =
  "Computed from the system's mean field (all electrons; Knizia & Chan 2012, Wouters et al. 2016): a result, not a planning estimate. Counted: the planning rule min(L, M − L, Nσ, M − Nσ) on the same orbitals, an upper bound reached when no fragment orbital is exactly occupied or empty.";

function readySection(summary: DmetBathSummary): string {
  const s = summary;
  const rows = [
    `| bath orbitals | ${perSpin(s.alpha.bathOrbitals, s.beta.bathOrbitals)} | ${perSpin(s.alpha.countedBathOrbitals, s.beta.countedBathOrbitals)} |`,
    `| impurity orbitals | ${s.impurityOrbitals} (${s.fragmentOrbitals} fragment + bath) | ${s.fragmentOrbitals + Math.max(s.alpha.countedBathOrbitals, s.beta.countedBathOrbitals)} |`,
    `| impurity electrons | ${electronsText(s.impurityElectrons)} (${perSpin(s.alpha.bathOrbitals + s.alpha.occupiedFragmentOrbitals, s.beta.bathOrbitals + s.beta.occupiedFragmentOrbitals)} per spin by the rule bath + fully occupied fragment orbitals) | ${s.alpha.countedImpurityElectrons + s.beta.countedImpurityElectrons} |`,
    `| core electrons (environment) | ${electronsText(s.coreElectrons)} | |`,
  ];
  const values = s.restricted
    ? [`Singular values σ: ${singularValuesText(s.alpha.singularValues, s.threshold)}.`]
    : [`Singular values σ (α): ${singularValuesText(s.alpha.singularValues, s.threshold)}.`, '', `Singular values σ (β): ${singularValuesText(s.beta.singularValues, s.threshold)}.`];
  return [
    `**DMET bath (computed)** · from the system's ${s.reference.toUpperCase()} mean field · ${s.systemOrbitals} orbitals · fragment in ${orbitalsText(s)} · bath where σ > ${s.threshold.toExponential(0)}`,
    '',
    '| | computed | counted |',
    '| --- | --- | --- |',
    ...rows,
    '',
    ...values,
    '',
    "The DMET impurity in the planning figures above is counted, outside the frozen core when frozen core is on.",
    '',
    `_${BATH_HOVER_NOTE}_`,
  ].join('\n');
}

/** The section, or null when the spec does not use DMET. */
export function bathSection(analysis: DocumentAnalysis, fragmentIndex: number): string | null {
  if (analysis.model.embedding !== 'dmet') return null;
  const computation = analysis.computation({ kind: 'fragment', index: fragmentIndex });
  const system = analysis.computation({ kind: 'system' });
  if (system.refusal) return `**DMET bath** · cannot be computed: the system's mean field cannot be computed (${system.refusal}).`;
  if (!computation.bath || !computation.bathKey) return null;
  const meanField = analysis.late.get<MeanFieldOutcome>(MEAN_FIELD_KIND, system.meanFieldKey!);
  const bath = analysis.late.get<DmetBathSummary>(DMET_BATH_KIND, computation.bathKey);
  switch (bath.state) {
    case 'ready':
      return readySection(bath.value);
    case 'failed':
      return `**DMET bath** · not computed: ${bath.message}`;
    case 'pending':
      return `**DMET bath** · computing: ${bath.detail ?? 'queued'}. The bath above is counted until it arrives.`;
    case 'absent':
      if (meanField.state === 'ready' && !meanField.value.result.converged) return "**DMET bath** · not computed: the system's mean field did not converge.";
      return "**DMET bath** · computed once the system's mean field is (the system's code lens computes it); the bath above is counted.";
  }
}
