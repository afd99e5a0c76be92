/**
 * The concrete syntax tree: statements (`keyword arguments... { block }`), their arguments and
 * blocks, each with its exact source span. The typed reading of statements lives in `ast.ts`.
 */
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
