/**
 * `tessera export <spec> --to fcidump|pauli`: a quantum fragment's active-space Hamiltonian for a
 * solver. The integral dump is checked against psi4 1.3.2's own dump of the same water molecule and
 * space (tests/fixtures/water-631g.psi4.fcidump, made by scripts/data/generate_hamiltonian_fixture.py;
 * the format is Knowles & Handy, Comput. Phys. Commun. 54, 75 (1989)) through the values that do not
 * depend on orbital phases; the Pauli export against Seeley, Richard & Love 2012 (H2 STO-3G, 15
 * strings).
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { FIXTURES, psi4Case } from '../electronic/psi4Fixture';
import { run, scratch } from './harness';

type Json = Record<string, any>;

function specOf(name: string, basis: string, active: string, extra = ''): string {
  const c = psi4Case(name) as ReturnType<typeof psi4Case> & { symbols: string[]; coordinates: number[] };
  const atoms = c.symbols.map((symbol, a) => `  ${symbol} a${a + 1} ${c.coordinates[3 * a]} ${c.coordinates[3 * a + 1]} ${c.coordinates[3 * a + 2]}`);
  return [
    `spec "${name}"`,
    `basis ${basis}`,
    'structure {',
    ...atoms,
    '}',
    'fragment site {',
    `  atoms ${c.symbols.map((_, a) => `a${a + 1}`).join(' ')}`,
    `  tier quantum { method vqe; active ${active}${extra} }`,
    '}',
  ].join('\n');
}

/** Header fields and `i j k l → value` of an integral dump. */
function readDump(text: string): { header: Record<string, number[]>; values: Map<string, number> } {
  const end = text.indexOf('&END');
  const header: Record<string, number[]> = {};
  for (const match of text.slice(0, end).matchAll(/([A-Z0-9]+)\s*=\s*([^=]*?)(?=,?\s*[A-Z0-9]+\s*=|$)/gs)) {
    header[match[1]!] = match[2]!.split(',').map((v) => v.trim()).filter((v) => v !== '' && !/^\.(TRUE|FALSE)\.$/i.test(v)).map(Number);
  }
  const values = new Map<string, number>();
  for (const line of text.slice(text.indexOf('\n', end) + 1).split('\n')) {
    const fields = line.trim().split(/\s+/);
    if (fields.length !== 5) continue;
    values.set(fields.slice(1).join(' '), Number(fields[0]));
  }
  return { header, values };
}

describe('--to fcidump', () => {
  it("water 6-31G, 8 electrons in 8 orbitals: psi4's header, core energy and the phase-independent integrals (psi4 1.3.2 fixture)", async () => {
    const folder = scratch({ 'water.tess': specOf('h2o-631g', '6-31G', '8e 8o') });
    const result = await run(['export', 'water.tess', '--to', 'fcidump', '--out', 'water.fcidump'], folder);
    expect(result.code).toBe(0);
    const ours = readDump(readFileSync(path.join(folder, 'water.fcidump'), 'utf8'));
    const theirs = readDump(readFileSync(path.join(FIXTURES, 'water-631g.psi4.fcidump'), 'utf8'));
    for (const key of ['NORB', 'NELEC', 'MS2', 'ORBSYM', 'ISYM']) expect(ours.header[key], key).toEqual(theirs.header[key]);
    // The core energy: nuclear repulsion + one frozen orbital (psi4 fixture). The command line's SCF
    // converges to its default orbital gradient (1e-6), hence 1e-5.
    expect(Math.abs(ours.values.get('0 0 0 0')! - theirs.values.get('0 0 0 0')!)).toBeLessThan(1e-5);
    // h_ii (psi4 1.3.2 leaves out the last row of its one-electron block when orbitals are frozen,
    // see tests/electronic/handoff/handoff.test.ts), (ii|jj) and (ij|ij): unchanged by orbital signs.
    let compared = 0;
    for (let i = 1; i <= 8; i++) {
      if (i < 8) {
        expect(Math.abs(ours.values.get(`${i} ${i} 0 0`)! - theirs.values.get(`${i} ${i} 0 0`)!)).toBeLessThan(1e-5);
        compared++;
      }
      for (let j = 1; j <= i; j++) {
        for (const key of [`${i} ${i} ${j} ${j}`, `${i} ${j} ${i} ${j}`]) {
          expect(Math.abs((ours.values.get(key) ?? 0) - (theirs.values.get(key) ?? 0)), key).toBeLessThan(1e-5);
          compared++;
        }
      }
    }
    expect(compared).toBe(7 + 2 * 36); // 7 diagonal one-electron values and 36 pairs twice (by construction)
  });

  it('writes to standard output without --out, the core energy last (Knowles & Handy 1989)', async () => {
    const folder = scratch({ 'h2.tess': specOf('h2-sto3g', 'STO-3G', '2e 2o') });
    const result = await run(['export', 'h2.tess', '--to', 'fcidump'], folder);
    expect(result.code).toBe(0);
    const lines = result.stdout.trim().split('\n');
    expect(lines[0]).toBe('&FCI NORB=2,NELEC=2,MS2=0,');
    expect(lines[lines.length - 1]).toMatch(/ 0 +0 +0 +0$/);
    // Nuclear repulsion of H2 at 0.7414 Å, no frozen core (psi4 1.3.2 fixture: 0.7137539933504182).
    expect(Number(lines[lines.length - 1]!.trim().split(/\s+/)[0])).toBeCloseTo(0.7137539933504182, 8);
  });
});

