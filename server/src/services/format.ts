/**
 * The formatter: two-space indentation by block depth, single spaces between tokens, and
 * structure blocks (`structure { … }`, `structure in bohr { … }`, and the retired keyword's blocks)
 * aligned in columns with coordinates at one fixed number of decimals per block.
 * It keeps every line where it is (so range formatting is a matter of lines), never changes a
 * number's value, leaves lines it cannot read untouched, and running it twice changes nothing.
 */
import type { IToken } from 'chevrotain';
import type { Range, TextEdit } from 'vscode-languageserver-types';
import { elementBySymbol } from '../chemistry/elements';
import { ElectronCount, LBrace, NumberLiteral, OrbitalCount, RangeDots, RBrace, Semicolon, tokenize, Word } from '../language/lexer';
import { MAX_BLOCK_DEPTH } from '../language/parser';
import { LineIndex, normalizeLineEnds } from '../language/text';

export interface FormatOptions {
  /** Spaces per block level (default 2). */
  readonly indent?: number;
  /** Smallest number of decimals for coordinates (default 4). */
  readonly minimumDecimals?: number;
}

/** Coordinates are written with at most this many decimals; beyond, a block keeps its numbers as typed. */
const MAX_DECIMALS = 10;
/** Fixed-point digits are exact below this magnitude for MAX_DECIMALS (doubles keep ~15–16 digits). */
const MAX_MAGNITUDE = 1e5;

interface Line {
  readonly text: string;
  readonly tokens: IToken[];
  readonly comment?: IToken;
  /** Column of the comment in the original line. */
  readonly commentColumn?: number;
  readonly unreadable: boolean;
}

function splitLines(text: string): { lines: Line[]; lineIndex: LineIndex } {
  const lineIndex = new LineIndex(text);
  const lexed = tokenize(text);
  const rawLines = text.split('\n');
  const lines: Line[] = rawLines.map((raw) => ({ text: raw.replace(/\r$/, ''), tokens: [], unreadable: false }));
  const lineOf = (offset: number) => lineIndex.positionAt(offset).line;
  for (const token of lexed.tokens) {
    if (token.tokenType.name === 'Newline') continue;
    const line = lines[lineOf(token.startOffset)]!;
    line.tokens.push(token);
    if (token.tokenType.name === 'UnterminatedString') (line as { unreadable: boolean }).unreadable = true;
  }
  for (const comment of lexed.comments) {
    const line = lines[lineOf(comment.startOffset)] as { comment?: IToken; commentColumn?: number };
    line.comment = comment;
    line.commentColumn = lineIndex.positionAt(comment.startOffset).character;
  }
  for (const error of lexed.errors) (lines[lineOf(error.offset)] as { unreadable: boolean }).unreadable = true;
  return { lines, lineIndex };
}

function adjacent(first: IToken, second: IToken): boolean {
  return first.startOffset + first.image.length === second.startOffset;
}

/**
 * Whether a token reads as the same token when a space follows it. Not always: `1e-3` directly
 * before `.5` is read as a word (a number cannot be followed by `.`), but as a number on its own;
 * separating the two would change what the line says and make formatting twice differ from once.
 */
function readsAlone(token: IToken): boolean {
  const lexed = tokenize(`${token.image} `);
  return lexed.errors.length === 0 && lexed.tokens.length === 1 && lexed.tokens[0]!.tokenType === token.tokenType;
}

/** Tokens that cannot be followed by `.` without becoming unreadable (`1..` does not lex). */
const NO_DOT_AFTER = new Set([NumberLiteral, ElectronCount, OrbitalCount]);

/**
 * Joins tokens with single spaces; `..` binds to its neighbours and `;` to the token before it,
 * except that `..` keeps its space after a number, which would otherwise stop reading as one.
 */
