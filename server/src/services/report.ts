/** The resource report of a spec as Markdown, for the editor's report view. */
import type { Analysis } from '../language/analyze';
import { renderEstimateMarkdown } from '../report/format/render';
import { estimateOf } from './cards';

export function reportMarkdown(analysis: Analysis): string {
  const problems = analysis.diagnostics
    .filter((d) => d.severity === 'error' || d.severity === 'warning')
    .map((d) => ({ line: analysis.lines.positionAt(d.span.start).line + 1, severity: d.severity, code: d.code, message: d.message }));
  return renderEstimateMarkdown(estimateOf(analysis), { level: 1, problems });
}
