/**
 * Data for the editor's structure view and cost panel: the structure of a spec (atoms, fragments,
 * bonds, scan), the three cost plots as SVG with the fragments whose growth can be plotted, and
 * which fragment and atom a cursor position stands in. The views draw; nothing is computed there.
 */
import type { Position } from 'vscode-languageserver-types';
import { PLANNING_NOTE, type DocumentAnalysis } from '../analysis';
import { growthChartSvg, qubitsChartSvg, scanChartSvg, shotsChartSvg, type ShotPoint } from '../report/plots';
import { HAMILTONIAN_KIND, hamiltonianFigures, requestKey, type HamiltonianOutcome } from '../analysis';
import { fragmentAccuracy } from './hamiltonian';
import { structureData, UNASSIGNED_COLOUR, type StructureData } from '../report/structure';
import { locate } from './locate';
import { toOffset } from './positions';

/**
 * What the editor's views accept: the same numbers client/src/views/protocol.ts checks (the test
 * tests/extension/views-limits.test.ts keeps them equal), so that nothing the server sends is
 * dropped there. Text beyond a limit is shortened here with '…'; a structure beyond a count limit
 * is not sent, and the view shows why, with the numbers, instead.
 */
export const VIEW_LIMITS = {
  atoms: 100_000,
  bonds: 400_000,
  fragments: 10_000,
  scanPoints: 100_000,
  /** Spec name, titles, notes. */
  text: 1_000,
  fragmentName: 200,
  label: 100,
  tier: 100,
  cost: 200,
} as const;

/** What a view request answers when the spec is beyond what the view shows. */
export interface ViewUnavailable {
  unavailable: string;
}

function shortened(text: string, limit: number): string {
  return text.length <= limit ? text : `${text.slice(0, limit - 1)}…`;
}

function countsBeyond(counts: readonly [string, number, number][]): string | undefined {
  const beyond = counts.filter(([, count, limit]) => count > limit);
  if (beyond.length === 0) return undefined;
  return beyond.map(([what, count, limit]) => `${count.toLocaleString('en-US')} ${what}, more than the ${limit.toLocaleString('en-US')} the view shows`).join('; ');
}

/** The structure data with the colour of atoms in no fragment, so that the view need not know it. */
export type StructureView = StructureData & { unassignedColour: string; note: string };

/** What `tessera/structure` answers: the structure, or why the view cannot show it. */
export function structureAnswer(analysis: DocumentAnalysis): StructureView | ViewUnavailable {
  const model = analysis.model;
  const beyond = countsBeyond([
    ['atoms', model.atoms.length, VIEW_LIMITS.atoms],
    ['bonds', model.contacts.bonds.length, VIEW_LIMITS.bonds],
    ['fragments', model.fragments.length, VIEW_LIMITS.fragments],
    ['scan points', model.scan?.values.length ?? 0, VIEW_LIMITS.scanPoints],
  ]);
  return beyond ? { unavailable: `This spec is too large for the structure view: ${beyond}.` } : structureOf(analysis);
}

/** The structure of a spec for the view, its text shortened to the view's limits. */
export function structureOf(analysis: DocumentAnalysis): StructureView {
  const data = structureData(analysis);
  return {
    ...data,
    spec: data.spec === null ? null : shortened(data.spec, VIEW_LIMITS.text),
    atoms: data.atoms.map((atom) => (atom.label !== null && atom.label.length > VIEW_LIMITS.label ? { ...atom, label: shortened(atom.label, VIEW_LIMITS.label) } : atom)),
    fragments: data.fragments.map((fragment) => ({
      ...fragment,
      name: shortened(fragment.name, VIEW_LIMITS.fragmentName),
      tier: fragment.tier === null ? null : shortened(fragment.tier, VIEW_LIMITS.tier),
      cost: shortened(fragment.cost, VIEW_LIMITS.cost),
    })),
    unassignedColour: UNASSIGNED_COLOUR,
    note: PLANNING_NOTE,
  };
}

export interface CostPlots {
  spec: string | null;
  /** The three charts, standalone SVG documents. */
  svg: { qubits: string; growth: string; shots: string; scan: string };
  /** Fragments with a sized quantum or correlated problem: the ones the growth chart can show. */
  fragments: { index: number; name: string }[];
  /** The fragment the growth chart shows, or null when no fragment can be shown. */
  selected: number | null;
  note: string;
}

/** The fragments whose active-space growth can be plotted. */
export function growthFragments(analysis: DocumentAnalysis): { index: number; name: string }[] {
  return analysis.model.fragments
    .filter((fragment) => analysis.fragmentFigures(fragment.index).problem !== null)
    .map((fragment) => ({ index: fragment.index, name: fragment.name }));
}

