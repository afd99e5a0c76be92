/** The `tessera` command line: exit codes, output formats, the JSON shape, unreadable files. */
import { execFileSync, spawnSync } from 'node:child_process';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../server/src/cli/main';
import { tempFiles } from '../support/tempFolders';

const root = path.resolve(__dirname, '..', '..');

async function run(args: string[], cwd = root): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t), cwd });
  return { code, stdout, stderr };
}

/** A temporary folder with these files, removed after the test (tests/support/tempFolders.ts). */
function scratch(files: Record<string, string>): string {
  return tempFiles(files, 'tessera-cli-');
}

// Water, experimental geometry (Hoy & Bunker 1979: r(OH) 0.9572 Å, HOH 104.52°), placed as in tests/fixtures/water.ts.
const WATER_XYZ = `3\nwater\nO 0.000000 0.000000 0.000000\nH 0.000000 0.756950 0.585882\nH 0.000000 -0.756950 0.585882\n`;

describe('tessera check', () => {
  it('exits 0 for a clean spec and prints a summary', async () => {
    const result = await run(['check', 'samples/molecules/water-cc-pvdz.tess']);
    expect(result.code).toBe(0);
    expect(result.stdout).toBe('');
    expect(result.stderr).toContain('0 errors, 0 warnings in 1 file');
  });

  it('exits 1 and prints file:line:col: severity code message for a spec with errors', async () => {
    const result = await run(['check', 'samples/mistakes.tess']);
    expect(result.code).toBe(1);
    expect(result.stdout).toMatch(/^samples\/mistakes\.tess:8:7: error unknown-basis 'cc-pvdzz' is not in the basis-set library\. Did you mean 'cc-pVDZ'\?/m);
  });

  it('shows an old spelling as an error with its rewrite, and exits 1', async () => {
    const folder = scratch({ 'old.tess': `units bohr\nbasis sto-3g { H = 3-21G }\ngeometry {\n  H a 0 0 0\n  H b 0 0 1.4\n}\nfragment h2 { atoms within 2 of a; tier mean-field { method rhf } }\n` });
    const result = await run(['check', 'old.tess'], folder);
    expect(result.code).toBe(1);
    expect(result.stdout.trimEnd().split('\n')).toEqual([
      'old.tess:1:1: error retired-spelling `units bohr` is an old spelling: the length unit is part of the structure header now, `structure in bohr { … }`. The rewrite moves it there and deletes this line.',
      'old.tess:2:1: error retired-spelling The braced basis block is an old spelling: write one line per basis, `basis sto-3g`, `basis 3-21G on all H`.',
      'old.tess:3:1: error retired-spelling `geometry` is an old spelling: write `structure in bohr { … }` (the unit of the old `units` line moves into the header, and that line goes).',
      'old.tess:7:21: error retired-spelling `within 2 of a` is an old spelling: write `closer-than 2 to a`, every atom strictly closer than 2 bohr (the structure\'s unit) to a.',
    ]);
  });

  it('gives JSON with positions, codes and counts', async () => {
    const result = await run(['check', '--format', 'json', 'samples/mistakes.tess', 'samples/molecules/water-sto-3g.tess']);
    expect(result.code).toBe(1);
    const json = JSON.parse(result.stdout) as { files: { file: string; diagnostics: { line: number; column: number; code: string; severity: string }[] }[]; errors: number };
    expect(json.files).toHaveLength(2);
    expect(json.files[0]!.diagnostics.find((d) => d.code === 'unknown-basis')).toMatchObject({ line: 8, column: 7, severity: 'error' });
    expect(json.files[1]!.diagnostics).toEqual([]);
    expect(json.errors).toBeGreaterThan(5);
  });

  it('exits 2 for a file that cannot be read, and still checks the others', async () => {
    const result = await run(['check', 'samples/does-not-exist.tess', 'samples/mistakes.tess']);
    expect(result.code).toBe(2);
    expect(result.stderr).toContain('cannot read samples/does-not-exist.tess: no such file');
    expect(result.stdout).toContain('unknown-basis');
  });

  it('exits 2 on bad usage', async () => {
    expect((await run(['check'])).code).toBe(2);
    expect((await run(['check', '--format', 'xml', 'a.tess'])).code).toBe(2);
    expect((await run(['frobnicate'])).code).toBe(2);
    expect((await run(['check', '--no-such-option', 'a.tess'])).code).toBe(2);
    expect((await run([])).code).toBe(2);
    expect((await run(['--help'])).code).toBe(0);
  });
});

