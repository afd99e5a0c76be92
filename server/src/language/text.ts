/** Offsets into a document and their conversion to zero-based line/character positions. */

/** A half-open range of UTF-16 offsets [start, end) into one document's text. */
export interface Span {
  readonly start: number;
  readonly end: number;
}

/** Zero-based line and UTF-16 character, the same shape as an LSP position. */
export interface Position {
  line: number;
  character: number;
}

/** The same shape as an LSP range. */
export interface Range {
  start: Position;
  end: Position;
}

/**
 * Lone carriage returns (old Mac line ends) become line feeds, as editors read them; `\r\n` stays.
 * The length is unchanged, so every offset, and with it every line and column, stays valid.
 */
export function normalizeLineEnds(text: string): string {
  return text.indexOf('\r') < 0 ? text : text.replace(/\r(?!\n)/g, '\n');
}

export function span(start: number, end: number): Span {
  return { start, end };
}

export function joinSpans(first: Span, last: Span): Span {
  return { start: Math.min(first.start, last.start), end: Math.max(first.end, last.end) };
}

export function spanContains(outer: Span, offset: number): boolean {
  return offset >= outer.start && offset <= outer.end;
}

/** Converts between offsets and line/character positions of one text. */
export class LineIndex {
  private starts: number[] | undefined;

  constructor(private readonly text: string) {}

  /** Computed on first use: analysis of a clean document never needs it. */
  private get lineStarts(): number[] {
    if (!this.starts) {
      const starts = [0];
      for (let i = this.text.indexOf('\n'); i >= 0; i = this.text.indexOf('\n', i + 1)) starts.push(i + 1);
      this.starts = starts;
    }
    return this.starts;
  }

  get lineCount(): number {
    return this.lineStarts.length;
  }

  positionAt(offset: number): Position {
    const clamped = Math.max(0, Math.min(offset, this.text.length));
    let low = 0;
    let high = this.lineStarts.length - 1;
    while (low < high) {
      const mid = (low + high + 1) >> 1;
      if (this.lineStarts[mid]! <= clamped) low = mid;
      else high = mid - 1;
    }
    return { line: low, character: clamped - this.lineStarts[low]! };
  }

  offsetAt(position: Position): number {
    if (position.line < 0) return 0;
    if (position.line >= this.lineStarts.length) return this.text.length;
    const lineStart = this.lineStarts[position.line]!;
    const lineEnd = this.lineEnd(position.line);
    return Math.max(lineStart, Math.min(lineStart + position.character, lineEnd));
  }

  /** Offset of the end of a line, before its line break. */
  lineEnd(line: number): number {
    const next = this.lineStarts[line + 1];
    if (next === undefined) return this.text.length;
    const beforeBreak = next - 1;
    return beforeBreak > 0 && this.text.charCodeAt(beforeBreak - 1) === 13 ? beforeBreak - 1 : beforeBreak;
  }

  lineStart(line: number): number {
    return this.lineStarts[Math.max(0, Math.min(line, this.lineStarts.length - 1))]!;
  }

  rangeOf(s: Span): Range {
    return { start: this.positionAt(s.start), end: this.positionAt(s.end) };
  }
}
