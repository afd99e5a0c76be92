/**
 * Completion that knows where the cursor is: only the keywords of the block it stands in, and
 * after a keyword only the values that keyword takes (basis sets ranked by coverage of the
 * file's elements, methods of the enclosing tier, atom labels in selectors, ...). Every keyword,
 * method, embedding and other word of the vocabulary comes with its documentation from the table
 * in language/vocabulary.ts. Snippets (snippets.ts) only where a statement starts on its own line.
 * A space typed where a statement starts (indentation) opens no list, so that the Enter that
 * follows makes a new line rather than accepting a keyword.
 */
import { CompletionItemKind, InsertTextFormat, MarkupKind, type CompletionItem, type CompletionList, type MarkupContent, type Position } from 'vscode-languageserver-types';
import { allBasisSets } from '../chemistry/basis/library';
import { ELEMENTS } from '../chemistry/elements';
import { MEMORY_UNITS } from '../chemistry/units';
import { SCAN_ATOM_COUNTS } from '../chemistry/scan';
import type { DocumentAnalysis } from '../analysis';
import type { Statement } from '../language/syntax';
import {
  ACTIVE_CHOICES,
  ANSATZE,
  BASIS_TARGET_WORDS,
  EMBEDDINGS,
  FUNCTION_TERMS,
  keywordsFor,
  MAPPING_TERMS,
  methodsForTier,
  SCAN_CLAUSES,
  SCAN_KINDS,
  SELECTOR_WORDS,
  SWITCH_TERMS,
  TIER_LEVELS,
  UNIT_TERMS,
  type BlockKind,
  type TermInfo,
  type TierLevel,
  ENERGY_UNIT_TERMS,
} from '../language/vocabulary';
import { locate, type CursorContext } from './locate';
import { SNIPPETS } from './snippets';
import { toOffset, toRange } from './positions';

/** Keywords that may appear more than once in their block (basis: one main line and its overrides). */
const REPEATABLE = new Set(['fragment', 'basis']);

/** The two words after another spec's name in `structure from "base.tess" with fragments`. */
const WITH_FRAGMENTS_WORDS = [
  { name: 'with', summary: '`structure from "base.tess" with fragments`: take the other spec\'s fragments as well as its atoms; a `fragment` of the same name here patches one.' },
  { name: 'fragments', summary: '`with fragments`: the other spec\'s fragments come first, then this spec\'s; a fragment of the same name patches the included one statement by statement.' },
] as const;

/** Elements offered in a structure block before any atom is written: the common ones first. */
const COMMON_ELEMENTS = ['H', 'C', 'N', 'O', 'F', 'P', 'S', 'Cl', 'Br', 'I', 'Fe', 'Co', 'Ni', 'Cu', 'Zn', 'Mn', 'Cr', 'Ti', 'Pd', 'Pt'];

/** A word's documentation: its summary, how its cost grows and its reference, where the table has them. */
export function termDocumentation(term: TermInfo): MarkupContent {
  return {
    kind: MarkupKind.Markdown,
    value: [term.summary, ...(term.scaling ? [`Cost: ${term.scaling}.`] : []), ...(term.reference ? [`_${term.reference}_`] : [])].join('\n\n'),
  };
}

function terms(list: readonly TermInfo[], kind: CompletionItemKind): CompletionItem[] {
  return list.map((term) => ({ label: term.name, kind, detail: term.summary, documentation: termDocumentation(term) }));
}

function present(statements: readonly Statement[]): Set<string> {
  return new Set(statements.map((statement) => statement.keyword.text));
}

function keywordItems(context: CursorContext, analysis: DocumentAnalysis): CompletionItem[] {
  const siblings = context.parents.length > 0 ? (context.parents[context.parents.length - 1]!.block?.statements ?? []) : analysis.tree.statements;
  const used = present(siblings.filter((s) => s !== context.statement));
  return keywordsFor(context.block)
    .filter((keyword) => REPEATABLE.has(keyword.name) || !used.has(keyword.name))
    .map((keyword) => ({ label: keyword.name, kind: CompletionItemKind.Keyword, detail: keyword.syntax, documentation: { kind: MarkupKind.Markdown, value: `\`${keyword.syntax}\`\n\n${keyword.summary}` } }));
}

