/** The estimate report as tables, shared by the text and Markdown renderings. */
import { formatRate } from '../../chemistry/cost/format';
import { approximateCount, countText, countValue, SYMMETRY_ATOM_LIMIT, type Count, type EstimateReport, type FragmentFigures, type SpaceFigures } from '../../analysis';
import type { Table } from './table';
import { scanSymmetryText } from './figures';

const dash = '–';

function spin(figures: SpaceFigures): string {
  return figures.alpha === null ? `${figures.electrons} (invalid spin)` : `${figures.electrons} (${figures.alpha}/${figures.beta})`;
}

function orNone(value: number | string | null | undefined): string {
  return value === null || value === undefined ? dash : String(value);
}

function countOrNone(value: Count | null | undefined): string {
  return value === null || value === undefined ? dash : countText(value);
}

/** `≈ ` before an estimate, unless the text says so already (counts beyond 2^53 do). */
function approximately(exact: boolean, count: Count): string {
  const text = countText(count);
  return exact || text.startsWith('≈') ? text : `≈ ${text}`;
}

function rowsFor(report: EstimateReport): { name: string; figures: SpaceFigures; fragment?: FragmentFigures }[] {
  return [
    { name: 'system', figures: report.system },
    ...report.fragments.map((fragment) => ({ name: fragment.name, figures: fragment, fragment })),
  ];
}

function oneGroup(counted: string, full: string | null): string {
  return full && full !== counted ? `${counted} (${full})` : counted;
}

/** The group counted in; for an embedded fragment also its own group, alone. */
function groupText(figures: SpaceFigures, fragment?: FragmentFigures): string {
  if (!figures.pointGroup) return dash;
  const counted = oneGroup(figures.pointGroup, figures.fullPointGroup);
  const own = fragment?.symmetry?.countedIn === 'in-system' ? fragment.symmetry.own : null;
  return own ? `${counted} in system; alone ${oneGroup(own.pointGroup, own.fullPointGroup)}` : counted;
}

function problemText(fragment: FragmentFigures | undefined): string {
  if (!fragment?.problem) return dash;
  const label = fragment.problem.embedding === 'dmet' ? 'impurity ' : '';
  return `${label}${fragment.problem.electrons}e ${fragment.problem.orbitals}o`;
}

/** Where the irreps of the active orbitals come from, in the qubits table: counted (given or apportioned) or computed. */
const IRREP_SOURCE_TEXT: Record<string, string> = { given: 'counted (given)', proportional: 'counted (apportioned)', computed: 'computed' };


