/**
 * A fast reader for the body of `structure { ... }` blocks, which hold nearly all of a large spec.
 *
 * It reads well-formed atom lines (`Element [label] x y z` with a known element, a plain label and
 * three finite numbers), comments and blank lines, and stores them column-wise in an AtomTable.
 * Any other line (a mistake, a line being typed, `;`, `#index`) is left to the general parser, which
 * reads it and reports the mistake: one bad line costs one line. Only what changes the block's
 * structure (a brace or a string, or a top-level keyword that suggests a missing `}`) sends the
 * whole block to the general parser. tests/language/geometry-fast-path.test.ts checks that both
 * readers give the same statements.
 */
import { elementBySymbol } from '../chemistry/elements';
import type { Argument, AtomTable, CommentNode, Statement } from './syntax';

const NUMBER = /^[+-]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?$/;
const PLAIN_WORD = /^[A-Za-z_][A-Za-z0-9_]*$/;

export interface FastGeometryBlock {
  /** Offset of the block's `{`. */
  readonly open: number;
  /** Offset of the closing `}`. */
  readonly close: number;
  readonly table: AtomTable;
  readonly comments: CommentNode[];
  /** Lines left to the general parser, [start, end) from the line's start to its end (or the `}`). */
  readonly handedOver: readonly { readonly start: number; readonly end: number }[];
}

/** Keywords that only start top-level statements: at a line start inside a block they mean a missing `}` (as in parser.ts). */
const TOP_LEVEL_STARTERS = new Set(['spec', 'basis', 'structure', 'fragment', 'embedding', 'scan', 'limits', 'variant', 'units', 'geometry']);

