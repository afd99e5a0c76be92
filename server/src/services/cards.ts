/**
 * Markdown cards of the resource figures, shared by hover and the report command. Every figure
 * comes from the document's analysis (analysis/figures), with the convention behind it; a card
 * asks for its own fragment's figures only.
 */
import { computedPauliTerms } from './hamiltonian';
import { formatRate } from '../chemistry/cost/format';
import { markdownText } from '../report/format/escape';
import { CONVENTIONS, countText, PLANNING_NOTE, type CapFigures, type DocumentAnalysis, type FragmentFigures, type SolverCostFigures, type SpaceFigures } from '../analysis';
import { CAP_RULE_TEXT, type CapRule } from '../chemistry/capping';

function signed(value: number): string {
  return value > 0 ? `+${value}` : String(value);
}

function spinText(figures: SpaceFigures): string {
  return figures.alpha === null ? 'charge and multiplicity do not fit' : `α ${figures.alpha} / β ${figures.beta}`;
}

/** The rows every part has: atoms, electrons, basis functions, orbitals. */
export function spaceRows(figures: SpaceFigures): string[] {
  const missing = figures.atomsWithoutBasis > 0 ? ` (${figures.atomsWithoutBasis} atom${figures.atomsWithoutBasis === 1 ? '' : 's'} without basis functions not counted)` : '';
  return [
    `| atoms | ${figures.atoms} · ${figures.formula || '–'} |`,
    `| electrons | ${figures.electrons} (${spinText(figures)}) · charge ${signed(figures.charge)}, multiplicity ${figures.multiplicity}${figures.ecpCoreElectrons > 0 ? ` · ${figures.ecpCoreElectrons} in ECP cores` : ''} |`,
    `| basis functions | ${figures.basisFunctions.spherical} spherical · ${figures.basisFunctions.cartesian} cartesian${missing} |`,
    `| orbitals | ${figures.orbitals} (${figures.functions}): ${figures.frozenCore.orbitals} frozen-core, ${figures.occupied ?? '–'} occupied, ${figures.virtual ?? '–'} virtual |`,
  ];
}

