/**
 * `tessera estimate … --mean-field`: the JSON keys of issue 9 under `meanField` for the system and
 * each fragment, checked against psi4 1.3.2 (tests/fixtures/scf-reference.psi4.json made by
 * scripts/data/generate_scf_reference_fixture.py, and tests/fixtures/ecp-energies.psi4.json made by
 * scripts/data/generate_ecp_fixture.py; geometries in bohr written here as XYZ in ångström), the
 * text and Markdown tables, and a clear message with a documented exit code for each kind of bad
 * input: no convergence, too large, atoms on top of each other, linear dependencies, an element
 * without basis data, and an interrupt that cancels the computation mid-integral.
 */
import { describe, expect, it } from 'vitest';
import { BOHR_IN_ANGSTROM } from '../../server/src/chemistry/units';
import { runCli } from '../../server/src/cli/main';
import { ECP_CASES, referenceCase, type ReferenceCase } from '../jobs/requests';
import { WATER_ROWS } from '../fixtures/water';
import { scratch } from './harness';

type Json = Record<string, any>;

function xyzOf(geometry: readonly { symbol: string; x: number; y: number; z: number }[], title = 'from the psi4 fixture'): string {
  const rows = geometry.map((atom) => `${atom.symbol} ${(atom.x * BOHR_IN_ANGSTROM).toFixed(10)} ${(atom.y * BOHR_IN_ANGSTROM).toFixed(10)} ${(atom.z * BOHR_IN_ANGSTROM).toFixed(10)}`);
  return `${geometry.length}\n${title}\n${rows.join('\n')}\n`;
}

const BASIS_NAMES: Record<string, string> = { 'sto-3g': 'STO-3G', 'cc-pvdz': 'cc-pVDZ', '6-31g*': '6-31G*', 'def2-svp': 'def2-SVP' };

async function run(args: string[], cwd: string, io: { onInterrupt?: (handler: () => void) => () => void } = {}): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t), cwd, ...io });
  return { code, stdout, stderr };
}

async function estimateCase(c: ReferenceCase, extra: string[] = []): Promise<{ code: number; json: Json; stderr: string }> {
  const folder = scratch({ 'molecule.xyz': xyzOf(c.geometry) });
  const args = ['estimate', '--xyz', 'molecule.xyz', '--basis', BASIS_NAMES[c.basis]!, '--charge', String(c.charge), '--multiplicity', String(c.multiplicity), '--mean-field', '--format', 'json', ...extra];
  const result = await run(args, folder);
  return { code: result.code, json: JSON.parse(result.stdout) as Json, stderr: result.stderr };
}

/** psi4 writes A′ and A″ as Ap and App. */
const label = (psi4: string) => (psi4 === 'Ap' ? "A'" : psi4 === 'App' ? 'A"' : psi4);

