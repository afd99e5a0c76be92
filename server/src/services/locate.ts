/**
 * Where a cursor stands in a spec: the enclosing blocks, the statement on its line, the token
 * under it and the argument being typed. Every feature that depends on position starts here.
 */
import { atomTableStatement } from '../language/geometryFastPath';
import type { Argument, Block, Statement } from '../language/syntax';
import type { BlockKind } from '../language/vocabulary';

export interface CursorContext {
  readonly offset: number;
  /** Statements whose block contains the cursor, outermost first. */
  readonly parents: readonly Statement[];
  /** The kind of block the cursor is in. */
  readonly block: BlockKind;
  /** The statement on the cursor's line in the innermost block, if any. */
  readonly statement?: Statement;
  /** The token under the cursor: index -1 is the statement's first word, 0.. its arguments. */
  readonly token?: { readonly node: Argument; readonly index: number };
  /** How many of the statement's arguments end before the cursor (the one being typed is this index). */
  readonly argumentIndex: number;
}

/**
 * The block kind a statement's block has, given the kind of block the statement stands in. The
 * retired `geometry` opens a structure block; the retired basis block is no block of the language
 * now (its lines are read as top-level statements would be).
 */
export function innerBlockKind(statement: Statement, outer: BlockKind): BlockKind | undefined {
  const word = statement.keyword.text;
  if (outer === 'top') {
    if (word === 'structure' || word === 'geometry') return 'structure';
    if (word === 'fragment' || word === 'limits') return word;
    return undefined;
  }
  if (outer === 'fragment' && word === 'tier') return 'tier';
  return undefined;
}

function lineEndAfter(text: string, offset: number): number {
  const newline = text.indexOf('\n', offset);
  return newline < 0 ? text.length : newline;
}

function insideBlock(block: Block, offset: number): boolean {
  return offset >= block.open.end && (block.close ? offset <= block.close.start : true);
}

/** Index of the last atom line starting at or before `offset` in a fast-read geometry block. */
function atomLineAt(block: Block, offset: number): number {
  const table = block.atomTable!;
  let low = 0;
  let high = table.count - 1;
  let found = -1;
  while (low <= high) {
    const mid = (low + high) >> 1;
    if (table.lineStart[mid]! <= offset) {
      found = mid;
      low = mid + 1;
    } else {
      high = mid - 1;
    }
  }
  return found;
}

/** The statement whose line holds the cursor, among a block's statements. */
function statementAt(text: string, statements: readonly Statement[], offset: number): { statement: Statement } | undefined {
  let low = 0;
  let high = statements.length - 1;
  let found = -1;
  while (low <= high) {
    const mid = (low + high) >> 1;
    if (statements[mid]!.span.start <= offset) {
      found = mid;
      low = mid + 1;
    } else {
      high = mid - 1;
    }
  }
  if (found < 0) return undefined;
  const statement = statements[found]!;
  const block = statement.block;
  // Inside its block, or anywhere after an unclosed `{`; past the `}`, a block statement ends on
  // that line like any other statement, and the lines after it start new statements.
  if (block && offset >= block.open.start && (!block.close || offset <= block.close.end)) return { statement };
  // The statement reaches to the end of its line (where the next argument would be typed), but not
  // past a `;` that ends it.
  const reach = lineEndAfter(text, statement.span.end);
  const semicolon = text.indexOf(';', statement.span.end);
  const end = semicolon >= 0 && semicolon < reach ? semicolon : reach;
  return offset <= end ? { statement } : undefined;
}

export function locate(text: string, statements: readonly Statement[], offset: number): CursorContext {
  const parents: Statement[] = [];
  let block: BlockKind = 'top';
  let list: readonly Statement[] = statements;
  for (;;) {
    const found = statementAt(text, list, offset);
    if (!found) return { offset, parents, block, argumentIndex: 0 };
    const { statement } = found;
    const inner = statement.block;
    if (inner && insideBlock(inner, offset)) {
      parents.push(statement);
      block = innerBlockKind(statement, block) ?? 'top';
      if (inner.atomTable) {
        // The atom line of the table or the line the general parser read, whichever starts last before the cursor.
        const atom = atomLineAt(inner, offset);
        const atomStatement = atom >= 0 ? atomTableStatement(inner.atomTable, atom) : undefined;
        const other = inner.otherStatements ? statementAt(text, inner.otherStatements, offset)?.statement : undefined;
        const candidate = other && (!atomStatement || other.span.start > atomStatement.span.start) ? other : atomStatement;
        if (!candidate || (candidate === atomStatement && offset > lineEndAfter(text, atomStatement.span.end))) return { offset, parents, block, argumentIndex: 0 };
        return { ...withToken(candidate, offset), offset, parents, block, statement: candidate };
      }
      list = inner.statements;
      continue;
    }
    return { ...withToken(statement, offset), offset, parents, block, statement };
  }
}

function withToken(statement: Statement, offset: number): { token?: { node: Argument; index: number }; argumentIndex: number } {
  let argumentIndex = 0;
  for (const arg of statement.args) if (arg.span.end < offset) argumentIndex++;
  // The token the cursor is on (inside it or before its first character); failing that, the one it
  // stands just after (a word being typed). Where two tokens touch, as `..` and `#9` in `n1..#9`,
  // the cursor before `#` is on `#9`, not at the end of `..`.
  const nodes = [statement.keyword, ...statement.args];
  let found = nodes.findIndex((node) => offset >= node.span.start && offset < node.span.end);
  if (found < 0) found = nodes.findIndex((node) => offset === node.span.end);
  if (found < 0) return { argumentIndex };
  if (found === 0) return { token: { node: statement.keyword, index: -1 }, argumentIndex: 0 };
  return { token: { node: nodes[found]!, index: found - 1 }, argumentIndex };
}
