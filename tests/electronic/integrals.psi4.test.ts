/**
 * Integrals against psi4 1.3.2 (Debian package psi4), through tests/fixtures/integrals.psi4.json
 * made by scripts/data/generate_integrals_fixture.py (MintsHelper ao_overlap, ao_kinetic,
 * ao_potential, ao_eri_shell; origin recorded in the file). psi4's function order and cartesian
 * normalisation are mapped onto ours by tests/electronic/psi4Mapping.ts, which documents the mapping.
 * Tolerance 1e-10 (absolute, on integrals of unit-normalised functions).
 */
import { describe, expect, it } from 'vitest';
import fixture from '../fixtures/integrals.psi4.json';
import { buildMolecularBasis } from '../../server/src/electronic/basis';
import type { FunctionKind, MolecularBasis } from '../../server/src/electronic/contracts';
import { createTwoElectronIntegrals, nuclearRepulsionEnergy, oneElectronBlock } from '../../server/src/electronic/integrals';
import { mapBlock } from './psi4Mapping';

interface FixtureShell {
  center: number;
  l: number;
  offset: number;
  size: number;
  exponents: number[];
  coefficients: number[];
}
interface FixtureCase {
  name: string;
  basis: string;
  functions: FunctionKind;
  atoms: { symbol: string; x: number; y: number; z: number }[];
  nbf: number;
  nuclearRepulsion: number;
  shells: FixtureShell[];
  oneElectron: { shells: [number, number]; overlap: number[]; kinetic: number[]; potential: number[] }[];
  twoElectron: { shells: [number, number, number, number]; values: number[] }[];
}

const cases = (fixture as unknown as { cases: FixtureCase[] }).cases;
const TOLERANCE = 1e-10;

function maxDifference(ours: Float64Array, theirs: Float64Array): number {
  let worst = 0;
  for (let k = 0; k < ours.length; k++) worst = Math.max(worst, Math.abs(ours[k]! - theirs[k]!));
  return worst;
}

const bases = new Map<string, MolecularBasis>();
function basisOf(c: FixtureCase): MolecularBasis {
  let basis = bases.get(c.name);
  if (!basis) {
    basis = buildMolecularBasis(c.atoms, c.basis, c.functions);
    bases.set(c.name, basis);
  }
  return basis;
}

describe('integrals against psi4 1.3.2', () => {
  it('covers spherical and cartesian shells up to g, a third-row and a transition-metal atom', () => {
    const lmax = Math.max(...cases.flatMap((c) => c.shells.map((s) => s.l)));
    expect(lmax).toBeGreaterThanOrEqual(4);
    expect(cases.some((c) => c.functions === 'cartesian' && c.shells.some((s) => s.l === 4))).toBe(true);
    expect(cases.some((c) => c.atoms.some((a) => a.symbol === 'Cu'))).toBe(true);
    expect(cases.some((c) => c.twoElectron.some((q) => q.shells.every((s) => c.shells[s]!.l === 4)))).toBe(true);
  });

  describe.each(cases.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    it('builds the same shells in the same order, with the same normalised coefficients', () => {
      const basis = basisOf(c);
      expect(basis.functionCount).toBe(c.nbf);
      expect(basis.shells.length).toBe(c.shells.length);
      c.shells.forEach((theirs, k) => {
        const ours = basis.shells[k]!;
        expect([ours.center, ours.l, ours.offset, ours.size]).toEqual([theirs.center, theirs.l, theirs.offset, theirs.size]);
        expect(Array.from(ours.exponents)).toEqual(theirs.exponents);
        theirs.coefficients.forEach((value, i) => expect(ours.coefficients[i]).toBeCloseTo(value, 12));
      });
    });

    it('has the same nuclear repulsion energy', () => {
      expect(nuclearRepulsionEnergy(basisOf(c))).toBeCloseTo(c.nuclearRepulsion, 10);
    });

    it.each(['overlap', 'kinetic', 'potential'] as const)('%s blocks agree to 1e-10', (kind) => {
      const basis = basisOf(c);
      for (const block of c.oneElectron) {
        const [p, q] = block.shells;
        const ours = new Float64Array(basis.shells[p]!.size * basis.shells[q]!.size);
        oneElectronBlock(kind, basis, p, q, ours);
        const theirs = mapBlock(block[kind], [basis.shells[p]!.l, basis.shells[q]!.l], c.functions === 'spherical');
        expect(maxDifference(ours, theirs), `${kind} (${p}|${q})`).toBeLessThan(TOLERANCE);
      }
    });

    it('electron-repulsion blocks agree to 1e-10', () => {
      const basis = basisOf(c);
      const eri = createTwoElectronIntegrals(basis);
      for (const quartet of c.twoElectron) {
        const [p, q, r, s] = quartet.shells;
        const size = [p, q, r, s].map((k) => basis.shells[k]!.size);
        const ours = new Float64Array(size[0]! * size[1]! * size[2]! * size[3]!);
        eri.shellQuartet(p, q, r, s, ours);
        const theirs = mapBlock(quartet.values, [p, q, r, s].map((k) => basis.shells[k]!.l), c.functions === 'spherical');
        expect(maxDifference(ours, theirs), `(${p} ${q}|${r} ${s})`).toBeLessThan(TOLERANCE);
      }
    });
  });
});