describe('tessera estimate --mean-field against psi4 1.3.2', () => {
  it('gives the keys of the issue for water/cc-pVDZ RHF: energy, orbital energies, irreps and MP2 (all electrons without --frozen-core)', async () => {
    const c = referenceCase('water', 'cc-pvdz', 'rhf');
    const { code, json } = await estimateCase(c);
    expect(code).toBe(0);
    const meanField = json['system']['meanField'] as Json;
    expect(meanField['reference']).toBe('rhf');
    expect(meanField['converged']).toBe(true);
    expect(Math.abs(meanField['energy'] - c.energy)).toBeLessThan(1e-6);
    expect(Math.abs(meanField['nuclearRepulsion'] - c.nuclearRepulsion)).toBeLessThan(1e-6);
    expect(meanField['iterations']).toBeGreaterThan(1);
    const alpha = meanField['orbitalEnergies']['alpha'] as number[];
    expect(alpha).toHaveLength(c.alpha.energies.length);
    alpha.forEach((energy, k) => expect(Math.abs(energy - c.alpha.energies[k]!)).toBeLessThan(1e-5));
    expect(meanField['orbitalEnergies']['beta']).toEqual(alpha);
    // Occupied orbitals per irrep exactly as psi4 (fixture `docc`: 3 A1, 0 A2, 1 B1, 1 B2).
    const occupied = (meanField['irreps']['alpha'] as string[]).filter((_, k) => meanField['occupations']['alpha'][k] === 1);
    expect(occupied.sort()).toEqual(c.alpha.irreps.slice(0, 5).map(label).sort());
    expect(Math.abs(meanField['homo'] - c.alpha.energies[4]!)).toBeLessThan(1e-5);
    expect(Math.abs(meanField['lumo'] - c.alpha.energies[5]!)).toBeLessThan(1e-5);
    expect(Math.abs(meanField['mp2']['correlationEnergy'] - c.mp2!)).toBeLessThan(1e-6);
    expect(meanField['mp2']['frozenOrbitals']).toBe(0);
    const occupations = meanField['mp2']['naturalOccupations'] as number[];
    // The natural occupations sum to the 10 electrons (by construction) and descend.
    expect(occupations.reduce((a, b) => a + b, 0)).toBeCloseTo(10, 8);
    expect(occupations.every((value, k) => k === 0 || value <= occupations[k - 1]! + 1e-12)).toBe(true);
  });

  it('freezes the core for MP2 when asked (psi4 1.3.2 fixture, freeze_core)', async () => {
    const c = referenceCase('water', 'cc-pvdz', 'rhf');
    const { json } = await estimateCase(c, ['--frozen-core']);
    expect(Math.abs(json['system']['meanField']['mp2']['correlationEnergy'] - c.mp2FrozenCore!)).toBeLessThan(1e-6);
    expect(json['system']['meanField']['mp2']['frozenOrbitals']).toBe(1);
    // The text table says which MP2 the figure is: psi4's frozen-core value, 1 frozen orbital.
    const folder = scratch({ 'molecule.xyz': xyzOf(c.geometry) });
    const frozen = await run(['estimate', '--xyz', 'molecule.xyz', '--basis', 'cc-pVDZ', '--mean-field', '--frozen-core'], folder);
    expect(frozen.stdout).toContain(`${c.mp2FrozenCore!.toFixed(6)} (1 frozen-core orbital)`);
    const all = await run(['estimate', '--xyz', 'molecule.xyz', '--basis', 'cc-pVDZ', '--mean-field'], folder);
    expect(all.stdout).toContain(`${c.mp2!.toFixed(6)} (all electrons)`);
  });

  it('defaults to UHF for a doublet cation, with UHF MP2 and β orbital energies of their own (psi4 1.3.2 fixture)', async () => {
    const c = referenceCase('water cation', '6-31g*', 'uhf');
    const { code, json } = await estimateCase(c);
    expect(code).toBe(0);
    const meanField = json['system']['meanField'] as Json;
    expect(meanField['reference']).toBe('uhf');
    expect(Math.abs(meanField['energy'] - c.energy)).toBeLessThan(1e-6);
    (meanField['orbitalEnergies']['beta'] as number[]).forEach((energy, k) => expect(Math.abs(energy - c.beta.energies[k]!)).toBeLessThan(1e-5));
    expect(Math.abs(meanField['mp2']['correlationEnergy'] - c.mp2!)).toBeLessThan(1e-6);
    expect(meanField['mp2']['naturalOccupations']).toBeNull();
  });

  it('runs ROHF when asked, without MP2 (psi4 1.3.2 fixture)', async () => {
    const c = referenceCase('methylene triplet', 'cc-pvdz', 'rohf');
    const { code, json } = await estimateCase(c, ['--reference', 'rohf']);
    expect(code).toBe(0);
    const meanField = json['system']['meanField'] as Json;
    expect(meanField['reference']).toBe('rohf');
    expect(Math.abs(meanField['energy'] - c.energy)).toBeLessThan(1e-6);
    expect(meanField['mp2']).toBeNull();
  });

  it('computes a part with an effective core potential (psi4 1.3.2 ECP fixture)', async () => {
    const c = ECP_CASES.find((entry) => entry.name === 'hydrogen iodide' && entry.basis === 'def2-svp' && entry.kind === 'spherical')!;
    const folder = scratch({ 'hi.xyz': xyzOf(c.geometry) });
    const result = await run(['estimate', '--xyz', 'hi.xyz', '--basis', 'def2-SVP', '--mean-field', '--format', 'json'], folder);
    expect(result.code).toBe(0);
    const meanField = (JSON.parse(result.stdout) as Json)['system']['meanField'];
    expect(Math.abs(meanField['energy'] - c.references.rhf!.energy)).toBeLessThan(1e-6);
    expect(Math.abs(meanField['mp2']['correlationEnergy'] - c.references.rhf!.mp2!)).toBeLessThan(1e-6);
  });

  it('computes every fragment of a spec under its own meanField, and prints the table in text and Markdown', async () => {
    const rows = (dz: number, suffix: string) => WATER_ROWS.map(([element, name, x, y, z]) => `  ${element} ${name}${suffix} ${x.toFixed(6)} ${y.toFixed(6)} ${(z + dz).toFixed(6)}`).join('\n');
    const spec = `spec "two waters"\nbasis STO-3G\nstructure {\n${rows(0, 'a')}\n${rows(8, 'b')}\n}\nfragment first { atoms oa h1a h2a; tier mean-field { method rhf } }\nfragment second { atoms ob h1b h2b; tier mean-field { method rhf } }\n`;
    const folder = scratch({ 'waters.tess': spec });
    const json = JSON.parse((await run(['estimate', 'waters.tess', '--mean-field', '--format', 'json'], folder)).stdout) as Json;
    // Each fragment is the water of Hoy & Bunker (1979); psi4 1.3.2 gives its STO-3G energy (fixture).
    const water = referenceCase('water', 'sto-3g', 'rhf').energy;
    for (const fragment of json['fragments'] as Json[]) expect(Math.abs(fragment['meanField']['energy'] - water)).toBeLessThan(2e-6);
    expect(json['system']['meanField']['converged']).toBe(true);
    const text = await run(['estimate', 'waters.tess', '--mean-field'], folder);
    expect(text.code).toBe(0);
    expect(text.stdout).toContain('Mean field (computed, hartree)');
    expect(text.stdout).toMatch(/fragment first\s+RHF\s+7\s+-74\.9629\d\d/);
    expect(text.stdout).toContain('not planning estimates');
    const markdown = await run(['estimate', 'waters.tess', '--mean-field', '--format', 'markdown'], folder);
    expect(markdown.stdout).toContain('### Mean field (computed, hartree)');
    expect(markdown.stdout).toMatch(/\| fragment second \| RHF \| 7 \| -74\.9629\d\d \| yes \(\d+\) \|/);
  });
});