function joinTokens(tokens: readonly IToken[]): string {
  let out = '';
  tokens.forEach((token, index) => {
    const previous = tokens[index - 1];
    const dotsAfterNumber = token.tokenType === RangeDots && previous !== undefined && NO_DOT_AFTER.has(previous.tokenType);
    const mustStayJoined = previous !== undefined && adjacent(previous, token) && !readsAlone(previous);
    const glue = !previous || mustStayJoined || (token.tokenType === RangeDots && !dotsAfterNumber) || previous.tokenType === RangeDots || token.tokenType === Semicolon;
    out += (glue ? '' : ' ') + token.image;
  });
  return out;
}

/**
 * Appends a trailing comment: at its original column when the code still ends before it (so that
 * comments aligned by hand stay aligned), otherwise two spaces after the code.
 */
function withComment(body: string, comment: IToken | undefined, column?: number): string {
  const text = comment ? comment.image.trimEnd() : '';
  if (!text) return body;
  if (!body.trim()) return body + text;
  const at = column !== undefined && column >= body.length + 2 ? column : body.length + 2;
  return body.padEnd(at) + text;
}

interface AtomRow {
  readonly line: number;
  readonly element: string;
  readonly label?: string;
  readonly numbers: [IToken, IToken, IToken];
  readonly comment?: IToken;
  readonly commentColumn?: number;
}

