/**
 * Tessera's integrals and SCF end to end against Debian's psi4 1.3.2
 * (tests/fixtures/scf-reference.psi4.json, made by scripts/data/generate_scf_reference_fixture.py:
 * scf_type pk, mp2_type conv, convergence 1e-10, invented geometries in our standard orientation):
 * total energies and MP2 correlation energies (RHF: all electrons and frozen core; UHF: all
 * electrons, psi4's occ module) to 1e-6 hartree,
 * orbital energies to 1e-5, occupied orbitals per irrep exactly.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { FunctionKind } from '../../server/src/electronic/contracts';
import { mp2, unrestrictedMp2 } from '../../server/src/electronic/correlation';
import { computeMeanField, type ScfReference } from '../../server/src/electronic/scf';

export interface ReferenceCase {
  name: string;
  basis: string;
  reference: ScfReference;
  charge: number;
  multiplicity: number;
  kind: FunctionKind;
  geometry: { symbol: string; x: number; y: number; z: number }[];
  energy: number;
  nuclearRepulsion: number;
  pointGroup: string;
  irrepLabels: string[];
  docc: number[];
  socc: number[];
  nbf: number;
  alpha: { energies: number[]; irreps: string[] };
  beta: { energies: number[]; irreps: string[] };
  mp2?: number;
  mp2FrozenCore?: number;
}

export const REFERENCE_CASES = (JSON.parse(readFileSync(join(__dirname, '..', 'fixtures', 'scf-reference.psi4.json'), 'utf8')) as { cases: ReferenceCase[] }).cases;

/** psi4 spells A′ and A″ as Ap and App. */
export function psi4Label(label: string): string {
  return label === 'Ap' ? "A'" : label === 'App' ? 'A"' : label;
}

const equal = (a: number[], b: number[]) => a.length === b.length && a.every((value, k) => value === b[k]);

/** The irrep holding the other π component (B1 ↔ B2 in C2v; B2g ↔ B3g, B2u ↔ B3u in D2h). */
function piPartner(labels: string[], h: number): number {
  const partner: Record<string, string> = { B1: 'B2', B2: 'B1', B2g: 'B3g', B3g: 'B2g', B2u: 'B3u', B3u: 'B2u' };
  const other = partner[labels[h]!];
  return other ? labels.indexOf(other) : h;
}

describe('SCF with Tessera integrals against psi4 1.3.2', () => {
  for (const entry of REFERENCE_CASES) {
    it(`${entry.name}, ${entry.basis} (${entry.kind}), ${entry.reference.toUpperCase()}`, () => {
      const { result, wavefunction, problem } = computeMeanField(
        { atoms: entry.geometry, basis: entry.basis, kind: entry.kind, charge: entry.charge, multiplicity: entry.multiplicity },
        { reference: entry.reference, energyTolerance: 1e-10, gradientTolerance: 1e-7 },
      );
      expect(result.converged).toBe(true);
      expect(result.functionCount).toBe(entry.nbf);
      expect(result.nuclearRepulsion).toBeCloseTo(entry.nuclearRepulsion, 9);
      expect(Math.abs(result.energy - entry.energy)).toBeLessThan(1e-6);
      result.orbitalEnergies.alpha.forEach((value, k) => expect(Math.abs(value - entry.alpha.energies[k]!), `α orbital ${k}`).toBeLessThan(1e-5));
      result.orbitalEnergies.beta.forEach((value, k) => expect(Math.abs(value - entry.beta.energies[k]!), `β orbital ${k}`).toBeLessThan(1e-5));
      // Occupied orbitals per irrep (psi4's docc and socc), in psi4's point group and axes.
      expect(result.pointGroup.toLowerCase()).toBe(entry.pointGroup);
      const labels = entry.irrepLabels.map(psi4Label);
      const count = (spin: 'alpha' | 'beta') => labels.map((label) => result.irreps[spin].filter((irrep, k) => irrep === label && result.occupations[spin][k] === 1).length);
      const alpha = count('alpha');
      const beta = count('beta');
      const socc = alpha.map((value, h) => value - beta[h]!);
      // In a linear molecule the two components of a π level are B1/B2 (C2v) or B2/B3 (D2h) and
      // equivalent: a half-filled π level may sit in either, in psi4 as here.
      const linear = entry.geometry.every((atom) => Math.abs(atom.x) < 1e-9 && Math.abs(atom.y) < 1e-9) && entry.geometry.length > 1;
      const swap = (counts: number[]) => counts.map((_, h) => counts[piPartner(labels, h)]!);
      if (linear && !equal(beta, entry.docc)) expect(swap(beta)).toEqual(entry.docc);
      else expect(beta).toEqual(entry.docc);
      if (linear && !equal(socc, entry.socc)) expect(swap(socc)).toEqual(entry.socc);
      else expect(socc).toEqual(entry.socc);
      if (entry.reference === 'rhf' && entry.mp2 !== undefined) {
        expect(Math.abs(mp2(wavefunction, problem.eri).result.correlationEnergy - entry.mp2)).toBeLessThan(1e-6);
        expect(Math.abs(mp2(wavefunction, problem.eri, { frozenCore: true }).result.correlationEnergy - entry.mp2FrozenCore!)).toBeLessThan(1e-6);
      }
      if (entry.reference === 'uhf' && entry.mp2 !== undefined) {
        expect(Math.abs(unrestrictedMp2(wavefunction, problem.eri).correlationEnergy - entry.mp2)).toBeLessThan(1e-6);
      }
    });
  }
});
