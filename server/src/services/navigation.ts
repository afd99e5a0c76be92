/**
 * Go to definition, find references, rename and document highlights for atom labels (defined in
 * the structure, referenced by selectors, basis lines and scans) and fragment names (referenced by
 * `basis … on fragment <name>`).
 */
import { DocumentHighlightKind, type DocumentHighlight, type Location, type Position, type Range, type TextEdit, type WorkspaceEdit } from 'vscode-languageserver-types';
import type { DocumentAnalysis } from '../analysis';
import type { Span } from '../language/text';
import { atomAt } from './hover';
import { includedFragmentLocation, onlyIncluded } from './includedFragments';
import { locate } from './locate';
import { toOffset, toRange } from './positions';

export interface SymbolOccurrences {
  readonly kind: 'atom' | 'fragment';
  readonly name: string;
  /** Where it is defined (an atom's label or line, a fragment's name). */
  readonly definition: Span;
  /** Where it is used (label references only; `#n` references do not change with a rename). */
  readonly references: readonly Span[];
  /** `#n` references, which point at the same atom but carry no name. */
  readonly indexReferences: readonly Span[];
  /** A fragment taken from another spec: its name there (go to definition leads there). */
  readonly external?: Location;
}

export function occurrencesAt(analysis: DocumentAnalysis, position: Position): SymbolOccurrences | undefined {
  const offset = toOffset(analysis, position);
  const context = locate(analysis.text, analysis.tree.statements, offset);
  const token = context.token;
  if (!token) return undefined;
  const { model } = analysis;
  const atom = atomAt(analysis, context);
  if (atom !== undefined) {
    const entry = model.atoms[atom]!;
    const uses = model.atomReferences.filter((ref) => ref.atom === atom);
    return {
      kind: 'atom',
      name: entry.label ?? `#${atom + 1}`,
      definition: entry.labelSpan ?? entry.span,
      references: uses.filter((ref) => ref.kind === 'label').map((ref) => ref.span),
      indexReferences: uses.filter((ref) => ref.kind === 'index').map((ref) => ref.span),
    };
  }
  const uses = fragmentReferences(analysis);
  const used = uses.find((use) => use.span.start === token.node.span.start);
  // A fragment taken from another spec has no name of its own here (its spans are `with fragments`).
  const fragment = model.fragments.find((f) => f.ast.name && ((!onlyIncluded(f) && f.ast.name.span.start === token.node.span.start) || f.name === used?.name));
  if (fragment?.ast.name) {
    const references = uses.filter((use) => use.name === fragment.name).map((use) => use.span);
    const external = includedFragmentLocation(fragment);
    return { kind: 'fragment', name: fragment.name, definition: fragment.ast.name.span, references, indexReferences: [], ...(external ? { external } : {}) };
  }
  return undefined;
}

/** `on fragment <name>` in basis lines: where fragment names are used. */
function fragmentReferences(analysis: DocumentAnalysis): { name: string; span: Span }[] {
  return analysis.ast.basisOverrides.flatMap((line) => line.targets.flatMap((target) => (target.kind === 'fragment' ? [{ name: target.name.value, span: target.name.span }] : [])));
}

export function findDefinition(analysis: DocumentAnalysis, uri: string, position: Position): Location | null {
  const found = occurrencesAt(analysis, position);
  if (!found) return null;
  return found.external ?? { uri, range: toRange(analysis, found.definition) };
}

export function findReferences(analysis: DocumentAnalysis, uri: string, position: Position, includeDeclaration: boolean): Location[] {
  const found = occurrencesAt(analysis, position);
  if (!found) return [];
  const spans = [...(includeDeclaration ? [found.definition] : []), ...found.references, ...found.indexReferences];
  return spans.map((span) => ({ uri, range: toRange(analysis, span) }));
}

export function findDocumentHighlights(analysis: DocumentAnalysis, position: Position): DocumentHighlight[] {
  const found = occurrencesAt(analysis, position);
  if (!found) return [];
  return [
    { range: toRange(analysis, found.definition), kind: DocumentHighlightKind.Write },
    ...[...found.references, ...found.indexReferences].map((span) => ({ range: toRange(analysis, span), kind: DocumentHighlightKind.Read })),
  ];
}

const NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;
/** Words that `atoms` and basis lines read as selectors: a label spelt like one would stop naming its atom there. */
const SELECTOR_WORDS = new Set(['rest', 'all', 'fragment', 'within']);

export type RenameCheck = { ok: true; range: Range; placeholder: string } | { ok: false; message: string };

export function prepareRename(analysis: DocumentAnalysis, position: Position): RenameCheck {
  const found = occurrencesAt(analysis, position);
  if (!found) return { ok: false, message: 'Only atom labels and fragment names can be renamed.' };
  if (found.external) return { ok: false, message: `Fragment '${found.name}' is taken from ${found.external.uri} (\`with fragments\`); rename it there.` };
  const offset = toOffset(analysis, position);
  const atomEntry = found.kind === 'atom' ? analysis.model.atoms.find((atom) => atom.labelSpan === found.definition) : undefined;
  if (found.kind === 'atom' && !atomEntry) return { ok: false, message: 'This atom has no label to rename; add one after its element symbol.' };
  const spans = [found.definition, ...found.references];
  const under = spans.find((span) => offset >= span.start && offset <= span.end);
  if (!under) {
    const onIndex = found.indexReferences.some((span) => offset >= span.start && offset <= span.end);
    return { ok: false, message: onIndex ? 'A #index names the atom by position; rename its label instead.' : `Put the cursor on the label '${found.name}' to rename it.` };
  }
  return { ok: true, range: toRange(analysis, under), placeholder: found.name };
}

export function rename(analysis: DocumentAnalysis, uri: string, position: Position, newName: string): WorkspaceEdit | { error: string } {
  const check = prepareRename(analysis, position);
  if (!check.ok) return { error: check.message };
  if (!NAME.test(newName)) return { error: `'${newName}' is not a valid name: use letters, digits and _, starting with a letter.` };
  const found = occurrencesAt(analysis, position)!;
  if (found.kind === 'atom' && SELECTOR_WORDS.has(newName)) return { error: `'${newName}' cannot be a label: \`atoms ${newName}\` is a selector.` };
  const taken = found.kind === 'atom' ? analysis.model.labels.has(newName) : analysis.model.fragments.some((f) => f.name === newName);
  if (taken && newName !== found.name) return { error: `'${newName}' is already the name of another ${found.kind}.` };
  const edits: TextEdit[] = [found.definition, ...found.references].map((span) => ({ range: toRange(analysis, span), newText: newName }));
  return { changes: { [uri]: edits } };
}
