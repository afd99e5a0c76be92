/**
 * `tessera report` documents against the JSON estimate (`tessera estimate --format json`), the one
 * source of every number: Markdown and HTML carry every figure of every part, the conventions, the
 * problems with their lines and the scan totals; HTML is standalone with the plots inline; CSV
 * parses back (RFC 4180) to the same numbers.
 */
import { markdownText } from '../../server/src/report/format/escape';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { CONVENTIONS, PLANNING_NOTE } from '../../server/src/analysis';
import { allSamples, atPath, cleanSamples, root, run, scratch } from '../cli/harness';

type Json = Record<string, unknown> & { system: Record<string, unknown>; fragments: (Record<string, unknown> & { name: string })[]; scan: { points: number; totals: Record<string, number | null> } | null; spec: { name: string | null }; note: string };

async function estimateJson(file: string, cwd?: string): Promise<Json> {
  const result = await run(['estimate', '--format', 'json', file], cwd);
  return JSON.parse(result.stdout) as Json;
}

async function report(file: string, format: string, cwd?: string): Promise<string> {
  const result = await run(['report', file, '--format', format], cwd);
  expect(result.code, result.stderr).toBeLessThanOrEqual(1);
  return result.stdout;
}

/** The parts in report order: the system, then the fragments. */
function parts(json: Json): Record<string, unknown>[] {
  return [json.system, ...json.fragments];
}

/** What a table cell shows for a JSON value: a dash for none. */
function cellOf(value: unknown): string {
  return value === null || value === undefined ? '–' : String(value);
}

/** Cost figures a report must show for every part that has them. */
const COST_KEYS = [
  'electrons',
  'orbitals',
  'basisFunctions.spherical',
  'active.electrons',
  'active.orbitals',
  'qubits.jordanWigner',
  'qubits.parity',
  'qubits.tapered',
  'qubitsRequired',
  'pauliTerms.jordanWigner',
  'measurement.groups',
  'ansatzCost.parameters',
  'circuit.cnots',
  'classical.determinants.exact',
  'classical.statevectorBytes.exact',
];

function markdownTable(markdown: string, title: string): string[][] {
  const lines = markdown.split('\n');
  const start = lines.indexOf(`## ${title}`);
  expect(start, `no table '${title}'`).toBeGreaterThanOrEqual(0);
  const rows: string[][] = [];
  for (let i = start + 2; i < lines.length && lines[i]!.startsWith('|'); i++) {
    rows.push(lines[i]!.slice(1, -1).split(/(?<!\\)\|/).map((cell) => cell.trim().replace(/\\\|/g, '|')));
  }
  return [rows[0]!, ...rows.slice(2)];
}

function unescapeHtml(text: string): string {
  return text.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&#39;/g, "'").replace(/&amp;/g, '&');
}

function htmlTable(html: string, title: string): string[][] {
  const start = html.indexOf(`<h2>${title}</h2>\n<table>`);
  expect(start, `no table '${title}'`).toBeGreaterThanOrEqual(0);
  const table = html.slice(start, html.indexOf('</table>', start));
  return [...table.matchAll(/<tr>(.*?)<\/tr>/gs)].map((row) => [...row[1]!.matchAll(/<t[hd][^>]*>(.*?)<\/t[hd]>/gs)].map((cell) => unescapeHtml(cell[1]!)));
}

function textOf(html: string): string {
  return unescapeHtml(html.replace(/<[^>]*>/g, ' ')).replace(/\s+/g, ' ');
}

/** Checks the table of every figure by part against the JSON estimate, cell by cell. */
function expectFiguresTable(rows: string[][], json: Json): void {
  const [header, ...body] = rows;
  expect(header).toEqual(['figure', 'key', 'system', ...json.fragments.map((fragment) => fragment.name)]);
  const keys = body.map((row) => row[1]!);
  for (const key of COST_KEYS) expect(keys).toContain(key);
  for (const row of body) {
    parts(json).forEach((part, p) => expect(row[2 + p], `${row[1]} of ${header![2 + p]}`).toBe(cellOf(atPath(part, row[1]!))));
  }
}

