/**
 * `tessera estimate … --mean-field` under `embedding dmet`: each fragment's bath computed from the
 * system's mean field through the jobs layer, under `dmetBath` in the JSON and in a table of its
 * own, checked against the numpy reference on psi4 densities (tests/fixtures/dmet-bath.psi4.json,
 * made by scripts/data/generate_dmet_bath_fixture.py with psi4 1.3.2; geometries in bohr, written
 * into the spec in bohr). Singular values agree to 1e-6: the command runs the SCF to its default
 * convergence (|ΔE| < 1e-8 Ha, orbital gradient 1e-6), psi4 ran to 1e-10.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../server/src/cli/main';
import { scratch } from './harness';

type Json = Record<string, any>;

interface FixtureCase {
  name: string;
  basis: string;
  reference: string;
  charge: number;
  multiplicity: number;
  geometry: { symbol: string; x: number; y: number; z: number }[];
  threshold: number;
  fragments: { name: string; atoms: number[]; alpha: { singularValues: number[]; bathOrbitals: number }; beta: { singularValues: number[]; bathOrbitals: number }; impurityElectrons: number; coreElectrons: number }[];
  iao: { name: string; fragmentOrbitals: number; singularValues: number[]; bathOrbitals: number; impurityElectrons: number }[] | null;
}

const FIXTURE = JSON.parse(readFileSync(join(__dirname, '..', 'fixtures', 'dmet-bath.psi4.json'), 'utf8')) as { cases: FixtureCase[] };
const BASIS_NAMES: Record<string, string> = { 'cc-pvdz': 'cc-pVDZ', '6-31g*': '6-31G*' };

/** A spec of a fixture case: its atoms in bohr, one fragment per fixture fragment, DMET embedding. */
function specOf(c: FixtureCase, embedding = 'dmet'): string {
  const atoms = c.geometry.map((atom) => `  ${atom.symbol} ${atom.x.toFixed(12)} ${atom.y.toFixed(12)} ${atom.z.toFixed(12)}`);
  const fragments = c.fragments.map((fragment, k) => {
    const selectors = fragment.atoms.map((atom) => `#${atom + 1}`).join(' ');
    // The bath comes from the system; the fragments' own charges matter for their own mean fields (Li+ is the charged one).
    return `fragment f${k} {\n  atoms ${selectors}\n  charge ${c.name === 'lithium cation with water' && k === 0 ? 1 : 0}\n  tier mean-field { method ${c.reference === 'rhf' ? 'rhf' : 'uhf'} }\n}`;
  });
  return [`spec "${c.name}"`, `charge ${c.charge}`, `multiplicity ${c.multiplicity}`, `basis ${BASIS_NAMES[c.basis]}`, `embedding ${embedding}`, 'structure in bohr {', ...atoms, '}', ...fragments, ''].join('\n');
}

async function run(args: string[], cwd: string): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t), cwd });
  return { code, stdout, stderr };
}

