/** Inlay hints after each fragment name, and a code lens with the totals above the spec. */
import { InlayHintKind, type CodeLens, type InlayHint, type Range } from 'vscode-languageserver-types';
import { mappingKey, type Mapping } from '../chemistry/qubits';
import type { DocumentAnalysis, FragmentFigures } from '../analysis';
import { toRange } from './positions';

/** Qubits under the fragment's mapping before tapering, or null outside the quantum tier. */
function untaperedQubits(figures: FragmentFigures): number | null {
  if (figures.qubitsRequired === null || !figures.mapping) return null;
  return figures.qubits[mappingKey(figures.mapping as Mapping)];
}

/**
 * The short cost label of a fragment, as shown in hints and the outline: `20 qubits · 17 tapered`
 * for the quantum tier, else its orbitals and electrons (counted by the model: no figures needed).
 */
export function fragmentCostLabel(analysis: DocumentAnalysis, index: number): string {
  const fragment = analysis.model.fragments[index]!;
  if (fragment.tier?.level === 'quantum') {
    const figures = analysis.fragmentFigures(index);
    const qubits = untaperedQubits(figures);
    if (qubits !== null) {
      const tapered = figures.qubits.tapered;
      return tapered !== null && tapered < qubits ? `${qubits} qubits · ${tapered} tapered` : `${qubits} qubits`;
    }
  }
  return `${fragment.space.orbitals} orbitals · ${fragment.space.electrons} e⁻`;
}

/** Hints for the fragments whose names lie in the range (the visible lines); only those are estimated. */
export function getInlayHints(analysis: DocumentAnalysis, range?: Range): InlayHint[] {
  const hints: InlayHint[] = [];
  for (const fragment of analysis.model.fragments) {
    const name = fragment.ast.name;
    if (!name) continue;
    const position = toRange(analysis, name.span).end;
    if (range && (position.line < range.start.line || position.line > range.end.line)) continue;
    const figures = analysis.fragmentFigures(fragment.index);
    hints.push({
      position,
      label: fragmentCostLabel(analysis, fragment.index),
      kind: InlayHintKind.Type,
      paddingLeft: true,
      paddingRight: true,
      tooltip: `${figures.tier ?? 'no tier'}: ${figures.active.electrons}e ${figures.active.orbitals}o active${figures.mapping ? `, ${figures.mapping}` : ''}. Planning estimate.`,
    });
  }
  return hints;
}

/** The largest qubit count any quantum-tier fragment needs, or undefined when there is none. */
export function largestQubitCount(analysis: DocumentAnalysis): { fragment: string; qubits: number } | undefined {
  return analysis.largestQubitCount();
}

export function getCodeLenses(analysis: DocumentAnalysis): CodeLens[] {
  const first = analysis.tree.statements[0];
  if (!first) return [];
  // The totals need no point group: the lens asks for the model's counts, not the system figures.
  const model = analysis.model;
  const system = model.system;
  const largest = analysis.largestQubitCount();
  const parts = [
    `${system.atomCount} atoms`,
    `${system.electrons} e⁻`,
    `${system.basisFunctions[system.functions]} ${system.functions} functions`,
    `${model.fragments.length} fragment${model.fragments.length === 1 ? '' : 's'}`,
  ];
  if (largest) parts.push(`largest quantum fragment ${largest.qubits} qubits (${largest.fragment})`);
  if (model.scan) parts.push(`× ${model.scan.distances.length} scan points`);
  const range = toRange(analysis, first.keyword.span);
  return [{ range, command: { title: parts.join(' · '), command: 'tessera.showReport', arguments: [] } }];
}
