/**
 * The chevrotain parser: turns tokens into statements, arguments and blocks.
 *
 * Grammar (newlines end statements; `;` does too; a block's `{` may sit on the next line):
 *
 *   document   := item* EOF
 *   item       := Newline | ';' | statement | stray
 *   statement  := head argument* (Newline* block)?
 *   head       := Word | Number | String | #index | 6e | 6o | '..' | '='
 *   argument   := the same token kinds as head
 *   block      := '{' item* '}'
 *
 * Every token is accepted by some alternative, so the parser never gives up: a mistake costs at
 * most its own statement, and everything else is still analysed. A block that is not closed ends
 * where a top-level keyword starts a line, so a missing `}` does not swallow the rest of the file.
 */
import { EmbeddedActionsParser, type IToken, type TokenType } from 'chevrotain';
import {
  allTokens,
  ElectronCount,
  Equals,
  IndexRef,
  LBrace,
  Newline,
  NumberLiteral,
  OrbitalCount,
  RangeDots,
  RBrace,
  Semicolon,
  StringLiteral,
  tokenize,
  UnterminatedString,
  Word,
} from './lexer';
import { atomTableStatements, extractGeometryBodies, type FastGeometryBlock } from './geometryFastPath';
import type { Argument, ArgumentKind, AtomTable, Block, Statement, SyntaxProblem, SyntaxTree } from './syntax';
import { countWords } from './limits';
import { span, type Span } from './text';

/**
 * Keywords that only start top-level statements; seeing one at a line start closes an unclosed
 * block. The retired `units` and `geometry` are among them, so that old specs recover the same way.
 */
const TOP_LEVEL_STARTERS = new Set(['spec', 'basis', 'structure', 'fragment', 'embedding', 'scan', 'limits', 'variant', 'units', 'geometry']);

/**
 * A variant block holds top-level statements (`fragment`, `basis`, `embedding`, `limits`), so only
 * these end a variant block left open.
 */
const VARIANT_ENDERS = new Set(['spec', 'structure', 'scan', 'variant', 'units', 'geometry']);

const ARGUMENT_KINDS = new Map<TokenType, ArgumentKind>([
  [Word, 'word'],
  [NumberLiteral, 'number'],
  [StringLiteral, 'string'],
  [UnterminatedString, 'string'],
  [IndexRef, 'index'],
  [ElectronCount, 'electrons'],
  [OrbitalCount, 'orbitals'],
  [RangeDots, 'range'],
  [Equals, 'equals'],
]);

function tokenSpan(token: IToken): Span {
  return span(token.startOffset, token.startOffset + token.image.length);
}

function unescapeString(image: string, closed: boolean): string {
  const inner = image.slice(1, closed ? -1 : undefined);
  return inner.replace(/\\(.)/g, '$1');
}

class SpecParser extends EmbeddedActionsParser {
  problems: SyntaxProblem[] = [];
  private text = '';
  /** The head word of each statement whose block is being read, innermost last. */
  private blockOwners: string[] = [];

  constructor() {
    super(allTokens, { recoveryEnabled: false, maxLookahead: 1 });
    this.performSelfAnalysis();
  }

  prepare(text: string): void {
    this.problems = [];
    this.text = text;
    this.blockOwners = [];
  }

  private toArgument(token: IToken): Argument {
    const kind = ARGUMENT_KINDS.get(token.tokenType) ?? 'word';
    const closedString = token.tokenType === StringLiteral;
    if (token.tokenType === UnterminatedString) {
      this.problems.push({
        code: 'unterminated-string',
        message: 'This string has no closing quote before the end of the line.',
        span: tokenSpan(token),
      });
    }
    const text = kind === 'string' ? unescapeString(token.image, closedString) : token.image;
    return { kind, text, span: tokenSpan(token) };
  }

