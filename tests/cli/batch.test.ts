/**
 * A batch goes on whatever one file does: unreadable, full of mistakes, or making Tessera itself
 * fail. The failure is simulated here by making analyze() throw for one marked text (standing for
 * any bug below it); everything else runs for real.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { tempFiles } from '../support/tempFolders';
import { root, run } from './harness';

const FAIL_MARK = '# the analysis of this file throws';

vi.mock('../../server/src/language/analyze', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../server/src/language/analyze')>();
  return {
    ...real,
    analyze: (text: string, options?: Parameters<typeof real.analyze>[1]) => {
      if (text.includes(FAIL_MARK)) throw new RangeError('simulated failure below analyze()');
      return real.analyze(text, options);
    },
  };
});

const WATER = readFileSync(path.join(root, 'samples', 'molecules', 'water-sto-3g.tess'), 'utf8');
const FAR = 'spec "far"\nbasis sto-3g\nstructure {\n  H 1e155 0 0\n  H 0 0 0\n}\n';

describe('tessera check on a batch', () => {
  it('a file on which Tessera fails: reported, the others checked, exit 3', async () => {
    const folder = tempFiles({ 'bad.tess': `${FAIL_MARK}\n${WATER}`, 'far.tess': FAR, 'good.tess': WATER });
    const result = await run(['check', 'bad.tess', 'far.tess', 'good.tess'], folder);
    expect(result.code).toBe(3);
    expect(result.stderr).toContain('tessera: Tessera failed on bad.tess: RangeError: simulated failure below analyze()');
    expect(result.stderr).toContain('This is a bug in Tessera');
    expect(result.stderr).not.toMatch(/\n\s+at /);
    expect(result.stdout).toContain('far.tess:4:5: error coordinate-out-of-range');
    expect(result.stderr).toMatch(/1 error, 0 warnings in 3 files; Tessera failed on 1/);
  });

  it('JSON: the failed file carries its error, the counts say how many failed', async () => {
    const folder = tempFiles({ 'bad.tess': `${FAIL_MARK}\n${WATER}`, 'good.tess': WATER });
    const result = await run(['check', 'bad.tess', 'good.tess', '--format', 'json'], folder);
    expect(result.code).toBe(3);
    const json = JSON.parse(result.stdout) as { files: { file: string; error?: string }[]; failed: number; unreadable: number };
    expect(json.failed).toBe(1);
    expect(json.files.map((file) => file.file)).toEqual(['bad.tess', 'good.tess']);
    expect(json.files[0]!.error).toContain('simulated failure');
    expect(json.files[1]!.error).toBeUndefined();
  });

  it('exit codes: unreadable beats errors (2), errors alone 1, clean 0', async () => {
    const folder = tempFiles({ 'far.tess': FAR, 'good.tess': WATER });
    expect((await run(['check', 'far.tess', 'missing.tess', 'good.tess'], folder)).code).toBe(2);
    expect((await run(['check', 'far.tess', 'good.tess'], folder)).code).toBe(1);
    expect((await run(['check', 'good.tess'], folder)).code).toBe(0);
  });

  it('estimate on a file Tessera fails on: exit 3 with one line, not a stack trace', async () => {
    const folder = tempFiles({ 'bad.tess': `${FAIL_MARK}\n${WATER}` });
    const result = await run(['estimate', 'bad.tess'], folder);
    expect(result.code).toBe(3);
    expect(result.stderr).toMatch(/^tessera: internal error: RangeError: simulated failure below analyze\(\) \(at .*\)\. This is a bug in Tessera; set TESSERA_DEBUG=1 for the whole stack\.\n$/);
  });
});
