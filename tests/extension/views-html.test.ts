/**
 * The webview pages (client/src/views/html.ts): a strict content-security policy with the page's
 * nonce, one script from the extension's folder carrying that nonce, no inline script or handler,
 * and the planning-estimate note.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import MarkdownIt from 'markdown-it';
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { reportMarkdown } from '../../server/src/services/report';
import { compareMarkdown } from '../../server/src/services/compare';
import { costPlots } from '../../server/src/services/views';
import { contentSecurityPolicy, makeNonce, reportPageHtml, viewPage, withoutInlineStyles, type ViewKind } from '../../client/src/views/html';

const CSP_SOURCE = 'https://file+.vscode-resource.vscode-cdn.net';
const NONCE = 'bm9uY2UtZm9yLXRoZS10ZXN0';

function page(kind: ViewKind, title = 'Structure: demo.tess'): string {
  return viewPage({ kind, cspSource: CSP_SOURCE, scriptUri: `${CSP_SOURCE}/ext/dist/webview/${kind}.js`, nonce: NONCE, title });
}

function policyOf(html: string): Map<string, string[]> {
  const content = /<meta http-equiv="Content-Security-Policy" content="([^"]*)">/.exec(html)?.[1];
  if (!content) throw new Error('no policy in the page');
  const decoded = content.replace(/&#39;/g, "'").replace(/&amp;/g, '&');
  return new Map(decoded.split(';').map((part) => part.trim().split(/\s+/)).map(([name, ...values]) => [name!, values]));
}

describe('the content-security policy', () => {
  it('allows nothing by default, scripts by nonce or from the extension, no eval and no inline code', () => {
    const policy = contentSecurityPolicy(CSP_SOURCE, NONCE);
    expect(policy).toBe(`default-src 'none'; script-src 'nonce-${NONCE}' ${CSP_SOURCE}; style-src ${CSP_SOURCE} 'nonce-${NONCE}'; img-src ${CSP_SOURCE} data: blob:`);
    expect(policy).not.toMatch(/unsafe-(eval|inline|hashes)|wasm-unsafe-eval|\*/);
  });

  it.each<ViewKind>(['structure', 'costs'])('is the %s page’s policy', (kind) => {
    const policy = policyOf(page(kind));
    expect(policy.get('default-src')).toEqual(["'none'"]);
    expect(policy.get('script-src')).toEqual([`'nonce-${NONCE}'`, CSP_SOURCE]);
    expect(policy.get('style-src')).toEqual([CSP_SOURCE, `'nonce-${NONCE}'`]);
    expect(policy.get('img-src')).toEqual([CSP_SOURCE, 'data:', 'blob:']);
    expect([...policy.keys()].sort()).toEqual(['default-src', 'img-src', 'script-src', 'style-src']);
  });
});

describe('the report panel', () => {
  it('runs no script at all: nothing by default, styles by nonce, images from the extension', () => {
    const html = reportPageHtml(CSP_SOURCE, NONCE, '<h1>Report</h1>');
    const policy = policyOf(html);
    expect(policy.get('default-src')).toEqual(["'none'"]);
    expect(policy.get('script-src')).toBeUndefined();
    expect(policy.get('style-src')).toEqual([CSP_SOURCE, `'nonce-${NONCE}'`]);
    expect(policy.get('img-src')).toEqual([CSP_SOURCE, 'data:']);
    expect(html).not.toMatch(/<script/i);
    expect(html).toContain('<h1>Report</h1>');
  });
});

/**
 * The report and comparison panels show the server's Markdown as VS Code renders it: markdown-it
 * (the renderer of its Markdown preview, HTML enabled as there) turns a `---:` column rule into
 * `style="text-align:right"` on every cell, which the page's policy (no 'unsafe-inline' styles)
 * refuses, one CSP error per cell, and the numbers fall back to the left.
 */