  private value = this.RULE('value', (): IToken => {
    return this.OR([
      { ALT: () => this.CONSUME(Word) },
      { ALT: () => this.CONSUME(NumberLiteral) },
      { ALT: () => this.CONSUME(StringLiteral) },
      { ALT: () => this.CONSUME(UnterminatedString) },
      { ALT: () => this.CONSUME(IndexRef) },
      { ALT: () => this.CONSUME(ElectronCount) },
      { ALT: () => this.CONSUME(OrbitalCount) },
      { ALT: () => this.CONSUME(RangeDots) },
      { ALT: () => this.CONSUME(Equals) },
    ]);
  });

  /** True when the next non-newline token opens a block. */
  private braceFollows(): boolean {
    for (let i = 1; ; i++) {
      const type = this.LA(i).tokenType;
      if (type === Newline) continue;
      return type === LBrace;
    }
  }

  /** Inside a block: a top-level keyword at the start of a line means the `}` was forgotten. */
  private topLevelKeywordStartsLine(): boolean {
    const next = this.LA(1);
    if (next.tokenType !== Word || !TOP_LEVEL_STARTERS.has(next.image)) return false;
    if (this.blockOwners[this.blockOwners.length - 1] === 'variant' && !VARIANT_ENDERS.has(next.image)) return false;
    // Only blanks between the line start and the word: scanning back stops at the first other
    // character, so that many statements on one line cost no more than the line.
    for (let i = next.startOffset - 1; i >= 0; i--) {
      const code = this.text.charCodeAt(i);
      if (code === 10 || code === 13) return true;
      if (code !== 32 && code !== 9 && code !== 12 && code !== 11 && code !== 0xa0 && code !== 0xfeff) return false;
    }
    return true;
  }

  public document = this.RULE('document', (): Statement[] => {
    const statements: Statement[] = [];
    this.MANY(() => {
      this.OR([
        { ALT: () => this.CONSUME(Newline) },
        { ALT: () => this.CONSUME(Semicolon) },
        { ALT: () => statements.push(this.SUBRULE(this.statement)) },
        {
          ALT: () => {
            const brace = this.CONSUME(RBrace);
            this.ACTION(() => this.reportStray(brace, 'This `}` closes no block.'));
          },
        },
        { ALT: () => this.SUBRULE(this.strayBlock) },
      ]);
    });
    return statements;
  });

  private blockItems = this.RULE('blockItems', (): Statement[] => {
    const statements: Statement[] = [];
    this.MANY({
      GATE: () => !this.topLevelKeywordStartsLine(),
      DEF: () => {
        this.OR([
          { ALT: () => this.CONSUME(Newline) },
          { ALT: () => this.CONSUME(Semicolon) },
          { ALT: () => statements.push(this.SUBRULE(this.statement)) },
          { ALT: () => this.SUBRULE(this.strayBlock) },
        ]);
      },
    });
    return statements;
  });

  private statement = this.RULE('statement', (): Statement => {
    const head = this.SUBRULE(this.value);
    const args: IToken[] = [];
    this.MANY(() => args.push(this.SUBRULE2(this.value)));
    let block: Block | undefined;
    this.OPTION({
      GATE: () => this.braceFollows(),
      DEF: () => {
        this.MANY2(() => this.CONSUME(Newline));
        this.ACTION(() => this.blockOwners.push(head.image));
        block = this.SUBRULE(this.block);
        this.ACTION(() => this.blockOwners.pop());
      },
    });
    return this.ACTION(() => {
      const keyword = this.toArgument(head);
      const argumentNodes = args.map((token) => this.toArgument(token));
      const last = block?.span ?? argumentNodes[argumentNodes.length - 1]?.span ?? keyword.span;
      const statement: Statement = { keyword, args: argumentNodes, span: span(keyword.span.start, last.end) };
      return block ? { ...statement, block } : statement;
    });
  });

