/**
 * Plans side by side (analysis/figures/compare.ts) as Markdown, standalone HTML with a bar chart of
 * qubits and CNOTs, and CSV (RFC 4180 like the estimate CSV). Inputs that differ between the plans
 * are marked (Markdown: bold; HTML: a highlighted cell); the best plan under the limits is marked
 * with "best" in its column header.
 */
import { formatDuration, PLANNING_NOTE, type PlanComparison, type PlanSummary } from '../../analysis';
import { csvField, escapeHtml, markdownText } from './escape';

/** One metric row: label, CSV key, and how a plan's value is written. */
interface Metric {
  label: string;
  key: string;
  value: (plan: PlanSummary) => string;
}

const count = (value: number | null) => (value === null ? '—' : String(value));

function bytesText(log10: number | null): string {
  if (log10 === null) return '—';
  const bytes = 10 ** log10;
  const units = ['B', 'KiB', 'MiB', 'GiB', 'TiB', 'PiB'];
  let value = bytes;
  let unit = 0;
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit++;
  }
  return value >= 1024 ? `10^${log10.toFixed(1)} B` : `${value < 10 ? value.toFixed(1) : Math.round(value)} ${units[unit]}`;
}

export const COMPARE_METRICS: readonly Metric[] = [
  { label: 'errors', key: 'errors', value: (plan) => String(plan.errors) },
  { label: 'qubits needed (largest fragment)', key: 'qubits', value: (plan) => count(plan.qubits) },
  { label: 'Pauli terms (Jordan–Wigner, summed)', key: 'pauliTerms', value: (plan) => count(plan.pauliTerms) },
  { label: 'measurement groups (summed)', key: 'measurementGroups', value: (plan) => count(plan.measurementGroups) },
  { label: 'shots', key: 'shots', value: () => 'needs the computed Hamiltonian' },
  { label: 'ansatz parameters (summed)', key: 'parameters', value: (plan) => count(plan.parameters) },
  { label: 'CNOTs per Trotter step (summed)', key: 'cnots', value: (plan) => count(plan.cnots) },
  { label: 'classical memory (largest object)', key: 'memory', value: (plan) => bytesText(plan.memoryLog10Bytes) },
  { label: 'classical time (SCF estimate, summed)', key: 'classicalSeconds', value: (plan) => (plan.classicalSeconds === null ? '—' : formatDuration(plan.classicalSeconds)) },
  { label: 'within the limits', key: 'withinLimits', value: (plan) => (plan.withinLimits ? 'yes' : 'no') },
];

function header(plan: PlanSummary): string {
  return plan.best ? `${plan.label} (best)` : plan.label;
}

function inputKeys(comparison: PlanComparison): string[] {
  return [...new Set(comparison.plans.flatMap((plan) => Object.keys(plan.inputs)))];
}

export function renderCompareMarkdown(comparison: PlanComparison): string {
  const sections = compareMarkdownSections(comparison);
  return `${sections.cost}\n${sections.inputs}`;
}

/**
 * The Markdown in two parts, so that the editor's comparison panel can put the chart
 * (`compareChartSvg`, the one the HTML output holds) between them, where the HTML output has it.
 */
export function compareMarkdownSections(comparison: PlanComparison): { readonly cost: string; readonly inputs: string } {
  const plans = comparison.plans;
  const head = `| | ${plans.map((plan) => markdownText(header(plan))).join(' | ')} |`;
  const rule = `| --- |${plans.map(() => ' ---: ').join('|')}|`;
  const metrics = COMPARE_METRICS.map((metric) => `| ${markdownText(metric.label)} | ${plans.map((plan) => markdownText(metric.value(plan))).join(' | ')} |`);
  const differing = new Set(comparison.differingInputs);
  const inputs = inputKeys(comparison).map((key) => {
    const mark = (text: string) => (differing.has(key) ? `**${text}**` : text);
    return `| ${mark(markdownText(key))} | ${plans.map((plan) => mark(markdownText(plan.inputs[key] ?? '—'))).join(' | ')} |`;
  });
  const best = comparison.best === null ? 'No plan is free of errors and within its limits.' : `Best under the limits: ${markdownText(plans[comparison.best]!.label)} (${markdownText(comparison.rule)}).`;
  const cost = ['# Plans compared', '', `_${markdownText(PLANNING_NOTE)}_`, '', '## Cost', '', head, rule, ...metrics, ''];
  const inputTable = ['## Inputs (differing ones in bold)', '', head, `| --- |${plans.map(() => ' --- ').join('|')}|`, ...inputs, '', best, ''];
  return { cost: cost.join('\n'), inputs: inputTable.join('\n') };
}

