/**
 * Every figure of the system and of each fragment under its stable key (its path in the JSON
 * estimate), with a short label: the CSV columns and the full per-part table of the Markdown and
 * HTML reports. Values are read from the estimate report by key, never computed here.
 */
import type { EstimateReport, FragmentFigures, SpaceFigures } from '../../analysis';
import { countText } from '../../analysis';
import type { Table } from './table';

export interface FigureColumn {
  /** Path in the JSON estimate (`qubits.jordanWigner` is `fragments[i].qubits.jordanWigner`). */
  readonly key: string;
  readonly label: string;
}

/** The figures, in column order. `part` and `name` identify the row and are not paths. */
export const FIGURE_COLUMNS: readonly FigureColumn[] = [
  { key: 'part', label: 'part (system or fragment)' },
  { key: 'name', label: 'name' },
  { key: 'tier', label: 'tier' },
  { key: 'method', label: 'method' },
  { key: 'ansatz', label: 'ansatz' },
  { key: 'mapping', label: 'mapping' },
  { key: 'atoms', label: 'atoms' },
  { key: 'formula', label: 'formula (caps included)' },
  { key: 'caps.rule', label: 'cap placement rule' },
  { key: 'caps.count', label: 'hydrogen caps' },
  { key: 'charge', label: 'charge' },
  { key: 'multiplicity', label: 'multiplicity' },
  { key: 'electrons', label: 'electrons' },
  { key: 'alpha', label: 'alpha electrons' },
  { key: 'beta', label: 'beta electrons' },
  { key: 'ecpCoreElectrons', label: 'electrons replaced by ECPs' },
  { key: 'functions', label: 'function type' },
  { key: 'basisFunctions.spherical', label: 'basis functions, spherical' },
  { key: 'basisFunctions.cartesian', label: 'basis functions, cartesian' },
  { key: 'atomsWithoutBasis', label: 'atoms without basis functions' },
  { key: 'orbitals', label: 'orbitals' },
  { key: 'occupied', label: 'occupied orbitals' },
  { key: 'virtual', label: 'virtual orbitals' },
  { key: 'frozenCore.orbitals', label: 'frozen-core orbitals' },
  { key: 'frozenCore.electrons', label: 'frozen-core electrons' },
  { key: 'pointGroup', label: 'point group (counted in)' },
  { key: 'fullPointGroup', label: 'full point group' },
  { key: 'problem.embedding', label: 'solver problem: embedding' },
  { key: 'problem.electrons', label: 'solver problem: electrons' },
  { key: 'problem.orbitals', label: 'solver problem: orbitals' },
  { key: 'problem.alpha', label: 'solver problem: alpha electrons' },
  { key: 'problem.beta', label: 'solver problem: beta electrons' },
  { key: 'problem.bath.alpha', label: 'DMET bath: alpha' },
  { key: 'problem.bath.beta', label: 'DMET bath: beta' },
  { key: 'active.electrons', label: 'active electrons' },
  { key: 'active.orbitals', label: 'active orbitals' },
  { key: 'active.alpha', label: 'active alpha electrons' },
  { key: 'active.beta', label: 'active beta electrons' },
  { key: 'active.source', label: 'active space from' },
  { key: 'activeIrreps.source', label: 'active irreps from (given, proportional or computed)' },
  { key: 'activeIrreps.occupation', label: 'reference occupation from (given, assumed or computed)' },
  { key: 'qubits.jordanWigner', label: 'qubits, Jordan–Wigner' },
  { key: 'qubits.bravyiKitaev', label: 'qubits, Bravyi–Kitaev' },
  { key: 'qubits.parity', label: 'qubits, parity (2q reduced)' },
  { key: 'qubits.tapered', label: 'qubits, tapered' },
  { key: 'qubitsRequired', label: 'qubits needed (own mapping)' },
  { key: 'pauliTerms.jordanWigner', label: 'Pauli terms, Jordan–Wigner' },
  { key: 'pauliTerms.bravyiKitaev', label: 'Pauli terms, Bravyi–Kitaev' },
  { key: 'pauliTerms.parity', label: 'Pauli terms, parity' },
  { key: 'pauliTerms.upperBound', label: 'Pauli terms are an upper bound' },
  { key: 'measurement.groups', label: 'QWC measurement groups' },
  { key: 'measurement.explicit', label: 'measurement groups from grouping the strings, greedy (a heuristic, not the minimum; else extrapolated)' },
  { key: 'ansatzCost.kind', label: 'ansatz (costed)' },
  { key: 'ansatzCost.parameters', label: 'ansatz parameters' },
  { key: 'ansatzCost.singles', label: 'ansatz singles' },
  { key: 'ansatzCost.doubles', label: 'ansatz doubles' },
  { key: 'ansatzCost.unscreened', label: 'ansatz parameters without symmetry' },
  { key: 'ansatzCost.spinAdapted', label: 'ansatz parameters, spin-adapted' },
  { key: 'circuit.cnots', label: 'CNOTs per Trotter step' },
  { key: 'circuit.compactCnots', label: 'CNOTs, compact circuits' },
  { key: 'circuit.rotations', label: 'rotations per Trotter step' },
  { key: 'circuit.depth', label: 'circuit depth' },
  { key: 'classical.determinants.exact', label: 'full-CI determinants' },
  { key: 'classical.determinants.log10', label: 'full-CI determinants, log10' },
  { key: 'classical.ciVectorBytes.exact', label: 'CI vector bytes' },
  { key: 'classical.ciVectorBytes.log10', label: 'CI vector bytes, log10' },
  { key: 'classical.ccsdAmplitudes.exact', label: 'CCSD amplitudes' },
  { key: 'classical.ccsdAmplitudes.log10', label: 'CCSD amplitudes, log10' },
  { key: 'classical.ccsdAmplitudesConvention', label: 'CCSD amplitudes counted as (closed-shell spin-adapted or spin orbitals)' },
  { key: 'classical.statevectorBytes.exact', label: 'statevector bytes' },
  { key: 'classical.statevectorBytes.log10', label: 'statevector bytes, log10' },
  { key: 'solverCost.method', label: 'classical solver (costed)' },
  { key: 'solverCost.scaling', label: 'classical solver scaling' },
  { key: 'solverCost.on', label: 'classical solver applied to' },
  { key: 'solverCost.occupied', label: 'classical solver occupied orbitals' },
  { key: 'solverCost.virtual', label: 'classical solver virtual orbitals' },
  { key: 'solverCost.operations.exact', label: 'classical solver operations' },
  { key: 'solverCost.operations.log10', label: 'classical solver operations, log10' },
  { key: 'solverCost.memoryBytes.exact', label: 'classical solver memory bytes' },
  { key: 'solverCost.memoryBytes.log10', label: 'classical solver memory bytes, log10' },
  { key: 'solverCost.time.seconds', label: 'classical solver time, seconds' },
  { key: 'solverCost.time.flopsPerSecond', label: 'rate the time is taken at, flop/s' },
];