describe('tessera estimate --mean-field on bad input', () => {
  const WATER_XYZ = `3\nwater\n${WATER_ROWS.map(([element, , x, y, z]) => `${element} ${x} ${y} ${z}`).join('\n')}\n`;

  it('says when the SCF did not converge, shows the last energy as such, and exits 1', async () => {
    const folder = scratch({ 'water.xyz': WATER_XYZ });
    const result = await run(['estimate', '--xyz', 'water.xyz', '--basis', 'cc-pVDZ', '--mean-field', '--max-iterations', '3', '--format', 'json'], folder);
    expect(result.code).toBe(1);
    const meanField = (JSON.parse(result.stdout) as Json)['system']['meanField'];
    expect(meanField['converged']).toBe(false);
    expect(meanField['iterations']).toBe(3);
    expect(meanField['note']).toContain('not converged after 3 iterations');
    expect(meanField['mp2']).toBeNull();
    expect(result.stderr).toMatch(/system: the SCF did not converge in 3 iterations \(last energy -\d+\.\d{6} Ha, not a result\)/);
    const text = await run(['estimate', '--xyz', 'water.xyz', '--basis', 'cc-pVDZ', '--mean-field', '--max-iterations', '3'], folder);
    expect(text.stdout).toContain('NO (stopped after 3)');
  });

  it('refuses a part beyond the memory limit with its estimated cost, and exits 1', async () => {
    const folder = scratch({ 'water.xyz': WATER_XYZ });
    const result = await run(['estimate', '--xyz', 'water.xyz', '--basis', 'cc-pVDZ', '--mean-field', '--memory-limit', '1', '--format', 'json'], folder);
    expect(result.code).toBe(1);
    const error = (JSON.parse(result.stdout) as Json)['system']['meanField']['error'];
    expect(error['code']).toBe('memory');
    expect(error['message']).toMatch(/would need .+ \(an estimate from 24 functions\): more than the memory limit of 1 MiB/);
  });

  it('refuses atoms on top of each other, naming them, and exits 1', async () => {
    const folder = scratch({ 'stacked.xyz': '3\nstacked\nO 0 0 0\nH 0 0 0.05\nH 0 0.75695 0.585882\n' });
    const result = await run(['estimate', '--xyz', 'stacked.xyz', '--basis', 'STO-3G', '--mean-field', '--format', 'json'], folder);
    expect(result.code).toBe(1);
    const json = JSON.parse(result.stdout) as Json;
    expect(json['diagnostics']['items'].some((d: Json) => d['code'] === 'atoms-too-close')).toBe(true);
    expect(json['system']['meanField']['computed']).toBe(false);
    expect(json['system']['meanField']['error']['message']).toContain('Atoms 1 (O) and 2 (H) of the part are 0.050 Å apart');
  });

  it('drops near-linearly dependent functions and says how many', async () => {
    // Four hydrogens on a 0.12 Å square in aug-cc-pVDZ: invented, close enough for the diffuse functions to coincide.
    const folder = scratch({ 'h4.xyz': '4\nsquare\nH 0 0 0\nH 0.12 0 0\nH 0 0.12 0\nH 0.12 0.12 0\n' });
    const result = await run(['estimate', '--xyz', 'h4.xyz', '--basis', 'aug-cc-pVDZ', '--mean-field'], folder);
    expect(result.stdout).toMatch(/system: 2 of 36 functions dropped as near-linearly dependent \(overlap eigenvalues below 1e-7, smallest \d\.\d\de-8\)/);
    const json = JSON.parse((await run(['estimate', '--xyz', 'h4.xyz', '--basis', 'aug-cc-pVDZ', '--mean-field', '--format', 'json'], folder)).stdout) as Json;
    expect(json['system']['meanField']['linearDependencies']['dropped']).toBe(2);
    expect(json['system']['meanField']['orbitals']).toBe(34);
  });

  it('refuses an element without basis data before any computation', async () => {
    const folder = scratch({ 'rbh.xyz': '2\nrubidium hydride\nRb 0 0 0\nH 0 0 2.37\n' });
    const result = await run(['estimate', '--xyz', 'rbh.xyz', '--basis', '6-31G', '--mean-field', '--format', 'json'], folder);
    expect(result.code).toBe(1);
    expect((JSON.parse(result.stdout) as Json)['system']['meanField']['error']).toEqual({ code: 'refused', message: '6-31G does not define Rb (atom #1).' });
  });

  it('cancels the running job on an interrupt, says so, and exits 130', async () => {
    // Benzene (invented, idealised: C–C 1.39 Å, C–H 1.09 Å) in cc-pVDZ runs for seconds.
    const atoms = [...[0, 1, 2, 3, 4, 5].map((k) => `C ${(1.39 * Math.cos((k * Math.PI) / 3)).toFixed(6)} ${(1.39 * Math.sin((k * Math.PI) / 3)).toFixed(6)} 0`), ...[0, 1, 2, 3, 4, 5].map((k) => `H ${(2.48 * Math.cos((k * Math.PI) / 3)).toFixed(6)} ${(2.48 * Math.sin((k * Math.PI) / 3)).toFixed(6)} 0`)];
    const folder = scratch({ 'benzene.xyz': `12\nbenzene\n${atoms.join('\n')}\n` });
    let interrupt: (() => void) | undefined;
    const running = run(['estimate', '--xyz', 'benzene.xyz', '--basis', 'cc-pVDZ', '--mean-field', '--format', 'json'], folder, {
      onInterrupt: (handler) => {
        interrupt = handler;
        return () => (interrupt = undefined);
      },
    });
    await new Promise((resolve) => setTimeout(resolve, 1500));
    expect(interrupt).toBeDefined();
    interrupt!();
    const result = await running;
    expect(result.code).toBe(130);
    expect(result.stderr).toContain('tessera: interrupted: the computations still running were cancelled.');
    const meanField = (JSON.parse(result.stdout) as Json)['system']['meanField'];
    expect(meanField['error']['code']).toBe('cancelled');
    expect(meanField['energy']).toBeUndefined();
  });

  it('refuses the computation options without --mean-field, and a reference it does not know', async () => {
    const folder = scratch({ 'water.xyz': WATER_XYZ });
    expect((await run(['estimate', '--xyz', 'water.xyz', '--basis', 'STO-3G', '--reference', 'uhf'], folder)).code).toBe(2);
    const bad = await run(['estimate', '--xyz', 'water.xyz', '--basis', 'STO-3G', '--mean-field', '--reference', 'dft'], folder);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain("--reference must be rhf, uhf or rohf; got 'dft'");
  });
});
