/**
 * The DMET bath in intrinsic atomic orbitals (server/src/electronic/embedding/iao.ts; Knizia,
 * J. Chem. Theory Comput. 9, 4834 (2013)) against the numpy construction from the paper's formulas
 * on psi4 1.3.2 data in tests/fixtures/dmet-bath.psi4.json (scripts/data/generate_dmet_bath_fixture.py:
 * overlaps with the STO-3G minimal basis from MintsHelper.ao_overlap, psi4's occupied orbitals):
 * closed shells only, singular values to 1e-10 on psi4's data, to 1e-6 from Tessera's own SCF.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { FunctionKind } from '../../../server/src/electronic/contracts';
import { dmetBath, spinDensity } from '../../../server/src/electronic/embedding';
import { minimalBasisOverlaps } from '../../../server/src/electronic/embedding/minimalBasis';
import { computeMeanField, type ScfReference } from '../../../server/src/electronic/scf';

interface IaoFragment {
  name: string;
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
  fragments: { name: string; atoms: number[] }[];
  overlap: number[];
  densityAlpha: number[];
  minimalBasis: string;
  minimalFunctionCenter: number[];
  iao: IaoFragment[] | null;
  minimalOverlap: number[] | null;
  mixedOverlap: number[] | null;
  occupiedAlpha: number[] | null;
}

const FIXTURE = JSON.parse(readFileSync(join(__dirname, '..', '..', 'fixtures', 'dmet-bath.psi4.json'), 'utf8')) as { cases: FixtureCase[] };
const CLOSED = FIXTURE.cases.filter((c) => c.iao !== null);

function maxDifference(ours: Float64Array, theirs: readonly number[]): number {
  expect(ours.length).toBe(theirs.length);
  let worst = 0;
  theirs.forEach((value, k) => (worst = Math.max(worst, Math.abs(ours[k]! - value))));
  return worst;
}

describe('DMET bath in intrinsic atomic orbitals on psi4 data against numpy (tests/fixtures/dmet-bath.psi4.json)', () => {
  for (const entry of CLOSED) {
    for (const [k, fragment] of entry.fragments.entries()) {
      it(`${entry.name} (${entry.basis}), fragment ${fragment.name}`, () => {
        const reference = entry.iao![k]!;
        const density = Float64Array.from(entry.densityAlpha);
        const bath = dmetBath({
          overlap: Float64Array.from(entry.overlap),
          functionCenter: entry.functionCenter,
          density: { alpha: density, beta: density },
          electrons: entry.electrons,
          fragmentAtoms: fragment.atoms,
          threshold: entry.threshold,
          iao: {
            minimalOverlap: Float64Array.from(entry.minimalOverlap!),
            mixedOverlap: Float64Array.from(entry.mixedOverlap!),
            minimalFunctionCenter: entry.minimalFunctionCenter,
            occupied: Float64Array.from(entry.occupiedAlpha!),
            occupiedCount: entry.electrons.alpha,
          },
        });
        expect(bath.orbitals).toBe('iao');
        expect(bath.fragmentOrbitals).toBe(reference.fragmentOrbitals);
        expect(maxDifference(bath.alpha.singularValues, reference.singularValues)).toBeLessThan(1e-10);
        expect(bath.alpha.bathOrbitals).toBe(reference.bathOrbitals);
        expect(Math.abs(bath.alpha.impurityElectrons - reference.impurityElectrons)).toBeLessThan(1e-9);
        // The occupied space lies in the IAOs' span: the density over them is idempotent and holds every electron (Knizia 2013).
        expect(bath.alpha.idempotencyError).toBeLessThan(1e-10);
      });
    }
  }
});

describe('DMET bath in intrinsic atomic orbitals from Tessera\'s own SCF and minimal-basis overlaps', () => {
  for (const entry of CLOSED) {
    it(`${entry.name} (${entry.basis})`, () => {
      const { result, wavefunction, problem } = computeMeanField(
        { atoms: entry.geometry, basis: entry.basis, kind: entry.kind, charge: entry.charge, multiplicity: entry.multiplicity },
        { reference: entry.reference, energyTolerance: 1e-10, gradientTolerance: 1e-8 },
      );
      const n = result.functionCount;
      const M = result.orbitalCount;
      const density = spinDensity(wavefunction.coefficients.alpha, n, M, result.occupations.alpha);
      const minimal = minimalBasisOverlaps(problem.basis, 'STO-3G');
      expect(Array.from(minimal.functionCenter)).toEqual(entry.minimalFunctionCenter);
      const occupied = new Float64Array(n * entry.electrons.alpha);
      for (let i = 0; i < n; i++) for (let p = 0; p < entry.electrons.alpha; p++) occupied[i * entry.electrons.alpha + p] = wavefunction.coefficients.alpha[i * M + p]!;
      for (const [k, fragment] of entry.fragments.entries()) {
        const bath = dmetBath({
          overlap: problem.overlap,
          functionCenter: problem.basis.functionCenter,
          density: { alpha: density, beta: density },
          electrons: result.electrons,
          fragmentAtoms: fragment.atoms,
          iao: { minimalOverlap: minimal.overlap, mixedOverlap: minimal.mixedOverlap, minimalFunctionCenter: minimal.functionCenter, occupied, occupiedCount: entry.electrons.alpha },
        });
        expect(maxDifference(bath.alpha.singularValues, entry.iao![k]!.singularValues), fragment.name).toBeLessThan(1e-6);
        expect(bath.alpha.bathOrbitals).toBe(entry.iao![k]!.bathOrbitals);
      }
    });
  }

  it('refuses open shells with a message that names the way out', () => {
    const entry = FIXTURE.cases.find((c) => c.reference === 'uhf')!;
    const alpha = Float64Array.from(entry.densityAlpha);
    const beta = alpha.map((value) => value * 0.5);
    expect(() =>
      dmetBath({
        overlap: Float64Array.from(entry.overlap),
        functionCenter: entry.functionCenter,
        density: { alpha, beta },
        electrons: entry.electrons,
        fragmentAtoms: [0],
        iao: { minimalOverlap: new Float64Array(0), mixedOverlap: new Float64Array(0), minimalFunctionCenter: [], occupied: new Float64Array(0), occupiedCount: 0 },
      }),
    ).toThrow(/closed-shell.*Löwdin/);
  });
});
