/**
 * Markdown cards of the resource figures, shared by hover and the report command. Every figure
 * comes from the document's analysis (analysis/figures), with the convention behind it; a card
 * asks for its own fragment's figures only.
 */
import { markdownText } from '../report/format/escape';
import { CONVENTIONS, countText, PLANNING_NOTE, type CapFigures, type DocumentAnalysis, type FragmentFigures, type SpaceFigures } from '../analysis';
import { CAP_RULE_TEXT, type CapRule } from '../chemistry/capping';

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
  return `**fragment ${markdownText(fragment.name)}** · ${parts.join(' · ')}`;
}

function irrepText(record: Record<string, number>): string {
  return Object.entries(record)
    .map(([label, count]) => `${count} ${label}`)
    .join(', ');
}

function groupText(group: { pointGroup: string; fullPointGroup: string }): string {
  return group.fullPointGroup !== group.pointGroup ? `${group.fullPointGroup} (counted in ${group.pointGroup})` : group.pointGroup;
}

/** Both point groups of a fragment, the one its figures are counted in first. */
function pointGroupRow(fragment: FragmentFigures): string | undefined {
  const symmetry = fragment.symmetry;
  if (!symmetry) return undefined;
  const own = symmetry.own ? groupText(symmetry.own) : 'not looked for (over the size limit)';
  if (symmetry.countedIn === 'in-system' && symmetry.inSystem) {
    return `| point group | **${groupText(symmetry.inSystem)}** inside the system (counted); ${own} alone |`;
  }
  return `| point group | **${own}**, the fragment alone (counted) |`;
}

/** Rows of the cost figures a plan estimate adds (quantum and correlated tiers). */
function planRows(fragment: FragmentFigures, limit: number | null): string[] {
  const rows: string[] = [];
  const symmetryRow = pointGroupRow(fragment);
  if (symmetryRow) rows.push(symmetryRow);
  if (fragment.problem) {
    const bath = fragment.problem.bath.alpha === fragment.problem.bath.beta ? `${fragment.problem.bath.alpha}` : `${fragment.problem.bath.alpha} α / ${fragment.problem.bath.beta} β`;
    rows.push(
      fragment.problem.embedding === 'dmet'
        ? `| DMET impurity | ${fragment.problem.electrons}e ${fragment.problem.orbitals}o (fragment + ${bath} bath orbitals) |`
        : `| solver's problem | ${fragment.problem.electrons}e ${fragment.problem.orbitals}o (${fragment.problem.embedding === 'none' ? 'the fragment\'s own orbitals' : `${fragment.problem.embedding} embedding`}) |`,
    );
  }
  if (fragment.activeIrreps) rows.push(`| active irreps | ${irrepText(fragment.activeIrreps.perIrrep)} (${fragment.activeIrreps.source === 'given' ? 'as given' : 'assumed in proportion to the orbitals of each irrep'}) |`);
  if (fragment.qubits.tapered !== null) rows.push(`| tapered | ${fragment.qubits.tapered} qubits (removed: ${fragment.taperingSymmetries.join(', ') || 'none'}) |`);
  if (fragment.qubitsRequired !== null) rows.push(`| qubits needed | **${fragment.qubitsRequired}** under ${fragment.mapping}${fragment.qubitsRequired === fragment.qubits.tapered && fragment.qubits.tapered !== null ? ', tapered' : ''}${limit !== null ? ` (limit ${limit})` : ''} |`);
  if (fragment.pauliTerms) rows.push(`| Pauli terms | ${fragment.pauliTerms.upperBound ? '≤ ' : ''}${countText(fragment.pauliTerms.jordanWigner)} (identity included) |`);
  if (fragment.measurement && fragment.tier === 'quantum') {
    const groups = countText(fragment.measurement.groups);
    rows.push(`| measurement | ${fragment.measurement.exact || groups.startsWith('≈') ? '' : '≈ '}${groups} qubit-wise commuting groups |`);
  }
  if (fragment.ansatzCost) {
    const unscreened = fragment.ansatzCost.unscreened !== null && countText(fragment.ansatzCost.unscreened) !== countText(fragment.ansatzCost.parameters) ? ` (${countText(fragment.ansatzCost.unscreened)} without point-group screening)` : '';
    rows.push(`| ansatz | ${fragment.ansatzCost.kind}: ${countText(fragment.ansatzCost.parameters)} parameters${unscreened} |`);
  }
  if (fragment.circuit) rows.push(`| circuit | ${countText(fragment.circuit.cnots)} CNOTs per Trotter step${fragment.circuit.compactCnots !== null ? `, ${countText(fragment.circuit.compactCnots)} with compact excitation circuits` : ''}${fragment.circuit.depth !== null ? `; depth ≤ ${countText(fragment.circuit.depth)}` : ''} |`);
  if (fragment.classical) {
    rows.push(`| full CI | ${fragment.classical.determinants.text} determinants (${fragment.classical.ciVectorBytes.text}) · CCSD ${fragment.classical.ccsdAmplitudes.text} amplitudes |`);
    if (fragment.classical.statevectorBytes) rows.push(`| statevector | ${fragment.classical.statevectorBytes.text} |`);
  }
  return rows;
}

