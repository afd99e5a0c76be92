/** Conversions between analysis spans and LSP positions and ranges. */
import type { Position, Range } from 'vscode-languageserver-types';
import type { DocumentAnalysis } from '../analysis';
import type { Span } from '../language/text';

export function toRange(analysis: DocumentAnalysis, span: Span): Range {
  return analysis.lines.rangeOf(span);
}

export function toOffset(analysis: DocumentAnalysis, position: Position): number {
  return analysis.lines.offsetAt(position);
}

export function spanOfRange(analysis: DocumentAnalysis, range: Range): Span {
  return { start: toOffset(analysis, range.start), end: toOffset(analysis, range.end) };
}

export function rangeContains(outer: Span, inner: Span): boolean {
  return inner.start >= outer.start && inner.end <= outer.end;
}
