/**
 * The editor's settings on the command line: `--mapping` (tessera.defaultMapping) and
 * `--qubit-limit` (tessera.qubitLimit) reach every command that reads a spec, so that the command
 * line shows what the editor shows for the same settings.
 *
 * Water in STO-3G without frozen core has 7 spatial orbitals: 14 qubits under Jordan–Wigner (one per
 * spin orbital, Jordan & Wigner 1928) and 12 under the parity mapping with the two-qubit reduction
 * (2n − 2; Bravyi, Gambetta, Mezzacapo, Temme, arXiv:1701.08213).
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { atPath, root, run, scratch } from './harness';

/** The water sample without a mapping of its own, so the default decides. */
function waterWithoutMapping(): string {
  return readFileSync(path.join(root, 'samples', 'molecules', 'water-sto-3g.tess'), 'utf8').replace('; mapping jordan-wigner', '');
}

describe('--mapping and --qubit-limit', () => {
  it('--mapping sets the mapping of tiers that name none, as the editor setting does', async () => {
    const folder = scratch({ 'water.tess': waterWithoutMapping() });
    const plain = JSON.parse((await run(['estimate', 'water.tess', '--format', 'json'], folder)).stdout) as unknown;
    const parity = JSON.parse((await run(['estimate', 'water.tess', '--format', 'json', '--mapping', 'parity'], folder)).stdout) as unknown;
    expect(atPath(plain, 'fragments.0.qubitsRequired')).toBe(14);
    expect(atPath(parity, 'fragments.0.mapping')).toBe('parity');
    expect(atPath(parity, 'fragments.0.qubitsRequired')).toBe(12);
    const editor = analyzeDocument(waterWithoutMapping(), { defaultMapping: 'parity' }).report();
    expect(atPath(parity, 'fragments.0')).toEqual(JSON.parse(JSON.stringify(editor.fragments[0])));
  });

  it('a mapping the spec names wins over --mapping, in the editor and on the command line', async () => {
    const folder = scratch({ 'water.tess': readFileSync(path.join(root, 'samples', 'molecules', 'water-sto-3g.tess'), 'utf8') });
    const json = JSON.parse((await run(['estimate', 'water.tess', '--format', 'json', '--mapping', 'parity'], folder)).stdout) as unknown;
    expect(atPath(json, 'fragments.0.qubitsRequired')).toBe(14);
  });

  it('--qubit-limit gives the same diagnostics as the editor setting, in check, estimate and report', async () => {
    const folder = scratch({ 'water.tess': waterWithoutMapping() });
    const editor = analyzeDocument(waterWithoutMapping(), { defaultQubitLimit: 10 }).diagnostics.map((d) => d.code);
    expect(editor).toContain('qubit-limit-exceeded');
    const checked = await run(['check', 'water.tess', '--format', 'json', '--qubit-limit', '10'], folder);
    expect(checked.code).toBe(1);
    const codes = (JSON.parse(checked.stdout) as { files: { diagnostics: { code: string }[] }[] }).files[0]!.diagnostics.map((d) => d.code);
    expect(codes).toEqual(editor);
    expect((await run(['check', 'water.tess'], folder)).code).toBe(0);
    expect((await run(['check', 'water.tess', '--qubit-limit', '14'], folder)).code).toBe(0);
    expect((await run(['check', 'water.tess', '--qubit-limit', '12', '--mapping', 'parity'], folder)).code).toBe(0);
    expect((await run(['estimate', 'water.tess', '--qubit-limit', '10'], folder)).code).toBe(1);
    const report = await run(['report', 'water.tess', '--qubit-limit', '10'], folder);
    expect(report.code).toBe(1);
    expect(report.stdout).toContain('qubit-limit-exceeded');
  });

  it('refuses a mapping or a limit that is none, with exit code 2 and what was given', async () => {
    const folder = scratch({ 'water.tess': waterWithoutMapping() });
    const mapping = await run(['estimate', 'water.tess', '--mapping', 'party'], folder);
    expect(mapping.code).toBe(2);
    expect(mapping.stderr).toContain("--mapping must be one of jordan-wigner, bravyi-kitaev, parity; got 'party'");
    const limit = await run(['check', 'water.tess', '--qubit-limit', '0'], folder);
    expect(limit.code).toBe(2);
    expect(limit.stderr).toContain('--qubit-limit must be at least 1');
    expect((await run(['export', 'water.tess', '--to', 'xyz', '--qubit-limit', 'many'], folder)).code).toBe(2);
  });

  it('the usage text names both options', async () => {
    const help = (await run(['--help'])).stdout;
    expect(help).toContain('--mapping jordan-wigner|bravyi-kitaev|parity');
    expect(help).toContain('--qubit-limit N');
  });
});
