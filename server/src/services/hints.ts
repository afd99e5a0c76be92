/** Inlay hints after each fragment name, and a code lens with the totals above the spec. */
import { InlayHintKind, type CodeLens, type InlayHint, type Range } from 'vscode-languageserver-types';
import { formatRate } from '../chemistry/cost/format';
import { mappingKey, type Mapping } from '../chemistry/qubits';
import type { DocumentAnalysis, FragmentFigures } from '../analysis';
import { toRange } from './positions';
import { onlyIncluded } from './includedFragments';

/** Qubits under the fragment's mapping before tapering, or null outside the quantum tier. */
function untaperedQubits(figures: FragmentFigures): number | null {
  if (figures.qubitsRequired === null || !figures.mapping || !figures.qubits) return null;
  return figures.qubits[mappingKey(figures.mapping as Mapping)];
}

/** `impurity 70e 130o` for a fragment solved in its DMET impurity. */
function impurityText(figures: FragmentFigures): string | undefined {
  const problem = figures.problem;
  return problem?.embedding === 'dmet' ? `impurity ${problem.electrons}e ${problem.orbitals}o` : undefined;
}

/**
 * The short cost label of a fragment, as shown in hints and the outline: for the quantum tier its
 * qubits (`20 qubits · 18 tapered`), for a classical tier its solver's time and memory
 * (`ccsd(t) 21 min · 2.3 GiB`), and the DMET impurity's size under DMET; without figures, the
 * fragment's orbitals and electrons (counted by the model).
 */
export function fragmentCostLabel(analysis: DocumentAnalysis, index: number): string {
  const fragment = analysis.model.fragments[index]!;
  if (!fragment.tier) return `${fragment.space.orbitals} orbitals · ${fragment.space.electrons} e⁻`;
  const figures = analysis.fragmentFigures(index);
  const parts: string[] = [];
  const qubits = untaperedQubits(figures);
  if (qubits !== null) {
    const tapered = figures.qubits!.tapered;
    parts.push(tapered !== null && tapered < qubits ? `${qubits} qubits · ${tapered} tapered` : `${qubits} qubits`);
  } else if (figures.solverCost) {
    parts.push(`${figures.solverCost.method} ${figures.solverCost.time.text} · ${figures.solverCost.memoryBytes.text}`);
  } else {
    parts.push(`${fragment.space.orbitals} orbitals · ${fragment.space.electrons} e⁻`);
  }
  const impurity = impurityText(figures);
  if (impurity) parts.push(impurity);
  return parts.join(' · ');
}

function hintTooltip(figures: FragmentFigures): string {
  const what = figures.active ? `${figures.active.electrons}e ${figures.active.orbitals}o active` : `${figures.orbitals} orbitals`;
  const cost = figures.solverCost ? `; ${figures.solverCost.operations.text} operations, ${figures.solverCost.memoryBytes.text}, ${figures.solverCost.time.text} at ${formatRate(figures.solverCost.time.flopsPerSecond)}` : '';
  return `${figures.tier ?? 'no tier'}: ${what}${figures.mapping ? `, ${figures.mapping}` : ''}${cost}. Planning estimate.`;
}

/** Hints for the fragments whose names lie in the range (the visible lines); only those are estimated. */
export function getInlayHints(analysis: DocumentAnalysis, range?: Range): InlayHint[] {
  const hints: InlayHint[] = [];
  for (const fragment of analysis.model.fragments) {
    const name = fragment.ast.name;
    // A fragment taken whole from another spec has no name in this text to stand beside.
    if (!name || onlyIncluded(fragment)) continue;
    const position = toRange(analysis, name.span).end;
    if (range && (position.line < range.start.line || position.line > range.end.line)) continue;
    const figures = analysis.fragmentFigures(fragment.index);
    hints.push({
      position,
      label: fragmentCostLabel(analysis, fragment.index),
      kind: InlayHintKind.Type,
      paddingLeft: true,
      paddingRight: true,
      tooltip: hintTooltip(figures),
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
  if (model.scan) parts.push(`× ${model.scan.values.length} scan points`);
  const range = toRange(analysis, first.keyword.span);
  return [{ range, command: { title: parts.join(' · '), command: 'tessera.showReport', arguments: [] } }];
}
