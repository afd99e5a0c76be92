/**
 * Quick fixes for diagnostics: the valid multiplicities near the one written, a scan end the step lands on, a word's suggested spelling, a
 * home for unassigned atoms, a basis override line that covers a missing element, the largest
 * active space that fits the qubit limit, the length unit the coordinates look like, and the
 * rewrite of a retired spelling (one statement, or every one in the file).
 */
import { CodeActionKind, type CodeAction, type Diagnostic as LspDiagnostic, type TextEdit, type WorkspaceEdit } from 'vscode-languageserver-types';
import { symmetrize } from '../chemistry/symmetry';
import { fromAngstrom } from '../chemistry/units';
import type { DocumentAnalysis } from '../analysis';
import { describeTarget } from '../language/ast';
import { retiredSpellings, type TextChange } from '../language/migrate';
import { rewriteRetiredSpellings } from '../language/migrateAll';
import { decimalsNeeded } from './format';
import { basisWithout } from '../language/checks/basis';
import { BASIS_RANK, type FragmentModel } from '../language/model';
import { toRange } from './positions';

function edit(uri: string, edits: TextEdit[]): WorkspaceEdit {
  return { changes: { [uri]: edits } };
}

function quickFix(title: string, diagnostic: LspDiagnostic, workspaceEdit: WorkspaceEdit, preferred = false): CodeAction {
  return { title, kind: CodeActionKind.QuickFix, diagnostics: [diagnostic], edit: workspaceEdit, ...(preferred ? { isPreferred: true } : {}) };
}

function endOfDocument(analysis: DocumentAnalysis): { line: number; character: number } {
  return analysis.lines.positionAt(analysis.text.length);
}

/** `#3..#5 #9` style references to atoms, labels where they exist. */
function atomList(analysis: DocumentAnalysis, atoms: readonly number[]): string {
  const parts: string[] = [];
  let i = 0;
  while (i < atoms.length) {
    const first = atoms[i]!;
    const label = analysis.model.atoms[first]!.label;
    let last = first;
    while (!label && i + 1 < atoms.length && atoms[i + 1] === last + 1 && !analysis.model.atoms[atoms[i + 1]!]!.label) {
      i++;
      last = atoms[i]!;
    }
    parts.push(label ?? (last > first ? `#${first + 1}..#${last + 1}` : `#${first + 1}`));
    i++;
  }
  return parts.join(' ');
}

function uniqueFragmentName(analysis: DocumentAnalysis, base: string): string {
  const taken = new Set(analysis.model.fragments.map((f) => f.name));
  if (!taken.has(base)) return base;
  for (let n = 2; ; n++) if (!taken.has(`${base}${n}`)) return `${base}${n}`;
}

function fragmentAtomsEdit(analysis: DocumentAnalysis, fragment: FragmentModel, addition: string): TextEdit | undefined {
  const atoms = fragment.ast.atoms;
  if (atoms) return { range: toRange(analysis, { start: atoms.span.end, end: atoms.span.end }), newText: ` ${addition}` };
  const block = fragment.ast.statement.block;
  if (!block) return undefined;
  // On a line of its own unless the block goes on after `{` on the same line: there the statement
  // has to end with `;` before the next one.
  const rest = analysis.text.slice(block.open.end, lineEndAfter(analysis.text, block.open.end));
  const newText = restIsBlank(rest) ? `\n  atoms ${addition}` : ` atoms ${addition};`;
  return { range: toRange(analysis, { start: block.open.end, end: block.open.end }), newText };
}

function lineEndAfter(text: string, offset: number): number {
  const newline = text.indexOf('\n', offset);
  return newline < 0 ? text.length : newline;
}

