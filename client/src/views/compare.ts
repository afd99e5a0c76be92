/**
 * The comparison panel's page: the server's Markdown (cost, then inputs) as VS Code renders it,
 * with the chart of the HTML output between them (the server's `compareChartSvg`, one renderer for
 * both). The page runs no script and its policy refuses inline styles, so the chart is SVG with
 * presentation attributes only; anything else in it is refused here and the panel says why.
 */
import { reportPageHtml } from './html';

/** The SVG elements a comparison chart is drawn with. */
const CHART_ELEMENTS = new Set(['svg', 'rect', 'line', 'text', 'title', 'g']);

/** Why the chart cannot be shown as it is, or undefined when it can. */
export function chartProblem(svg: string): string | undefined {
  const trimmed = svg.trim();
  if (!trimmed.startsWith('<svg') || !trimmed.endsWith('</svg>')) return 'it is not one SVG element';
  for (const match of trimmed.matchAll(/<\/?([A-Za-z][\w:-]*)/g)) {
    const name = match[1]!;
    if (!CHART_ELEMENTS.has(name)) return `it holds a <${name}> element, which a chart does not need`;
  }
  if (/\sstyle\s*=/i.test(trimmed)) return 'it holds a style attribute, which the panel\'s content-security policy refuses';
  if (/\son[a-z]+\s*=/i.test(trimmed)) return 'it holds an event handler';
  if (/href\s*=|url\(/i.test(trimmed)) return 'it refers to another resource';
  return undefined;
}

export interface ComparePage {
  /** The rendered Markdown of the cost table and the best plan's line. */
  readonly cost: string;
  /** The rendered Markdown of the inputs table. */
  readonly inputs: string;
  /** The chart, SVG text from the server. */
  readonly chart: string;
}

export function comparePageHtml(cspSource: string, nonce: string, page: ComparePage): string {
  const problem = chartProblem(page.chart);
  const figure = problem ? `<p class="ts-chart-missing">The chart is not shown: ${escapeText(problem)}.</p>` : `<figure class="ts-chart">${page.chart}</figure>`;
  return reportPageHtml(cspSource, nonce, `${page.cost}\n${figure}\n${page.inputs}`);
}

function escapeText(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}