  private block = this.RULE('block', (): Block => {
    const open = this.CONSUME(LBrace);
    const statements = this.SUBRULE(this.blockItems);
    let close: IToken | undefined;
    this.OPTION(() => {
      close = this.CONSUME(RBrace);
    });
    return this.ACTION(() => {
      const openSpan = tokenSpan(open);
      if (!close) {
        this.problems.push({
          code: 'unclosed-block',
          message: 'This `{` is never closed: add a `}` at the end of the block.',
          span: openSpan,
        });
        const lastStatement = statements[statements.length - 1];
        return { open: openSpan, statements, span: span(openSpan.start, lastStatement?.span.end ?? openSpan.end) };
      }
      const closeSpan = tokenSpan(close);
      return { open: openSpan, close: closeSpan, statements, span: span(openSpan.start, closeSpan.end) };
    });
  });

  /** A `{` with no statement before it: its contents are skipped, with one error on the brace. */
  private strayBlock = this.RULE('strayBlock', (): void => {
    const block = this.SUBRULE(this.block);
    this.ACTION(() => {
      this.problems.push({
        code: 'unexpected-token',
        message: 'A block must follow a statement such as `fragment name` or `structure`; its contents are ignored.',
        span: block.open,
      });
    });
  });

  private reportStray(token: IToken, message: string): void {
    this.problems.push({ code: 'unexpected-token', message, span: tokenSpan(token) });
  }
}

let sharedParser: SpecParser | undefined;

/** Deeper blocks than this are never meaningful (the language nests three levels) and would only cost stack. */
export const MAX_BLOCK_DEPTH = 16;

/**
 * Drops braces nested deeper than MAX_BLOCK_DEPTH, with their matching closers, so that the
 * recursive parser cannot exhaust the stack on pathological input.
 */
function limitNesting(tokens: IToken[], problems: SyntaxProblem[]): IToken[] {
  let depth = 0;
  let dropped = 0;
  let reported = false;
  const kept: IToken[] = [];
  for (const token of tokens) {
    if (token.tokenType === LBrace) {
      if (depth >= MAX_BLOCK_DEPTH) {
        dropped++;
        if (!reported) {
          problems.push({ code: 'unexpected-token', message: `Blocks are nested deeper than ${MAX_BLOCK_DEPTH} levels; the deeper braces are ignored.`, span: tokenSpan(token) });
          reported = true;
        }
        continue;
      }
      depth++;
    } else if (token.tokenType === RBrace) {
      if (dropped > 0) {
        dropped--;
        continue;
      }
      depth = Math.max(0, depth - 1);
    }
    kept.push(token);
  }
  return kept;
}

export interface ParseOptions {
  /** Read plain structure blocks with the fast reader (default true; tests compare both ways). */
  readonly fastGeometry?: boolean;
  /**
   * The previous version of the same document: when the edit since then lies inside a structure
   * block, only the changed lines of that block are read again.
   */
  readonly previous?: { readonly text: string; readonly tree: SyntaxTree };
  /** Refuse (return an empty tree with `words` set) when the text outside plain structure blocks has more words. */
  readonly maxWords?: number;
}

/**
 * A geometry block read by the fast reader: its statements are built from the table on first use,
 * merged in document order with those the general parser read from the lines handed over to it.
 */
function tableBlock(block: Block, table: AtomTable): Block {
  let statements: Statement[] | undefined;
  const others = block.statements;
  return {
    open: block.open,
    ...(block.close ? { close: block.close } : {}),
    span: block.span,
    atomTable: table,
    ...(others.length > 0 ? { otherStatements: others } : {}),
    get statements(): Statement[] {
      return (statements ??= others.length === 0 ? atomTableStatements(table) : mergeByStart(atomTableStatements(table), others));
    },
  };
}

function mergeByStart(a: readonly Statement[], b: readonly Statement[]): Statement[] {
  const merged: Statement[] = [];
  let i = 0;
  let j = 0;
  while (i < a.length || j < b.length) {
    if (j >= b.length || (i < a.length && a[i]!.span.start < b[j]!.span.start)) merged.push(a[i++]!);
    else merged.push(b[j++]!);
  }
  return merged;
}