function elementItems(analysis: DocumentAnalysis): CompletionItem[] {
  const inFile = [...new Set(analysis.model.atoms.map((atom) => atom.element.symbol))];
  const order = [...inFile, ...COMMON_ELEMENTS.filter((s) => !inFile.includes(s)), ...ELEMENTS.map((e) => e.symbol).filter((s) => !inFile.includes(s) && !COMMON_ELEMENTS.includes(s))];
  return order.map((symbol, rank) => {
    const element = ELEMENTS.find((e) => e.symbol === symbol)!;
    return { label: symbol, kind: CompletionItemKind.Constant, detail: `${element.name}, Z = ${element.z}`, sortText: String(rank).padStart(4, '0') };
  });
}

/** Basis sets, those defining every element wanted first; the others say which element they lack. */
export function basisItems(analysis: DocumentAnalysis, wanted?: readonly string[]): CompletionItem[] {
  const elements = wanted ?? [...new Set(analysis.model.atoms.map((atom) => atom.element.symbol))];
  return allBasisSets().map((basis, rank) => {
    const missing = elements.filter((symbol) => !basis.shellsFor(symbol));
    return {
      label: basis.displayName,
      kind: CompletionItemKind.Module,
      detail: missing.length === 0 ? `${basis.family.title}: covers every element here` : `lacks ${missing.slice(0, 4).join(', ')}${missing.length > 4 ? ', …' : ''}`,
      sortText: `${missing.length === 0 ? 0 : 1}${String(rank).padStart(3, '0')}`,
    };
  });
}

function labelItems(analysis: DocumentAnalysis): CompletionItem[] {
  return [...analysis.model.labels.entries()].map(([label, atom]) => ({
    label,
    kind: CompletionItemKind.Variable,
    detail: `atom #${atom + 1} ${analysis.model.atoms[atom]!.element.symbol}`,
  }));
}

function fragmentItems(analysis: DocumentAnalysis): CompletionItem[] {
  return analysis.model.fragments.map((fragment) => ({ label: fragment.name, kind: CompletionItemKind.Class, detail: `fragment, ${fragment.atoms.length} atoms` }));
}

function keywordItem(term: TermInfo): CompletionItem {
  return { label: term.name, kind: CompletionItemKind.Keyword, detail: term.summary, documentation: termDocumentation(term) };
}

const SELECTOR_TERMS = SELECTOR_WORDS.filter((term) => term.name !== 'to');

/**
 * The selector being typed at argument `index` (the selectors start at `first`): after `all` an
 * element, after `closer-than` a number then `to` then an atom, else an atom or a selector word.
 */
function selectorItems(analysis: DocumentAnalysis, args: Statement['args'], index: number, first: number, forBasis: boolean): CompletionItem[] {
  const previous = args[index - 1]?.text;
  if (index <= first - 1) return [];
  if (previous === 'all') return elementItems(analysis).slice(0, new Set(analysis.model.atoms.map((a) => a.element.symbol)).size || 20);
  if (previous === 'closer-than') return [];
  if (args[index - 2]?.text === 'closer-than') return [keywordItem(SELECTOR_WORDS.find((term) => term.name === 'to')!)];
  // `closer-than <d> to` names one atom: selector words do not belong there.
  if (previous === 'to' && args[index - 3]?.text === 'closer-than') return labelItems(analysis);
  if (forBasis && previous === 'fragment') return fragmentItems(analysis);
  const words = forBasis ? [...SELECTOR_TERMS.filter((term) => term.name !== 'rest'), BASIS_TARGET_WORDS.find((term) => term.name === 'fragment')!] : SELECTOR_TERMS;
  return [...labelItems(analysis), ...terms(words, CompletionItemKind.Keyword)];
}

/** The elements of the atoms an override line selects, so that its basis list ranks by them. */
function overrideElements(analysis: DocumentAnalysis, statement: Statement): string[] | undefined {
  const line = analysis.model.basis.overrides.find((override) => override.ast.statement === statement);
  if (!line || line.atomRanks.size === 0) return undefined;
  return [...new Set([...line.atomRanks.keys()].map((atom) => analysis.model.atoms[atom]!.element.symbol))];
}