function activeRow(figures: SpaceFigures): string[] {
  const active = figures.active;
  if (!active) return [];
  const source =
    active.source === 'given'
      ? 'as given'
      : active.source === 'computed'
        ? 'as computed from the mean field'
        : active.source.startsWith('estimated-')
          ? 'counted until the suggested orbitals are computed (a planning estimate)'
          : active.source === 'dmet-impurity'
            ? 'the whole DMET impurity'
            : active.source === 'outside-frozen-core'
              ? 'all orbitals outside the frozen core'
              : 'all orbitals';
  return [`| active space | ${active.electrons}e ${active.orbitals}o${active.alpha !== null ? ` (α ${active.alpha} / β ${active.beta})` : ''}, ${source} |`];
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

function problemRow(fragment: FragmentFigures): string[] {
  const problem = fragment.problem;
  if (!problem) return [];
  if (problem.embedding === 'dmet') {
    const bath = problem.bath.alpha === problem.bath.beta ? `${problem.bath.alpha}` : `${problem.bath.alpha} α / ${problem.bath.beta} β`;
    return [`| DMET impurity | ${problem.electrons}e ${problem.orbitals}o (α ${problem.alpha} / β ${problem.beta}; fragment + ${bath} bath orbitals) |`];
  }
  return [`| solver's problem | ${problem.electrons}e ${problem.orbitals}o (${problem.embedding === 'none' ? "the fragment's own orbitals" : `${problem.embedding} embedding`}) |`];
}

/** Which orbitals a figure read: `irreps computed` or `irreps counted`. */
function sourceText(fragment: FragmentFigures, key: string): string {
  const source = fragment.orbitalSources?.figures[key];
  return source === 'computed' ? 'irreps computed' : 'irreps counted';
}

function activeIrrepsRow(fragment: FragmentFigures): string {
  const irreps = fragment.activeIrreps!;
  if (irreps.source === 'computed') {
    const from = fragment.orbitalSources?.computedFrom ?? 'the computed active orbitals';
    return `| active irreps | ${irrepText(irreps.perIrrep)} (**computed**: ${from}); reference occupation ${irreps.occupation === 'computed' ? 'computed' : 'assumed'} |`;
  }
  const reference = irreps.occupation === 'given' ? 'reference occupation as given' : 'reference occupation assumed (the orbitals of each irrep spread evenly, the lowest filled; give `occupied A1=2 …` to set it)';
  return `| active irreps | ${irrepText(irreps.perIrrep)} (counted: ${irreps.source === 'given' ? 'as given' : 'assumed in proportion to the orbitals of each irrep'}); ${reference} |`;
}

/** A quantum tier's register first: what decides whether it runs. */
function quantumRows(fragment: FragmentFigures, limit: number | null, computed: { jordanWigner: number; groups: number } | null): string[] {
  const rows: string[] = [];
  const qubits = fragment.qubits;
  if (fragment.qubitsRequired !== null) {
    const tapered = qubits !== null && fragment.qubitsRequired === qubits.tapered && qubits.tapered !== null;
    rows.push(`| qubits needed | **${fragment.qubitsRequired}** under ${fragment.mapping}${tapered ? ', tapered' : ''}${fragment.method === 'qpe' ? ', the system register only (the phase register and ancillas of the QPE scheme not counted)' : ''}${limit !== null ? ` (limit ${limit})` : ''} |`);
  }
  if (qubits?.tapered !== null && qubits?.tapered !== undefined) rows.push(`| tapered | ${qubits.tapered} qubits (removed: ${fragment.taperingSymmetries.join(', ') || 'none'}) · ${sourceText(fragment, 'taperedQubits')} |`);
  rows.push(...problemRow(fragment), ...activeRow(fragment));
  if (fragment.activeIrreps) rows.push(activeIrrepsRow(fragment));
  if (qubits) rows.push(`| qubits | Jordan–Wigner ${qubits.jordanWigner} · Bravyi–Kitaev ${qubits.bravyiKitaev} · parity ${qubits.parity} |`);
  const counted = fragment.pauliTerms ? `${fragment.pauliTerms.upperBound ? '≤ ' : ''}${countText(fragment.pauliTerms.jordanWigner)}` : null;
  if (computed && counted !== null) rows.push(`| Pauli terms | **${computed.jordanWigner}** computed (counted bound ${counted}; identity included) |`);
  else if (counted !== null) rows.push(`| Pauli terms | ${counted} counted (identity included) · ${sourceText(fragment, 'pauliTerms')} |`);
  if (computed) rows.push(`| measurement | ${computed.groups} qubit-wise commuting groups, computed from the strings (greedy grouping, Jordan–Wigner block order: a heuristic, not the minimum) |`);
  else if (fragment.measurement) {
    const groups = countText(fragment.measurement.groups);
    const how = fragment.measurement.explicit ? 'greedy grouping, Jordan–Wigner block order: a heuristic, not the minimum' : fragment.measurement.method;
    rows.push(`| measurement | ${fragment.measurement.explicit || groups.startsWith('≈') ? '' : '≈ '}${groups} qubit-wise commuting groups (${how}) |`);
  }
  if (fragment.ansatzCost) {
    const unscreened = fragment.ansatzCost.unscreened !== null && countText(fragment.ansatzCost.unscreened) !== countText(fragment.ansatzCost.parameters) ? ` (${countText(fragment.ansatzCost.unscreened)} without point-group screening)` : '';
    const screening = fragment.ansatzCost.kind === 'uccsd' ? ` · ${sourceText(fragment, 'ansatzParameters')}` : '';
    rows.push(`| ansatz | ${fragment.ansatzCost.kind}: ${countText(fragment.ansatzCost.parameters)} parameters${unscreened}${screening} |`);
  }
  if (fragment.circuit) {
    const register = fragment.circuit.construction === 'hardware-efficient' ? `on the ${fragment.qubitsRequired ?? fragment.qubits?.jordanWigner} qubits needed` : `untapered Jordan–Wigner on ${fragment.qubits?.jordanWigner} qubits, interleaved order`;
    rows.push(`| circuit | ${countText(fragment.circuit.cnots)} CNOTs per Trotter step${fragment.circuit.compactCnots !== null ? `, ${countText(fragment.circuit.compactCnots)} with compact excitation circuits` : ''}${fragment.circuit.depth !== null ? `; depth ≤ ${countText(fragment.circuit.depth)} (serial upper estimate)` : ''} — ${register} |`);
  }
  if (fragment.classical) {
    rows.push(`| full CI | ${fragment.classical.determinants.text} determinants (${fragment.classical.ciVectorBytes.text}) · CCSD ${fragment.classical.ccsdAmplitudes.text} amplitudes (${fragment.classical.ccsdAmplitudesConvention === 'closed-shell' ? 'spin-adapted, closed shell' : 'spin orbitals'}) |`);
    if (fragment.classical.statevectorBytes) rows.push(`| statevector | ${fragment.classical.statevectorBytes.text} |`);
  }
  return rows;
}

const SOLVER_TARGETS: Record<SolverCostFigures['on'], string> = {
  'active-space': 'its active space',
  'dmet-impurity': 'the DMET impurity',
  fragment: "the fragment's own orbitals",
};

/** A classical tier's solver cost first: what decides whether it runs. */
function classicalRows(fragment: FragmentFigures): string[] {
  const rows: string[] = [];
  const cost = fragment.solverCost;
  if (cost) {
    const size = fragment.tier === 'mean-field' ? `${cost.basisFunctions} basis functions` : `${SOLVER_TARGETS[cost.on]}, ${cost.occupied} occupied and ${cost.virtual} virtual orbitals`;
    rows.push(`| solver | **${cost.method}** on ${size}${cost.determinants ? `, ${cost.determinants.text} determinants` : ''} |`);
    const rate = `${formatRate(cost.time.flopsPerSecond)}${cost.time.rateFrom === 'default' ? ' (assumed; set `limits { rate }`)' : ''}`;
    rows.push(`| cost | **${cost.time.text}** at ${rate}: ${cost.operations.text} operations${cost.iterations !== null ? ` (${cost.iterations} iterations)` : ''}, ${cost.memoryBytes.text} memory |`);
    rows.push(`| scaling | ${cost.scaling} |`);
  }
  rows.push(...problemRow(fragment), ...activeRow(fragment));
  if (fragment.classical) rows.push(`| full CI | ${fragment.classical.determinants.text} determinants (${fragment.classical.ciVectorBytes.text}) · CCSD ${fragment.classical.ccsdAmplitudes.text} amplitudes (${fragment.classical.ccsdAmplitudesConvention === 'closed-shell' ? 'spin-adapted, closed shell' : 'spin orbitals'}) |`);
  return rows;
}

/**
 * The card of a fragment: the figures that decide first (the qubits a quantum tier needs, the time
 * and memory of a classical solver, the problem's size), then the point groups and the sizes every
 * part has, conventions last.
 */
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
  if (fragment.qubits?.tapered !== null && fragment.qubits?.tapered !== undefined) conventions.push(`qubits: ${CONVENTIONS.qubits}`);
  if (fragment.measurement) conventions.push(`measurement: ${fragment.measurement.method}`);
  if (fragment.orbitalSources) conventions.push(`irreps counted or computed: ${CONVENTIONS.orbitalSources}`);
  if (fragment.solverCost) conventions.push(`solver cost: ${fragment.solverCost.formula} (${fragment.solverCost.references.join('; ')})`);
  const deciding = fragment.tier === 'quantum' ? quantumRows(fragment, analysis.model.limits.qubits ?? null, computedPauliTerms(analysis, index)) : classicalRows(fragment);
  const symmetryRow = pointGroupRow(fragment);
  return [
    fragmentHeadline(fragment),
    '',
    '| | |',
    '| --- | --- |',
    ...deciding,
    ...(symmetryRow ? [symmetryRow] : []),
    ...spaceRows(fragment),
    ...capsRows(analysis, fragment.caps),
    ...fragment.notes.map((note) => `| note | ${note} |`),
    '',
    `_Conventions: ${conventions.join('; ')}._`,
    '',
    `_${PLANNING_NOTE}_`,
  ].join('\n');
}