export type FigureValue = string | number | boolean | null;

export interface ReportPart {
  readonly part: 'system' | 'fragment';
  readonly name: string;
  readonly figures: SpaceFigures | FragmentFigures;
}

/** The system, then each fragment in the spec's order. */
export function reportParts(report: EstimateReport): ReportPart[] {
  return [{ part: 'system', name: 'system', figures: report.system }, ...report.fragments.map((fragment) => ({ part: 'fragment' as const, name: fragment.name, figures: fragment }))];
}

/** The value under `key` for one part; null where the part has no such figure. */
export function figureValue(part: ReportPart, key: string): FigureValue {
  if (key === 'part') return part.part;
  if (key === 'name') return part.name;
  let value: unknown = part.figures;
  for (const step of key.split('.')) {
    if (value === null || typeof value !== 'object') return null;
    value = (value as Record<string, unknown>)[step];
  }
  if (value === undefined || value === null) return null;
  if (typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean') return value;
  // A count beyond 2^53: its exact digits when known, else its magnitude as text.
  if (typeof value === 'object' && 'log10' in value && 'text' in value) {
    const count = value as unknown as { exact: string | null; text: string };
    return count.exact ?? count.text;
  }
  throw new TypeError(`Figure '${key}' is not a single value.`);
}

/** The text of a value: empty for none, `true`/`false`, numbers as JavaScript prints them (exact round trip). */
export function figureText(value: FigureValue): string {
  if (value === null) return '';
  return String(value);
}

/** One row per figure, one column per part: the full per-part table of the reports. */
export function figuresTable(report: EstimateReport): Table {
  const parts = reportParts(report);
  const columns = FIGURE_COLUMNS.filter((column) => column.key !== 'part' && column.key !== 'name');
  return {
    title: 'All figures by part',
    headers: ['figure', 'key', ...parts.map((part) => part.name)],
    numeric: [false, false, ...parts.map(() => true)],
    rows: columns.map((column) => [column.label, column.key, ...parts.map((part) => figureText(figureValue(part, column.key)) || '–')]),
  };
}

/**
 * The point groups along a scan as text: runs of consecutive points that agree, each with its group
 * and the qubits each quantum fragment needs there (`Cs at 0.9372 Å: w 11; C2v at 0.9572 Å: w 10`).
 */
export function scanSymmetryText(scan: NonNullable<EstimateReport['scan']>): string {
  const symmetry = scan.symmetry;
  if (symmetry.notLookedFor) return `not looked for: ${symmetry.notLookedFor}`;
  const unit = scan.coordinate === 'distance' ? ' Å' : '°';
  const value = (v: number) => `${Number(v.toFixed(6))}${unit}`;
  const runs: { first: number; last: number; key: string }[] = [];
  symmetry.points.forEach((point, index) => {
    const key = JSON.stringify([point.fullPointGroup, point.fragments]);
    const last = runs[runs.length - 1];
    if (last && last.key === key) last.last = index;
    else runs.push({ first: index, last: index, key });
  });
  return runs
    .map((run) => {
      const point = symmetry.points[run.first]!;
      const where = run.first === run.last ? `at ${value(point.value)}` : `${value(point.value)} to ${value(symmetry.points[run.last]!.value)}`;
      const qubits = point.fragments.filter((fragment) => fragment.qubitsRequired !== null).map((fragment) => `${fragment.fragment} ${fragment.qubitsRequired}`);
      return `${point.fullPointGroup ?? 'C1'} ${where}${qubits.length > 0 ? `: qubits needed ${qubits.join(', ')}` : ''}`;
    })
    .join('; ');
}

/** The scan: its points and what the whole scan costs; null without a scan. */
export function scanTable(report: EstimateReport): Table | null {
  const scan = report.scan;
  if (!scan) return null;
  const values = scan.values.map((value) => value.toFixed(3)).join(', ');
  const valuesRow = scan.coordinate === 'distance' ? ['distances (Å)', 'scan.distances', values || '–'] : [`${scan.coordinate}s (°)`, 'scan.values', values || '–'];
  return {
    title: 'Scan totals',
    headers: ['figure', 'key', 'value'],
    numeric: [false, false, true],
    rows: [
      ['points', 'scan.points', String(scan.points)],
      ['coordinate', 'scan.coordinate', scan.coordinate],
      valuesRow,
      ['fragment calculations over the scan', 'scan.totals.fragmentCalculations', String(scan.totals.fragmentCalculations)],
      ['measurement circuits per energy evaluation, at each point (the same at every point)', 'scan.totals.measurementCircuitsPerPoint', countText(scan.totals.measurementCircuitsPerPoint)],
      ['most qubits at any point (each point in its own point group)', 'scan.totals.peakQubits', figureText(scan.totals.peakQubits) || '–'],
      ['point group and qubits needed along the scan', 'scan.symmetry.points', scanSymmetryText(scan) || '–'],
    ],
  };
}