export const COMPARE_CSV_COLUMNS: readonly string[] = ['plan', 'spec', 'variant', 'best', ...COMPARE_METRICS.map((metric) => metric.key), 'differing inputs', 'note'];

/** One row per plan; numbers as counted (empty where unknown), memory as log10 bytes. */
export function renderCompareCsv(comparison: PlanComparison): string {
  const raw = (plan: PlanSummary, key: string): string => {
    switch (key) {
      case 'errors':
        return String(plan.errors);
      case 'shots':
        return '';
      case 'memory':
        return plan.memoryLog10Bytes === null ? '' : String(plan.memoryLog10Bytes);
      case 'withinLimits':
        return String(plan.withinLimits);
      default: {
        const value = plan[key as 'qubits' | 'pauliTerms' | 'measurementGroups' | 'parameters' | 'cnots' | 'classicalSeconds'];
        return value === null ? '' : String(value);
      }
    }
  };
  const rows = [COMPARE_CSV_COLUMNS.map(csvField).join(',')];
  for (const plan of comparison.plans) {
    const differing = comparison.differingInputs.map((key) => `${key} = ${plan.inputs[key] ?? '—'}`).join('; ');
    rows.push([plan.label, plan.spec, plan.variant ?? '', String(plan.best), ...COMPARE_METRICS.map((metric) => raw(plan, metric.key)), differing, PLANNING_NOTE].map(csvField).join(','));
  }
  return `${rows.join('\r\n')}\r\n`;
}

const FONT = 'font-family="Helvetica, Arial, sans-serif"';
/** Okabe & Ito (2008) colours, as the other plots: qubits blue, CNOTs orange. */
const QUBIT_COLOUR = '#0072b2';
const CNOT_COLOUR = '#e69f00';

