/**
 * Data for the editor's structure view and cost panel: the structure of a spec (atoms, fragments,
 * bonds, scan), the three cost plots as SVG with the fragments whose growth can be plotted, and
 * which fragment and atom a cursor position stands in. The views draw; nothing is computed there.
 */
import type { Position } from 'vscode-languageserver-types';
import { PLANNING_NOTE, type DocumentAnalysis } from '../analysis';
import { growthChartSvg, qubitsChartSvg, scanChartSvg } from '../report/plots';
import { structureData, UNASSIGNED_COLOUR, type StructureData } from '../report/structure';
import { locate } from './locate';
import { toOffset } from './positions';

/** The structure data with the colour of atoms in no fragment, so that the view need not know it. */
export type StructureView = StructureData & { unassignedColour: string; note: string };

export function structureOf(analysis: DocumentAnalysis): StructureView {
  return { ...structureData(analysis), unassignedColour: UNASSIGNED_COLOUR, note: PLANNING_NOTE };
}

export interface CostPlots {
  spec: string | null;
  /** The three charts, standalone SVG documents. */
  svg: { qubits: string; growth: string; scan: string };
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
    spec: report.spec.name,
    svg: { qubits: qubitsChartSvg(report), growth, scan: scanChartSvg(report) },
    fragments,
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
