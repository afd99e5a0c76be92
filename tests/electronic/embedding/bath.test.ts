/**
 * The DMET bath (server/src/electronic/embedding) against the numpy reference on psi4 densities in
 * tests/fixtures/dmet-bath.psi4.json (scripts/data/generate_dmet_bath_fixture.py: psi4 1.3.2 SCF,
 * scf_type pk, convergence 1e-10; Löwdin-orthogonalised density and numpy's LAPACK SVD of its
 * environment–fragment block). Two ways:
 * - our bath on psi4's own overlap and densities: the algorithm alone, singular values to 1e-10;
 * - our SCF and our bath end to end: singular values to 1e-7 (measured ≤ 5e-8, limited by the two SCFs' convergence,
 *   not by the decomposition), bath counts and impurity electrons exactly.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { bathSize } from '../../../server/src/chemistry/cost/dmet';
import type { FunctionKind } from '../../../server/src/electronic/contracts';
import { dmetBath, spinDensity } from '../../../server/src/electronic/embedding';
import { computeMeanField, type ScfReference } from '../../../server/src/electronic/scf';

interface FixtureSpin {
  fragmentOrbitals: number;
  singularValues: number[];
  bathOrbitals: number;
  impurityElectrons: number;
  idempotencyError: number;
}

interface FixtureCase {
  name: string;
  basis: string;
  reference: ScfReference;
  charge: number;
  multiplicity: number;
  kind: FunctionKind;
  geometry: { symbol: string; x: number; y: number; z: number }[];
  functions: number;
  electrons: { alpha: number; beta: number };
  functionCenter: number[];
  threshold: number;
  fragments: { name: string; atoms: number[]; alpha: FixtureSpin; beta: FixtureSpin; impurityElectrons: number; coreElectrons: number }[];
  overlap: number[];
  densityAlpha: number[];
  densityBeta: number[] | null;
}

const FIXTURE = JSON.parse(readFileSync(join(__dirname, '..', '..', 'fixtures', 'dmet-bath.psi4.json'), 'utf8')) as { cases: FixtureCase[] };

function maxDifference(ours: Float64Array, theirs: readonly number[]): number {
  expect(ours.length).toBe(theirs.length);
  let worst = 0;
  theirs.forEach((value, k) => (worst = Math.max(worst, Math.abs(ours[k]! - value))));
  return worst;
}

describe('DMET bath on psi4 densities against numpy (tests/fixtures/dmet-bath.psi4.json)', () => {
  for (const entry of FIXTURE.cases) {
    const alpha = Float64Array.from(entry.densityAlpha);
    const density = { alpha, beta: entry.densityBeta ? Float64Array.from(entry.densityBeta) : alpha };
    for (const fragment of entry.fragments) {
      it(`${entry.name} (${entry.basis}, ${entry.reference.toUpperCase()}), fragment ${fragment.name}`, () => {
        const bath = dmetBath({ overlap: Float64Array.from(entry.overlap), functionCenter: entry.functionCenter, density, electrons: entry.electrons, fragmentAtoms: fragment.atoms, threshold: entry.threshold });
        expect(bath.fragmentOrbitals).toBe(fragment.alpha.fragmentOrbitals);
        for (const spin of ['alpha', 'beta'] as const) {
          // Singular values, bath orbitals and impurity electrons per spin as the fixture's numpy gives them.
          expect(maxDifference(bath[spin].singularValues, fragment[spin].singularValues), spin).toBeLessThan(1e-10);
          expect(bath[spin].bathOrbitals).toBe(fragment[spin].bathOrbitals);
          expect(Math.abs(bath[spin].impurityElectrons - fragment[spin].impurityElectrons)).toBeLessThan(1e-9);
          expect(bath[spin].idempotencyError).toBeLessThan(1e-12);
        }
        expect(Math.abs(bath.impurityElectrons - fragment.impurityElectrons)).toBeLessThan(1e-9);
        expect(Math.abs(bath.coreElectrons - fragment.coreElectrons)).toBeLessThan(1e-9);
      });
    }
  }
});

describe('DMET bath from Tessera\'s own SCF against the psi4 fixture', () => {
  for (const entry of FIXTURE.cases) {
    it(`${entry.name} (${entry.basis}, ${entry.reference.toUpperCase()})`, () => {
      const { result, wavefunction, problem } = computeMeanField(
        { atoms: entry.geometry, basis: entry.basis, kind: entry.kind, charge: entry.charge, multiplicity: entry.multiplicity },
        { reference: entry.reference, energyTolerance: 1e-10, gradientTolerance: 1e-8 },
      );
      expect(result.converged).toBe(true);
      expect(result.functionCount).toBe(entry.functions);
      const n = result.functionCount;
      const M = result.orbitalCount;
      const alpha = spinDensity(wavefunction.coefficients.alpha, n, M, result.occupations.alpha);
      const beta = entry.reference === 'rhf' ? alpha : spinDensity(wavefunction.coefficients.beta, n, M, result.occupations.beta);
      for (const fragment of entry.fragments) {
        const bath = dmetBath({ overlap: problem.overlap, functionCenter: problem.basis.functionCenter, density: { alpha, beta }, electrons: result.electrons, fragmentAtoms: fragment.atoms });
        for (const spin of ['alpha', 'beta'] as const) {
          expect(maxDifference(bath[spin].singularValues, fragment[spin].singularValues), `${fragment.name} ${spin}`).toBeLessThan(1e-7);
          expect(bath[spin].bathOrbitals).toBe(fragment[spin].bathOrbitals);
        }
        expect(Math.round(bath.impurityElectrons)).toBe(Math.round(fragment.impurityElectrons));
        expect(Math.abs(bath.impurityElectrons - Math.round(bath.impurityElectrons))).toBeLessThan(1e-8);
      }
    });
  }
});

describe('computed bath against the counting rule (chemistry/cost/dmet.ts)', () => {
  // For these fragments no orbital of the fragment is exactly occupied or empty, so the Schmidt
  // decomposition reaches the rule's generic size min(L, M − L, Nσ, M − Nσ) (fixture values).
  for (const entry of FIXTURE.cases) {
    it(`${entry.name}: the fixture's bath counts equal the generic size`, () => {
      for (const fragment of entry.fragments) {
        const L = fragment.alpha.fragmentOrbitals;
        expect(fragment.alpha.bathOrbitals).toBe(bathSize(L, entry.functions, entry.electrons.alpha));
        expect(fragment.beta.bathOrbitals).toBe(bathSize(L, entry.functions, entry.electrons.beta));
        // Impurity electrons = bath + fully occupied fragment orbitals per spin; here 2 × bath for a closed shell.
        if (entry.reference === 'rhf') expect(Math.round(fragment.impurityElectrons)).toBe(2 * fragment.alpha.bathOrbitals);
      }
    });
  }

  it('two H2 molecules 20 Å apart: the fragment is unentangled, bath 0 where the rule counts 2 (by construction)', () => {
    // Far apart, the determinant is a product of the two molecules' determinants: no fragment
    // orbital is partly occupied, so there is no bath (Knizia & Chan 2012: the bath spans only
    // entangled modes); the rule, which assumes a general position, counts min(2, 2, 2, 2) = 2.
    const atoms = [
      { symbol: 'H', x: 0, y: 0, z: 0 },
      { symbol: 'H', x: 0, y: 0, z: 1.4 },
      { symbol: 'H', x: 0, y: 0, z: 37.8 },
      { symbol: 'H', x: 0, y: 0, z: 39.2 },
    ];
    const { result, wavefunction, problem } = computeMeanField({ atoms, basis: 'STO-3G', kind: 'spherical', charge: 0, multiplicity: 1 }, { reference: 'rhf', energyTolerance: 1e-10 });
    const density = spinDensity(wavefunction.coefficients.alpha, 4, result.orbitalCount, result.occupations.alpha);
    const bath = dmetBath({ overlap: problem.overlap, functionCenter: problem.basis.functionCenter, density: { alpha: density, beta: density }, electrons: result.electrons, fragmentAtoms: [0, 1] });
    expect(bath.alpha.bathOrbitals).toBe(0);
    expect(bathSize(2, 4, 2)).toBe(2);
    expect(bath.alpha.occupiedFragmentOrbitals).toBe(1);
    expect(Math.abs(bath.impurityElectrons - 2)).toBeLessThan(1e-8);
    expect(Math.abs(bath.coreElectrons - 2)).toBeLessThan(1e-8);
  });
});

describe('bath threshold', () => {
  it('a threshold above every singular value leaves no bath (by definition)', () => {
    const entry = FIXTURE.cases[0]!;
    const alpha = Float64Array.from(entry.densityAlpha);
    const fragment = entry.fragments[0]!;
    const largest = fragment.alpha.singularValues[0]!;
    const bath = dmetBath({ overlap: Float64Array.from(entry.overlap), functionCenter: entry.functionCenter, density: { alpha, beta: alpha }, electrons: entry.electrons, fragmentAtoms: fragment.atoms, threshold: Math.min(0.49, largest * 1.01) });
    expect(bath.alpha.bathOrbitals).toBe(0);
  });

  it('refuses a threshold outside (0, ½)', () => {
    const entry = FIXTURE.cases[0]!;
    const alpha = Float64Array.from(entry.densityAlpha);
    expect(() => dmetBath({ overlap: Float64Array.from(entry.overlap), functionCenter: entry.functionCenter, density: { alpha, beta: alpha }, electrons: entry.electrons, fragmentAtoms: [0], threshold: 0 })).toThrow(/between 0 and 0.5/);
  });
});
