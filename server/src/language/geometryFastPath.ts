/**
 * A fast reader for the body of `structure { ... }` blocks, which hold nearly all of a large spec.
 *
 * It accepts only well-formed atom lines (`Element [label] x y z` with a known element, a plain
 * label and three finite numbers), comments and blank lines, and stores them column-wise in an
 * AtomTable. On anything else (a mistake, a string, `;`, `#index`, nested braces, a top-level
 * keyword that suggests a missing `}`) it gives up and the block goes through the general parser,
 * which reports the mistake. tests/language/geometry-fast-path.test.ts checks that both readers
 * give the same statements.
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
}

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

  toArray(): T {
    return this.data.slice(0, this.length) as T;
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
 * Reads the lines after the `{` at `open` up to the first `}`; undefined when the block is not
 * plain enough.
 */
function readBody(text: string, open: number): FastGeometryBlock | undefined {
  const columns = new Columns();
  const comments: CommentNode[] = [];
  const elementCache = new Map<number, number>();
  let position = open + 1;
  const length = text.length;
  while (position < length) {
    let lineEnd = text.indexOf('\n', position);
    if (lineEnd < 0) lineEnd = length;
    let fields = 0;
    let cursor = position;
    let closeAt = -1;
    while (cursor < lineEnd) {
      const code = text.charCodeAt(cursor);
      if (isSpace(code)) {
        cursor++;
        continue;
      }
      if (code === 35 /* # */) {
        const next = text.charCodeAt(cursor + 1);
        if (next >= 48 && next <= 57) return undefined;
        comments.push({ text: text.slice(cursor, lineEnd), span: { start: cursor, end: lineEnd } });
        break;
      }
      if (code === 125 /* } */) {
        closeAt = cursor;
        break;
      }
      let end = cursor;
      while (end < lineEnd) {
        const c = text.charCodeAt(end);
        if (isSpace(c) || c === 35 || c === 125) break;
        end++;
      }
      if (fields === 5) return undefined;
      fieldStarts[fields] = cursor;
      fieldEnds[fields] = end;
      fields++;
      cursor = end;
    }
    if (fields > 0 && !readAtomLine(text, fields, columns, elementCache)) return undefined;
    if (closeAt >= 0) {
      // Anything after the `}` on its line is left to the general parser, which sees it as usual.
      return { open, close: closeAt, table: columns.table(text), comments };
    }
    position = lineEnd + 1;
  }
  return undefined;
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
  for (let k = 0; k < 3; k++) {
    const value = readNumber(text, fieldStarts[first + k]!, fieldEnds[first + k]!);
    if (!Number.isFinite(value)) return false;
    columns.coordinates.push(value);
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
 * Finds `structure {` or `structure in <unit> {` (or the retired keyword it replaced) at the start of a
 * line and reads its body. Returns the blocks it could read, and the text with each such body
 * blanked out (same length, so every offset stays valid).
 */
export function extractGeometryBodies(text: string): { masked: string; blocks: FastGeometryBlock[] } {
  const blocks: FastGeometryBlock[] = [];
  const pattern = /^[ \t]*(?:structure(?:[ \t]+in[ \t]+[A-Za-z]+)?|geometry)[ \t]*\{/gm;
  let match: RegExpExecArray | null;
  while ((match = pattern.exec(text)) !== null) {
    const open = match.index + match[0].length - 1;
    const block = readBody(text, open);
    if (!block) continue;
    blocks.push(block);
    pattern.lastIndex = block.close + 1;
  }
  if (blocks.length === 0) return { masked: text, blocks };
  const pieces: string[] = [];
  let from = 0;
  for (const block of blocks) {
    pieces.push(text.slice(from, block.open + 1), ' '.repeat(block.close - block.open - 1));
    from = block.close;
  }
  pieces.push(text.slice(from));
  return { masked: pieces.join(''), blocks };
}