describe('--to pauli', () => {
  it("H2 STO-3G: Tessera's qubit Hamiltonian JSON with 15 strings (Seeley, Richard & Love 2012) under the fragment's mapping", async () => {
    const folder = scratch({ 'h2.tess': specOf('h2-sto3g', 'STO-3G', '2e 2o', '; mapping bravyi-kitaev') });
    const result = await run(['export', 'h2.tess', '--to', 'pauli', '--out', 'h2.json'], folder);
    expect(result.code).toBe(0);
    const json = JSON.parse(readFileSync(path.join(folder, 'h2.json'), 'utf8')) as Json;
    expect(json['format']).toBe('tessera-qubit-hamiltonian'); // docs/qubit-hamiltonian-json.md (by definition)
    expect(json['mapping']).toBe('bravyi-kitaev');
    expect(json['termCount']).toBe(15); // Seeley, Richard & Love 2012
    expect(json['terms']).toHaveLength(15); // Seeley, Richard & Love 2012
    expect(json['activeOrbitals']).toEqual([0, 1]); // by construction: both orbitals
    expect(json['source']).toContain('fragment site');
  });
});

describe('refusals', () => {
  it('a spec without a quantum fragment, an unknown --fragment and two quantum fragments without one: exit 2 with the choices', async () => {
    const none = scratch({ 'none.tess': 'basis STO-3G\nstructure {\n  H a 0 0 0\n  H b 0 0 0.7414\n}\nfragment f {\n  atoms a b\n  tier mean-field\n}\n' });
    const first = await run(['export', 'none.tess', '--to', 'fcidump'], none);
    expect(first.code).toBe(2);
    expect(first.stderr).toContain('no quantum-tier fragment');
    const two = [
      'basis STO-3G',
      'structure {',
      '  H a 0 0 0',
      '  H b 0 0 0.7414',
      '  H c 5 0 0',
      '  H d 5 0 0.7414',
      '}',
      'fragment left {\n  atoms a b\n  tier quantum { method vqe; active 2e 2o }\n}',
      'fragment right {\n  atoms c d\n  tier quantum { method vqe; active 2e 2o }\n}',
    ].join('\n');
    const folder = scratch({ 'two.tess': two });
    const both = await run(['export', 'two.tess', '--to', 'pauli'], folder);
    expect(both.code).toBe(2);
    expect(both.stderr).toContain('choose one with --fragment <name>');
    const unknown = await run(['export', 'two.tess', '--to', 'pauli', '--fragment', 'middle'], folder);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toContain('quantum fragments: left, right');
    const chosen = await run(['export', 'two.tess', '--to', 'pauli', '--fragment', 'right'], folder);
    expect(chosen.code).toBe(0);
    expect((JSON.parse(chosen.stdout) as Json)['termCount']).toBe(15); // Seeley, Richard & Love 2012
  });

  it('never writes over the spec (exit 2), and --fragment goes only with the Hamiltonian exports and xyz', async () => {
    const folder = scratch({ 'h2.tess': specOf('h2-sto3g', 'STO-3G', '2e 2o') });
    const over = await run(['export', 'h2.tess', '--to', 'fcidump', '--out', 'h2.tess'], folder);
    expect(over.code).toBe(2);
    expect(readFileSync(path.join(folder, 'h2.tess'), 'utf8')).toContain('spec "h2-sto3g"');
    const misplaced = await run(['export', 'h2.tess', '--to', 'qcschema', '--fragment', 'site'], folder);
    expect(misplaced.code).toBe(2);
  });
});
