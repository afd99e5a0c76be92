/**
 * `tessera report --mean-field`: the computed results beside the planning figures, labelled
 * computed, and (HTML) shots against active-space size from Hamiltonians computed in canonical
 * windows. Water cc-pVDZ at Hoy & Bunker's structure (tests/fixtures/water.ts); the RHF energy is
 * psi4 1.3.2's (tests/fixtures/scf-reference.psi4.json, scripts/data/generate_scf_reference_fixture.py).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../server/src/cli/main';
import { WATER_ROWS } from '../fixtures/water';
import { scratch } from './harness';

const WATER = WATER_ROWS.map(([element, label, x, y, z]) => `  ${element} ${label} ${x.toFixed(6)} ${y.toFixed(6)} ${z.toFixed(6)}`).join('\n');
const SPEC = `basis cc-pVDZ\nstructure {\n${WATER}\n}\nfragment w { atoms rest; tier quantum { method vqe; ansatz uccsd; mapping jordan-wigner; active 4e 4o } }\n`;
const PSI4_RHF = (JSON.parse(readFileSync(join(__dirname, '..', 'fixtures', 'scf-reference.psi4.json'), 'utf8')) as { cases: { name: string; basis: string; reference: string; energy: number }[] }).cases.find(
  (c) => c.name === 'water' && c.basis === 'cc-pvdz' && c.reference === 'rhf',
)!.energy;

async function run(args: string[], cwd: string): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t), cwd });
  return { code, stdout, stderr };
}

describe('tessera report --mean-field', () => {
  const folder = scratch({ 'w.tess': SPEC });

  it('markdown: the computed section, the energy of psi4 1.3.2 and the Hamiltonian, labelled computed', async () => {
    const { code, stdout } = await run(['report', 'w.tess', '--mean-field'], folder);
    expect(code).toBe(0);
    expect(stdout).toContain("## Computed results (Tessera's engine)");
    const row = stdout.split('\n').find((line) => line.startsWith('| fragment w | RHF'))!;
    const energy = Number(row.split('|')[4]!.trim().replace('−', '-'));
    expect(Math.abs(energy - PSI4_RHF)).toBeLessThan(1e-5);
    expect(stdout).toContain('Active-space Hamiltonian (computed)');
    // The planning tables read the computed irreps.
    expect(stdout).toMatch(/\| w \|[^\n]*\| computed \|/);
  }, 120_000);

  it('html: shots against active-space size from computed Hamiltonians, every window computed', async () => {
    const { code } = await run(['report', 'w.tess', '--mean-field', '--format', 'html', '--out', 'w.html'], folder);
    expect(code).toBe(0);
    const html = readFileSync(join(folder, 'w.html'), 'utf8');
    expect(html).not.toMatch(/\sstyle="/); // the page's policy allows no inline style attributes
    const svg = html.match(/<svg[^>]*>(?:(?!<\/svg>)[\s\S])*Shots against active-space size(?:(?!<\/svg>)[\s\S])*<\/svg>/)![0];
    expect(svg).toContain('(λ/ε)² bound, any state (computed λ)');
    // Windows of 2, 4, …, 16 orbitals (4 is also the fragment's own): two series of 8 points.
    expect(svg.match(/<circle /g)).toHaveLength(16);
    expect(svg).not.toContain('not computed');
  }, 180_000);

  it('refuses --mean-field with csv (usage, exit 2)', async () => {
    const { code, stderr } = await run(['report', 'w.tess', '--mean-field', '--format', 'csv'], folder);
    expect(code).toBe(2);
    expect(stderr).toContain('--mean-field goes with --format markdown or html');
  });
});
