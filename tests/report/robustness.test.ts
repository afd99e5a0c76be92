/**
 * The report renderers and the exports never throw on what the analysis makes of a broken spec:
 * every sample with each of its lines deleted in turn, and with each line cut in half.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { buildQcSchemaExport } from '../../server/src/report/export/qcschema';
import { renderXyz } from '../../server/src/report/export/xyz';
import { renderEstimateCsv } from '../../server/src/report/format/csv';
import { renderReportHtml } from '../../server/src/report/format/html';
import { renderEstimateMarkdown } from '../../server/src/report/format/render';
import { structureData } from '../../server/src/report/structure';
import { allSamples, root } from '../cli/harness';

function variants(text: string): string[] {
  const lines = text.split('\n');
  const out: string[] = [];
  lines.forEach((line, i) => {
    if (line.trim() === '') return;
    out.push([...lines.slice(0, i), ...lines.slice(i + 1)].join('\n'));
    out.push([...lines.slice(0, i), line.slice(0, Math.floor(line.length / 2)), ...lines.slice(i + 1)].join('\n'));
  });
  return out;
}

describe('renderers and exports on broken specs', () => {
  it.each(allSamples())('%s: every line deleted or cut in half, nothing throws', (file) => {
    const absolute = path.join(root, file);
    let exported = 0;
    for (const text of variants(readFileSync(absolute, 'utf8'))) {
      const analysis = analyzeDocument(text, { path: absolute });
      const report = analysis.report();
      const growth = analysis.model.fragments.filter((f) => f.tier?.level === 'quantum').map((f) => ({ fragment: f.name, points: analysis.growth(f.index, 12) }));
      expect(renderEstimateMarkdown(report, { full: true, problems: [] })).toContain('# Resource report');
      expect(renderReportHtml(report, { growth })).toContain('</html>');
      expect(renderEstimateCsv(report).split('\r\n')[0]).toMatch(/^spec,part,name,/);
      // The CLI exports only specs without errors; those must always export.
      if (analysis.diagnostics.some((d) => d.severity === 'error')) continue;
      const data = structureData(analysis);
      expect(renderXyz(data, { title: 't', version: '0' })).toMatch(/^\d+\n/);
      expect(buildQcSchemaExport(analysis, data, { title: 't', version: '0' }).system.symbols).toHaveLength(analysis.model.atoms.length);
      exported++;
    }
    if (file !== 'samples/mistakes.tess') expect(exported).toBeGreaterThan(0);
  });
});
