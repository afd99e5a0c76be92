/**
 * Semantic tokens: keywords, element symbols, atom labels, fragment names, value words, basis
 * names, numbers (with their units), strings, comments and operators.
 */
import type { SemanticTokens, SemanticTokensLegend } from 'vscode-languageserver-types';
import type { DocumentAnalysis } from '../analysis';
import type { Argument, Statement } from '../language/syntax';
import { findKeyword, type BlockKind } from '../language/vocabulary';
import { innerBlockKind } from './locate';

export const TOKEN_TYPES = ['keyword', 'type', 'variable', 'class', 'enumMember', 'number', 'string', 'comment', 'operator', 'namespace', 'unit'] as const;
export const TOKEN_MODIFIERS = ['declaration'] as const;
export const semanticTokensLegend: SemanticTokensLegend = { tokenTypes: [...TOKEN_TYPES], tokenModifiers: [...TOKEN_MODIFIERS] };

type TokenType = (typeof TOKEN_TYPES)[number];
const TYPE_INDEX = new Map(TOKEN_TYPES.map((type, index) => [type, index]));
const DECLARATION = 1;

/** Value words: the word after these keywords is one of a closed list. */
const VALUE_KEYWORDS = new Set(['tier', 'method', 'ansatz', 'mapping', 'embedding', 'functions', 'frozen-core', 'taper']);
/** Selector words of `atoms` and of basis lines after `on` (the retired `within … of` too, so old specs colour alike). */
const SELECTOR_KEYWORDS = new Set(['rest', 'all', 'closer-than', 'to', 'within', 'of']);
const SCAN_KEYWORDS = new Set(['from', 'to', 'step', 'points']);

class TokenCollector {
  /** start, length, type, modifiers — flat. */
  readonly items: number[] = [];

  add(node: { span: { start: number; end: number } }, type: TokenType, modifiers = 0): void {
    this.items.push(node.span.start, node.span.end - node.span.start, TYPE_INDEX.get(type)!, modifiers);
  }

  plain(arg: Argument): void {
    if (arg.kind === 'number' || arg.kind === 'electrons' || arg.kind === 'orbitals') this.add(arg, 'number');
    else if (arg.kind === 'string') this.add(arg, 'string');
    else if (arg.kind === 'range' || arg.kind === 'equals') this.add(arg, 'operator');
    else if (arg.kind === 'index') this.add(arg, 'variable');
  }
}

function statementTokens(out: TokenCollector, statement: Statement, block: BlockKind): void {
  const head = statement.keyword;
  const word = head.text;
  if (block === 'structure') {
    if (head.kind === 'word') out.add(head, 'type');
    statement.args.forEach((arg, index) => (index === 0 && arg.kind === 'word' ? out.add(arg, 'variable', DECLARATION) : out.plain(arg)));
    return;
  }
  if (head.kind === 'word' && findKeyword(word, block)) out.add(head, 'keyword');
  else out.plain(head);
  statement.args.forEach((arg, index) => {
    if (arg.kind !== 'word') return out.plain(arg);
    if (word === 'fragment' && index === 0) return out.add(arg, 'class', DECLARATION);
    if (word === 'basis' && index === 0) return out.add(arg, 'namespace');
    if (word === 'basis') {
      if (index === 1 && arg.text === 'on') return out.add(arg, 'keyword');
      if (arg.text === 'fragment') return out.add(arg, 'keyword');
      if (statement.args[index - 1]?.text === 'fragment') return out.add(arg, 'class');
    }
    if (word === 'structure') return out.add(arg, arg.text === 'in' || arg.text === 'from' ? 'keyword' : 'unit');
    if (word === 'units' || word === 'memory') return out.add(arg, 'unit');
    if (VALUE_KEYWORDS.has(word) && index === 0) return out.add(arg, 'enumMember');
    if (word === 'atoms' || word === 'basis') {
      if (SELECTOR_KEYWORDS.has(arg.text)) return out.add(arg, 'keyword');
      if (statement.args[index - 1]?.text === 'all') return out.add(arg, 'type');
      return out.add(arg, 'variable');
    }
    if (word === 'scan') {
      if (index === 0) return out.add(arg, 'enumMember');
      if (SCAN_KEYWORDS.has(arg.text)) return out.add(arg, 'keyword');
      return out.add(arg, 'variable');
    }
  });
}

function walk(out: TokenCollector, statements: readonly Statement[], block: BlockKind, analysis: DocumentAnalysis): void {
  for (const statement of statements) {
    if (statement.block?.atomTable) {
      statementTokens(out, statement, block);
      const table = statement.block.atomTable;
      const type = TYPE_INDEX.get('type')!;
      const variable = TYPE_INDEX.get('variable')!;
      const number = TYPE_INDEX.get('number')!;
      for (let i = 0; i < table.count; i++) {
        out.items.push(table.lineStart[i]!, table.elementEnd[i]! - table.lineStart[i]!, type, 0);
        if (table.labelStart[i]! >= 0) out.items.push(table.labelStart[i]!, table.labelEnd[i]! - table.labelStart[i]!, variable, DECLARATION);
        for (let k = 0; k < 3; k++) out.items.push(table.coordinateStart[3 * i + k]!, table.coordinateEnd[3 * i + k]! - table.coordinateStart[3 * i + k]!, number, 0);
      }
      continue;
    }
    statementTokens(out, statement, block);
    if (statement.block) walk(out, statement.block.statements, innerBlockKind(statement, block) ?? 'top', analysis);
  }
}

export function getSemanticTokens(analysis: DocumentAnalysis): SemanticTokens {
  const out = new TokenCollector();
  walk(out, analysis.tree.statements, 'top', analysis);
  for (const comment of analysis.tree.comments) out.add({ span: { start: comment.span.start, end: comment.span.start + comment.text.replace(/\r$/, '').length } }, 'comment');
  const count = out.items.length / 4;
  const order = Array.from({ length: count }, (_, i) => i).sort((a, b) => out.items[4 * a]! - out.items[4 * b]!);
  const data: number[] = [];
  let previousLine = 0;
  let previousCharacter = 0;
  for (const i of order) {
    const start = analysis.lines.positionAt(out.items[4 * i]!);
    const deltaLine = start.line - previousLine;
    data.push(deltaLine, deltaLine === 0 ? start.character - previousCharacter : start.character, out.items[4 * i + 1]!, out.items[4 * i + 2]!, out.items[4 * i + 3]!);
    previousLine = start.line;
    previousCharacter = start.character;
  }
  return { data };
}