describe('tessera estimate --mean-field: the DMET bath of each fragment (tests/fixtures/dmet-bath.psi4.json)', () => {
  it('water dimer, cc-pVDZ: singular values to 1e-6, bath computed and counted, impurity and core electrons', async () => {
    const c = FIXTURE.cases.find((entry) => entry.name === 'water dimer')!;
    const folder = scratch({ 'dimer.tess': specOf(c) });
    const { code, stdout } = await run(['estimate', 'dimer.tess', '--mean-field', '--format', 'json'], folder);
    expect(code).toBe(0);
    const json = JSON.parse(stdout) as Json;
    c.fragments.forEach((fragment, k) => {
      const bath = json['fragments'][k]['dmetBath'] as Json;
      expect(bath['computed']).toBe(true);
      expect(bath['orbitals']).toBe('lowdin');
      expect(bath['threshold']).toBe(c.threshold);
      const values = bath['alpha']['singularValues'] as number[];
      expect(values).toHaveLength(fragment.alpha.singularValues.length);
      values.forEach((value, i) => expect(Math.abs(value - fragment.alpha.singularValues[i]!)).toBeLessThan(1e-6));
      expect(bath['bath']['computed']).toEqual({ alpha: fragment.alpha.bathOrbitals, beta: fragment.beta.bathOrbitals });
      // The counting rule min(L, M − L, Nσ, M − Nσ): 24 fragment functions of 48, 10 electrons per spin → 10 (fixture bath count).
      expect(bath['bath']['counted']).toEqual({ alpha: fragment.alpha.bathOrbitals, beta: fragment.beta.bathOrbitals });
      expect(Math.abs(bath['impurity']['electrons'] - fragment.impurityElectrons)).toBeLessThan(1e-8);
      // The rule counts bath + max(0, L + Nσ − M) = 10 + 0 per spin (fixture bath count; L 24, M 48, Nσ 10).
      expect(bath['impurity']['countedElectrons']).toBe(2 * fragment.alpha.bathOrbitals);
      expect(Math.abs(bath['coreElectrons'] - fragment.coreElectrons)).toBeLessThan(1e-8);
      expect(bath['impurity']['orbitals']).toBe(24 + fragment.alpha.bathOrbitals);
      expect(bath['beta']).toBeNull();
    });
  }, 120_000);

  it('hydroxyl radical with water, 6-31G*, UHF: a bath per spin (fixture: 10 α, 9 β)', async () => {
    const c = FIXTURE.cases.find((entry) => entry.name === 'hydroxyl radical with water')!;
    const folder = scratch({ 'radical.tess': specOf(c) });
    const { stdout } = await run(['estimate', 'radical.tess', '--mean-field', '--format', 'json'], folder);
    const json = JSON.parse(stdout) as Json;
    c.fragments.forEach((fragment, k) => {
      const bath = json['fragments'][k]['dmetBath'] as Json;
      expect(bath['reference']).toBe('uhf');
      expect(bath['bath']['computed']).toEqual({ alpha: fragment.alpha.bathOrbitals, beta: fragment.beta.bathOrbitals });
      (bath['beta']['singularValues'] as number[]).forEach((value, i) => expect(Math.abs(value - fragment.beta.singularValues[i]!)).toBeLessThan(1e-6));
      expect(Math.round(bath['impurity']['electrons'])).toBe(Math.round(fragment.impurityElectrons));
    });
  }, 120_000);

  it('prints the bath table with computed and counted side by side, and the singular values', async () => {
    const c = FIXTURE.cases.find((entry) => entry.name === 'lithium cation with water')!;
    const folder = scratch({ 'li.tess': specOf(c) });
    const { stdout } = await run(['estimate', 'li.tess', '--mean-field'], folder);
    expect(stdout).toContain('DMET bath (computed from the system mean field; counted beside it)');
    expect(stdout).toMatch(/bath computed\s+bath counted/);
    // The largest singular value of either fragment, 0.286 (fixture, three digits).
    expect(stdout).toContain(`σ = ${c.fragments[0]!.alpha.singularValues[0]!.toPrecision(3)}`);
  }, 120_000);

  it('no dmetBath without embedding dmet, and --bath-threshold is checked and used', async () => {
    const c = FIXTURE.cases.find((entry) => entry.name === 'lithium cation with water')!;
    const folder = scratch({ 'none.tess': specOf(c, 'none'), 'li.tess': specOf(c) });
    const none = JSON.parse((await run(['estimate', 'none.tess', '--mean-field', '--format', 'json'], folder)).stdout) as Json;
    expect(none['fragments'][0]['dmetBath']).toBeUndefined();
    const bad = await run(['estimate', 'li.tess', '--mean-field', '--bath-threshold', '0.7'], folder);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain('--bath-threshold must be a number between 0 and 0.5');
    // Between the fixture's 5th (0.068) and 6th (0.0079) singular values: 5 bath orbitals (by construction).
    const five = JSON.parse((await run(['estimate', 'li.tess', '--mean-field', '--format', 'json', '--bath-threshold', '0.03'], folder)).stdout) as Json;
    expect(five['fragments'][0]['dmetBath']['bath']['computed']['alpha']).toBe(5);
    expect(five['fragments'][0]['dmetBath']['threshold']).toBe(0.03);
  }, 120_000);

  it('--bath-orbitals iao: the bath in intrinsic atomic orbitals (fixture, numpy from Knizia 2013 on psi4 data); refused for UHF with the way out', async () => {
    const c = FIXTURE.cases.find((entry) => entry.name === 'lithium cation with water')!;
    const folder = scratch({ 'li.tess': specOf(c), 'radical.tess': specOf(FIXTURE.cases.find((entry) => entry.name === 'hydroxyl radical with water')!) });
    const { code, stdout } = await run(['estimate', 'li.tess', '--mean-field', '--format', 'json', '--bath-orbitals', 'iao'], folder);
    expect(code).toBe(0);
    const json = JSON.parse(stdout) as Json;
    c.iao!.forEach((reference, k) => {
      const bath = json['fragments'][k]['dmetBath'] as Json;
      expect(bath['orbitals']).toBe('iao');
      expect(bath['minimalBasis']).toBe('STO-3G');
      expect(bath['fragmentOrbitals']).toBe(reference.fragmentOrbitals);
      expect(bath['bath']['computed']['alpha']).toBe(reference.bathOrbitals);
      (bath['alpha']['singularValues'] as number[]).forEach((value, i) => expect(Math.abs(value - reference.singularValues[i]!)).toBeLessThan(1e-6));
      expect(Math.abs(bath['impurity']['electrons'] - 2 * reference.impurityElectrons)).toBeLessThan(1e-6);
    });
    const refused = await run(['estimate', 'radical.tess', '--mean-field', '--format', 'json', '--bath-orbitals', 'iao'], folder);
    expect(refused.code).toBe(1);
    const bath = (JSON.parse(refused.stdout) as Json)['fragments'][0]['dmetBath'] as Json;
    expect(bath['computed']).toBe(false);
    expect(bath['error']['message']).toContain('closed-shell (RHF) mean field of the system; this one is UHF. Use Löwdin orbitals');
    const bad = await run(['estimate', 'li.tess', '--mean-field', '--bath-orbitals', 'boys'], folder);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain("--bath-orbitals must be lowdin or iao; got 'boys'");
  }, 180_000);
});
