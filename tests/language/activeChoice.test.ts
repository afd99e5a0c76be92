/**
 * The active-space suggestions of the spec language: `active shells <atoms> <shell>…` and
 * `active natural [<low> to <high>]` — reading, the counts they are planned with before any orbital
 * is computed, and their checks. Water at Hoy & Bunker's structure (tests/fixtures/water.ts).
 */
import { describe, expect, it } from 'vitest';
import { aufbauOccupation, minimalValence, valenceShell } from '../../server/src/chemistry/atomicShells';
import { WATER_ROWS } from '../fixtures/water';
import { analyzeMarked, expectDiagnostic, expectDiagnostics } from './fixture';

const WATER = WATER_ROWS.map(([element, label, x, y, z]) => `  ${element} ${label} ${x.toFixed(6)} ${y.toFixed(6)} ${z.toFixed(6)}`).join('\n');
const spec = (tier: string, extra = '') => `basis cc-pvdz\nstructure {\n${WATER}\n}\nfragment w { atoms rest; tier quantum { ${tier} } }\n${extra}`;

describe('atomic shells for planning (the Madelung rule, from memory: textbook aufbau)', () => {
  it('fills subshells in Madelung order: O 2p holds 4, Fe 3d 6 and 4s 2, Zn 3d 10', () => {
    expect(aufbauOccupation(8, 2, 1)).toBe(4);
    expect(aufbauOccupation(26, 3, 2)).toBe(6);
    expect(aufbauOccupation(26, 4, 0)).toBe(2);
    expect(aufbauOccupation(30, 3, 2)).toBe(10);
    expect(aufbauOccupation(1, 2, 1)).toBe(0);
  });

  it('names the valence shell of an l as a minimal basis does (by definition: STO-3G has O 2p, Fe 3d and 4p, no H p)', () => {
    expect(valenceShell(8, 1)).toBe(2);
    expect(valenceShell(26, 2)).toBe(3);
    expect(valenceShell(26, 1)).toBe(4);
    expect(valenceShell(1, 1)).toBeUndefined();
  });

  it('counts the minimal valence space: O 6e 4o, H 1e 1o (by definition of the minimal basis)', () => {
    expect(minimalValence(8)).toEqual({ electrons: 6, orbitals: 4 });
    expect(minimalValence(1)).toEqual({ electrons: 1, orbitals: 1 });
  });
});

describe('active shells', () => {
  it('reads atoms and their shells and plans with the free atoms\' shells: O 2p is 4e 3o (Madelung rule, by construction)', () => {
    const analysis = analyzeMarked(spec('active shells o 2p'));
    expect(analysis.diagnostics).toEqual([]);
    const tier = analysis.model.fragments[0]!.tier!;
    expect(tier.activeChoice).toMatchObject({ kind: 'shells', shells: [{ atom: 0, n: 2, l: 1 }] });
    expect(tier.active).toEqual({ electrons: 4, orbitals: 3 });
    expect(tier.activeSource).toBe('estimated');
  });

  it('takes several groups and `all <Element>`: O 2s 2p plus both H 1s is 8e 6o (by construction)', () => {
    const analysis = analyzeMarked(spec('active shells o 2s p all H 1s'));
    expect(analysis.diagnostics).toEqual([]);
    const tier = analysis.model.fragments[0]!.tier!;
    expect(tier.activeChoice?.kind === 'shells' && tier.activeChoice.shells.map((s) => [s.atom, s.n, s.l])).toEqual([[0, 2, 0], [0, null, 1], [1, 1, 0], [2, 1, 0]]);
    expect(tier.active).toEqual({ electrons: 8, orbitals: 6 });
  });

  it('fits the planned counts to the qubit limit (two qubits per orbital, by construction)', () => {
    const analysis = analyzeMarked(spec('active shells o 2s 2p all H 1s', 'limits { qubits 8 }'));
    expect(analysis.model.fragments[0]!.tier!.active!.orbitals).toBe(4);
    expect(analysis.diagnostics.filter((d) => d.code === 'qubit-limit-exceeded')).toEqual([]);
  });

  it('reports a shell the atom does not have, naming those it has (by definition of a minimal basis: O has 1s 2s 2p)', () => {
    const { diagnostic } = expectDiagnostic(spec('active shells o ⟦3d⟧'), 'active-space-invalid');
    expect(diagnostic.message).toBe('O has no 3d shell in a minimal basis; it has 1s 2s 2p.');
  });

  it('reports atoms outside the fragment', () => {
    const text = `basis cc-pvdz\nstructure {\n${WATER}\n}\nfragment a { atoms o; charge -1; tier quantum { active shells ⟦h1 1s⟧ } }\nfragment b { atoms h1 h2; charge 1; tier mean-field { } }\n`;
    const { diagnostic } = expectDiagnostic(text, 'active-space-invalid');
    expect(diagnostic.message).toContain("is not in fragment 'a'");
  });

  it('asks for the shells when only atoms are named, and for atoms before shells', () => {
    expectDiagnostics(spec('active shells ⟦o⟧'), ['missing-value']);
    expectDiagnostics(spec('active shells ⟦2p⟧'), ['invalid-value']);
  });
});

describe('active natural', () => {
  it('takes the default window 0.02 to 1.98 (common practice) and plans with the minimal valence space: water 8e 6o', () => {
    const analysis = analyzeMarked(spec('active natural'));
    expect(analysis.diagnostics).toEqual([]);
    const tier = analysis.model.fragments[0]!.tier!;
    expect(tier.activeChoice).toEqual({ kind: 'natural', window: { low: 0.02, high: 1.98 } });
    expect(tier.active).toEqual({ electrons: 8, orbitals: 6 });
  });

  it('reads a window and refuses one outside 0 to 2 (by definition of occupation numbers)', () => {
    expect(analyzeMarked(spec('active natural 0.05 to 1.95')).model.fragments[0]!.tier!.activeChoice).toEqual({ kind: 'natural', window: { low: 0.05, high: 1.95 } });
    expectDiagnostics(spec('active natural ⟦1.5 to 2.5⟧'), ['invalid-value']);
  });

  it('refuses an open-shell fragment: MP2 natural orbitals come from RHF here', () => {
    const text = `basis cc-pvdz\nstructure {\n${WATER}\n}\nfragment w { atoms rest; charge 1; multiplicity 2; tier quantum { ⟦active natural⟧ } }\ncharge 1\nmultiplicity 2\n`;
    const { diagnostic } = expectDiagnostic(text, 'active-space-invalid');
    expect(diagnostic.message).toContain('multiplicity 2');
  });
});
