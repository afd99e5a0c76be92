/** The estimate report as plain text or Markdown: the same tables and conventions in both. */
import type { EstimateReport } from '../../analysis';
import { PLANNING_NOTE } from '../../analysis';
import { conventionLines, estimateTables, headerLines } from './estimateTables';
import { figuresTable, scanTable } from './figures';
import { markdownText, plainText } from './escape';
import { renderMarkdownTable, renderTextTable, type Table } from './table';

export interface ProblemLine {
  readonly line: number;
  readonly severity: string;
  readonly code: string;
  readonly message: string;
}

export function reportTitle(report: EstimateReport): string {
  return report.spec.name ?? report.spec.path ?? 'spec';
}

export function renderEstimateText(report: EstimateReport): string {
  const tables = estimateTables(report);
  return [
    `Tessera estimate: ${plainText(reportTitle(report))}`,
    PLANNING_NOTE,
    ...headerLines(report).map(plainText),
    '',
    ...tables.flatMap((table) => [renderTextTable(table), '']),
    'Conventions:',
    ...conventionLines(report).map((line) => `  ${plainText(line)}`),
    '',
  ].join('\n');
}

/** The tables of a report: the estimate tables, and with `full` the table of every figure by part and the scan totals. */
export function reportTables(report: EstimateReport, full = false): Table[] {
  const tables = estimateTables(report);
  if (!full) return tables;
  const scan = scanTable(report);
  return [...tables, figuresTable(report), ...(scan ? [scan] : [])];
}

export interface MarkdownOptions {
  /** Heading level of the title: 1 for a document, 2 for a section (default 1). */
  level?: number;
  /** Errors and warnings with their 1-based lines; a Problems section when given. */
  problems?: readonly ProblemLine[];
  /** Adds the table of every figure by part and the scan totals (the `tessera report` document). */
  full?: boolean;
}

/**
 * Markdown with `heading` levels starting at `level` (1 for a document, 2 for a section). Every
 * piece of text is escaped (escape.ts), so names and messages from the spec show as written and
 * never as markup, here and in the editor's report panel, which renders this Markdown.
 */
export function renderEstimateMarkdown(report: EstimateReport, options: MarkdownOptions = {}): string {
  const level = options.level ?? 1;
  const h = (depth: number) => '#'.repeat(level + depth);
  const lines = [
    `${h(0)} Resource report: ${markdownText(reportTitle(report))}`,
    '',
    `> ${markdownText(PLANNING_NOTE)}`,
    '',
    ...headerLines(report).map((line) => `- ${markdownText(line)}`),
    '',
    ...reportTables(report, options.full).flatMap((table) => [renderMarkdownTable(table, h(1)), '']),
    `${h(1)} Conventions`,
    '',
    ...conventionLines(report).map((line) => `- ${markdownText(line)}`),
    '',
  ];
  if (options.problems) {
    lines.push(`${h(1)} Problems (${options.problems.length})`, '');
    lines.push(...(options.problems.length === 0 ? ['None.'] : options.problems.map((p) => `- line ${p.line}: **${p.severity}** \`${p.code}\` ${markdownText(p.message)}`)), '');
  }
  return lines.join('\n');
}
