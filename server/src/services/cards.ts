/**
 * Markdown cards of the resource figures, shared by hover and the report command. Every figure
 * comes from the estimate report (report/estimate.ts), with the convention behind it.
 */
import type { Analysis } from '../language/analyze';
import { buildEstimateReport, PLANNING_NOTE, type EstimateReport, type FragmentFigures, type SpaceFigures } from '../report/estimate';

const reports = new WeakMap<Analysis, EstimateReport>();

/** The estimate report of an analysis, built once. */
export function estimateOf(analysis: Analysis): EstimateReport {
  let report = reports.get(analysis);
  if (!report) {
    report = buildEstimateReport(analysis);
    reports.set(analysis, report);
  }
  return report;
}

function signed(value: number): string {
  return value > 0 ? `+${value}` : String(value);
}

function spinText(figures: SpaceFigures): string {
  return figures.alpha === null ? 'charge and multiplicity do not fit' : `α ${figures.alpha} / β ${figures.beta}`;
}

export function spaceRows(figures: SpaceFigures): string[] {
  const missing = figures.atomsWithoutBasis > 0 ? ` (${figures.atomsWithoutBasis} atom${figures.atomsWithoutBasis === 1 ? '' : 's'} without basis functions not counted)` : '';
  return [
    `| atoms | ${figures.atoms} · ${figures.formula || '–'} |`,
    `| electrons | ${figures.electrons} (${spinText(figures)}) · charge ${signed(figures.charge)}, multiplicity ${figures.multiplicity}${figures.ecpCoreElectrons > 0 ? ` · ${figures.ecpCoreElectrons} in ECP cores` : ''} |`,
    `| basis functions | ${figures.basisFunctions.spherical} spherical · ${figures.basisFunctions.cartesian} cartesian${missing} |`,
    `| orbitals | ${figures.orbitals} (${figures.functions}): ${figures.frozenCore.orbitals} frozen-core, ${figures.occupied ?? '–'} occupied, ${figures.virtual ?? '–'} virtual |`,
    `| active space | ${figures.active.electrons}e ${figures.active.orbitals}o (${figures.active.source === 'given' ? 'as given' : figures.active.source === 'outside-frozen-core' ? 'all orbitals outside the frozen core' : 'all orbitals'}) |`,
    `| qubits | Jordan–Wigner ${figures.qubits.jordanWigner} · Bravyi–Kitaev ${figures.qubits.bravyiKitaev} · parity ${figures.qubits.parity} |`,
  ];
}

function fragmentHeadline(fragment: FragmentFigures): string {
  const parts = [fragment.tier ?? 'no tier'];
  if (fragment.method) parts.push([fragment.method, fragment.ansatz, fragment.mapping].filter(Boolean).join(' / '));
  return `**fragment ${fragment.name}** · ${parts.join(' · ')}`;
}

export function fragmentCard(analysis: Analysis, index: number): string {
  const report = estimateOf(analysis);
  const fragment = report.fragments[index]!;
  const needed = fragment.qubitsRequired !== null ? [`| qubits needed | **${fragment.qubitsRequired}** under ${fragment.mapping}${report.limits.qubits !== null ? ` (limit ${report.limits.qubits})` : ''} |`] : [];
  return [
    fragmentHeadline(fragment),
    '',
    '| | |',
    '| --- | --- |',
    ...spaceRows(fragment),
    ...needed,
    '',
    `_Conventions: electrons = ${report.conventions.electrons}; fragment charge = ${report.conventions.fragmentCharge}; frozen core = ${report.conventions.frozenCore}; qubits: ${report.conventions.qubits}._`,
    '',
    `_${PLANNING_NOTE}_`,
  ].join('\n');
}
