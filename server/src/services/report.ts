/** The resource report of a spec as Markdown, for the editor's report view. */
import type { DocumentAnalysis } from '../analysis';
import { renderEstimateMarkdown } from '../report/format/render';

export function reportMarkdown(analysis: DocumentAnalysis): string {
  const problems = analysis.diagnostics
    .filter((d) => d.severity === 'error' || d.severity === 'warning')
    .map((d) => ({ line: analysis.lines.positionAt(d.span.start).line + 1, severity: d.severity, code: d.code, message: d.message }));
  return renderEstimateMarkdown(analysis.report(), { level: 1, problems });
}
