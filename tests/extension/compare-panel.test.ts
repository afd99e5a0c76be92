/**
 * The editor's comparison panel shows the chart of the HTML comparison (one renderer,
 * `compareChartSvg`) between the cost and the inputs tables, under the report panel's policy,
 * which refuses inline styles (client/src/views/compare.ts).
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import MarkdownIt from 'markdown-it';
import { describe, expect, it } from 'vitest';
import { analyzeDocument, comparePlans, specPlans } from '../../server/src/analysis';
import { renderCompareHtml } from '../../server/src/report/format/compare';
import { compareAnswer } from '../../server/src/services/compare';
import { chartProblem, comparePageHtml } from '../../client/src/views/compare';
import { reportPageHtml } from '../../client/src/views/html';

const CSP_SOURCE = 'https://file+.vscode-resource.vscode-cdn.net';
const NONCE = 'bm9uY2UtZm9yLXRoZS10ZXN0';
const SAMPLE = path.resolve(__dirname, '..', '..', 'samples', 'launch', 'ethane-plan-variants.tess');
/** VS Code renders the panel's Markdown with markdown-it (markdown.api.render). */
const markdown = new MarkdownIt();

describe('the comparison panel', () => {
  const analysis = analyzeDocument(readFileSync(SAMPLE, 'utf8'), { path: SAMPLE });
  const answer = compareAnswer(analysis, 'ethane-plan-variants.tess');
  const page = comparePageHtml(CSP_SOURCE, NONCE, { cost: markdown.render(answer.cost), inputs: markdown.render(answer.inputs), chart: answer.chart });

  it('holds the very chart of the HTML output, between the cost and the inputs', () => {
    const html = renderCompareHtml(comparePlans(specPlans(analysis, analysis.model.name!)));
    expect(html).toContain(answer.chart);
    const costAt = page.indexOf('<h2>Cost</h2>');
    const chartAt = page.indexOf('<figure class="ts-chart"><svg');
    const inputsAt = page.indexOf('<h2>Inputs');
    expect(costAt).toBeGreaterThan(0);
    expect(chartAt).toBeGreaterThan(costAt);
    expect(inputsAt).toBeGreaterThan(chartAt);
    expect(answer.markdown).toBe(`${answer.cost}\n${answer.inputs}`);
  });

  it('keeps the report panel’s policy and has no inline style anywhere', () => {
    const policy = /<meta http-equiv="Content-Security-Policy" content="([^"]*)">/.exec(page)?.[1];
    expect(policy).toBe(/<meta http-equiv="Content-Security-Policy" content="([^"]*)">/.exec(reportPageHtml(CSP_SOURCE, NONCE, ''))?.[1]);
    expect(policy).not.toMatch(/unsafe-inline/);
    expect(page).not.toMatch(/\sstyle\s*=/i);
    expect(page).not.toMatch(/<script/i);
    expect(chartProblem(answer.chart)).toBeUndefined();
  });

  it('draws each plan’s qubits to scale: the untapered 4e 4o plan needs 8 (Jordan–Wigner, one qubit per spin orbital)', () => {
    const bars = [...answer.chart.matchAll(/<rect x="[^"]*" y="[^"]*" width="[^"]*" height="([^"]*)" fill="#0072b2"><title>([^<]*): (\d+) qubits<\/title>/g)].map((match) => ({ label: match[2]!, height: Number(match[1]), qubits: Number(match[3]) }));
    expect(bars).toHaveLength(4);
    expect(bars.find((bar) => bar.label.endsWith('no-tapering'))?.qubits).toBe(8);
    const [first] = bars;
    for (const bar of bars) expect(bar.height / first!.height).toBeCloseTo(bar.qubits / first!.qubits, 2);
  });

  it('refuses a chart that the policy would break or that could run or load anything, and says why', () => {
    expect(chartProblem('<svg><rect style="fill:red"/></svg>')).toMatch(/style attribute/);
    expect(chartProblem('<svg><script>alert(1)</script></svg>')).toMatch(/<script>/);
    expect(chartProblem('<svg onload="x()"></svg>')).toMatch(/event handler/);
    expect(chartProblem('<svg><image href="https://example.org/a.png"/></svg>')).toMatch(/<image>/);
    expect(chartProblem('<p>no chart</p>')).toMatch(/not one SVG element/);
    const refused = comparePageHtml(CSP_SOURCE, NONCE, { cost: '<h2>Cost</h2>', inputs: '', chart: '<svg><script>alert(1)</script></svg>' });
    expect(refused).toContain('The chart is not shown: it holds a &lt;script&gt; element');
    expect(refused).not.toContain('<script>');
  });
});
