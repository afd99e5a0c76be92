/** The estimate report as tables, shared by the text and Markdown renderings. */
import type { EstimateReport, FragmentFigures, SpaceFigures } from '../estimate';
import type { Table } from './table';

const dash = '–';

function spin(figures: SpaceFigures): string {
  return figures.alpha === null ? `${figures.electrons} (invalid spin)` : `${figures.electrons} (${figures.alpha}/${figures.beta})`;
}

function orNone(value: number | string | null): string {
  return value === null ? dash : String(value);
}

function rowsFor(report: EstimateReport): { name: string; figures: SpaceFigures; fragment?: FragmentFigures }[] {
  return [
    { name: 'system', figures: report.system },
    ...report.fragments.map((fragment) => ({ name: fragment.name, figures: fragment, fragment })),
  ];
}

export function estimateTables(report: EstimateReport): Table[] {
  const rows = rowsFor(report);
  const plan: Table = {
    title: 'Plan',
    headers: ['part', 'tier', 'method', 'ansatz', 'mapping', 'atoms', 'formula', 'charge', 'mult'],
    numeric: [false, false, false, false, false, true, false, true, true],
    rows: rows.map(({ name, figures, fragment }) => [
      name,
      fragment ? orNone(fragment.tier) : dash,
      fragment ? orNone(fragment.method) : dash,
      fragment ? orNone(fragment.ansatz) : dash,
      fragment ? orNone(fragment.mapping) : dash,
      String(figures.atoms),
      figures.formula || dash,
      figures.charge > 0 ? `+${figures.charge}` : String(figures.charge),
      String(figures.multiplicity),
    ]),
  };
  const orbitals: Table = {
    title: 'Electrons and orbitals',
    headers: ['part', 'electrons (α/β)', 'functions sph/cart', 'orbitals', 'frozen core', 'occupied', 'virtual', 'active space'],
    numeric: [false, true, true, true, true, true, true, true],
    rows: rows.map(({ name, figures }) => [
      name,
      spin(figures),
      `${figures.basisFunctions.spherical}/${figures.basisFunctions.cartesian}${figures.atomsWithoutBasis > 0 ? '*' : ''}`,
      `${figures.orbitals} ${figures.functions === 'spherical' ? 'sph' : 'cart'}`,
      String(figures.frozenCore.orbitals),
      orNone(figures.occupied),
      orNone(figures.virtual),
      `${figures.active.electrons}e ${figures.active.orbitals}o`,
    ]),
  };
  const qubits: Table = {
    title: 'Qubits for the active space',
    headers: ['part', 'Jordan–Wigner', 'Bravyi–Kitaev', 'parity (2-qubit reduced)', 'needed'],
    numeric: [false, true, true, true, true],
    rows: rows.map(({ name, figures, fragment }) => [
      name,
      String(figures.qubits.jordanWigner),
      String(figures.qubits.bravyiKitaev),
      String(figures.qubits.parity),
      fragment?.qubitsRequired !== undefined && fragment.qubitsRequired !== null ? `${fragment.qubitsRequired} (${fragment.mapping})` : dash,
    ]),
  };
  return [plan, orbitals, qubits];
}

export function conventionLines(report: EstimateReport): string[] {
  const c = report.conventions;
  return [
    `electrons: ${c.electrons}`,
    `spin: ${c.spin}`,
    `orbitals: ${c.orbitals}`,
    `frozen core: ${c.frozenCore}`,
    `active space: ${c.activeSpace}`,
    `qubits: ${c.qubits}`,
    `fragment charge: ${c.fragmentCharge}`,
  ];
}

export function headerLines(report: EstimateReport): string[] {
  const overrides = Object.entries(report.basis.overrides).map(([symbol, name]) => `${symbol}: ${name}`);
  const basis = `${report.basis.name ?? '(none)'}${overrides.length > 0 ? ` (${overrides.join(', ')})` : ''}, ${report.basis.functions} functions`;
  const lines = [`basis ${basis}`, `embedding ${report.embedding}`];
  if (report.scan) {
    const first = report.scan.distances[0];
    const last = report.scan.distances[report.scan.distances.length - 1];
    lines.push(
      report.scan.points > 0
        ? `scan ${report.scan.points} points, ${first!.toFixed(3)} to ${last!.toFixed(3)} Å: per-point costs below repeat ${report.scan.points} times`
        : 'scan: no valid points',
    );
  }
  return lines;
}
