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

/** Tokens as flat (start offset, length, type, modifiers) quadruples, in document order. */
class TokenCollector {
  items: Int32Array;
  length = 0;

  /** `expected` tokens fit without growing. */
  constructor(expected = 1024) {
    this.items = new Int32Array(4 * Math.max(16, expected));
  }

  push(start: number, length: number, type: number, modifiers: number): void {
    if (this.length + 4 > this.items.length) {
      const grown = new Int32Array(this.items.length * 2);
      grown.set(this.items);
      this.items = grown;
    }
    const items = this.items;
    const at = this.length;
    items[at] = start;
    items[at + 1] = length;
    items[at + 2] = type;
    items[at + 3] = modifiers;
    this.length = at + 4;
  }

  add(node: { span: { start: number; end: number } }, type: TokenType, modifiers = 0): void {
    this.push(node.span.start, node.span.end - node.span.start, TYPE_INDEX.get(type)!, modifiers);
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

/**
 * Atom lines get tokens up to this many per geometry block. Beyond it the TextMate grammar, which
 * colours element symbols, labels and numbers the same way, is left to do it: the tokens would be
 * megabytes sent after every edit for no difference on screen.
 */
export const SEMANTIC_ATOM_LINE_LIMIT = 10_000;

function walk(out: TokenCollector, statements: readonly Statement[], block: BlockKind, analysis: DocumentAnalysis): void {
  for (const statement of statements) {
    if (statement.block?.atomTable && statement.block.atomTable.count > SEMANTIC_ATOM_LINE_LIMIT) {
      statementTokens(out, statement, block);
      for (const other of statement.block.otherStatements ?? []) statementTokens(out, other, 'structure');
      continue;
    }
    if (statement.block?.atomTable) {
      statementTokens(out, statement, block);
      const table = statement.block.atomTable;
      const type = TYPE_INDEX.get('type')!;
      const variable = TYPE_INDEX.get('variable')!;
      const number = TYPE_INDEX.get('number')!;
      const others = statement.block.otherStatements ?? [];
      let other = 0;
      for (let i = 0; i < table.count; i++) {
        // Lines the general parser read go in their place, so the tokens stay in document order.
        while (other < others.length && others[other]!.span.start < table.lineStart[i]!) statementTokens(out, others[other++]!, 'structure');
        out.push(table.lineStart[i]!, table.elementEnd[i]! - table.lineStart[i]!, type, 0);
        if (table.labelStart[i]! >= 0) out.push(table.labelStart[i]!, table.labelEnd[i]! - table.labelStart[i]!, variable, DECLARATION);
        for (let k = 0; k < 3; k++) out.push(table.coordinateStart[3 * i + k]!, table.coordinateEnd[3 * i + k]! - table.coordinateStart[3 * i + k]!, number, 0);
      }
      while (other < others.length) statementTokens(out, others[other++]!, 'structure');
      continue;
    }
    statementTokens(out, statement, block);
    if (statement.block) walk(out, statement.block.statements, innerBlockKind(statement, block) ?? 'top', analysis);
  }
}

/**
 * The tokens of the document, encoded relative to each other as LSP wants them. Statements are
 * walked in document order, so their tokens come sorted; comments (sorted too) are merged in, and
 * lines are found by walking the line index forward once.
 */
export function getSemanticTokens(analysis: DocumentAnalysis): SemanticTokens {
  return { data: plainNumbers(encodeSemanticTokens(analysis), 0, Infinity) };
}

/** values[from, to) as a plain array (what JSON can carry), filled in one loop. */
export function plainNumbers(values: ArrayLike<number>, from: number, to: number): number[] {
  const end = Math.min(to, values.length);
  const out: number[] = [];
  for (let k = from; k < end; k++) out.push(values[k]!);
  return out;
}

/** The encoded tokens as a typed array (what getSemanticTokens sends, and what deltas compare). */
export function encodeSemanticTokens(analysis: DocumentAnalysis): Int32Array {
  // At most five tokens per atom line, and a few hundred for the rest of a spec.
  let rows = 0;
  for (const block of analysis.tree.geometryBlocks ?? []) rows += block.table.count <= SEMANTIC_ATOM_LINE_LIMIT ? block.table.count : 0;
  const out = new TokenCollector(5 * rows + 1024);
  walk(out, analysis.tree.statements, 'top', analysis);
  const comments = new TokenCollector();
  for (const comment of analysis.tree.comments) comments.add({ span: { start: comment.span.start, end: comment.span.start + comment.text.replace(/\r$/, '').length } }, 'comment');
  const items = out.items;
  const notes = comments.items;
  const data = new Int32Array(((out.length + comments.length) / 4) * 5);
  const lines = analysis.lines;
  let line = 0;
  let nextLineStart = lines.lineStart(1);
  let previousLine = 0;
  let previousCharacter = 0;
  let written = 0;
  let previousStart = -1;
  for (let a = 0, b = 0; a < out.length || b < comments.length; ) {
    const fromComments = a >= out.length || (b < comments.length && notes[b]! < items[a]!);
    const source = fromComments ? notes : items;
    const at = fromComments ? b : a;
    if (fromComments) b += 4;
    else a += 4;
    const start = source[at]!;
    // A token never starts where the previous one did; the walk guarantees order otherwise.
    if (start < previousStart) return Int32Array.from(getSemanticTokensSorted(analysis, out, comments).data);
    previousStart = start;
    while (start >= nextLineStart && line + 1 < lines.lineCount) {
      line++;
      nextLineStart = lines.lineStart(line + 1);
    }
    const character = start - lines.lineStart(line);
    const deltaLine = line - previousLine;
    data[written++] = deltaLine;
    data[written++] = deltaLine === 0 ? character - previousCharacter : character;
    data[written++] = source[at + 1]!;
    data[written++] = source[at + 2]!;
    data[written++] = source[at + 3]!;
    previousLine = line;
    previousCharacter = character;
  }
  return data;
}

/** The general path for tokens that do not come in document order (never expected; kept for safety). */
function getSemanticTokensSorted(analysis: DocumentAnalysis, out: TokenCollector, comments: TokenCollector): SemanticTokens {
  const quads: number[][] = [];
  for (const collector of [out, comments]) for (let i = 0; i < collector.length; i += 4) quads.push([collector.items[i]!, collector.items[i + 1]!, collector.items[i + 2]!, collector.items[i + 3]!]);
  quads.sort((x, y) => x[0]! - y[0]!);
  const data: number[] = [];
  let previousLine = 0;
  let previousCharacter = 0;
  for (const [offset, length, type, modifiers] of quads) {
    const start = analysis.lines.positionAt(offset!);
    const deltaLine = start.line - previousLine;
    data.push(deltaLine, deltaLine === 0 ? start.character - previousCharacter : start.character, length!, type!, modifiers!);
    previousLine = start.line;
    previousCharacter = start.character;
  }
  return { data };
}

/**
 * The edits that turn one token array into the next: the part between their common prefix and
 * common suffix, in whole tokens (five numbers). An edit inside one line changes a few tokens, so
 * the editor receives a few numbers instead of the whole document's tokens.
 */
export function semanticTokensEdits(previous: ArrayLike<number>, next: ArrayLike<number>): { start: number; deleteCount: number; data: number[] }[] {
  const shortest = Math.min(previous.length, next.length);
  let prefix = 0;
  while (prefix < shortest && previous[prefix] === next[prefix]) prefix++;
  prefix -= prefix % 5;
  let suffix = 0;
  while (suffix < shortest - prefix && previous[previous.length - 1 - suffix] === next[next.length - 1 - suffix]) suffix++;
  suffix -= suffix % 5;
  if (prefix === previous.length && prefix === next.length) return [];
  return [{ start: prefix, deleteCount: previous.length - prefix - suffix, data: plainNumbers(next, prefix, next.length - suffix) }];
}
