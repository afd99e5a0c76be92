/** The estimate report as plain text or Markdown: the same tables and conventions in both. */
import type { EstimateReport } from '../estimate';
import { PLANNING_NOTE } from '../estimate';
import { conventionLines, estimateTables, headerLines } from './estimateTables';
import { renderMarkdownTable, renderTextTable } from './table';

export interface ProblemLine {
  readonly line: number;
  readonly severity: string;
  readonly code: string;
  readonly message: string;
}

function title(report: EstimateReport): string {
  return report.spec.name ?? report.spec.path ?? 'spec';
}

export function renderEstimateText(report: EstimateReport): string {
  const tables = estimateTables(report);
  return [
    `Tessera estimate: ${title(report)}`,
    PLANNING_NOTE,
    ...headerLines(report),
    '',
    ...tables.flatMap((table) => [renderTextTable(table), '']),
    'Conventions:',
    ...conventionLines(report).map((line) => `  ${line}`),
    '',
  ].join('\n');
}

/** Markdown with `heading` levels starting at `level` (1 for a document, 2 for a section). */
export function renderEstimateMarkdown(report: EstimateReport, options: { level?: number; problems?: readonly ProblemLine[] } = {}): string {
  const level = options.level ?? 1;
  const h = (depth: number) => '#'.repeat(level + depth);
  const lines = [
    `${h(0)} Resource report: ${title(report)}`,
    '',
    `> ${PLANNING_NOTE}`,
    '',
    ...headerLines(report).map((line) => `- ${line}`),
    '',
    ...estimateTables(report).flatMap((table) => [renderMarkdownTable(table, h(1)), '']),
    `${h(1)} Conventions`,
    '',
    ...conventionLines(report).map((line) => `- ${line}`),
    '',
  ];
  if (options.problems) {
    lines.push(`${h(1)} Problems (${options.problems.length})`, '');
    lines.push(...(options.problems.length === 0 ? ['None.'] : options.problems.map((p) => `- line ${p.line}: **${p.severity}** \`${p.code}\` ${p.message}`)), '');
  }
  return lines.join('\n');
}
