/** `tessera report`: formats, --out, exit codes and usage errors. The contents are checked in tests/report/. */
import { existsSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { root, run, scratch } from './harness';

describe('tessera report', () => {
  it('exits 0 for a clean spec; Markdown is the default format', async () => {
    const result = await run(['report', 'samples/molecules/water-cc-pvdz.tess']);
    expect(result.code).toBe(0);
    expect(result.stdout).toMatch(/^# Resource report: water-cc-pvdz\n/);
    expect(result.stdout).toContain('## All figures by part');
    expect(result.stderr).toBe('');
  });

  it('each format has its own shape', async () => {
    const html = await run(['report', 'samples/molecules/water-cc-pvdz.tess', '--format', 'html']);
    expect(html.code).toBe(0);
    expect(html.stdout.startsWith('<!DOCTYPE html>')).toBe(true);
    const csv = await run(['report', 'samples/molecules/water-cc-pvdz.tess', '--format', 'csv']);
    expect(csv.code).toBe(0);
    expect(csv.stdout.startsWith('spec,part,name,')).toBe(true);
    expect(csv.stdout.split('\r\n')).toHaveLength(4); // header, system, one fragment, and the empty text after the last CRLF
  });

  it('writes the report for a spec with errors, prints the diagnostics on stderr and exits 1', async () => {
    for (const format of ['markdown', 'html', 'csv']) {
      const result = await run(['report', 'samples/mistakes.tess', '--format', format]);
      expect(result.code, format).toBe(1);
      expect(result.stdout.length).toBeGreaterThan(0);
      expect(result.stderr).toMatch(/^samples\/mistakes\.tess:8:7: error unknown-basis /m);
      expect(result.stderr).toContain('the figures in the report may be incomplete');
    }
  });

  it('--out writes the file and nothing to stdout; warnings still go to stderr', async () => {
    const folder = scratch({});
    const spec = path.join(root, 'samples', 'zn-site-h2s-scan.tess');
    const result = await run(['report', spec, '--format', 'html', '--out', 'zn.html'], folder);
    expect(result.code).toBe(0);
    expect(result.stdout).toBe('');
    expect(result.stderr).toContain('warning bond-cut');
    expect(readFileSync(path.join(folder, 'zn.html'), 'utf8')).toContain('<h1>Resource report: zn-site-h2s-approach</h1>');
  });

  it('exit 2: unreadable spec, unwritable --out, bad usage', async () => {
    expect((await run(['report', 'samples/none.tess'])).code).toBe(2);
    const folder = scratch({});
    const unwritable = await run(['report', 'samples/molecules/water-sto-3g.tess', '--out', path.join(folder, 'missing', 'r.md')]);
    expect(unwritable.code).toBe(2);
    expect(unwritable.stderr).toContain('cannot write');
    expect(existsSync(path.join(folder, 'missing'))).toBe(false);
    const usage = [
      ['report'],
      ['report', 'samples/molecules/water-sto-3g.tess', '--format', 'pdf'],
      ['report', 'samples/molecules/water-sto-3g.tess', '--format', 'json'],
      ['report', 'samples/molecules/water-sto-3g.tess', 'samples/molecules/water-cc-pvdz.tess'],
      ['report', 'samples/molecules/water-sto-3g.tess', '--to', 'xyz'],
      ['report', 'samples/molecules/water-sto-3g.tess', '--out', 'samples/molecules/water-sto-3g.tess'],
      ['report', 'samples/molecules/water-sto-3g.tess', '--out', ''],
    ];
    for (const args of usage) {
      const result = await run(args);
      expect(result.code, args.join(' ')).toBe(2);
      expect(result.stderr).toContain("Run 'tessera --help'");
    }
    expect((await run(['report', '--help'])).code).toBe(0);
    expect((await run(['frobnicate'])).stderr).toContain('the commands are check, estimate, export, report, compare and lsp');
  });

  it('the built executable writes reports (npm run build first)', () => {
    const bin = path.join(root, 'node_modules', '.bin', 'tessera');
    const ok = spawnSync(bin, ['report', 'samples/molecules/water-sto-3g.tess', '--format', 'csv'], { cwd: root, encoding: 'utf8' });
    expect(ok.status, ok.stderr).toBe(0);
    expect(ok.stdout.startsWith('spec,part,name,')).toBe(true);
    const bad = spawnSync(bin, ['report', 'samples/mistakes.tess'], { cwd: root, encoding: 'utf8' });
    expect(bad.status).toBe(1);
  });
});
