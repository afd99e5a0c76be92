/**
 * The estimate report as one standalone HTML page: the same tables, header lines, conventions and
 * problems as the Markdown report, and the cost plots inline as SVG. No scripts and no external
 * resources (a content-security policy in the page says so to the browser); every piece of text is
 * escaped.
 */
import { PLANNING_NOTE, type EstimateReport } from '../../analysis';
import { growthChartSvg, qubitsChartSvg, scanChartSvg, shotsChartSvg, type ShotPoint } from '../plots';
import type { ComputedSection } from './computedSections';
import type { GrowthPoint } from '../../analysis';
import { conventionLines, headerLines } from './estimateTables';
import { reportTables, reportTitle, type ProblemLine } from './render';
import type { Table } from './table';

export interface HtmlReportOptions {
  /** Errors and warnings with their 1-based lines. */
  readonly problems?: readonly ProblemLine[];
  /** Active-space growth of quantum-tier fragments, by fragment name (report/structure.ts activeSpaceGrowth). */
  readonly growth?: readonly { readonly fragment: string; readonly points: readonly GrowthPoint[] }[];
  /** Who made the page, for the footer (for example `Tessera 0.1.0`). */
  readonly generator?: string;
  /** Computed results (`report --mean-field`): tables with their notes, after the planning tables. */
  readonly computed?: readonly ComputedSection[];
  /** Shots against active-space size per quantum fragment, from computed Hamiltonians. */
  readonly shots?: readonly ShotSeries[];
}

export interface ShotSeries {
  readonly fragment: string;
  /** Target accuracy (hartree). */
  readonly epsilon: number;
  readonly points: readonly ShotPoint[];
}

import { escapeHtml } from './escape';

export { escapeHtml };

export function renderHtmlTable(table: Table): string {
  const align = (column: number) => (table.numeric?.[column] ? ' class="num"' : '');
  const head = `<tr>${table.headers.map((header, column) => `<th scope="col"${align(column)}>${escapeHtml(header)}</th>`).join('')}</tr>`;
  const body = table.rows.map((row) => `<tr>${row.map((cell, column) => `<td${align(column)}>${escapeHtml(cell)}</td>`).join('')}</tr>`).join('\n');
  const caption = table.title ? `<h2>${escapeHtml(table.title)}</h2>\n` : '';
  return `${caption}<table>\n<thead>${head}</thead>\n<tbody>\n${body}\n</tbody>\n</table>`;
}

const STYLE = `
body { font-family: Helvetica, Arial, sans-serif; margin: 2em auto; max-width: 72em; padding: 0 1em; color: #222222; }
h1 { font-size: 1.5em; } h2 { font-size: 1.15em; margin-top: 1.6em; }
.note { border-left: 4px solid #e69f00; background: #fff8e6; padding: 0.5em 0.8em; }
table { border-collapse: collapse; margin: 0.5em 0; font-size: 0.9em; }
th, td { border: 1px solid #cccccc; padding: 0.25em 0.5em; text-align: left; vertical-align: top; }
th { background: #f2f2f2; } td.num, th.num { text-align: right; }
figure { margin: 1em 0; } figcaption { font-size: 0.85em; color: #555555; }
.absent { color: #555555; font-style: italic; }
code { white-space: nowrap; }
.error { color: #b00020; font-weight: bold; } .warning { color: #8a5a00; font-weight: bold; }
`;

function figure(svg: string, caption: string): string {
  return `<figure>\n${svg}\n<figcaption>${escapeHtml(caption)}</figcaption>\n</figure>`;
}

function absent(text: string): string {
  return `<p class="absent">${escapeHtml(text)}</p>`;
}

