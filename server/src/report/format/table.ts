/** Plain-text and Markdown tables. */
import { markdownText, plainText } from './escape';

export interface Table {
  readonly title?: string;
  readonly headers: readonly string[];
  readonly rows: readonly (readonly string[])[];
  /** Columns aligned to the right (numbers). */
  readonly numeric?: readonly boolean[];
}

export function renderTextTable(table: Table): string {
  const headers = table.headers.map(plainText);
  const rows = table.rows.map((row) => row.map(plainText));
  const widths = headers.map((header, column) => rows.reduce((most, row) => Math.max(most, (row[column] ?? '').length), header.length));
  const line = (cells: readonly string[]) =>
    cells
      .map((cell, column) => (table.numeric?.[column] ? cell.padStart(widths[column]!) : cell.padEnd(widths[column]!)))
      .join('  ')
      .trimEnd();
  const out: string[] = [];
  if (table.title) out.push(plainText(table.title));
  out.push(line(headers));
  out.push(widths.map((width) => '-'.repeat(width)).join('  '));
  for (const row of rows) out.push(line(row));
  return out.join('\n');
}

export function renderMarkdownTable(table: Table, heading = '###'): string {
  const out: string[] = [];
  if (table.title) out.push(`${heading} ${markdownText(table.title)}`, '');
  out.push(`| ${table.headers.map(markdownText).join(' | ')} |`);
  out.push(`|${table.headers.map((_, column) => (table.numeric?.[column] ? ' ---: ' : ' --- ')).join('|')}|`);
  for (const row of table.rows) out.push(`| ${row.map(markdownText).join(' | ')} |`);
  return out.join('\n');
}
