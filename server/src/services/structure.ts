/** Folding ranges (blocks and comment runs) and selection ranges (token, statement, block, ...). */
import { FoldingRangeKind, type FoldingRange, type Position, type SelectionRange } from 'vscode-languageserver-types';
import type { DocumentAnalysis } from '../analysis';
import type { Statement } from '../language/syntax';
import type { Span } from '../language/text';
import { locate } from './locate';
import { toOffset, toRange } from './positions';

export function getFoldingRanges(analysis: DocumentAnalysis): FoldingRange[] {
  const ranges: FoldingRange[] = [];
  const visit = (statements: readonly Statement[]) => {
    for (const statement of statements) {
      const block = statement.block;
      if (!block) continue;
      const start = analysis.lines.positionAt(statement.span.start).line;
      const end = analysis.lines.positionAt(block.close?.start ?? block.span.end).line;
      if (end > start) ranges.push({ startLine: start, endLine: block.close ? end - 1 : end });
      if (!block.atomTable) visit(block.statements);
    }
  };
  visit(analysis.tree.statements);
  // Runs of two or more comment lines fold as one.
  let runStart = -1;
  let runEnd = -1;
  const flush = () => {
    if (runEnd > runStart && runStart >= 0) ranges.push({ startLine: runStart, endLine: runEnd, kind: FoldingRangeKind.Comment });
  };
  for (const comment of analysis.tree.comments) {
    const line = analysis.lines.positionAt(comment.span.start).line;
    const lineStart = analysis.lines.lineStart(line);
    const alone = analysis.text.slice(lineStart, comment.span.start).trim() === '';
    if (!alone) continue;
    if (line === runEnd + 1 && runStart >= 0) runEnd = line;
    else {
      flush();
      runStart = line;
      runEnd = line;
    }
  }
  flush();
  return ranges;
}

export function getSelectionRanges(analysis: DocumentAnalysis, positions: readonly Position[]): SelectionRange[] {
  return positions.map((position) => {
    const offset = toOffset(analysis, position);
    const context = locate(analysis.text, analysis.tree.statements, offset);
    const spans: Span[] = [];
    if (context.token) spans.push(context.token.node.span);
    if (context.statement) spans.push(context.statement.span);
    for (const parent of [...context.parents].reverse()) {
      if (parent.block) spans.push({ start: parent.block.open.end, end: parent.block.close?.start ?? parent.block.span.end });
      spans.push(parent.span);
    }
    spans.push({ start: 0, end: analysis.text.length });
    // Every range must contain the position: a cursor in a trailing comment or after the last
    // argument is on the statement's line but outside its span.
    const containing = spans.filter((span) => span.start <= offset && offset <= span.end);
    let range: SelectionRange | undefined;
    for (const span of containing.reverse()) {
      if (range && span.start === analysis.lines.offsetAt(range.range.start) && span.end === analysis.lines.offsetAt(range.range.end)) continue;
      range = range ? { range: toRange(analysis, span), parent: range } : { range: toRange(analysis, span) };
    }
    return range!;
  });
}