/** RFC 4180 records: quoted fields may hold commas, doubled quotes and line breaks. */
function parseCsv(text: string): string[][] {
  const records: string[][] = [];
  let record: string[] = [];
  let field = '';
  let i = 0;
  while (i < text.length) {
    const c = text[i]!;
    if (c === '"' && field === '') {
      i++;
      for (;;) {
        if (i >= text.length) throw new Error('unterminated quoted field');
        if (text[i] === '"') {
          if (text[i + 1] === '"') {
            field += '"';
            i += 2;
            continue;
          }
          i++;
          break;
        }
        field += text[i++];
      }
      if (i < text.length && text[i] !== ',' && text[i] !== '\r') throw new Error(`text after a closing quote at ${i}`);
      continue;
    }
    if (c === ',') {
      record.push(field);
      field = '';
      i++;
    } else if (c === '\r' && text[i + 1] === '\n') {
      record.push(field);
      records.push(record);
      record = [];
      field = '';
      i += 2;
    } else if (c === '\n' || c === '\r' || c === '"') {
      throw new Error(`bare ${JSON.stringify(c)} outside a quoted field at ${i}`);
    } else {
      field += c;
      i++;
    }
  }
  if (field !== '' || record.length > 0) throw new Error('last record without CRLF');
  return records;
}

describe('tessera report --format markdown', () => {
  it.each(allSamples())('%s: every figure of every part, as in the JSON estimate', async (file) => {
    const [markdown, json] = await Promise.all([report(file, 'markdown'), estimateJson(file)]);
    expect(markdown).toContain(`> ${PLANNING_NOTE}`);
    expectFiguresTable(markdownTable(markdown, 'All figures by part'), json);
  });

  it('the conventions, every one of them', async () => {
    const markdown = await report('samples/zn-site-h2s-scan.tess', 'markdown');
    expect(markdown).toContain('## Conventions');
    // As written, escaped for Markdown (report/format/escape.ts).
    for (const text of Object.values(CONVENTIONS)) expect(markdown).toContain(markdownText(text));
  });

  it('the warnings and errors with their lines', async () => {
    const zn = await report('samples/zn-site-h2s-scan.tess', 'markdown');
    // The sample's two bond-cut warnings, on the `atoms` lines of guest (54) and frame (60).
    expect(zn).toContain('## Problems (2)');
    expect(zn).toMatch(/^- line 52: \*\*warning\*\* `bond-cut` /m);
    expect(zn).toMatch(/^- line 58: \*\*warning\*\* `bond-cut` /m);
    const mistakes = await report('samples/mistakes.tess', 'markdown');
    expect(mistakes).toMatch(/^- line 8: \*\*error\*\* `unknown-basis` 'cc-pvdzz' is not in the basis-set library/m);
    expect(mistakes).toMatch(/^- line 6: \*\*error\*\* `multiplicity-parity` /m);
  });

  it('the scan totals', async () => {
    const [markdown, json] = await Promise.all([report('samples/zn-site-h2s-scan.tess', 'markdown'), estimateJson('samples/zn-site-h2s-scan.tess')]);
    const rows = markdownTable(markdown, 'Scan totals');
    const value = (key: string) => rows.find((row) => row[1] === key)?.[2];
    // 7 points (2.3 to 3.5 Å in steps of 0.2) × 3 fragments with a tier, from the sample.
    expect(value('scan.points')).toBe('7');
    expect(value('scan.totals.fragmentCalculations')).toBe('21');
    // Per point, not points × per point (the JSON keeps both).
    expect(value('scan.totals.measurementCircuitsPerPoint')).toBe(String(json.scan!.totals.measurementCircuitsPerPoint));
    expect(value('scan.totals.measurementCircuits')).toBeUndefined();
    expect(value('scan.totals.peakQubits')).toBe(cellOf(json.scan!.totals.peakQubits));
    expect(value('scan.distances')).toBe('2.300, 2.500, 2.700, 2.900, 3.100, 3.300, 3.500');
  });

  it('no scan table without a scan; `estimate --format markdown` keeps its shorter form', async () => {
    const markdown = await report('samples/molecules/water-cc-pvdz.tess', 'markdown');
    expect(markdown).not.toContain('Scan totals');
    const estimate = (await run(['estimate', '--format', 'markdown', 'samples/zn-site-h2s-scan.tess'])).stdout;
    expect(estimate).toContain('| part | tier |');
    expect(estimate).not.toContain('All figures by part');
  });
});

