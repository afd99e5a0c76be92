/**
 * The estimate report as CSV (RFC 4180: comma-separated, CRLF line ends, fields with a comma, a
 * double quote or a line break enclosed in double quotes, inner quotes doubled). One header row,
 * then one row per part: the system, then each fragment in the spec's order.
 *
 * Columns, stable: `spec` (the spec's name), then every key of FIGURE_COLUMNS (`part`, `name`, and
 * the paths of the figures in the JSON estimate, for example `qubits.jordanWigner`), then `note`
 * (the planning-estimate note, the same on every row). An empty field means the part has no such
 * figure; `true`/`false` for yes/no figures; numbers as in the JSON estimate.
 */
import { PLANNING_NOTE, type EstimateReport } from '../../analysis';
import { FIGURE_COLUMNS, figureText, figureValue, reportParts } from './figures';

export const CSV_COLUMNS: readonly string[] = ['spec', ...FIGURE_COLUMNS.map((column) => column.key), 'note'];

import { csvField } from './escape';

export { csvField };

export function renderEstimateCsv(report: EstimateReport): string {
  const spec = report.spec.name ?? '';
  const rows = [CSV_COLUMNS.map(csvField).join(',')];
  for (const part of reportParts(report)) {
    const fields = [spec, ...FIGURE_COLUMNS.map((column) => figureText(figureValue(part, column.key))), PLANNING_NOTE];
    rows.push(fields.map(csvField).join(','));
  }
  return `${rows.join('\r\n')}\r\n`;
}
