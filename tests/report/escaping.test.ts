/**
 * Whatever a spec is named, every output shows the name as written and nothing else: no markup in
 * Markdown (rendered here by markdown-it, the renderer VS Code's Markdown preview uses, with HTML
 * enabled as there), no markup in HTML, no formula in CSV, no control sequence on a terminal, and
 * JSON that still parses to the same name.
 */
import * as path from 'node:path';
import MarkdownIt from 'markdown-it';
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { renderEstimateCsv } from '../../server/src/report/format/csv';
import { csvField, escapeHtml, markdownText } from '../../server/src/report/format/escape';
import { renderReportHtml } from '../../server/src/report/format/html';
import { renderEstimateMarkdown } from '../../server/src/report/format/render';
import { reportMarkdown } from '../../server/src/services/report';
import { run } from '../cli/harness';
import { tempFiles } from '../support/tempFolders';
import { WATER_LINES } from '../fixtures/water';

function spec(name: string): string {
  return `spec "${name.replace(/["\\]/g, (c) => `\\${c}`)}"\nbasis sto-3g\nstructure {\n${WATER_LINES}\n}\nfragment w_1* { atoms rest; tier mean-field { } }\n`;
}

const HOSTILE_NAMES = ['<img src=x onerror=alert(1)>', '*bold* _it_ [link](http://example.invalid) `code`', '</title><script>alert(1)</script>', '| a | b |', '&lt;escaped&gt;'];
const markdown = new MarkdownIt({ html: true, linkify: false });

describe('Markdown: the report and the report panel', () => {
  for (const name of HOSTILE_NAMES) {
    it(`a spec named ${JSON.stringify(name)} renders as that text, with no element from it`, () => {
      const analysis = analyzeDocument(spec(name));
      for (const source of [renderEstimateMarkdown(analysis.report(), { level: 1, full: true }), reportMarkdown(analysis)]) {
        const html = markdown.render(source);
        expect(html).not.toMatch(/<(img|script|a|em|strong|code|table)\b[^>]*>[^<]*(x onerror|alert|bold|it_|link)/);
        const heading = /<h1>([\s\S]*?)<\/h1>/.exec(html)![1]!;
        expect(heading.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&amp;/g, '&')).toBe(`Resource report: ${name}`);
      }
    });
  }

  it('a fragment name with * and _ shows as written in the tables', () => {
    const html = markdown.render(renderEstimateMarkdown(analyzeDocument(spec('w')).report()));
    expect(html).toContain('<td>w_1*</td>');
    expect(markdownText('a*b_c')).toBe('a\\*b\\_c');
  });
});

describe('HTML', () => {
  it('the title, tables and problems of a hostile name are text', () => {
    const page = renderReportHtml(analyzeDocument(spec('</title><script>alert(1)</script>')).report());
    expect(page).not.toContain('<script>');
    expect(page).toContain('<title>Resource report: &lt;/title&gt;&lt;script&gt;alert(1)&lt;/script&gt;</title>');
    expect(escapeHtml('a\u001b[2Jb')).toBe('a\\x1b[2Jb');
  });
});

describe('CSV (OWASP, "CSV Injection")', () => {
  it('fields a spreadsheet would take for formulas get a leading quote; numbers, negative ones too, do not', () => {
    expect(csvField('=HYPERLINK("http://example.invalid")')).toBe(`"'=HYPERLINK(""http://example.invalid"")"`);
    for (const formula of ['+SUM(A1)', '-2+3', '@cmd']) expect(csvField(formula).replace(/^"|"$/g, '').startsWith("'")).toBe(true);
    // A leading tab is a control character: escaped as text, it can no longer start a formula.
    expect(csvField('\t=1')).toBe('\\x09=1');
    for (const number of ['-1', '+2', '3.5', '-1e-3', '0']) expect(csvField(number)).toBe(number);
  });

  it('a spec named =1+1 is written as text in the spec column', () => {
    const csv = renderEstimateCsv(analyzeDocument(spec('=1+1')).report());
    expect(csv.split('\r\n')[1]!.startsWith("'=1+1,system,")).toBe(true);
  });
});

describe('terminal and JSON output of the command line', () => {
  const NAME = '\u001b]0;title\u0007\u001b[2J\u009b31m\u202eevil';

  it('estimate: no control character reaches standard output or standard error', async () => {
    const folder = tempFiles({ 'x.tess': `${spec(NAME)}bogus\n` });
    const result = await run(['estimate', 'x.tess'], folder);
    for (const text of [result.stdout, result.stderr]) expect(text).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202a-\u202e]/);
    expect(result.stdout).toContain('Tessera estimate: \\x1b]0;title\\x07\\x1b[2J\\x9b31m\\u202eevil');
  });

  it('estimate --format json: escapes the same characters and parses back to the name', async () => {
    const folder = tempFiles({ 'x.tess': spec(NAME) });
    const result = await run(['estimate', 'x.tess', '--format', 'json'], folder);
    expect(result.stdout).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202a-\u202e]/);
    expect((JSON.parse(result.stdout) as { spec: { name: string } }).spec.name).toBe(NAME);
  });

  it('a file name with an escape character is printed escaped', async () => {
    const folder = tempFiles({ 'a\u001b[31m.tess': spec('w') });
    const result = await run(['check', path.join(folder, 'a\u001b[31m.tess'), 'missing\u001b[2J.tess'], folder);
    expect(`${result.stdout}${result.stderr}`).not.toContain('\u001b');
    expect(result.stderr).toContain('cannot read missing\\x1b[2J.tess');
  });

  it('export --to xyz: the comment line names the spec escaped', async () => {
    const folder = tempFiles({ 'x.tess': spec(NAME) });
    const result = await run(['export', 'x.tess', '--to', 'xyz', '--out', 'x.xyz'], folder);
    expect(result.code).toBe(0);
    const { readFileSync } = await import('node:fs');
    const comment = readFileSync(path.join(folder, 'x.xyz'), 'utf8').split('\n')[1]!;
    expect(comment.startsWith('\\x1b]0;title\\x07\\x1b[2J\\x9b31m\\u202eevil; ')).toBe(true);
  });
});
