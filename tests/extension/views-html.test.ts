/**
 * The webview pages (client/src/views/html.ts): a strict content-security policy with the page's
 * nonce, one script from the extension's folder carrying that nonce, no inline script or handler,
 * and the planning-estimate note.
 */
import { describe, expect, it } from 'vitest';
import { contentSecurityPolicy, makeNonce, reportPageHtml, viewPage, type ViewKind } from '../../client/src/views/html';

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

describe('the pages', () => {
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
    for (const id of ['plot-qubits', 'plot-growth', 'plot-scan', 'fragment', 'message', 'plots', 'title']) expect(costs).toContain(`id="${id}"`);
    expect(costs.match(/data-export="(svg|png)"/g)).toHaveLength(6);
  });
});

describe('nonces', () => {
  it('are fresh for every page: 24 random bytes in base64', () => {
    const nonces = new Set(Array.from({ length: 50 }, makeNonce));
    expect(nonces.size).toBe(50);
    for (const nonce of nonces) expect(nonce).toMatch(/^[A-Za-z0-9+/]{32}$/);
  });
});