/**
 * The cost plots of a spec. The growth chart shows `fragment` when it can be plotted, otherwise the
 * first fragment that can (the quantum fragment needing the most qubits, when there is one).
 */
/** What `tessera/costs` answers: the plots, or why the panel cannot show them. */
export function costsAnswer(analysis: DocumentAnalysis, fragment?: number | null): CostPlots | ViewUnavailable {
  const beyond = countsBeyond([['fragments', analysis.model.fragments.length, VIEW_LIMITS.fragments]]);
  return beyond ? { unavailable: `This spec is too large for the cost plots: ${beyond}.` } : costPlots(analysis, fragment);
}

/** Under DMET the problem is the impurity (fragment and bath), whose Hamiltonian is not computed. */
export const DMET_SHOTS_MESSAGE = 'Under embedding dmet the Hamiltonian is the impurity’s (fragment + bath): not computed, so no shots.';

/**
 * Shots against active-space size of the selected fragment, from the Hamiltonians of its shot
 * series that have arrived (the editor computes them after the fragment's own figures).
 */
function shotsChart(analysis: DocumentAnalysis, selected: number | null): string {
  const fragment = selected === null ? undefined : analysis.model.fragments[selected];
  const name = fragment?.name ?? 'no fragment';
  if (!fragment || fragment.tier?.level !== 'quantum') return shotsChartSvg([], name, '', 'Shots are shown for quantum-tier fragments.');
  if (analysis.underDmet(fragment.index)) return shotsChartSvg([], shortened(name, VIEW_LIMITS.fragmentName), '', DMET_SHOTS_MESSAGE);
  const epsilon = fragmentAccuracy(analysis, fragment.index);
  const points: ShotPoint[] = analysis.shotSeriesRequests(fragment.index).map((request) => {
    const size = request.space.kind === 'window' ? { orbitals: request.space.orbitals, electrons: request.space.electrons } : { orbitals: 0, electrons: 0 };
    const result = analysis.late.get<HamiltonianOutcome>(HAMILTONIAN_KIND, requestKey(request));
    if (result.state !== 'ready') return { ...size, bound: null, grouped: null };
    const figures = hamiltonianFigures(result.value, epsilon);
    if (figures.status !== 'computed') return { ...size, bound: null, grouped: null };
    return { ...size, bound: figures.mappings.jordanWigner.shots.separateBound, grouped: figures.mappings.jordanWigner.shots.groupedEstimate };
  });
  return shotsChartSvg(points, shortened(name, VIEW_LIMITS.fragmentName), `${(epsilon * 1000).toPrecision(3)} mHa`);
}

export function costPlots(analysis: DocumentAnalysis, fragment?: number | null): CostPlots {
  const report = analysis.report();
  const fragments = growthFragments(analysis);
  const largestQuantum = report.fragments
    .map((figures, index) => ({ index, qubits: figures.qubitsRequired }))
    .filter((entry) => entry.qubits !== null && fragments.some((f) => f.index === entry.index))
    .sort((a, b) => b.qubits! - a.qubits! || a.index - b.index)[0]?.index;
  const selected = fragments.some((f) => f.index === fragment) ? fragment! : (largestQuantum ?? fragments[0]?.index ?? null);
  const growth =
    selected === null
      ? growthChartSvg([], report.fragments.length > 0 ? 'no sized fragment' : 'no fragments')
      : growthChartSvg(analysis.growth(selected), report.fragments[selected]!.name);
  return {
    spec: report.spec.name === null ? null : shortened(report.spec.name, VIEW_LIMITS.text),
    svg: { qubits: qubitsChartSvg(report), growth, shots: shotsChart(analysis, selected), scan: scanChartSvg(report) },
    fragments: fragments.map((entry) => ({ index: entry.index, name: shortened(entry.name, VIEW_LIMITS.fragmentName) })),
    selected,
    note: PLANNING_NOTE,
  };
}

/**
 * The fragment whose block (header line included) holds the position, and the atom whose
 * geometry line it is on; null for each when there is none.
 */
export function viewTargetAt(analysis: DocumentAnalysis, position: Position): { fragment: number | null; atom: number | null } {
  const offset = toOffset(analysis, position);
  const context = locate(analysis.text, analysis.tree.statements, offset);
  const candidates = [...context.parents, ...(context.statement ? [context.statement] : [])];
  let fragment: number | null = null;
  for (const statement of candidates) {
    const found = analysis.model.fragments.find((f) => f.ast.statement === statement);
    if (found) {
      fragment = found.index;
      break;
    }
  }
  const line = analysis.lines.positionAt(offset).line;
  const atom = analysis.model.atoms.find((a) => !a.source && analysis.lines.positionAt(a.span.start).line === line);
  return { fragment, atom: atom ? atom.index : null };
}
