/**
 * Exports stream: a scan is written one point at a time (the same text as the whole export built
 * at once), so that any scan the language accepts leaves in bounded memory; a closed standard
 * output (`tessera … | head`) ends the command quietly with exit code 141.
 *
 * Geometries are invented test data (helium atoms 3 Å apart).
 */
import { spawn } from 'node:child_process';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { safeJsonStringify } from '../../server/src/language/printable';
import { buildQcSchemaExport, qcSchemaExportParts, qcSchemaJsonChunks } from '../../server/src/report/export/qcschema';
import { renderXyz, xyzChunks } from '../../server/src/report/export/xyz';
import { structureData } from '../../server/src/report/structure';
import { readSample } from '../services/service';
import { root, run, scratch } from './harness';

/** `atoms` helium atoms on a line, two fragments, and a scan of `points` points. */
function scanSpec(atoms: number, points: number): string {
  const lines = Array.from({ length: atoms }, (_, i) => `  He a${i} ${(3 * i).toFixed(1)} 0 0`);
  return `spec "helium line"\nbasis sto-3g\nstructure {\n${lines.join('\n')}\n}\nfragment head {\n  atoms a0\n  tier mean-field { method rhf }\n}\nfragment tail {\n  atoms rest\n  tier mean-field { method rhf }\n}\nscan distance a0 a1 from 2.5 to 6.5 points ${points}\n`;
}

const OPTIONS = { title: 'helium line', version: '0.0.0' };

describe('streamed exports', () => {
  it('write the same text as the export built whole (a sample scan and a generated one)', () => {
    for (const text of [readSample('zn-site-h2s-scan.tess'), scanSpec(4, 7), scanSpec(3, 1)]) {
      const analysis = analyzeDocument(text);
      expect(analysis.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
      const data = structureData(analysis);
      expect([...xyzChunks(data, OPTIONS)].join('')).toBe(renderXyz(data, OPTIONS));
      const streamed = [...qcSchemaJsonChunks(qcSchemaExportParts(analysis, data, OPTIONS))].join('');
      expect(streamed).toBe(`${safeJsonStringify(buildQcSchemaExport(analysis, data, OPTIONS), 2)}\n`);
      JSON.parse(streamed);
    }
  });

  it('hold one scan point at a time: one chunk per point, none larger than a point', () => {
    const points = 2_000;
    const analysis = analyzeDocument(scanSpec(50, points));
    const data = structureData(analysis);
    const xyz = [...xyzChunks(data, OPTIONS)];
    expect(xyz.length).toBe(points);
    const frame = xyz[0]!.length;
    expect(Math.max(...xyz.map((chunk) => chunk.length))).toBeLessThan(frame * 1.1);
    const parts = qcSchemaExportParts(analysis, data, OPTIONS);
    expect(parts.head.scan!.molecules).toEqual([]);
    const chunks = [...qcSchemaJsonChunks(parts)];
    // The head (system, fragments, distances), one chunk per point, and the end.
    expect(chunks.length).toBe(points + 2);
    // Every point's chunk is one molecule of the same atoms: none much larger than the first point's.
    const pointChunks = chunks.slice(1, -1).map((chunk) => chunk.length);
    expect(Math.max(...pointChunks)).toBeLessThan(1.1 * pointChunks[0]!);
    expect(pointChunks[0]!).toBeLessThan(2 * safeJsonStringify(parts.head.system, 2).length);
  });

  it('a scan of 10,000 points (the most the language accepts) reaches the file whole', async () => {
    const folder = scratch({ 'line.tess': scanSpec(3, 10_000) });
    const result = await run(['export', 'line.tess', '--to', 'qcschema'], folder);
    expect(result.code).toBe(0);
    const json = JSON.parse(result.stdout) as { scan: { molecules: { extras: { tessera: { scan_point: { point: number } } } }[] } };
    expect(json.scan.molecules.length).toBe(10_000);
    expect(json.scan.molecules[9_999]!.extras.tessera.scan_point.point).toBe(10_000);
  });
});

describe('a closed standard output', () => {
  it('ends `tessera export … | head` quietly with exit code 141', async () => {
    const folder = scratch({ 'line.tess': scanSpec(200, 10_000) });
    const child = spawn(process.execPath, [path.join(root, 'dist', 'cli.js'), 'export', 'line.tess', '--to', 'xyz'], { cwd: folder, stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString('utf8')));
    // Like head: read the first lines, then close the pipe.
    child.stdout.once('data', () => child.stdout.destroy());
    const code = await new Promise<number | null>((resolve) => child.on('exit', (status) => resolve(status)));
    expect(stderr).toBe('');
    expect(code).toBe(141);
  });
});
