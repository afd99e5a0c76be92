/** The outline of a spec (structure, basis lines, fragments, scan, limits) and workspace symbols. */
import { SymbolKind, type DocumentSymbol, type SymbolInformation } from 'vscode-languageserver-types';
import type { DocumentAnalysis } from '../analysis';
import type { Statement } from '../language/syntax';
import { fragmentCostLabel } from './hints';
import { toRange } from './positions';

const KINDS: Readonly<Record<string, SymbolKind>> = {
  spec: SymbolKind.File,
  basis: SymbolKind.Module,
  structure: SymbolKind.Struct,
  geometry: SymbolKind.Struct,
  fragment: SymbolKind.Class,
  embedding: SymbolKind.Property,
  scan: SymbolKind.Event,
  limits: SymbolKind.Object,
};

function detailOf(analysis: DocumentAnalysis, statement: Statement): string {
  const model = analysis.model;
  switch (statement.keyword.text) {
    case 'structure':
    case 'geometry':
      return `${model.atoms.length} atoms, ${model.units === 'bohr' ? 'bohr' : 'ångström'}`;
    case 'fragment': {
      const fragment = model.fragments.find((f) => f.ast.statement === statement);
      if (!fragment) return '';
      return `${fragment.tier?.level ?? 'no tier'} · ${fragment.atoms.length} atoms · ${fragmentCostLabel(analysis, fragment.index)}`;
    }
    case 'scan':
      return model.scan ? `${model.scan.values.length} points` : '';
    default:
      return statement.args.map((arg) => arg.text).join(' ');
  }
}

function nameOf(statement: Statement): string {
  const first = statement.args[0];
  if (statement.keyword.text === 'fragment' || statement.keyword.text === 'spec' || statement.keyword.text === 'basis') {
    return first ? `${statement.keyword.text} ${first.text}` : statement.keyword.text;
  }
  return statement.keyword.text;
}

export function findDocumentSymbols(analysis: DocumentAnalysis): DocumentSymbol[] {
  const symbols: DocumentSymbol[] = [];
  for (const statement of analysis.tree.statements) {
    const kind = KINDS[statement.keyword.text];
    if (kind === undefined || statement.keyword.kind !== 'word') continue;
    const selection = statement.keyword.text === 'fragment' && statement.args[0] ? statement.args[0].span : statement.keyword.span;
    const symbol: DocumentSymbol = {
      name: nameOf(statement),
      detail: detailOf(analysis, statement),
      kind,
      range: toRange(analysis, statement.span),
      selectionRange: toRange(analysis, selection),
    };
    if (statement.keyword.text === 'fragment' && statement.block) {
      const tier = statement.block.statements.find((inner) => inner.keyword.text === 'tier');
      if (tier) {
        symbol.children = [{ name: `tier ${tier.args[0]?.text ?? ''}`.trim(), kind: SymbolKind.Method, range: toRange(analysis, tier.span), selectionRange: toRange(analysis, tier.keyword.span) }];
      }
    }
    symbols.push(symbol);
  }
  return symbols;
}

/** Fragments and specs of the given documents whose names contain the query (case-insensitive). */
export function findWorkspaceSymbols(documents: readonly { uri: string; analysis: DocumentAnalysis }[], query: string): SymbolInformation[] {
  const wanted = query.toLowerCase();
  const found: SymbolInformation[] = [];
  for (const { uri, analysis } of documents) {
    const specName = analysis.model.name;
    for (const fragment of analysis.model.fragments) {
      if (!fragment.ast.name || !fragment.name.toLowerCase().includes(wanted)) continue;
      found.push({
        name: fragment.name,
        kind: SymbolKind.Class,
        location: { uri, range: toRange(analysis, fragment.ast.name.span) },
        ...(specName ? { containerName: specName } : {}),
      });
    }
    if (specName && specName.toLowerCase().includes(wanted) && analysis.ast.name) {
      found.push({ name: specName, kind: SymbolKind.File, location: { uri, range: toRange(analysis, analysis.ast.name.span) } });
    }
  }
  return found;
}