/** Decimals needed to write a literal's value exactly in fixed point, or Infinity. */
/** The fewest decimals that write a number literal's value exactly in fixed point (Infinity if not a number). */
export function decimalsNeeded(literal: string): number {
  const match = /^[+-]?(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/.exec(literal);
  if (!match) return Infinity;
  // The value is digits × 10^scale; trailing zeros of the digits raise the scale. The fewest
  // decimals that write it exactly are −scale (0 for a whole number or zero).
  let digits = `${match[1] ?? ''}${match[2] ?? ''}`.replace(/^0+/, '');
  let scale = Number(match[3] ?? '0') - (match[2] ?? '').length;
  if (digits === '') return 0;
  while (digits.endsWith('0')) {
    digits = digits.slice(0, -1);
    scale++;
  }
  return Math.max(0, -scale);
}

function atomRow(line: Line, index: number): AtomRow | undefined {
  const tokens = line.tokens;
  if (line.unreadable || tokens.length < 4 || tokens.length > 5) return undefined;
  const [first] = tokens;
  if (first!.tokenType !== Word || !elementBySymbol(first!.image)) return undefined;
  const hasLabel = tokens.length === 5;
  if (hasLabel && (tokens[1]!.tokenType !== Word || !readsAlone(tokens[1]!))) return undefined;
  const numbers = tokens.slice(hasLabel ? 2 : 1);
  if (numbers.some((token) => token.tokenType.name !== 'NumberLiteral')) return undefined;
  return {
    line: index,
    element: first!.image,
    ...(hasLabel ? { label: tokens[1]!.image } : {}),
    numbers: numbers as [IToken, IToken, IToken],
    ...(line.comment ? { comment: line.comment, commentColumn: line.commentColumn ?? 0 } : {}),
  };
}

/** Formats a run of atom rows as aligned columns. */
function alignRows(rows: readonly AtomRow[], indent: string, minimumDecimals: number): Map<number, string> {
  const out = new Map<number, string>();
  const values = rows.flatMap((row) => row.numbers.map((token) => token.image));
  // Loops, not Math.max(...list): a spread of a 100,000-atom block overflows the stack.
  const decimals = values.reduce((most, value) => Math.max(most, decimalsNeeded(value)), minimumDecimals);
  const fixed = decimals <= MAX_DECIMALS && values.every((value) => Math.abs(Number(value)) < MAX_MAGNITUDE);
  const written = rows.map((row) => row.numbers.map((token) => (fixed ? Number(token.image).toFixed(decimals) : token.image)));
  const elementWidth = rows.reduce((most, row) => Math.max(most, row.element.length), 0);
  const labelWidth = rows.reduce((most, row) => Math.max(most, row.label?.length ?? 0), 0);
  const numberWidth = written.reduce((most, row) => row.reduce((widest, text) => Math.max(widest, text.length), most), 0);
  rows.forEach((row, index) => {
    const parts = [row.element.padEnd(elementWidth)];
    if (labelWidth > 0) parts.push((row.label ?? '').padEnd(labelWidth));
    parts.push(...written[index]!.map((text) => text.padStart(numberWidth)));
    out.set(row.line, withComment(indent + parts.join('  '), row.comment, row.commentColumn).trimEnd());
  });
  return out;
}

/** The formatted text of every line (same number of lines as the input). */
export function formatLines(original: string, options: FormatOptions = {}): string[] {
  const text = normalizeLineEnds(original);
  const unit = ' '.repeat(options.indent ?? 2);
  const minimumDecimals = options.minimumDecimals ?? 4;
  const { lines } = splitLines(text);
  const result: string[] = [];
  let depth = 0;
  /** Open blocks, innermost last: whether each is a geometry block. */
  const blocks: boolean[] = [];
  let pendingGeometry = false;
  let rows: AtomRow[] = [];
  const flushRows = () => {
    if (rows.length === 0) return;
    for (const [line, formatted] of alignRows(rows, unit.repeat(Math.min(depth, MAX_BLOCK_DEPTH)), minimumDecimals)) result[line] = formatted;
    rows = [];
  };
  lines.forEach((line, index) => {
    const tokens = line.tokens;
    const startsWithClose = tokens[0]?.tokenType === RBrace;
    const inGeometry = blocks[blocks.length - 1] === true;
    const row = inGeometry ? atomRow(line, index) : undefined;
    if (row) {
      rows.push(row);
      result[index] = line.text;
      return;
    }
    if (tokens.length > 0 || line.comment) flushRows();
    // The parser ignores braces nested deeper than MAX_BLOCK_DEPTH, and so does the indentation:
    // indenting by the true depth would make the output grow with the square of the input.
    const level = Math.min(MAX_BLOCK_DEPTH, Math.max(0, depth - (startsWithClose ? 1 : 0)));
    if (line.unreadable) result[index] = line.text;
    else if (tokens.length === 0 && !line.comment) result[index] = '';
    else result[index] = withComment(unit.repeat(level) + joinTokens(tokens), line.comment, line.commentColumn).trimEnd();
    for (const token of tokens) {
      if (token.tokenType === Word && (token.image === 'structure' || token.image === 'geometry')) pendingGeometry = true;
      else if (token.tokenType === LBrace) {
        blocks.push(pendingGeometry);
        pendingGeometry = false;
        depth++;
      } else if (token.tokenType === RBrace) {
        if (blocks.length > 0) {
          blocks.pop();
          depth--;
        }
      } else if (token.tokenType === Semicolon) pendingGeometry = false;
    }
    if (tokens.length > 0 && tokens[tokens.length - 1]!.tokenType !== Word && tokens[tokens.length - 1]!.tokenType !== LBrace) pendingGeometry = false;
  });
  flushRows();
  return result;
}

export function formatText(text: string, options: FormatOptions = {}): string {
  return formatLines(text, options).join('\n');
}

/** Edits that format the document, or only the lines a range touches. */
export function format(text: string, range?: Range, options: FormatOptions = {}): TextEdit[] {
  const formatted = formatLines(text, options);
  const original = normalizeLineEnds(text).split('\n').map((line) => line.replace(/\r$/, ''));
  const edits: TextEdit[] = [];
  original.forEach((line, index) => {
    if (range && (index < range.start.line || index > range.end.line)) return;
    const wanted = formatted[index] ?? line;
    if (wanted !== line) edits.push({ range: { start: { line: index, character: 0 }, end: { line: index, character: line.length } }, newText: wanted });
  });
  return edits;
}
