/**
 * The scan chart runs in scan order: the first scanned distance at the left, also when the scan
 * descends (a chart convention of this project; common practice for a coordinate scan).
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { scanChartSvg } from '../../server/src/report/plots';

const spec = (range: string) => `basis sto-3g
structure {
  O o 0.000000 0.000000 0.000000
  H h1 0.000000 0.756950 0.585882
  H h2 0.000000 -0.756950 0.585882
}
fragment a { atoms o h1; charge -1; tier mean-field { method rhf } }
fragment b { atoms h2; charge +1; tier mean-field { method rhf } }
scan distance o h2 ${range}
`;

/** The x of each point circle, in drawing order. */
function pointXs(svg: string): number[] {
  return [...svg.matchAll(/<circle cx="([\d.]+)"/g)].map((match) => Number(match[1]));
}

/** Tick labels along the x axis, left to right. */
function tickLabels(svg: string): string[] {
  return [...svg.matchAll(/<text x="([\d.]+)" y="[\d.]+"[^>]*text-anchor="middle"[^>]*>(\d+\.\d\d)<\/text>/g)].sort((a, b) => Number(a[1]) - Number(b[1])).map((match) => match[2]!);
}

describe('the scan chart', () => {
  it('draws a descending scan from its first distance at the left (common practice)', () => {
    const svg = scanChartSvg(analyzeDocument(spec('from 3.0 to 2.0 step -0.25')).report());
    const xs = pointXs(svg);
    expect(xs).toHaveLength(5); // 3.0, 2.75, 2.5, 2.25, 2.0: by construction
    for (let k = 1; k < xs.length; k++) expect(xs[k]!).toBeGreaterThan(xs[k - 1]!);
    expect(tickLabels(svg)[0]).toBe('3.00');
  });

  it('draws an ascending scan the same way round (common practice)', () => {
    const svg = scanChartSvg(analyzeDocument(spec('from 2.0 to 3.0 step 0.25')).report());
    expect(tickLabels(svg)[0]).toBe('2.00');
  });
});