function tierLevelOf(context: CursorContext): TierLevel | undefined {
  const tier = [...context.parents].reverse().find((statement) => statement.keyword.text === 'tier');
  const level = tier?.args[0]?.text;
  return TIER_LEVELS.some((t) => t.name === level) ? (level as TierLevel) : undefined;
}

function multiplicityItems(electrons: number): CompletionItem[] {
  const items: CompletionItem[] = [];
  for (let m = electrons % 2 === 0 ? 1 : 2; m <= Math.min(electrons + 1, 9); m += 2) {
    items.push({ label: String(m), kind: CompletionItemKind.Value, detail: `valid for ${electrons} electrons` });
  }
  return items;
}

function valueItems(context: CursorContext, analysis: DocumentAnalysis): CompletionItem[] {
  const statement = context.statement!;
  const keyword = statement.keyword.text;
  const index = context.argumentIndex;
  const previous = statement.args[index - 1]?.text;
  const block: BlockKind = context.block;
  if (block === 'structure') return [];
  switch (keyword) {
    case 'structure':
      if (index === 0)
        return [
          { name: 'in', summary: '`structure in bohr { … }`: the length unit of the atoms and of every distance in the spec (ångström unless given).' },
          { name: 'from', summary: '`structure from "file.xyz"`: the atoms of an XYZ file (in ångström, by the XYZ convention), or of another spec.' },
        ].map(keywordItem);
      if (index === 1 && previous === 'in') return terms(UNIT_TERMS, CompletionItemKind.EnumMember);
      // After another spec's name: `with fragments` takes its fragments too.
      if (statement.args[0]?.text === 'from' && /\.tess"?$/i.test(statement.args[1]?.text ?? '')) {
        if (index === 2) return [keywordItem(WITH_FRAGMENTS_WORDS[0]!)];
        if (index === 3 && previous === 'with') return [keywordItem(WITH_FRAGMENTS_WORDS[1]!)];
      }
      return [];
    case 'basis':
      if (block !== 'top') return [];
      if (index === 0) return basisItems(analysis, overrideElements(analysis, statement));
      if (index === 1) return [keywordItem(BASIS_TARGET_WORDS.find((term) => term.name === 'on')!)];
      return statement.args[1]?.text === 'on' ? selectorItems(analysis, statement.args, index, 2, true) : [];
    case 'functions':
      return index === 0 ? terms(FUNCTION_TERMS, CompletionItemKind.EnumMember) : [];
    case 'frozen-core':
    case 'taper':
      return index === 0 ? terms(SWITCH_TERMS, CompletionItemKind.EnumMember) : [];
    case 'embedding':
      return index === 0 ? terms(EMBEDDINGS, CompletionItemKind.EnumMember) : [];
    case 'accuracy':
      return index === 1 ? terms(ENERGY_UNIT_TERMS, CompletionItemKind.Unit) : [];
    case 'tier':
      return index === 0 ? terms(TIER_LEVELS, CompletionItemKind.EnumMember) : [];
    case 'method': {
      const level = tierLevelOf(context);
      return index === 0 ? terms(level ? methodsForTier(level) : [], CompletionItemKind.EnumMember) : [];
    }
    case 'ansatz':
      return index === 0 ? terms(ANSATZE, CompletionItemKind.EnumMember) : [];
    case 'active':
      if (index === 0) return terms(ACTIVE_CHOICES, CompletionItemKind.EnumMember);
      return statement.args[0]?.text === 'shells' ? labelItems(analysis) : [];
    case 'mapping':
      return index === 0 ? terms(MAPPING_TERMS, CompletionItemKind.EnumMember) : [];
    case 'multiplicity': {
      if (index !== 0) return [];
      const fragment = block === 'fragment' ? analysis.model.fragments.find((f) => f.ast.statement === context.parents[context.parents.length - 1]) : undefined;
      return multiplicityItems((fragment?.space ?? analysis.model.system).electrons);
    }
    case 'atoms':
      return selectorItems(analysis, statement.args, index, 0, false);
    case 'scan': {
      if (index === 0) return terms(SCAN_KINDS, CompletionItemKind.EnumMember);
      // A distance names two atoms, an angle three, a dihedral four.
      const kind = statement.args[0]?.text;
      const atomCount = kind === 'angle' || kind === 'dihedral' || kind === 'distance' ? SCAN_ATOM_COUNTS[kind] : 2;
      if (index >= 1 && index <= atomCount) return labelItems(analysis);
      const given = new Set(statement.args.map((arg) => arg.text));
      const expectsNumber = ['from', 'to', 'step', 'points'].includes(previous ?? '');
      if (expectsNumber) return [];
      const clauses = SCAN_CLAUSES.filter((clause) => !given.has(clause.name) && !(clause.name === 'points' && given.has('step')) && !(clause.name === 'step' && given.has('points')));
      // After `moving` the atoms that move, then the clauses not yet given.
      return given.has('moving') && statement.args.findIndex((arg) => arg.text === 'moving') < index ? [...labelItems(analysis), ...terms(clauses, CompletionItemKind.Keyword)] : terms(clauses, CompletionItemKind.Keyword);
    }
    case 'memory':
      return index === 1 ? Object.keys(MEMORY_UNITS).map((unit) => ({ label: unit, kind: CompletionItemKind.Unit })) : [];
    default:
      return [];
  }
}