/** Puts what the fast reader found into the geometry blocks the parser saw as empty. */
function injectGeometry(statements: Statement[], blocks: readonly FastGeometryBlock[]): Statement[] {
  const byOpen = new Map(blocks.map((block) => [block.open, block]));
  const visit = (list: Statement[]): Statement[] =>
    list.map((statement) => {
      if (!statement.block) return statement;
      const fast = byOpen.get(statement.block.open.start);
      const block = fast ? tableBlock(statement.block, fast.table) : { ...statement.block, statements: visit(statement.block.statements) };
      return { ...statement, block };
    });
  return visit(statements);
}

/** Parses spec text into a syntax tree; never throws on bad input. */
export function parseSpec(text: string, options: ParseOptions = {}): SyntaxTree {
  const previous = options.previous?.tree.geometryBlocks ? { text: options.previous.text, blocks: options.previous.tree.geometryBlocks } : undefined;
  const { masked, blocks } = options.fastGeometry === false ? { masked: text, blocks: [] } : extractGeometryBodies(text, previous);
  if (options.maxWords !== undefined) {
    // The blanked bodies of fast-read blocks hold no words: only the rest is counted.
    let words = 0;
    let from = 0;
    for (const block of blocks) {
      words += countWords(masked, from, block.open + 1);
      for (const line of block.handedOver) words += countWords(masked, line.start, line.end);
      from = block.close;
    }
    words += countWords(masked, from, masked.length);
    if (words > options.maxWords) return { statements: [], comments: [], problems: [], textLength: text.length, words };
  }
  const lexed = tokenize(masked);
  const parser = (sharedParser ??= new SpecParser());
  const nestingProblems: SyntaxProblem[] = [];
  const tokens = limitNesting(lexed.tokens, nestingProblems);
  parser.prepare(text);
  parser.input = tokens;
  const parsed = parser.document();
  const statements = blocks.length > 0 ? injectGeometry(parsed, blocks) : parsed;
  const problems: SyntaxProblem[] = [...lexerProblems(text, lexed.errors), ...nestingProblems, ...parser.problems];
  for (const error of parser.errors) {
    problems.push({ code: 'syntax', message: error.message, span: tokenSpan(error.token) });
  }
  problems.sort((a, b) => a.span.start - b.span.start);
  const comments = lexed.comments.map((token) => ({ text: token.image, span: tokenSpan(token) }));
  for (const block of blocks) comments.push(...block.comments);
  if (blocks.length > 0) comments.sort((a, b) => a.span.start - b.span.start);
  return {
    statements,
    comments,
    problems,
    textLength: text.length,
    ...(blocks.length > 0 ? { geometryBlocks: blocks } : {}),
  };
}

/** Consecutive characters the lexer cannot read become one problem. */
function lexerProblems(text: string, errors: readonly { offset: number; length: number }[]): SyntaxProblem[] {
  const problems: SyntaxProblem[] = [];
  for (const error of errors) {
    const previous = problems[problems.length - 1];
    if (previous && previous.span.end === error.offset) {
      const merged = span(previous.span.start, error.offset + error.length);
      problems[problems.length - 1] = { ...previous, span: merged, message: badCharacterMessage(text, merged) };
    } else {
      const errorSpan = span(error.offset, error.offset + error.length);
      problems.push({ code: 'bad-character', span: errorSpan, message: badCharacterMessage(text, errorSpan) });
    }
  }
  return problems;
}

function badCharacterMessage(text: string, s: Span): string {
  const shown = text.slice(s.start, Math.min(s.end, s.start + 20));
  const plural = s.end - s.start > 1 ? 'characters' : 'character';
  return `Unexpected ${plural} '${shown}': not part of the spec language (comments start with '# ').`;
}