describe('the report panel’s tables', () => {
  const markdown = new MarkdownIt({ html: true, linkify: false });
  const SAMPLE = path.resolve(__dirname, '../../samples/zn-site-h2s-scan.tess');
  const analysis = analyzeDocument(readFileSync(SAMPLE, 'utf8'), { path: SAMPLE });
  const rendered = markdown.render(reportMarkdown(analysis));
  const page = reportPageHtml(CSP_SOURCE, NONCE, rendered);

  it('the renderer does give inline alignment (else this test checks nothing)', () => {
    expect(rendered).toMatch(/<td style="text-align:right">/);
  });

  it('has no inline style attribute left', () => {
    expect(page).not.toMatch(/<[a-z][^>]*\sstyle\s*=/i);
  });

  it('gives every right-aligned cell the page’s right-aligned class instead, and the class is in the stylesheet', () => {
    const before = rendered.match(/<t[dh] style="text-align:right">/g)!.length;
    expect(page.match(/<t[dh] class="ts-right">/g)).toHaveLength(before);
    expect(page).toMatch(/<style nonce="[^"]+">[\s\S]*\.ts-right \{ text-align: right; \}[\s\S]*<\/style>/);
  });

  it('right-aligns every cell that holds a plain number', () => {
    const cells = [...page.matchAll(/<td([^>]*)>([^<]*)<\/td>/g)];
    const numbers = cells.filter(([, , text]) => /^[+-]?\d[\d,]*(\.\d+)?$/.test(text!.trim()));
    expect(numbers.length).toBeGreaterThan(20);
    for (const [, attributes, text] of numbers) expect(`${text}:${attributes}`).toBe(`${text}: class="ts-right"`);
  });

  it('does the same for the comparison of plan variants', () => {
    const variants = `${readFileSync(SAMPLE, 'utf8')}\nvariant smaller { basis sto-3g }\n`;
    const compared = compareMarkdown(analyzeDocument(variants, { path: SAMPLE }), 'zn.tess');
    const html = markdown.render(compared);
    expect(html).toMatch(/style="text-align:right"/);
    expect(reportPageHtml(CSP_SOURCE, NONCE, html)).not.toMatch(/\sstyle\s*=/i);
  });

  it('turns other alignments into classes and drops any other inline style', () => {
    expect(withoutInlineStyles('<th style="text-align:center">a</th><td style="text-align: left;">b</td><p style="color:red">c</p>')).toBe('<th class="ts-center">a</th><td class="ts-left">b</td><p>c</p>');
  });
});

describe('the cost panel’s charts', () => {
  it('carry no inline style attribute (the page inserts the server’s SVG as it is)', () => {
    const SAMPLE = path.resolve(__dirname, '../../samples/zn-site-h2s-scan.tess');
    const plots = costPlots(analyzeDocument(readFileSync(SAMPLE, 'utf8'), { path: SAMPLE }));
    for (const [name, svg] of Object.entries(plots.svg)) {
      expect(svg, name).toMatch(/<svg\b/);
      expect(svg, name).not.toMatch(/<[a-z][^>]*\sstyle\s*=/i);
    }
  });
});

describe('the pages', () => {
  it('levels: no inline style either', () => {
    expect(page('levels')).not.toMatch(/\sstyle="/i);
  });

  it.each<ViewKind>(['structure', 'costs'])('%s: one script, from the extension folder, with the nonce; no inline code', (kind) => {
    const html = page(kind);
    const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/g)];
    expect(scripts).toHaveLength(1);
    expect(scripts[0]![1]).toContain(`nonce="${NONCE}"`);
    expect(scripts[0]![1]).toContain(`src="${CSP_SOURCE}/ext/dist/webview/${kind}.js"`);
    expect(scripts[0]![2]).toBe('');
    expect(html).not.toMatch(/\son[a-z]+=/i);
    expect(html).not.toMatch(/\sstyle="/i);
    expect(html).not.toMatch(/javascript:/i);
    const styles = [...html.matchAll(/<style\b([^>]*)>/g)];
    expect(styles.map((s) => s[1])).toEqual([` nonce="${NONCE}"`]);
    expect(html).toMatch(/Planning estimates/);
  });

  it('escapes the title', () => {
    const html = page('structure', 'Structure: <img src=x onerror=alert(1)>.tess');
    expect(html).toContain('<title>Structure: &lt;img src=x onerror=alert(1)&gt;.tess</title>');
    expect(html).not.toContain('<img');
  });

  it('hold the elements the scripts fill', () => {
    const structure = page('structure');
    for (const id of ['viewer', 'fragments', 'labels', 'fit', 'status', 'scan-detail', 'mark-cut', 'mark-scan', 'mark-unassigned', 'unassigned-dot', 'title']) expect(structure).toContain(`id="${id}"`);
    const costs = page('costs');
    for (const id of ['plot-qubits', 'plot-growth', 'plot-shots', 'plot-scan', 'fragment', 'message', 'plots', 'title']) expect(costs).toContain(`id="${id}"`);
    expect(costs.match(/data-export="(svg|png)"/g)).toHaveLength(8);
  });
});

describe('nonces', () => {
  it('are fresh for every page: 24 random bytes in base64', () => {
    const nonces = new Set(Array.from({ length: 50 }, makeNonce));
    expect(nonces.size).toBe(50);
    for (const nonce of nonces) expect(nonce).toMatch(/^[A-Za-z0-9+/]{32}$/);
  });
});