/** A line that opens a block the fast reader reads: `structure {`, `structure in bohr {`, or the retired keyword's block. */
const BLOCK_START = /^[ \t]*(?:structure(?:[ \t]+in[ \t]+[A-Za-z]+)?|geometry)[ \t]*\{/m;

function isSpace(code: number): boolean {
  return code === 32 || code === 9 || code === 13 || code === 12 || code === 11 || code === 0xa0 || code === 0xfeff;
}

/** A typed array that doubles when full: far less garbage than pushing to plain arrays. */
class Growable<T extends Int32Array | Float64Array> {
  private data: T;
  length = 0;

  constructor(private readonly make: (size: number) => T) {
    this.data = make(256);
  }

  push(value: number): void {
    if (this.length === this.data.length) {
      const bigger = this.make(this.data.length * 2);
      bigger.set(this.data);
      this.data = bigger;
    }
    this.data[this.length++] = value;
  }

  /** Puts back −1 where an appended value was −1 before `shift` was added (a missing label), here and in `other`. */
  unshiftMissing(from: number, shift: number, other: Growable<T>): void {
    for (let k = from; k < this.length; k++) {
      if (this.data[k] === shift - 1) {
        this.data[k] = -1;
        other.data[k] = -1;
      }
    }
  }

  /** Appends source[from, to), each value plus `shift`. */
  appendShifted(source: ArrayLike<number>, from: number, to: number, shift: number): void {
    const needed = this.length + (to - from);
    if (needed > this.data.length) {
      const bigger = this.make(Math.max(needed, this.data.length * 2));
      bigger.set(this.data);
      this.data = bigger;
    }
    const data = this.data;
    let at = this.length;
    // A plain copy when nothing moves: adding 0 would turn −0 into 0.
    if (shift === 0) for (let k = from; k < to; k++) data[at++] = source[k]!;
    else for (let k = from; k < to; k++) data[at++] = source[k]! + shift;
    this.length = at;
  }

  /** The values as a view of the storage (no copy: the columns are not used again once read). */
  toArray(): T {
    return this.data.subarray(0, this.length) as T;
  }
}

const int32 = () => new Growable((size) => new Int32Array(size));

/** Column storage while reading. */
class Columns {
  count = 0;
  readonly atomicNumbers = int32();
  readonly labels = new Map<number, string>();
  readonly lineStart = int32();
  readonly lineEnd = int32();
  readonly elementEnd = int32();
  readonly labelStart = int32();
  readonly labelEnd = int32();
  readonly coordinateStart = int32();
  readonly coordinateEnd = int32();
  readonly coordinates = new Growable((size) => new Float64Array(size));

  /** Appends rows [from, to) of a table, their offsets moved by `shift`. */
  appendRows(table: AtomTable, from: number, to: number, shift: number): void {
    if (to <= from) return;
    for (const [index, label] of table.labels) if (index >= from && index < to) this.labels.set(this.count + index - from, label);
    this.atomicNumbers.appendShifted(table.atomicNumbers, from, to, 0);
    this.lineStart.appendShifted(table.lineStart, from, to, shift);
    this.lineEnd.appendShifted(table.lineEnd, from, to, shift);
    this.elementEnd.appendShifted(table.elementEnd, from, to, shift);
    // A label start of −1 (no label) stays −1.
    const labelFrom = this.labelStart.length;
    this.labelStart.appendShifted(table.labelStart, from, to, shift);
    this.labelEnd.appendShifted(table.labelEnd, from, to, shift);
    if (shift !== 0) this.labelStart.unshiftMissing(labelFrom, shift, this.labelEnd);
    this.coordinateStart.appendShifted(table.coordinateStart, 3 * from, 3 * to, shift);
    this.coordinateEnd.appendShifted(table.coordinateEnd, 3 * from, 3 * to, shift);
    this.coordinates.appendShifted(table.coordinates, 3 * from, 3 * to, 0);
    this.count += to - from;
  }

  table(text: string): AtomTable {
    return {
      text,
      count: this.count,
      atomicNumbers: Uint8Array.from(this.atomicNumbers.toArray()),
      labels: this.labels,
      lineStart: this.lineStart.toArray(),
      lineEnd: this.lineEnd.toArray(),
      elementEnd: this.elementEnd.toArray(),
      labelStart: this.labelStart.toArray(),
      labelEnd: this.labelEnd.toArray(),
      coordinateStart: this.coordinateStart.toArray(),
      coordinateEnd: this.coordinateEnd.toArray(),
      coordinates: this.coordinates.toArray(),
    };
  }
}

/** Field boundaries of one line, reused between lines to avoid allocation. */
const fieldStarts: number[] = [];
const fieldEnds: number[] = [];

/**
 * Reads the lines after the `{` at `open` up to the first `}`; undefined when the block's
 * structure needs the general parser.
 */
function readBody(text: string, open: number): FastGeometryBlock | undefined {
  const parts: BodyParts = { columns: new Columns(), comments: [], handedOver: [] };
  const close = readLines(text, open + 1, text.length, parts, new Map<number, number>());
  if (close === undefined || close < 0) return undefined;
  return { open, close, table: parts.columns.table(text), comments: parts.comments, handedOver: parts.handedOver };
}

interface BodyParts {
  readonly columns: Columns;
  readonly comments: CommentNode[];
  readonly handedOver: { start: number; end: number }[];
}

/**
 * Reads whole lines from `position` (a line start) while lines start before `limit`, into `parts`.
 * Returns the offset of the `}` that ends the block, −1 when `limit` was reached first, or
 * undefined when the block's structure needs the general parser.
 */
function readLines(text: string, position: number, limit: number, parts: BodyParts, elementCache: Map<number, number>): number | undefined {
  const { columns, comments, handedOver } = parts;
  const length = text.length;
  while (position < length && position < limit) {
    let lineEnd = text.indexOf('\n', position);
    if (lineEnd < 0) lineEnd = length;
    let fields = 0;
    let cursor = position;
    let closeAt = -1;
    let comment = -1;
    // A sixth field, `#index` or `;` make the line one for the general parser.
    let unusual = false;
    while (cursor < lineEnd) {
      const code = text.charCodeAt(cursor);
      if (isSpace(code)) {
        cursor++;
        continue;
      }
      if (code === 35 /* # */) {
        const next = text.charCodeAt(cursor + 1);
        if (next >= 48 && next <= 57) {
          unusual = true;
          cursor++;
          continue;
        }
        comment = cursor;
        break;
      }
      if (code === 125 /* } */) {
        closeAt = cursor;
        break;
      }
      let end = cursor;
      while (end < lineEnd) {
        const c = text.charCodeAt(end);
        if (c === 123 /* { */ || c === 34 /* " */) return undefined;
        if (isSpace(c) || c === 35 || c === 125) break;
        end++;
      }
      if (fields === 0 && TOP_LEVEL_STARTERS.has(text.slice(cursor, end))) return undefined;
      if (fields < 5) {
        fieldStarts[fields] = cursor;
        fieldEnds[fields] = end;
      } else {
        unusual = true;
      }
      fields++;
      cursor = end;
    }
    if (fields > 0 && (unusual || !readAtomLine(text, fields, columns, elementCache))) {
      // The whole line up to the `}`, comment included, goes to the general parser.
      handedOver.push({ start: position, end: closeAt >= 0 ? closeAt : lineEnd });
    } else if (comment >= 0) {
      comments.push({ text: text.slice(comment, lineEnd), span: { start: comment, end: lineEnd } });
    }
    // Anything after the `}` on its line is left to the general parser, which sees it as usual.
    if (closeAt >= 0) return closeAt;
    position = lineEnd + 1;
  }
  return position >= length ? undefined : -1;
}

const POWERS_OF_TEN = Array.from({ length: 23 }, (_, k) => 10 ** k);

/**
 * The value of the number literal text[start, end), exactly as Number() would read it, or NaN when
 * it is not a plain number literal. Plain fixed-point literals with at most 15 digits take the
 * exact fast path (one correctly rounded division of two exactly representable integers, as in
 * Clinger, PLDI 1990); anything else goes through Number().
 */
export function readNumber(text: string, start: number, end: number): number {
  let position = start;
  let negative = false;
  let code = text.charCodeAt(position);
  if (code === 43 /* + */ || code === 45 /* - */) {
    negative = code === 45;
    position++;
  }
  let mantissa = 0;
  let digits = 0;
  let fractionDigits = 0;
  let seenPoint = false;
  let seenDigit = false;
  for (; position < end; position++) {
    code = text.charCodeAt(position);
    if (code >= 48 && code <= 57) {
      mantissa = mantissa * 10 + (code - 48);
      if (mantissa > 0) digits++;
      if (seenPoint) fractionDigits++;
      seenDigit = true;
    } else if (code === 46 /* . */ && !seenPoint) {
      seenPoint = true;
    } else {
      break;
    }
  }
  if (!seenDigit) return NaN;
  if (position === end) {
    if (digits > 15 || fractionDigits > 22) return Number(text.slice(start, end));
    const value = mantissa / POWERS_OF_TEN[fractionDigits]!;
    return negative ? -value : value;
  }
  if (code !== 101 && code !== 69) return NaN;
  const field = text.slice(start, end);
  return NUMBER.test(field) ? Number(field) : NaN;
}

/**
 * Atomic number of the element symbol text[start, end), or 0. Symbols are one or two letters;
 * the cache key packs their character codes.
 */
function atomicNumberAt(text: string, start: number, end: number, cache: Map<number, number>): number {
  const length = end - start;
  if (length < 1 || length > 2) return 0;
  const key = text.charCodeAt(start) * 65536 + (length === 2 ? text.charCodeAt(start + 1) : 0);
  let z = cache.get(key);
  if (z === undefined) {
    const word = text.slice(start, end);
    z = PLAIN_WORD.test(word) ? (elementBySymbol(word)?.z ?? 0) : 0;
    cache.set(key, z);
  }
  return z;
}

/** Appends one `Element [label] x y z` line; false when the line is anything else. */
function readAtomLine(text: string, fields: number, columns: Columns, elementCache: Map<number, number>): boolean {
  if (fields !== 4 && fields !== 5) return false;
  const z = atomicNumberAt(text, fieldStarts[0]!, fieldEnds[0]!, elementCache);
  if (z === 0) return false;
  let first = 1;
  let label: string | undefined;
  if (fields === 5) {
    label = text.slice(fieldStarts[1], fieldEnds[1]);
    if (!PLAIN_WORD.test(label)) return false;
    first = 2;
  }
  // Every value is read before any is stored, so that a rejected line leaves no trace in the columns.
  const x = readNumber(text, fieldStarts[first]!, fieldEnds[first]!);
  const y = readNumber(text, fieldStarts[first + 1]!, fieldEnds[first + 1]!);
  const zValue = readNumber(text, fieldStarts[first + 2]!, fieldEnds[first + 2]!);
  if (!Number.isFinite(x) || !Number.isFinite(y) || !Number.isFinite(zValue)) return false;
  columns.coordinates.push(x);
  columns.coordinates.push(y);
  columns.coordinates.push(zValue);
  for (let k = 0; k < 3; k++) {
    columns.coordinateStart.push(fieldStarts[first + k]!);
    columns.coordinateEnd.push(fieldEnds[first + k]!);
  }
  columns.atomicNumbers.push(z);
  if (label !== undefined) columns.labels.set(columns.count, label);
  columns.lineStart.push(fieldStarts[0]!);
  columns.lineEnd.push(fieldEnds[fields - 1]!);
  columns.elementEnd.push(fieldEnds[0]!);
  columns.labelStart.push(label === undefined ? -1 : fieldStarts[1]!);
  columns.labelEnd.push(label === undefined ? -1 : fieldEnds[1]!);
  columns.count++;
  return true;
}

/** The statement the general parser would have produced for atom line `i` of the table. */
export function atomTableStatement(table: AtomTable, i: number): Statement {
  const { text } = table;
  const keyword: Argument = { kind: 'word', text: text.slice(table.lineStart[i], table.elementEnd[i]), span: { start: table.lineStart[i]!, end: table.elementEnd[i]! } };
  const args: Argument[] = [];
  const labelStart = table.labelStart[i]!;
  if (labelStart >= 0) args.push({ kind: 'word', text: text.slice(labelStart, table.labelEnd[i]), span: { start: labelStart, end: table.labelEnd[i]! } });
  for (let k = 0; k < 3; k++) {
    const start = table.coordinateStart[3 * i + k]!;
    const end = table.coordinateEnd[3 * i + k]!;
    args.push({ kind: 'number', text: text.slice(start, end), span: { start, end } });
  }
  return { keyword, args, span: { start: table.lineStart[i]!, end: table.lineEnd[i]! } };
}

/** The statements the general parser would have produced for the table's lines. */
export function atomTableStatements(table: AtomTable): Statement[] {
  return Array.from({ length: table.count }, (_, i) => atomTableStatement(table, i));
}

/**
 * Finds `structure {` or `structure in <unit> {` (or the retired keyword it replaced) at the start
 * of a line and reads its body. Returns the blocks it could read,
 * and the text with what it read blanked out (same length, so every offset stays valid): the lines
 * it handed over stay, each on a line of its own, for the general parser.
 */
export function extractGeometryBodies(text: string, previous?: PreviousReading): { masked: string; blocks: FastGeometryBlock[] } {
  const reused = previous ? rereadChangedLines(text, previous) : undefined;
  const blocks: FastGeometryBlock[] = reused ?? [];
  if (!reused) {
    const pattern = new RegExp(BLOCK_START.source, 'gm');
    let match: RegExpExecArray | null;
    while ((match = pattern.exec(text)) !== null) {
      const open = match.index + match[0].length - 1;
      const block = readBody(text, open);
      if (!block) continue;
      blocks.push(block);
      pattern.lastIndex = block.close + 1;
    }
  }
  return { masked: maskBodies(text, blocks), blocks };
}

/** What the previous version of a document read: its text and its fast-read blocks. */
export interface PreviousReading {
  readonly text: string;
  readonly blocks: readonly FastGeometryBlock[];
}

/** Where two texts differ: [start, oldEnd) of the old one became [start, newEnd) of the new one. */
export function changedRange(before: string, after: string): { start: number; oldEnd: number; newEnd: number } | undefined {
  if (before === after) return undefined;
  const shortest = Math.min(before.length, after.length);
  // Compare in chunks first (native string comparison), then character by character.
  const CHUNK = 1024;
  let start = 0;
  while (start + CHUNK <= shortest && before.slice(start, start + CHUNK) === after.slice(start, start + CHUNK)) start += CHUNK;
  while (start < shortest && before.charCodeAt(start) === after.charCodeAt(start)) start++;
  let suffix = 0;
  const room = shortest - start;
  while (suffix + CHUNK <= room && before.slice(before.length - suffix - CHUNK, before.length - suffix) === after.slice(after.length - suffix - CHUNK, after.length - suffix)) suffix += CHUNK;
  while (suffix < room && before.charCodeAt(before.length - 1 - suffix) === after.charCodeAt(after.length - 1 - suffix)) suffix++;
  return { start, oldEnd: before.length - suffix, newEnd: after.length - suffix };
}

/**
 * The blocks of the new text when the edit since the previous reading lies inside the body of one
 * fast-read block, away from its braces: only the changed lines are read again, the rows before
 * them are kept and those after them moved by the edit's length. Undefined when the edit is
 * anywhere else (or changes the block's structure): then the whole text is read again.
 */
export function rereadChangedLines(text: string, previous: PreviousReading): FastGeometryBlock[] | undefined {
  const change = changedRange(previous.text, text);
  if (!change) return [...previous.blocks];
  if (previous.blocks.length !== 1) return undefined;
  const old = previous.blocks[0]!;
  const { start, oldEnd, newEnd } = change;
  const shift = newEnd - oldEnd;
  // Strictly inside the body, and not on the line of the `{` or of the `}`.
  const oldText = previous.text;
  const firstLine = oldText.lastIndexOf('\n', start - 1) + 1;
  if (firstLine <= old.open || oldEnd > old.close) return undefined;
  const oldLastLineEnd = oldText.indexOf('\n', oldEnd);
  if (oldLastLineEnd < 0 || oldLastLineEnd >= old.close) return undefined;
  // A structure block cannot start inside the changed lines of the new text either.
  const newLastLineEnd = text.indexOf('\n', newEnd);
  if (newLastLineEnd < 0 || BLOCK_START.test(text.slice(firstLine, newLastLineEnd))) return undefined;

  const parts: BodyParts = { columns: new Columns(), comments: [], handedOver: [] };
  const table = old.table;
  // Rows on the lines before the change, as they were.
  let row = 0;
  while (row < table.count && table.lineStart[row]! < firstLine) row++;
  parts.columns.appendRows(table, 0, row, 0);
  for (const comment of old.comments) if (comment.span.start < firstLine) parts.comments.push(comment);
  for (const line of old.handedOver) if (line.start < firstLine) parts.handedOver.push(line);
  // The changed lines, read again.
  const ended = readLines(text, firstLine, newLastLineEnd + 1, parts, new Map<number, number>());
  if (ended !== -1) return undefined;
  // Rows after the change, moved.
  let after = row;
  while (after < table.count && table.lineStart[after]! <= oldLastLineEnd) after++;
  parts.columns.appendRows(table, after, table.count, shift);
  for (const comment of old.comments) {
    if (comment.span.start > oldLastLineEnd) parts.comments.push({ text: comment.text, span: { start: comment.span.start + shift, end: comment.span.end + shift } });
  }
  for (const line of old.handedOver) if (line.start > oldLastLineEnd) parts.handedOver.push({ start: line.start + shift, end: line.end + shift });
  return [{ open: old.open, close: old.close + shift, table: parts.columns.table(text), comments: parts.comments, handedOver: parts.handedOver }];
}

/** The text with what the fast reader read blanked out; handed-over lines stay, each on a line of its own. */
function maskBodies(text: string, blocks: readonly FastGeometryBlock[]): string {
  if (blocks.length === 0) return text;
  const pieces: string[] = [];
  let from = 0;
  const blank = (start: number, end: number) => {
    if (end > start) pieces.push(' '.repeat(end - start));
  };
  for (const block of blocks) {
    pieces.push(text.slice(from, block.open + 1));
    let cursor = block.open + 1;
    for (const line of block.handedOver) {
      // Keep the line break before the handed-over line (it ends the previous line) and the line itself.
      blank(cursor, line.start - 1);
      if (line.start - 1 >= cursor) pieces.push(text[line.start - 1]!);
      pieces.push(text.slice(line.start, line.end));
      cursor = line.end;
      // And the line break after it, which ends a comment on it.
      if (text[cursor] === '\n' && cursor < block.close) pieces.push(text[cursor++]!);
    }
    blank(cursor, block.close);
    from = block.close;
  }
  pieces.push(text.slice(from));
  return pieces.join('');
}
