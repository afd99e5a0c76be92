/**
 * The concrete syntax tree: statements (`keyword arguments... { block }`), their arguments and
 * blocks, each with its exact source span. The typed reading of statements lives in `ast.ts`.
 */
import type { FastGeometryBlock } from './geometryFastPath';
import type { Span } from './text';

export type ArgumentKind =
  | 'word'
  | 'number'
  | 'string'
  | 'index'
  | 'electrons'
  | 'orbitals'
  | 'range'
  | 'equals';

export interface Argument {
  readonly kind: ArgumentKind;
  /** Source text; for strings, the text between the quotes with escapes resolved. */
  readonly text: string;
  readonly span: Span;
}

export interface Block {
  readonly open: Span;
  /** Absent when the block is never closed (a syntax error is reported on `open`). */
  readonly close?: Span;
  readonly statements: Statement[];
  readonly span: Span;
  /**
   * For a structure block read by the fast reader: its atom lines column by column. Then
   * `statements` is built from it on first use; analysis reads the table directly.
   */
  readonly atomTable?: AtomTable;
  /** With `atomTable`: the statements of the lines the fast reader left to the general parser. */
  readonly otherStatements?: Statement[];
}

/**
 * Atom lines `Element [label] x y z` stored column-wise, so that a geometry of ten thousand atoms
 * costs a few typed arrays instead of a hundred thousand small objects. Offsets point into `text`.
 */
export interface AtomTable {
  readonly text: string;
  readonly count: number;
  /** Atomic number of each atom. */
  readonly atomicNumbers: Uint8Array;
  /** Labels of the labelled atoms, by atom position. */
  readonly labels: ReadonlyMap<number, string>;
  /** Start and end of each atom line (from the element to the last coordinate). */
  readonly lineStart: Int32Array;
  readonly lineEnd: Int32Array;
  readonly elementEnd: Int32Array;
  /** -1 when the atom has no label. */
  readonly labelStart: Int32Array;
  readonly labelEnd: Int32Array;
  /** Three entries per atom. */
  readonly coordinateStart: Int32Array;
  readonly coordinateEnd: Int32Array;
  readonly coordinates: Float64Array;
}

export interface Statement {
  /** The first token; a keyword when the statement is well formed. */
  readonly keyword: Argument;
  readonly args: Argument[];
  readonly block?: Block;
  readonly span: Span;
}

export interface CommentNode {
  readonly text: string;
  readonly span: Span;
}

export interface SyntaxProblem {
  readonly message: string;
  readonly span: Span;
  readonly code: 'syntax' | 'unclosed-block' | 'unexpected-token' | 'unterminated-string' | 'bad-character';
}

export interface SyntaxTree {
  readonly statements: Statement[];
  readonly comments: CommentNode[];
  readonly problems: SyntaxProblem[];
  readonly textLength: number;
  /** What the fast structure-block reader read, so that the next version of the text can reuse it. */
  readonly geometryBlocks?: readonly FastGeometryBlock[];
  /** Set when the parse was refused: the words counted outside plain structure blocks, beyond `maxWords`. */
  readonly words?: number;
}

/** Visits every statement depth-first, passing the chain of enclosing statements. */
export function walkStatements(
  statements: readonly Statement[],
  visit: (statement: Statement, parents: readonly Statement[]) => void,
  parents: Statement[] = [],
): void {
  for (const statement of statements) {
    visit(statement, parents);
    if (statement.block) {
      parents.push(statement);
      walkStatements(statement.block.statements, visit, parents);
      parents.pop();
    }
  }
}