describe('tessera report --format html', () => {
  it.each(allSamples())('%s: every figure of every part, as in the JSON estimate', async (file) => {
    const [html, json] = await Promise.all([report(file, 'html'), estimateJson(file)]);
    expectFiguresTable(htmlTable(html, 'All figures by part'), json);
    expect(textOf(html)).toContain(PLANNING_NOTE);
  });

  it('standalone: no scripts, no external resources, balanced tables and plots', async () => {
    for (const file of allSamples()) {
      const html = await report(file, 'html');
      expect(html.startsWith('<!DOCTYPE html>\n<html lang="en">')).toBe(true);
      expect(html.trimEnd().endsWith('</html>')).toBe(true);
      expect(html).not.toMatch(/<script|<link|<img|<iframe|<object|<embed|\bsrc=|\bhref=|url\(|@import|\bon[a-z]+=/i);
      // The only address is the SVG namespace, which loads nothing.
      for (const match of html.matchAll(/https?:\/\/[^\s"'<>]*/g)) expect(match[0]).toBe('http://www.w3.org/2000/svg');
      expect(html.match(/<table>/g)?.length).toBe(html.match(/<\/table>/g)?.length);
      expect(html.match(/<svg /g)?.length ?? 0).toBe(html.match(/<\/svg>/g)?.length ?? 0);
    }
  });

  it('the three plots for the scan sample: qubits, active-space growth of the quantum fragment, the scan', async () => {
    const html = await report('samples/zn-site-h2s-scan.tess', 'html');
    const svgs = [...html.matchAll(/<figure>\n(<svg [\s\S]*?<\/svg>)\n<figcaption>/g)].map((match) => match[1]!);
    expect(svgs).toHaveLength(3);
    expect(svgs[0]).toContain('aria-label="Qubits per fragment (planning estimate)"');
    expect(svgs[1]).toContain('aria-label="Cost against active-space size: site (planning estimate)"');
    expect(svgs[2]).toContain('aria-label="Cumulative cost along the scan (planning estimate)"');
    // The growth plot has its curves (not the empty-chart message).
    expect(svgs[1]).toContain('<polyline');
  });

  it('says why a plot is absent', async () => {
    const water = await report('samples/molecules/water-cc-pvdz.tess', 'html');
    expect(water.match(/<svg /g)).toHaveLength(2);
    expect(water).toContain('No scan plot: the spec has no scan.');
    const folder = scratch({
      'mf.tess': 'spec "water-mean-field"\nbasis sto-3g\nstructure {\n  O 0 0 0\n  H 0 0.756950 0.585882\n  H 0 -0.756950 0.585882\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\n',
    });
    const meanField = await report('mf.tess', 'html', folder);
    expect(meanField).toContain('No active-space growth plot: the spec has no quantum-tier fragment.');
    expect(meanField).toContain('No scan plot: the spec has no scan.');
    expect(meanField.match(/<svg /g)).toHaveLength(1);
  });

  it('the conventions and the problems with their lines', async () => {
    const html = await report('samples/zn-site-h2s-scan.tess', 'html');
    const text = textOf(html);
    for (const convention of Object.values(CONVENTIONS)) expect(text).toContain(convention);
    const problems = htmlTable(html.replace('<h2>Problems (2)</h2>\n<table>', '<h2>Problems</h2>\n<table>'), 'Problems');
    expect(problems.slice(1).map((row) => [row[0], row[1], row[2]])).toEqual([
      ['52', 'warning', '<code>bond-cut</code>'],
      ['58', 'warning', '<code>bond-cut</code>'],
    ]);
    const mistakes = textOf(await report('samples/mistakes.tess', 'html'));
    expect(mistakes).toContain("8 error unknown-basis 'cc-pvdzz' is not in the basis-set library");
  });

  it('escapes all text', async () => {
    const folder = scratch({ 'odd.tess': 'spec "<b>R&D</b> \'x\'"\nbasis sto-3g\nstructure {\n  He 0 0 0\n}\n' });
    const html = await report('odd.tess', 'html', folder);
    expect(html).not.toContain('<b>R&D');
    expect(html).toContain('<title>Resource report: &lt;b&gt;R&amp;D&lt;/b&gt; &#39;x&#39;</title>');
    expect(html).toContain('<h1>Resource report: &lt;b&gt;R&amp;D&lt;/b&gt; &#39;x&#39;</h1>');
  });
});

describe('tessera report --format csv', () => {
  it.each(allSamples())('%s: one row per part, parsing back to the numbers of the JSON estimate', async (file) => {
    const [csv, json] = await Promise.all([report(file, 'csv'), estimateJson(file)]);
    expect(csv.endsWith('\r\n')).toBe(true);
    const [header, ...rows] = parseCsv(csv);
    expect(header!.slice(0, 3)).toEqual(['spec', 'part', 'name']);
    expect(header![header!.length - 1]).toBe('note');
    expect(rows).toHaveLength(1 + json.fragments.length);
    for (const key of COST_KEYS) expect(header).toContain(key);
    rows.forEach((row, r) => {
      expect(row).toHaveLength(header!.length);
      const part = parts(json)[r]!;
      expect(row[0]).toBe(json.spec.name ?? '');
      expect(row[1]).toBe(r === 0 ? 'system' : 'fragment');
      expect(row[2]).toBe(r === 0 ? 'system' : json.fragments[r - 1]!.name);
      expect(row[row.length - 1]).toBe(json.note);
      header!.slice(3, -1).forEach((key, c) => {
        const cell = row[3 + c]!;
        const value = atPath(part, key);
        const what = `${key} of ${row[2]}`;
        if (value === null || value === undefined) expect(cell, what).toBe('');
        else if (typeof value === 'number') expect(Number(cell), what).toBe(value);
        else expect(cell, what).toBe(String(value));
      });
    });
  });

  it('every figure column leads to a figure in some sample (no dead columns)', async () => {
    const header = parseCsv(await report('samples/zn-site-h2s-scan.tess', 'csv'))[0]!;
    const jsons = await Promise.all(cleanSamples().map((file) => estimateJson(file)));
    for (const key of header.slice(3, -1)) {
      const found = jsons.some((json) => parts(json).some((part) => atPath(part, key) !== undefined && atPath(part, key) !== null));
      expect(found, key).toBe(true);
    }
  });

  it('quotes as RFC 4180 says: the note (it has commas) in double quotes, inner quotes doubled', async () => {
    const csv = await report('samples/molecules/water-sto-3g.tess', 'csv');
    expect(csv.split('\r\n')[1]!.endsWith(`,"${PLANNING_NOTE}"`)).toBe(true);
    const folder = scratch({ 'q.tess': 'spec "say \\"hi\\", twice"\nbasis sto-3g\nstructure {\n  He 0 0 0\n}\n' });
    const quoted = await report('q.tess', 'csv', folder);
    const json = await estimateJson('q.tess', folder);
    expect(json.spec.name).toContain('"');
    expect(quoted.split('\r\n')[1]!.startsWith(`"${json.spec.name!.replace(/"/g, '""')}",system,system,`)).toBe(true);
    expect(parseCsv(quoted)[1]![0]).toBe(json.spec.name);
  });
});

describe('README', () => {
  it('lists the CSV columns in the order the CSV has them', async () => {
    const readme = readFileSync(path.join(root, 'README.md'), 'utf8');
    const start = readme.indexOf('- `csv` (RFC 4180');
    const section = readme.slice(start, readme.indexOf('`true`/`false`.', start));
    expect(start).toBeGreaterThan(0);
    const header = parseCsv(await report('samples/molecules/water-sto-3g.tess', 'csv'))[0]!;
    const positions = header.map((column) => section.indexOf(`\`${column}\``));
    header.forEach((column, c) => expect(positions[c], column).toBeGreaterThanOrEqual(0));
    positions.slice(1).forEach((position, c) => expect(position, header[c + 1]).toBeGreaterThan(positions[c]!));
  });
});
