/** The resource report of a spec as Markdown, for the editor's report view. */
import type { Analysis } from '../language/analyze';
import { PLANNING_NOTE } from '../report/estimate';
import { conventionLines, estimateTables, headerLines } from '../report/format/estimateTables';
import { renderMarkdownTable } from '../report/format/table';
import { estimateOf } from './cards';

export function reportMarkdown(analysis: Analysis): string {
  const report = estimateOf(analysis);
  const problems = analysis.diagnostics.filter((d) => d.severity === 'error' || d.severity === 'warning');
  return [
    `# Resource report: ${report.spec.name ?? 'spec'}`,
    '',
    `> ${PLANNING_NOTE}`,
    '',
    ...headerLines(report).map((line) => `- ${line}`),
    '',
    ...estimateTables(report).flatMap((table) => [renderMarkdownTable(table), '']),
    '## Conventions',
    '',
    ...conventionLines(report).map((line) => `- ${line}`),
    '',
    `## Problems (${problems.length})`,
    '',
    ...(problems.length === 0
      ? ['None.']
      : problems.map((d) => {
          const position = analysis.lines.positionAt(d.span.start);
          return `- line ${position.line + 1}: **${d.severity}** \`${d.code}\` ${d.message}`;
        })),
    '',
  ].join('\n');
}
