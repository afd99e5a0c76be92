/** Plain-text and Markdown tables. */

export interface Table {
  readonly title?: string;
  readonly headers: readonly string[];
  readonly rows: readonly (readonly string[])[];
  /** Columns aligned to the right (numbers). */
  readonly numeric?: readonly boolean[];
}

export function renderTextTable(table: Table): string {
  const widths = table.headers.map((header, column) =>
    table.rows.reduce((most, row) => Math.max(most, (row[column] ?? '').length), header.length),
  );
  const line = (cells: readonly string[]) =>
    cells
      .map((cell, column) => (table.numeric?.[column] ? cell.padStart(widths[column]!) : cell.padEnd(widths[column]!)))
      .join('  ')
      .trimEnd();
  const out: string[] = [];
  if (table.title) out.push(table.title);
  out.push(line(table.headers));
  out.push(widths.map((width) => '-'.repeat(width)).join('  '));
  for (const row of table.rows) out.push(line(row));
  return out.join('\n');
}

function escapeMarkdown(cell: string): string {
  return cell.replace(/\|/g, '\\|');
}

export function renderMarkdownTable(table: Table, heading = '###'): string {
  const out: string[] = [];
  if (table.title) out.push(`${heading} ${table.title}`, '');
  out.push(`| ${table.headers.map(escapeMarkdown).join(' | ')} |`);
  out.push(`|${table.headers.map((_, column) => (table.numeric?.[column] ? ' ---: ' : ' --- ')).join('|')}|`);
  for (const row of table.rows) out.push(`| ${row.map(escapeMarkdown).join(' | ')} |`);
  return out.join('\n');
}
