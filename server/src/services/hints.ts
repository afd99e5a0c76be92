/** Inlay hints after each fragment name, and a code lens with the totals above the spec. */
import { InlayHintKind, type CodeLens, type InlayHint, type Range } from 'vscode-languageserver-types';
import { mappingKey, type Mapping } from '../chemistry/qubits';
import type { Analysis } from '../language/analyze';
import type { FragmentFigures } from '../report/estimate';
import { estimateOf } from './cards';
import { toRange } from './positions';

/** Qubits under the fragment's mapping before tapering, or null outside the quantum tier. */
function untaperedQubits(figures: FragmentFigures): number | null {
  if (figures.qubitsRequired === null || !figures.mapping) return null;
  return figures.qubits[mappingKey(figures.mapping as Mapping)];
}

/** The short cost label of a fragment, as shown in hints and the outline: `20 qubits · 17 tapered`. */
export function fragmentCostLabel(figures: FragmentFigures): string {
  const qubits = untaperedQubits(figures);
  if (qubits !== null) {
    const tapered = figures.qubits.tapered;
    return tapered !== null && tapered < qubits ? `${qubits} qubits · ${tapered} tapered` : `${qubits} qubits`;
  }
  return `${figures.orbitals} orbitals · ${figures.electrons} e⁻`;
}

export function getInlayHints(analysis: Analysis, range?: Range): InlayHint[] {
  const report = estimateOf(analysis);
  const hints: InlayHint[] = [];
  for (const fragment of analysis.model.fragments) {
    const name = fragment.ast.name;
    if (!name) continue;
    const position = toRange(analysis, name.span).end;
    if (range && (position.line < range.start.line || position.line > range.end.line)) continue;
    const figures = report.fragments[fragment.index]!;
    hints.push({
      position,
      label: fragmentCostLabel(figures),
      kind: InlayHintKind.Type,
      paddingLeft: true,
      paddingRight: true,
      tooltip: `${figures.tier ?? 'no tier'}: ${figures.active.electrons}e ${figures.active.orbitals}o active${figures.mapping ? `, ${figures.mapping}` : ''}. Planning estimate.`,
    });
  }
  return hints;
}

/** The largest qubit count any quantum-tier fragment needs, or undefined when there is none. */
export function largestQubitCount(analysis: Analysis): { fragment: string; qubits: number } | undefined {
  let best: { fragment: string; qubits: number } | undefined;
  for (const figures of estimateOf(analysis).fragments) {
    if (figures.qubitsRequired !== null && (!best || figures.qubitsRequired > best.qubits)) best = { fragment: figures.name, qubits: figures.qubitsRequired };
  }
  return best;
}

export function getCodeLenses(analysis: Analysis): CodeLens[] {
  const first = analysis.tree.statements[0];
  if (!first) return [];
  const report = estimateOf(analysis);
  const system = report.system;
  const largest = largestQubitCount(analysis);
  const parts = [
    `${system.atoms} atoms`,
    `${system.electrons} e⁻`,
    `${system.basisFunctions[system.functions]} ${system.functions} functions`,
    `${report.fragments.length} fragment${report.fragments.length === 1 ? '' : 's'}`,
  ];
  if (largest) parts.push(`largest quantum fragment ${largest.qubits} qubits (${largest.fragment})`);
  if (report.scan) parts.push(`× ${report.scan.points} scan points`);
  const range = toRange(analysis, first.keyword.span);
  return [{ range, command: { title: parts.join(' · '), command: 'tessera.showReport', arguments: [] } }];
}