describe('tessera estimate', () => {
  it('prints the plan, orbital and qubit tables for a spec', async () => {
    const result = await run(['estimate', 'samples/zn-site-h2s-scan.tess']);
    expect(result.code).toBe(0);
    expect(result.stdout).toContain('Planning estimates');
    expect(result.stdout).toMatch(/site\s+quantum\s+vqe\s+uccsd\s+jordan-wigner/);
    expect(result.stdout).toContain('Qubits and Hamiltonian');
  });

  it('gives Markdown tables', async () => {
    const result = await run(['estimate', '--format', 'markdown', 'samples/molecules/water-cc-pvdz.tess']);
    expect(result.stdout).toContain('| part | tier |');
    expect(result.stdout).toContain('> Planning estimates');
  });

  it('gives JSON under stable keys for a spec', async () => {
    const result = await run(['estimate', '--format', 'json', 'samples/molecules/water-cc-pvdz.tess']);
    const json = JSON.parse(result.stdout);
    // cc-pVDZ: O [3s2p1d] = 14 spherical / 15 cartesian, H [2s1p] = 5 (Dunning, J. Chem. Phys. 90, 1007 (1989)).
    expect(json.system).toMatchObject({ electrons: 10, multiplicity: 1, functions: 'spherical', basisFunctions: { spherical: 24, cartesian: 25 } });
    expect(json.fragments[0]).toMatchObject({ name: 'water', tier: 'quantum', mapping: 'parity', active: { electrons: 4, orbitals: 4 }, qubitsRequired: 6 });
  });

  it('--xyz water --basis cc-pVDZ: 24 basis functions, full orbital space without --frozen-core (48 qubits)', async () => {
    const folder = scratch({ 'water.xyz': WATER_XYZ });
    const result = await run(['estimate', '--xyz', 'water.xyz', '--basis', 'cc-pVDZ', '--format', 'json'], folder);
    expect(result.code).toBe(0);
    const json = JSON.parse(result.stdout);
    expect(json.system.electrons).toBe(10);
    expect(json.system.multiplicity).toBe(1);
    expect(json.system.functions).toBe('spherical');
    // O [3s2p1d] = 14 / 15, H [2s1p] = 5 (Dunning 1989); 2 × 24 qubits (Jordan–Wigner, Seeley, Richard & Love 2012).
    expect(json.system.basisFunctions.spherical).toBe(24);
    expect(json.system.basisFunctions.cartesian).toBe(25);
    expect(json.system.qubits.jordanWigner).toBe(48);
  });

  it('--xyz with --frozen-core and --functions spherical', async () => {
    const folder = scratch({ 'water.xyz': WATER_XYZ });
    const result = await run(['estimate', '--xyz', 'water.xyz', '--basis', '6-31G(d)', '--functions', 'spherical', '--frozen-core', '--format', 'json'], folder);
    const json = JSON.parse(result.stdout);
    // 6-31G*: O [3s2p1d] = 14 spherical (one d set, Hariharan & Pople, Theor. Chim. Acta 28, 213 (1973)),
    // H [2s] = 2 (Ditchfield, Hehre & Pople 1971): 18 orbitals, the O 1s frozen (common practice)
    // → 17 active → 34 qubits.
    expect(json.system.functions).toBe('spherical');
    expect(json.system.orbitals).toBe(18);
    expect(json.system.qubits.jordanWigner).toBe(34);
  });

  it('--xyz: a basis that lacks an element gives exit 1 and the diagnostic', async () => {
    // r(HI) = 1.609 Å (Huber & Herzberg 1979, from memory). The library's 6-31G (psi4 1.3.2's
    // 6-31g.gbs, scripts/data/generate_basis_library.py) covers H–Kr only.
    const folder = scratch({ 'hi.xyz': '2\nhydrogen iodide\nH 0 0 0\nI 0 0 1.609\n' });
    const result = await run(['estimate', '--xyz', 'hi.xyz', '--basis', '6-31G'], folder);
    expect(result.code).toBe(1);
    expect(result.stderr).toContain('basis-missing-element');
    expect(result.stderr).toContain('6-31G has no functions for I');
  });

  it('--xyz: an impossible multiplicity gives exit 1 and the diagnostic', async () => {
    const folder = scratch({ 'water.xyz': WATER_XYZ });
    const result = await run(['estimate', '--xyz', 'water.xyz', '--basis', 'sto-3g', '--multiplicity', '2', '--format', 'json'], folder);
    expect(result.code).toBe(1);
    const json = JSON.parse(result.stdout);
    expect(json.diagnostics.items.map((d: { code: string }) => d.code)).toContain('multiplicity-parity');
  });

  it('--xyz: a negative charge as a plain value, `--charge -1` (hydroxide: 8 + 1 + 1 = 10 electrons, IUPAC periodic table)', async () => {
    const folder = scratch({ 'oh.xyz': '2\nhydroxide\nO 0 0 0\nH 0 0 0.97\n' });
    const result = await run(['estimate', '--xyz', 'oh.xyz', '--basis', 'sto-3g', '--charge', '-1', '--format', 'json'], folder);
    expect(result.code).toBe(0);
    expect(JSON.parse(result.stdout).system).toMatchObject({ charge: -1, electrons: 10 });
  });

  it('exits 2 for unreadable files and bad options', async () => {
    expect((await run(['estimate', 'nope.tess'])).code).toBe(2);
    expect((await run(['estimate', '--xyz', 'nope.xyz', '--basis', 'sto-3g'])).code).toBe(2);
    expect((await run(['estimate', '--xyz', 'a.xyz'])).code).toBe(2);
    expect((await run(['estimate', '--xyz', 'a.xyz', '--basis', 'sto-3g', '--charge', 'one'])).code).toBe(2);
    expect((await run(['estimate', '--xyz', 'a.xyz', '--basis', 'sto-3g', '--functions', 'pure'])).code).toBe(2);
    expect((await run(['estimate', 'samples/mistakes.tess', '--basis', 'sto-3g'])).code).toBe(2);
  });
});

describe('the installed executable', () => {
  it('runs through node_modules/.bin like `npx tessera` and returns the documented exit codes', () => {
    const bin = path.join(root, 'node_modules', '.bin', 'tessera');
    const ok = spawnSync(bin, ['check', 'samples/molecules/water-sto-3g.tess'], { cwd: root, encoding: 'utf8' });
    expect(ok.status).toBe(0);
    const bad = spawnSync(bin, ['check', 'samples/mistakes.tess'], { cwd: root, encoding: 'utf8' });
    expect(bad.status).toBe(1);
    const usage = spawnSync(bin, ['check'], { cwd: root, encoding: 'utf8' });
    expect(usage.status).toBe(2);
    expect(execFileSync(bin, ['--version'], { cwd: root, encoding: 'utf8' }).trim()).toMatch(/^\d+\.\d+\.\d+/);
  });
});