/** "1 fragment calculation", "3 fragment calculations". */
function countOf(count: number, noun: string): string {
  return `${count} ${noun}${count === 1 ? '' : 's'}`;
}
export function estimateTables(report: EstimateReport): Table[] {
  const rows = rowsFor(report);
  const plan: Table = {
    title: 'Plan',
    headers: ['part', 'tier', 'method', 'ansatz', 'mapping', 'atoms', 'formula', 'charge', 'mult', 'point group'],
    numeric: [false, false, false, false, false, true, false, true, true, false],
    rows: rows.map(({ name, figures, fragment }) => [
      name,
      fragment ? orNone(fragment.tier) : dash,
      fragment ? orNone(fragment.method) : dash,
      fragment ? orNone(fragment.ansatz) : dash,
      fragment ? orNone(fragment.mapping) : dash,
      fragment?.caps && fragment.caps.count > 0 ? `${figures.atoms} + ${fragment.caps.count} cap${fragment.caps.count === 1 ? '' : 's'}` : String(figures.atoms),
      figures.formula || dash,
      figures.charge > 0 ? `+${figures.charge}` : String(figures.charge),
      String(figures.multiplicity),
      groupText(figures, fragment),
    ]),
  };
  const orbitals: Table = {
    title: 'Electrons and orbitals',
    headers: ['part', 'electrons (α/β)', 'functions sph/cart', 'orbitals', 'frozen core', 'occupied', 'virtual'],
    numeric: [false, true, true, true, true, true, true],
    rows: rows.map(({ name, figures }) => [
      name,
      spin(figures),
      `${figures.basisFunctions.spherical}/${figures.basisFunctions.cartesian}${figures.atomsWithoutBasis > 0 ? '*' : ''}`,
      `${figures.orbitals} ${figures.functions === 'spherical' ? 'sph' : 'cart'}`,
      String(figures.frozenCore.orbitals),
      orNone(figures.occupied),
      orNone(figures.virtual),
    ]),
  };
  // Qubits belong to quantum tiers; the system's row is the hypothetical "everything on one quantum tier".
  const quantumRows = rows.filter(({ fragment }) => !fragment || fragment.tier === 'quantum');
  const qubits: Table = {
    title: 'Qubits and Hamiltonian (quantum tiers; the system row is hypothetical: the whole system on one quantum tier)',
    headers: ['part', 'problem', 'active', 'irreps', 'Jordan–Wigner', 'Bravyi–Kitaev', 'parity (2q reduced)', 'tapered', 'needed', 'Pauli terms', 'QWC groups (greedy, block order)'],
    numeric: [false, true, true, false, true, true, true, true, true, true, true],
    rows: quantumRows.map(({ name, figures, fragment }) => [
      fragment ? name : `${name} (hypothetical)`,
      problemText(fragment),
      figures.active ? `${figures.active.electrons}e ${figures.active.orbitals}o` : dash,
      fragment?.activeIrreps ? IRREP_SOURCE_TEXT[fragment.activeIrreps.source] ?? fragment.activeIrreps.source : dash,
      orNone(figures.qubits?.jordanWigner),
      orNone(figures.qubits?.bravyiKitaev),
      orNone(figures.qubits?.parity),
      orNone(figures.qubits?.tapered),
      // Phase estimation needs a phase register and ancillas besides: the figure is the system's register.
      fragment?.qubitsRequired !== undefined && fragment.qubitsRequired !== null ? `${fragment.qubitsRequired}${fragment.method === 'qpe' ? ' (system register only)' : ''}` : dash,
      figures.pauliTerms ? `${figures.pauliTerms.upperBound ? '≤ ' : ''}${countText(figures.pauliTerms.jordanWigner)}` : dash,
      fragment?.measurement ? approximately(fragment.measurement.explicit, fragment.measurement.groups) : dash,
    ]),
  };
  const quantum = report.fragments.filter((fragment) => fragment.tier === 'quantum' && (fragment.ansatzCost || fragment.circuit));
  const tables = [plan, orbitals, qubits];
  if (quantum.length > 0) {
    tables.push({
      title: 'Ansatz and circuit (one Trotter step on the untapered Jordan–Wigner register; depth a serial upper estimate)',
      headers: ['part', 'ansatz', 'parameters', 'without symmetry', 'CNOTs', 'compact CNOTs', 'depth', 'statevector'],
      numeric: [false, false, true, true, true, true, true, true],
      rows: quantum.map((fragment) => [
        fragment.name,
        orNone(fragment.ansatzCost?.kind),
        countOrNone(fragment.ansatzCost?.parameters),
        countOrNone(fragment.ansatzCost?.unscreened),
        countOrNone(fragment.circuit?.cnots),
        countOrNone(fragment.circuit?.compactCnots),
        countOrNone(fragment.circuit?.depth),
        fragment.classical?.statevectorBytes?.text ?? dash,
      ]),
    });
  }
  const solvers = report.fragments.filter((fragment) => fragment.solverCost);
  if (solvers.length > 0) {
    const rate = `${formatRate(report.limits.flopsPerSecond)}${report.limits.flopsFrom === 'default' ? ', assumed' : ''}`;
    tables.push({
      title: `Classical solvers (time at ${rate})`,
      headers: ['part', 'method', 'applied to', 'o / v', 'scaling', 'operations', 'memory', 'time'],
      numeric: [false, false, false, true, false, true, true, true],
      rows: solvers.map((fragment) => {
        const cost = fragment.solverCost!;
        return [
          fragment.name,
          cost.method,
          cost.on === 'dmet-impurity' ? `DMET impurity, ${cost.orbitals}o` : cost.on === 'active-space' ? `active space, ${cost.orbitals}o` : `${cost.basisFunctions} functions`,
          `${cost.occupied} / ${cost.virtual}`,
          cost.scaling.split(':')[0]!,
          cost.operations.text,
          cost.memoryBytes.text,
          cost.time.text,
        ];
      }),
    });
  }
  const classical = report.fragments.filter((fragment) => fragment.classical);
  if (classical.length > 0) {
    tables.push({
      title: 'Classical size of the active space',
      headers: ['part', 'full-CI determinants', 'CI vector', 'CCSD amplitudes'],
      numeric: [false, true, true, true],
      rows: classical.map((fragment) => [fragment.name, fragment.classical!.determinants.text, fragment.classical!.ciVectorBytes.text, `${fragment.classical!.ccsdAmplitudes.text} (${fragment.classical!.ccsdAmplitudesConvention === 'closed-shell' ? 'spin-adapted' : 'spin orbitals'})`]),
    });
  }
  return tables;
}