/** Caps shown one by one up to this many; beyond, counted. */
const LISTED_CAPS = 6;

/** The caps row: how many, by which rule, and on which bonds (kept atom → partner, X–H length). */
function capsRows(analysis: DocumentAnalysis, caps: CapFigures | null): string[] {
  if (!caps) return [];
  if (caps.count === 0) return [`| caps | none needed: the boundary cuts no bond of this fragment (rule ${caps.rule}) |`];
  const name = (number: number) => {
    const atom = analysis.model.atoms[number - 1];
    return atom?.label ? `${markdownText(atom.label)} (#${number})` : `#${number} ${atom?.element.symbol ?? ''}`.trim();
  };
  const listed = caps.list.slice(0, LISTED_CAPS).map((cap) => `${cap.element} on ${name(cap.host)} toward ${name(cap.partner)}, ${cap.length.toFixed(3)} Å`);
  const more = caps.count > LISTED_CAPS ? `; and ${caps.count - LISTED_CAPS} more` : '';
  return [`| caps | ${caps.count} hydrogen link atom${caps.count === 1 ? '' : 's'} (${caps.rule}, counted in every figure): ${listed.join('; ')}${more} |`];
}

export function fragmentCard(analysis: DocumentAnalysis, index: number): string {
  const fragment = analysis.fragmentFigures(index);
  const conventions = [`electrons = ${CONVENTIONS.electrons}`, `fragment charge = ${CONVENTIONS.fragmentCharge}`, `frozen core = ${CONVENTIONS.frozenCore}`];
  if (fragment.caps) conventions.push(`caps: ${CAP_RULE_TEXT[fragment.caps.rule as CapRule] ?? fragment.caps.rule}`);
  if (fragment.problem) conventions.push(fragment.problem.convention);
  if (fragment.symmetry) conventions.push(`point group: ${fragment.symmetry.reason}`);
  if (fragment.pauliTerms) conventions.push(`Pauli terms: ${CONVENTIONS.pauliTerms}`);
  if (fragment.qubits.tapered !== null) conventions.push(`qubits: ${CONVENTIONS.qubits}`);
  return [
    fragmentHeadline(fragment),
    '',
    '| | |',
    '| --- | --- |',
    ...spaceRows(fragment),
    ...capsRows(analysis, fragment.caps),
    ...planRows(fragment, analysis.model.limits.qubits ?? null),
    ...fragment.notes.map((note) => `| note | ${note} |`),
    '',
    `_Conventions: ${conventions.join('; ')}._`,
    '',
    `_${PLANNING_NOTE}_`,
  ].join('\n');
}