/** The plots: qubits per fragment, active-space growth of each quantum fragment, cost along the scan. */
function plots(report: EstimateReport, options: HtmlReportOptions): string[] {
  const parts = [figure(qubitsChartSvg(report), 'Qubits of each sized fragment under each mapping and after tapering; the dashed line is the qubit limit when the spec sets one.')];
  const quantum = report.fragments.filter((fragment) => fragment.tier === 'quantum');
  if (quantum.length === 0) {
    parts.push(absent('No active-space growth plot: the spec has no quantum-tier fragment.'));
  } else {
    for (const fragment of quantum) {
      const points = options.growth?.find((entry) => entry.fragment === fragment.name)?.points ?? [];
      parts.push(figure(growthChartSvg(points, fragment.name), `How qubits and Pauli terms of '${fragment.name}' grow with the number of active orbitals (half filled).`));
      const shots = options.shots?.find((entry) => entry.fragment === fragment.name);
      if (shots) {
        parts.push(
          figure(
            shotsChartSvg(shots.points, fragment.name, `${(shots.epsilon * 1000).toPrecision(3)} mHa`),
            `Shots per energy evaluation of '${fragment.name}' against active-space size, from Hamiltonians computed on its own mean field in canonical windows: the (λ/ε)² bound (any state, computed λ) and the QWC grouped estimate (reference-state variances). Both are estimates built on computed Hamiltonians; sizes marked × were not computed.`,
          ),
        );
      } else if (fragment.problem?.embedding === 'dmet') {
        parts.push(absent(`No shots plot for '${fragment.name}': under embedding dmet its Hamiltonian is the impurity's (fragment and bath), which is not computed.`));
      } else if (!options.computed) parts.push(absent(`No shots plot for '${fragment.name}': shots need computed Hamiltonians (tessera report --mean-field).`));
    }
  }
  if (report.scan && report.scan.points > 0) {
    parts.push(figure(scanChartSvg(report), 'Measurement circuits per energy evaluation, summed over the scan points so far.'));
  } else {
    parts.push(absent(report.scan ? 'No scan plot: the scan has no valid points.' : 'No scan plot: the spec has no scan.'));
  }
  return parts;
}

function problemsSection(problems: readonly ProblemLine[]): string {
  if (problems.length === 0) return `<h2>Problems (0)</h2>\n<p>None.</p>`;
  const rows = problems
    .map((p) => `<tr><td class="num">${p.line}</td><td class="${p.severity === 'error' ? 'error' : p.severity === 'warning' ? 'warning' : ''}">${escapeHtml(p.severity)}</td><td><code>${escapeHtml(p.code)}</code></td><td>${escapeHtml(p.message)}</td></tr>`)
    .join('\n');
  return `<h2>Problems (${problems.length})</h2>\n<table>\n<thead><tr><th scope="col" class="num">line</th><th scope="col">severity</th><th scope="col">code</th><th scope="col">message</th></tr></thead>\n<tbody>\n${rows}\n</tbody>\n</table>`;
}

export function renderReportHtml(report: EstimateReport, options: HtmlReportOptions = {}): string {
  const title = `Resource report: ${reportTitle(report)}`;
  const body = [
    `<h1>${escapeHtml(title)}</h1>`,
    `<p class="note"><strong>${escapeHtml(PLANNING_NOTE)}</strong></p>`,
    `<ul>\n${headerLines(report).map((line) => `<li>${escapeHtml(line)}</li>`).join('\n')}\n</ul>`,
    ...(options.problems ? [problemsSection(options.problems)] : []),
    ...reportTables(report, true).map(renderHtmlTable),
    ...(options.computed ? ['<h2>Computed results (Tessera\'s engine)</h2>', ...options.computed.flatMap((section) => [renderHtmlTable(section.table), `<ul>\n${section.notes.map((note) => `<li>${escapeHtml(note)}</li>`).join('\n')}\n</ul>`])] : []),
    `<h2>Plots (planning estimates${options.shots ? '; shots from computed Hamiltonians' : ''})</h2>`,
    ...plots(report, options),
    '<h2>Conventions</h2>',
    `<ul>\n${conventionLines(report).map((line) => `<li>${escapeHtml(line)}</li>`).join('\n')}\n</ul>`,
    `<p class="absent">${escapeHtml(`${options.generator ? `Made by ${options.generator}. ` : ''}${PLANNING_NOTE}`)}</p>`,
  ];
  return [
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'">`,
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>${escapeHtml(title)}</title>`,
    `<style>${STYLE}</style>`,
    '</head>',
    '<body>',
    ...body,
    '</body>',
    '</html>',
    '',
  ].join('\n');
}