export function conventionLines(report: EstimateReport): string[] {
  const c = report.conventions;
  const dmet = report.fragments.find((fragment) => fragment.problem?.embedding === 'dmet')?.problem?.convention;
  return [
    `electrons: ${c.electrons}`,
    `spin: ${c.spin}`,
    `orbitals: ${c.orbitals}`,
    `frozen core: ${c.frozenCore}`,
    `active space: ${c.activeSpace}`,
    `irreps counted or computed: ${c.orbitalSources}`,
    `point group: ${c.pointGroup}`,
    `fragment symmetry: ${c.fragmentSymmetry}`,
    ...(dmet ? [`embedding: ${dmet.replace(/^DMET impurity: [^;]*; /, 'DMET impurity: ')}`] : []),
    `qubits: ${c.qubits}`,
    `Pauli terms: ${c.pauliTerms}`,
    `measurement: ${c.measurement}`,
    `ansatz: ${c.ansatz}`,
    `circuit: ${c.circuit}`,
    `classical: ${c.classical}`,
    `tiers: ${c.tiers}`,
    `solver cost: ${c.solverCost}`,
    `fragment charge: ${c.fragmentCharge}`,
    `caps: ${c.caps}`,
  ];
}

export function headerLines(report: EstimateReport): string[] {
  const overrides = report.basis.overrides.map((line) => `${line.basis} on ${line.on}`);
  const basis = `${report.basis.name ?? '(none)'}${overrides.length > 0 ? ` (${overrides.join(', ')})` : ''}, ${report.basis.functions} functions`;
  const lines = [`basis ${basis}`, `embedding ${report.embedding}`];
  const system = report.system;
  if (system.pointGroup) {
    const irreps = system.orbitalsPerIrrep ? Object.entries(system.orbitalsPerIrrep).map(([label, count]) => `${count} ${label}`).join(', ') : '';
    lines.push(`point group ${system.fullPointGroup}, counted in ${system.pointGroup}${irreps ? `: orbitals ${irreps}` : ''}`);
  } else if (system.atoms > SYMMETRY_ATOM_LIMIT) {
    lines.push(`point group not looked for (more than ${SYMMETRY_ATOM_LIMIT} atoms): system figures counted in C1`);
  }
  if (system.nearSymmetry) lines.push(`near symmetry: ${system.nearSymmetry.group} within ${system.nearSymmetry.within.toFixed(3)} Å`);
  if (report.scan) {
    const values = report.scan.values;
    const unit = report.scan.coordinate === 'distance' ? ' Å' : '°';
    const first = values[0];
    const last = values[values.length - 1];
    const totals = report.scan.totals;
    lines.push(
      report.scan.points > 0
        ? `scan ${report.scan.points} points, ${report.scan.coordinate === 'distance' ? '' : `${report.scan.coordinate} `}${first!.toFixed(3)} to ${last!.toFixed(3)}${unit}: at each point ${countOf(totals.fragmentCalculations / report.scan.points, 'fragment calculation')} and ${countText(totals.measurementCircuitsPerPoint)} measurement circuits per energy evaluation (counted at the structure's geometry, the same at every point), ${totals.fragmentCalculations} fragment calculations over the scan${totals.peakQubits !== null ? `, at most ${totals.peakQubits} qubits at any point` : ''}`
        : 'scan: no valid points',
    );
    if (report.scan.points > 0) lines.push(`scan point groups: ${scanSymmetryText(report.scan)}`);
  }
  return lines;
}
