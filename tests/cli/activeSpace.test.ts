/**
 * `tessera estimate --mean-field`: each fragment's computed active orbitals in the JSON estimate
 * and the text table, beside what the plan counted. The orbitals of `active 4e 4o` carry psi4
 * 1.3.2's orbital energies (tests/fixtures/scf-reference.psi4.json, scripts/data/
 * generate_scf_reference_fixture.py); water at Hoy & Bunker's structure (tests/fixtures/water.ts).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../server/src/cli/main';
import { WATER_ROWS } from '../fixtures/water';
import { scratch } from './harness';

type Json = Record<string, any>;
const WATER = WATER_ROWS.map(([element, label, x, y, z]) => `  ${element} ${label} ${x.toFixed(6)} ${y.toFixed(6)} ${z.toFixed(6)}`).join('\n');
const spec = (tier: string) => `basis cc-pVDZ\nstructure {\n${WATER}\n}\nfragment w { atoms rest; tier quantum { ${tier} } }\n`;
const PSI4 = (JSON.parse(readFileSync(join(__dirname, '..', 'fixtures', 'scf-reference.psi4.json'), 'utf8')) as { cases: { name: string; basis: string; reference: string; alpha: { energies: number[] } }[] }).cases.find(
  (c) => c.name === 'water' && c.basis === 'cc-pvdz' && c.reference === 'rhf',
)!;

async function run(args: string[], cwd: string): Promise<{ code: number; stdout: string }> {
  let stdout = '';
  const code = await runCli(args, { stdout: (t) => (stdout += t), stderr: () => {}, cwd });
  return { code, stdout };
}

describe('tessera estimate --mean-field: computed active orbitals', () => {
  it('active 4e 4o: computed and counted side by side, energies of psi4 1.3.2 (fixture)', async () => {
    const folder = scratch({ 'w.tess': spec('active 4e 4o') });
    const { code, stdout } = await run(['estimate', 'w.tess', '--mean-field', '--format', 'json'], folder);
    expect(code).toBe(0);
    const active = (JSON.parse(stdout) as Json)['fragments'][0]['activeSpace'] as Json;
    expect(active['computed']).toBe(true);
    expect(active['source']).toBe('canonical-window');
    expect(active['counted']).toEqual({ electrons: 4, orbitals: 4, source: 'given' });
    (active['active'] as Json[]).forEach((orbital, k) => expect(Math.abs(orbital['energy'] - PSI4.alpha.energies[3 + k]!)).toBeLessThan(1e-5));
  });

  it('active shells o p: counted from the free atom (estimated-shells) and computed by projection, in the text table', async () => {
    const folder = scratch({ 'w.tess': spec('active shells o p') });
    const json = await run(['estimate', 'w.tess', '--mean-field', '--format', 'json'], folder);
    const active = (JSON.parse(json.stdout) as Json)['fragments'][0]['activeSpace'] as Json;
    expect(active['counted']['source']).toBe('estimated-shells');
    expect(active['source']).toBe('atomic-projection');
    // The Hamiltonian is built in the projected orbitals the choice picked, as many as it picked.
    const hamiltonian = (JSON.parse(json.stdout) as Json)['fragments'][0]['hamiltonian'] as Json;
    expect(hamiltonian['activeSpace']['orbitalKind']).toBe('projected');
    expect(hamiltonian['activeSpace']['orbitals']).toBe((active['active'] as Json[]).length);
    const text = await run(['estimate', 'w.tess', '--mean-field'], folder);
    expect(text.stdout).toContain('Computed active orbitals');
  });

  it('the figures that read the active irreps are built on the computed orbitals, in JSON and text (water 8e 8o, psi4 irreps in tests/analysis/computedIrreps.test.ts)', async () => {
    const folder = scratch({ 'w.tess': spec('method vqe; ansatz uccsd; mapping jordan-wigner; active 8e 8o') });
    const counted = JSON.parse((await run(['estimate', 'w.tess', '--format', 'json'], folder)).stdout) as Json;
    expect(counted['fragments'][0]['activeIrreps']['source']).toBe('proportional');
    expect(counted['fragments'][0]['orbitalSources']['figures']['pauliTerms']).toBe('counted');
    const json = JSON.parse((await run(['estimate', 'w.tess', '--mean-field', '--format', 'json'], folder)).stdout) as Json;
    const fragment = json['fragments'][0];
    expect(fragment['activeIrreps']).toEqual({ perIrrep: { A1: 4, B2: 3, B1: 1 }, source: 'computed', occupation: 'computed' });
    expect(fragment['orbitalSources']['figures']).toMatchObject({ taperedQubits: 'computed', pauliTerms: 'computed', ansatzParameters: 'computed' });
    // The computed Hamiltonian has as many strings as the count on the computed irreps allows.
    expect(fragment['pauliTerms']['jordanWigner']).toBe(fragment['hamiltonian']['pauliTerms']['jordanWigner']);
    expect(counted['fragments'][0]['pauliTerms']['jordanWigner']).not.toBe(fragment['pauliTerms']['jordanWigner']);
    const text = await run(['estimate', 'w.tess', '--mean-field'], folder);
    expect(text.stdout).toMatch(/^w +8e 23o +8e 8o +computed +16 /m);
  });
});