/** Bars per plan: qubits needed (left scale) and log10 CNOTs (right scale); the qubit limit dashed. */
export function compareChartSvg(comparison: PlanComparison): string {
  const plans = comparison.plans;
  const width = Math.max(480, 120 + 110 * plans.length);
  const height = 320;
  const left = 60;
  const right = width - 60;
  const top = 50;
  const bottom = height - 70;
  const title = 'Qubits and CNOTs per plan (planning estimate)';
  const limit = plans.reduce<number | null>((most, plan) => (plan.limits.qubits === null ? most : Math.max(most ?? 0, plan.limits.qubits)), null);
  const qubitMax = Math.max(1, limit ?? 0, ...plans.map((plan) => plan.qubits ?? 0));
  const cnotMax = Math.max(1, ...plans.map((plan) => (plan.cnots ? Math.log10(plan.cnots) : 0)));
  const slot = (right - left) / Math.max(1, plans.length);
  const bar = Math.min(36, slot / 3);
  const y = (fraction: number) => bottom - fraction * (bottom - top);
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="${escapeHtml(title)}">`,
    `<rect x="0" y="0" width="${width}" height="${height}" fill="#ffffff"/>`,
    `<text x="${left}" y="22" ${FONT} font-size="15" font-weight="bold" fill="#222222">${escapeHtml(title)}</text>`,
    `<line x1="${left}" y1="${bottom}" x2="${right}" y2="${bottom}" stroke="#888888"/>`,
    `<text x="${left - 8}" y="${top}" ${FONT} font-size="10" fill="${QUBIT_COLOUR}" text-anchor="end">${qubitMax}</text>`,
    `<text x="${left - 8}" y="${bottom}" ${FONT} font-size="10" fill="${QUBIT_COLOUR}" text-anchor="end">0</text>`,
    `<text x="${right + 8}" y="${top}" ${FONT} font-size="10" fill="${CNOT_COLOUR}">10^${cnotMax.toFixed(1)}</text>`,
    `<text x="${right + 8}" y="${bottom}" ${FONT} font-size="10" fill="${CNOT_COLOUR}">1</text>`,
  ];
  if (limit !== null) {
    const at = y(limit / qubitMax).toFixed(1);
    parts.push(`<line x1="${left}" y1="${at}" x2="${right}" y2="${at}" stroke="#b00020" stroke-dasharray="5 3"/><text x="${right - 4}" y="${Number(at) - 4}" ${FONT} font-size="10" fill="#b00020" text-anchor="end">limit ${limit} qubits</text>`);
  }
  plans.forEach((plan, index) => {
    const centre = left + slot * (index + 0.5);
    if (plan.qubits !== null) {
      const h = (plan.qubits / qubitMax) * (bottom - top);
      parts.push(`<rect x="${(centre - bar - 2).toFixed(1)}" y="${(bottom - h).toFixed(1)}" width="${bar.toFixed(1)}" height="${h.toFixed(1)}" fill="${QUBIT_COLOUR}"><title>${escapeHtml(`${plan.label}: ${plan.qubits} qubits`)}</title></rect>`);
    }
    if (plan.cnots) {
      const h = (Math.log10(plan.cnots) / cnotMax) * (bottom - top);
      parts.push(`<rect x="${(centre + 2).toFixed(1)}" y="${(bottom - h).toFixed(1)}" width="${bar.toFixed(1)}" height="${h.toFixed(1)}" fill="${CNOT_COLOUR}"><title>${escapeHtml(`${plan.label}: ${plan.cnots} CNOTs`)}</title></rect>`);
    }
    const label = plan.variant ?? plan.spec;
    parts.push(`<text x="${centre.toFixed(1)}" y="${bottom + 16}" ${FONT} font-size="11" fill="#333333" text-anchor="middle"${plan.best ? ' font-weight="bold"' : ''}>${escapeHtml(plan.best ? `${label} (best)` : label)}</text>`);
  });
  parts.push(
    `<rect x="${left}" y="${height - 26}" width="10" height="10" fill="${QUBIT_COLOUR}"/><text x="${left + 14}" y="${height - 17}" ${FONT} font-size="11" fill="#333333">qubits needed (left scale)</text>`,
    `<rect x="${left + 200}" y="${height - 26}" width="10" height="10" fill="${CNOT_COLOUR}"/><text x="${left + 214}" y="${height - 17}" ${FONT} font-size="11" fill="#333333">CNOTs per Trotter step (log scale, right)</text>`,
    '</svg>',
  );
  return parts.join('');
}

const STYLE = `
body { font-family: Helvetica, Arial, sans-serif; margin: 2em auto; max-width: 72em; padding: 0 1em; color: #222222; }
.note { border-left: 4px solid #e69f00; background: #fff8e6; padding: 0.5em 0.8em; }
table { border-collapse: collapse; margin: 0.5em 0; font-size: 0.9em; }
th, td { border: 1px solid #cccccc; padding: 0.25em 0.5em; text-align: left; vertical-align: top; }
td.num { text-align: right; font-variant-numeric: tabular-nums; }
td.differs, th.differs { background: #fff1c2; font-weight: bold; }
th.best { background: #d9f2e6; }
`;

/** The comparison as the body of a page (tables, chart, rule); `renderCompareHtml` wraps it. */
export function compareHtmlBody(comparison: PlanComparison): string {
  const plans = comparison.plans;
  const head = `<tr><th scope="col"></th>${plans.map((plan) => `<th scope="col"${plan.best ? ' class="best"' : ''}>${escapeHtml(header(plan))}</th>`).join('')}</tr>`;
  const metrics = COMPARE_METRICS.map((metric) => `<tr><th scope="row">${escapeHtml(metric.label)}</th>${plans.map((plan) => `<td class="num">${escapeHtml(metric.value(plan))}</td>`).join('')}</tr>`);
  const differing = new Set(comparison.differingInputs);
  const inputs = inputKeys(comparison).map((key) => {
    const cls = differing.has(key) ? ' class="differs"' : '';
    return `<tr><th scope="row"${cls}>${escapeHtml(key)}</th>${plans.map((plan) => `<td${cls}>${escapeHtml(plan.inputs[key] ?? '—')}</td>`).join('')}</tr>`;
  });
  const best = comparison.best === null ? 'No plan is free of errors and within its limits.' : `Best under the limits: ${plans[comparison.best]!.label} (${comparison.rule}).`;
  return [
    `<p class="note"><strong>${escapeHtml(PLANNING_NOTE)}</strong></p>`,
    '<h2>Cost</h2>',
    `<table>\n<thead>${head}</thead>\n<tbody>\n${metrics.join('\n')}\n</tbody>\n</table>`,
    `<p>${escapeHtml(best)}</p>`,
    `<figure>${compareChartSvg(comparison)}</figure>`,
    '<h2>Inputs (differing ones highlighted)</h2>',
    `<table>\n<thead>${head}</thead>\n<tbody>\n${inputs.join('\n')}\n</tbody>\n</table>`,
  ].join('\n');
}

export function renderCompareHtml(comparison: PlanComparison): string {
  const title = 'Plans compared';
  return [
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'">`,
    `<title>${escapeHtml(title)}</title>`,
    `<style>${STYLE}</style>`,
    '</head>',
    '<body>',
    `<h1>${escapeHtml(title)}</h1>`,
    compareHtmlBody(comparison),
    '</body>',
    '</html>',
    '',
  ].join('\n');
}