export interface CompletionOptions {
  /** Whether the editor expands snippet syntax (LSP `snippetSupport`); without it no snippet is offered. */
  snippets?: boolean;
  /** The character whose typing asked for completion, if one did. */
  triggerCharacter?: string;
}

/** Snippets that may start a statement in this block, where nothing but blanks precedes the word on its line. */
function snippetItems(analysis: DocumentAnalysis, context: CursorContext, offset: number): CompletionItem[] {
  const wordStart = context.token?.index === -1 ? context.token.node.span.start : offset;
  const lineStart = analysis.text.lastIndexOf('\n', wordStart - 1) + 1;
  if (analysis.text.slice(lineStart, wordStart).trim() !== '') return [];
  const emptySpec = analysis.tree.statements.every((statement) => statement === context.statement);
  return SNIPPETS.filter((snippet) => snippet.blocks.includes(context.block) && (!snippet.emptySpecOnly || emptySpec)).map((snippet, rank) => ({
    label: snippet.label,
    kind: CompletionItemKind.Snippet,
    detail: snippet.description,
    documentation: { kind: MarkupKind.Markdown, value: `${snippet.description}\n\n\`\`\`tessera\n${snippet.body.replace(/\$\{\d+\|([^,|]*)[^}]*\}/g, '$1').replace(/\$\{\d+:([^}]*)\}/g, '$1').replace(/\$\d+/g, '')}\n\`\`\`` },
    insertText: snippet.body,
    insertTextFormat: InsertTextFormat.Snippet,
    filterText: snippet.label.split(' ').pop()!,
    sortText: `~${rank}`, // after the keywords
  }));
}

export function doComplete(analysis: DocumentAnalysis, position: Position, options: CompletionOptions = {}): CompletionList {
  const offset = toOffset(analysis, position);
  const context = locate(analysis.text, analysis.tree.statements, offset);
  const atStatementStart = !context.statement || context.token?.index === -1;
  // A space typed where a statement starts is indentation, not a request.
  if (atStatementStart && options.triggerCharacter === ' ') return { isIncomplete: false, items: [] };
  let items: CompletionItem[];
  if (atStatementStart) {
    if (context.block === 'structure') items = elementItems(analysis);
    else items = [...keywordItems(context, analysis), ...(options.snippets ? snippetItems(analysis, context, offset) : [])];
  } else {
    items = valueItems(context, analysis);
  }
  // Replace the word being typed, if any.
  const token = context.token;
  if (token && (token.node.kind === 'word' || token.node.kind === 'number')) {
    const range = toRange(analysis, token.node.span);
    items = items.map((item) => ({ ...item, textEdit: { range, newText: item.insertText ?? item.label } }));
  }
  return { isIncomplete: false, items };
}