/** Whether what follows on a line is only blanks or a comment. */
function restIsBlank(rest: string): boolean {
  const trimmed = rest.trim();
  return trimmed === '' || (trimmed.startsWith('#') && !/^#[0-9]/.test(trimmed));
}

function unassignedFixes(analysis: DocumentAnalysis, uri: string, diagnostic: LspDiagnostic, atoms: readonly number[]): CodeAction[] {
  const actions: CodeAction[] = [];
  const name = uniqueFragmentName(analysis, 'environment');
  const end = endOfDocument(analysis);
  const needsBreak = analysis.text.length > 0 && !analysis.text.endsWith('\n');
  actions.push(
    quickFix(
      `Add a fragment '${name}' that takes the ${atoms.length} unassigned atom${atoms.length === 1 ? '' : 's'} (atoms rest)`,
      diagnostic,
      edit(uri, [{ range: { start: end, end }, newText: `${needsBreak ? '\n' : ''}\nfragment ${name} {\n  atoms rest\n  tier mean-field { method rhf }\n}\n` }]),
      true,
    ),
  );
  const list = atomList(analysis, atoms);
  for (const fragment of analysis.model.fragments.slice(0, 6)) {
    const change = fragmentAtomsEdit(analysis, fragment, list);
    if (change) actions.push(quickFix(`Put the unassigned atoms into fragment '${fragment.name}'`, diagnostic, edit(uri, [change])));
  }
  return actions;
}

/**
 * A basis that defines a missing element, the spec's own choices first. When an override line gave
 * those atoms the basis that lacks it: removing that line (when it gives its basis to no other
 * atom and what the atoms fall back to defines the element), then the spec's own basis (the main
 * line's). After them the library's other bases that define the element. Each basis is offered by
 * renaming the override line that gave the atoms their basis, when that line gives it to no other
 * atom, or else by a new override line after the last basis line, where it wins among lines of its
 * kind: `on all <Element>`, or, when the atoms got their basis from an element line or a line naming
 * them (which a new element line would tie with or not beat), `on` those atoms.
 */
function basisOverrideFixes(analysis: DocumentAnalysis, uri: string, diagnostic: LspDiagnostic, element: string, candidates: readonly string[], line: number, atoms: readonly number[]): CodeAction[] {
  const basis = analysis.model.basis;
  const main = analysis.ast.basis;
  if (!main) return [];
  const decider = line >= 0 ? basis.overrides[line] : undefined;
  const missing = new Set(atoms);
  const ownLine = decider?.ast.name && [...decider.atomRanks.keys()].every((atom) => basis.decidedBy[atom] !== line || missing.has(atom)) ? decider : undefined;
  // A new `all <Element>` line would tie with an element line that stays (a conflict): name the
  // atoms instead, which beats it.
  const namedAtoms = decider && atoms.some((atom) => (decider.atomRanks.get(atom) ?? 0) >= BASIS_RANK.element);
  const lastLine = [main, ...analysis.ast.basisOverrides].reduce((last, current) => (current.statement.span.end > last.statement.span.end ? current : last));
  // After a retired basis block, the new line follows its `}`; comments after it stay on their line.
  const end = lastLine.statement.block?.close?.end ?? lastLine.statement.span.end;
  const at = lineEndAfter(analysis.text, end);
  const defines = new Set(candidates);
  const specBasis = basis.main && defines.has(basis.main.displayName) ? basis.main.displayName : undefined;
  const actions: CodeAction[] = [];
  const offered = new Set<string>();

  // Remove the override: the atoms take what they would have without it.
  const without = ownLine ? basisWithout(basis.overrides, basis.main, atoms[0]!, line) : undefined;
  if (ownLine && without && defines.has(without.displayName)) {
    const on = ownLine.ast.targets.map(describeTarget).join(' ');
    const lineStart = analysis.text.lastIndexOf('\n', ownLine.ast.statement.span.start - 1) + 1;
    const lineEnd = lineEndAfter(analysis.text, ownLine.ast.statement.span.end);
    const change = { range: toRange(analysis, { start: lineStart, end: Math.min(lineEnd + 1, analysis.text.length) }), newText: '' };
    const fallback = without === basis.main ? `the spec’s basis ${without.displayName}` : without.displayName;
    actions.push(quickFix(`Remove the override \`basis ${ownLine.ast.name!.value} on ${on}\` (${element} takes ${fallback})`, diagnostic, edit(uri, [change])));
    offered.add(without.displayName);
  }

  const useBasis = (candidate: string, spec: boolean): CodeAction => {
    const which = spec ? `the spec’s basis ${candidate}` : candidate;
    if (ownLine) {
      const on = ownLine.ast.targets.map(describeTarget).join(' ');
      return quickFix(`Use ${which} for ${element} (basis ${candidate} on ${on})`, diagnostic, edit(uri, [{ range: toRange(analysis, ownLine.ast.name!.span), newText: candidate }]));
    }
    const target = namedAtoms ? atomList(analysis, atoms) : `all ${element}`;
    return quickFix(`Use ${which} for ${element} (basis ${candidate} on ${target})`, diagnostic, edit(uri, [{ range: toRange(analysis, { start: at, end: at }), newText: `\nbasis ${candidate} on ${target}` }]));
  };
  // The spec's own basis, unless removing the override already gives it (or it is the one lacking).
  if (specBasis && decider && !offered.has(specBasis)) {
    actions.push(useBasis(specBasis, true));
    offered.add(specBasis);
  }
  for (const candidate of candidates) {
    if (actions.length >= 4) break;
    if (!offered.has(candidate)) actions.push(useBasis(candidate, false));
    offered.add(candidate);
  }
  return actions.map((action, index) => (index === 0 ? { ...action, isPreferred: true } : action));
}

function textEdits(analysis: DocumentAnalysis, changes: readonly TextChange[]): TextEdit[] {
  return changes.map((change) => ({ range: toRange(analysis, change.span), newText: change.newText }));
}

/** The rewrite of the retired statement a diagnostic marks. */
function retiredFix(analysis: DocumentAnalysis, uri: string, diagnostic: LspDiagnostic): CodeAction[] {
  const start = analysis.lines.offsetAt(diagnostic.range.start);
  const end = analysis.lines.offsetAt(diagnostic.range.end);
  const item = retiredSpellings(analysis.text, analysis.tree, analysis.model).find((found) => found.span.start === start && found.span.end === end);
  if (!item || item.changes.length === 0) return [];
  return [quickFix(item.title, diagnostic, edit(uri, textEdits(analysis, item.changes)), true)];
}

/** Every retired spelling of the file rewritten, as one edit of the part of the text that changes. */
function rewriteAllFix(analysis: DocumentAnalysis, uri: string, diagnostics: readonly LspDiagnostic[]): CodeAction | undefined {
  const rewritten = rewriteRetiredSpellings(analysis.text, analysis.path ? { path: analysis.path } : {}).text;
  if (rewritten === analysis.text) return undefined;
  const old = analysis.text;
  let prefix = 0;
  while (prefix < old.length && prefix < rewritten.length && old[prefix] === rewritten[prefix]) prefix++;
  let suffix = 0;
  while (suffix < old.length - prefix && suffix < rewritten.length - prefix && old[old.length - 1 - suffix] === rewritten[rewritten.length - 1 - suffix]) suffix++;
  const change = { range: toRange(analysis, { start: prefix, end: old.length - suffix }), newText: rewritten.slice(prefix, rewritten.length - suffix) };
  return { title: 'Rewrite every old spelling in this file', kind: CodeActionKind.QuickFix, diagnostics: [...diagnostics], edit: edit(uri, [change]) };
}

function activeSpaceFix(analysis: DocumentAnalysis, uri: string, diagnostic: LspDiagnostic, active: { electrons: number; orbitals: number }): CodeAction[] {
  const range = diagnostic.range;
  const start = analysis.lines.offsetAt(range.start);
  const fragment = analysis.model.fragments.find((f) => f.ast.tier && start >= f.ast.tier.statement.span.start && start <= f.ast.tier.statement.span.end);
  const tier = fragment?.ast.tier;
  if (!fragment || !tier) return [];
  const text = `active ${active.electrons}e ${active.orbitals}o`;
  let change: TextEdit;
  if (tier.active) change = { range: toRange(analysis, tier.active.span), newText: text };
  else if (tier.statement.block) change = { range: toRange(analysis, { start: tier.statement.block.open.end, end: tier.statement.block.open.end }), newText: ` ${text};` };
  else return [];
  return [quickFix(`Shrink the active space of '${fragment.name}' to ${active.electrons}e ${active.orbitals}o`, diagnostic, edit(uri, [change]), true)];
}

/** Names the unit in the structure header (or in a retired `units` line, where one still sets it). */
function unitsFix(analysis: DocumentAnalysis, uri: string, diagnostic: LspDiagnostic, units: string): CodeAction[] {
  const geometry = analysis.ast.geometry;
  if (!geometry || geometry.include) return [];
  const keyword = geometry.statement.keyword;
  let change: TextEdit;
  if (geometry.unit) change = { range: toRange(analysis, geometry.unit.span), newText: units };
  else if (analysis.ast.legacyUnits) change = { range: toRange(analysis, analysis.ast.legacyUnits.span), newText: units };
  else change = { range: toRange(analysis, keyword.span), newText: `structure in ${units}` };
  return [quickFix(`Read the coordinates as ${units}`, diagnostic, edit(uri, [change]))];
}

/** Rewrites every inline coordinate with the geometry made exactly symmetric in its near group. */
function symmetrizeFix(analysis: DocumentAnalysis, uri: string, diagnostic: LspDiagnostic): CodeAction[] {
  const geometry = analysis.ast.geometry;
  const figures = analysis.estimates.systemSymmetry();
  if (!geometry || geometry.include || !figures?.symmetry.nearGroup) return [];
  const atoms = geometry.atoms;
  if (atoms.length !== analysis.model.atoms.length) return [];
  const symmetric = symmetrize(analysis.model.coordinates, figures.symmetry);
  let decimals = 4;
  for (let i = 0; i < atoms.length; i++) {
    for (let axis = 0; axis < 3; axis++) {
      const span = atoms.coordinateSpan(i, axis);
      decimals = Math.max(decimals, Math.min(10, decimalsNeeded(analysis.text.slice(span.start, span.end))));
    }
  }
  const edits: TextEdit[] = [];
  for (let i = 0; i < atoms.length; i++) {
    for (let axis = 0; axis < 3; axis++) {
      const value = fromAngstrom(symmetric[3 * i + axis]!, analysis.model.units);
      const text = (Math.abs(value) < 0.5 * 10 ** -decimals ? 0 : value).toFixed(decimals);
      const span = atoms.coordinateSpan(i, axis);
      if (analysis.text.slice(span.start, span.end) !== text) edits.push({ range: toRange(analysis, span), newText: text });
    }
  }
  return edits.length > 0 ? [quickFix(`Symmetrize the geometry to ${figures.symmetry.nearGroup.group}`, diagnostic, edit(uri, edits), true)] : [];
}

export function getCodeActions(analysis: DocumentAnalysis, uri: string, diagnostics: readonly LspDiagnostic[]): CodeAction[] {
  const actions: CodeAction[] = [];
  const retired: LspDiagnostic[] = [];
  for (const diagnostic of diagnostics) {
    if (diagnostic.source !== undefined && diagnostic.source !== 'tessera') continue;
    const data = (diagnostic.data ?? {}) as Record<string, unknown>;
    const code = (data['code'] as string | undefined) ?? String(diagnostic.code ?? '');
    if ((code === 'multiplicity-parity' || code === 'multiplicity-too-high' || code === 'spin-coupling') && typeof data['multiplicity'] === 'number') {
      // Every valid value near the one written (both neighbours of a wrong parity), the first preferred.
      const values = Array.isArray(data['multiplicities']) ? (data['multiplicities'] as unknown[]).filter((value): value is number => typeof value === 'number') : [data['multiplicity']];
      values.forEach((value, i) => actions.push(quickFix(`Set the multiplicity to ${value}`, diagnostic, edit(uri, [{ range: diagnostic.range, newText: String(value) }]), i === 0)));
    } else if (code === 'scan-end-missed' && Array.isArray(data['ends'])) {
      // The two ends the step does land on: the last point reached, and one step further.
      (data['ends'] as unknown[]).filter((end): end is number => typeof end === 'number').forEach((end, i) => actions.push(quickFix(`Change the end to ${end}`, diagnostic, edit(uri, [{ range: diagnostic.range, newText: String(end) }]), i === 0)));
    } else if (typeof data['replacement'] === 'string') {
      actions.push(quickFix(`Replace with '${data['replacement']}'`, diagnostic, edit(uri, [{ range: diagnostic.range, newText: data['replacement'] }]), true));
    } else if (code === 'atoms-unassigned' && Array.isArray(data['atoms'])) {
      actions.push(...unassignedFixes(analysis, uri, diagnostic, data['atoms'] as number[]));
    } else if (code === 'basis-missing-element' && typeof data['element'] === 'string' && Array.isArray(data['candidates'])) {
      actions.push(...basisOverrideFixes(analysis, uri, diagnostic, data['element'], data['candidates'] as string[], Number(data['line'] ?? -1), (data['atoms'] as number[] | undefined) ?? []));
    } else if (code === 'retired-spelling') {
      actions.push(...retiredFix(analysis, uri, diagnostic));
      retired.push(diagnostic);
    } else if (code === 'qubit-limit-exceeded' && data['active']) {
      actions.push(...activeSpaceFix(analysis, uri, diagnostic, data['active'] as { electrons: number; orbitals: number }));
    } else if (code === 'near-symmetry') {
      actions.push(...symmetrizeFix(analysis, uri, diagnostic));
    } else if (code === 'units-suspect' && typeof data['units'] === 'string') {
      actions.push(...unitsFix(analysis, uri, diagnostic, data['units']));
    }
  }
  // One action for the whole file, offered with any old spelling the request covers.
  if (retired.length > 0) {
    const all = rewriteAllFix(analysis, uri, retired);
    if (all) actions.push(all);
  }
  return withoutIncludedEdits(analysis, uri, actions);
}

/**
 * Fragments taken from another spec have their syntax at the `with fragments` words of this one
 * (language/model/includedFragments.ts): a fix for them belongs in that spec, so no edit may touch
 * those words.
 */
function withoutIncludedEdits(analysis: DocumentAnalysis, uri: string, actions: CodeAction[]): CodeAction[] {
  const taken = analysis.ast.geometry?.withFragments;
  if (!taken) return actions;
  const touches = (edit: TextEdit) => {
    const start = analysis.lines.offsetAt(edit.range.start);
    const end = analysis.lines.offsetAt(edit.range.end);
    return end >= taken.start && start <= taken.end;
  };
  return actions.filter((action) => !(action.edit?.changes?.[uri] ?? []).some(touches));
}
