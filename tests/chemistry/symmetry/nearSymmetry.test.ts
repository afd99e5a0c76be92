/**
 * Near symmetry and symmetrize(): distorted copies of idealised test molecules (molecules.ts;
 * the distortions are this test's own construction).
 */
import { describe, expect, it } from 'vitest';
import { detectSymmetry, symmetrize } from '../../../server/src/chemistry/symmetry';
import * as M from './molecules';

function shifted(molecule: M.TestMolecule, atom: number, delta: readonly [number, number, number]): number[] {
  const coordinates = [...molecule.coordinates];
  for (let k = 0; k < 3; k++) coordinates[3 * atom + k]! += delta[k]!;
  return coordinates;
}

function largestMove(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let worst = 0;
  for (let i = 0; i < a.length; i += 3) worst = Math.max(worst, Math.hypot(a[i]! - b[i]!, a[i + 1]! - b[i + 1]!, a[i + 2]! - b[i + 2]!));
  return worst;
}

/** A small deterministic generator for the random distortions (common practice, no source). */
function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state * 1664525 + 1013904223) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
}

/** Water with one H moved 0.02 Å along y, within the molecular plane. */
const inPlaneCopy = () => shifted(M.water, 1, [0, 0.02, 0]);
/** Water with the first O–H bond stretched by 0.02 Å (H moved along the bond). */
function stretchedCopy(): number[] {
  const bond = [0, M.water.coordinates[4]! - M.water.coordinates[1]!, M.water.coordinates[5]! - M.water.coordinates[2]!];
  const length = Math.hypot(...bond);
  return shifted(M.water, 1, [0, (0.02 * bond[1]!) / length, (0.02 * bond[2]!) / length]);
}

describe('near symmetry', () => {
  // One H of water moved 0.02 Å within the molecular plane: still Cs (the plane), no longer C2v.
  const inPlane = inPlaneCopy();
  // One H of water moved 0.02 Å along its bond: still planar (three atoms always are), so Cs.
  const stretched = stretchedCopy();
  // One H of ammonia (the one at (0.94, 0, −0.38)) moved 0.02 Å along y, out of its mirror
  // plane: no symmetry left.
  const skewedAmmonia = shifted(M.ammonia, 1, [0, 0.02, 0]);

  it('water with an H moved 0.02 Å in plane: Cs at 0.01 Å, C2v within about 0.02 Å', () => {
    const result = detectSymmetry(M.water.numbers, inPlane, { tolerance: 0.01 });
    expect(result.fullGroup).toBe('Cs');
    expect(result.nearGroup?.group).toBe('C2v');
    // The best C2v fit splits the 0.02 Å between the two H: between 0.01 and 0.02 Å.
    expect(result.nearGroup!.within).toBeGreaterThan(0.005);
    expect(result.nearGroup!.within).toBeLessThanOrEqual(0.02);
  });

  it('water with an O–H bond stretched by 0.02 Å: Cs at 0.001 Å, C2v near', () => {
    const result = detectSymmetry(M.water.numbers, stretched, { tolerance: 0.001 });
    expect(result.fullGroup).toBe('Cs');
    expect(result.nearGroup?.group).toBe('C2v');
    expect(result.nearGroup!.within).toBeLessThanOrEqual(0.025);
  });

  it('ammonia with an H moved 0.02 Å out of its mirror plane: C1 at 0.01 Å, C3v near', () => {
    const result = detectSymmetry(M.ammonia.numbers, skewedAmmonia, { tolerance: 0.01 });
    expect(result.fullGroup).toBe('C1');
    expect(result.nearGroup?.group).toBe('C3v');
    expect(result.nearGroup!.within).toBeLessThanOrEqual(0.025);
  });

  it('at a tolerance looser than the distortion it is C2v and nothing is near', () => {
    const result = detectSymmetry(M.water.numbers, inPlane, { tolerance: 0.05 });
    expect(result.fullGroup).toBe('C2v');
    expect(result.maxDeviation).toBeLessThanOrEqual(0.05);
    expect(result.nearGroup).toBeUndefined();
  });

  it('no near group for an exact geometry, nor when the search is off', () => {
    expect(detectSymmetry(M.water.numbers, M.water.coordinates).nearGroup).toBeUndefined();
    expect(detectSymmetry(M.water.numbers, inPlane, { nearTolerance: 0 }).nearGroup).toBeUndefined();
  });

  it('a distortion beyond the near tolerance finds nothing near', () => {
    const far = shifted(M.water, 1, [0, 0.3, 0.1]);
    const result = detectSymmetry(M.water.numbers, far);
    expect(result.fullGroup).toBe('Cs');
    expect(result.nearGroup).toBeUndefined();
  });
});


// The equivalent atoms by construction of the test molecules: the three H of ammonia, the two H of
// water (Cotton 1990 for the groups C3v and C2v).
describe('symmetrize', () => {
  it('restores C3v for the skewed ammonia', () => {
    const coordinates = shifted(M.ammonia, 1, [0, 0.02, 0]);
    const result = detectSymmetry(M.ammonia.numbers, coordinates);
    const check = detectSymmetry(M.ammonia.numbers, symmetrize(coordinates, result), { tolerance: 1e-9 });
    expect(check.fullGroup).toBe('C3v');
    expect(check.equivalentSets).toEqual([[0], [1, 2, 3]]);
  });

  it('restores C2v for the distorted water, keeping atom order and moving atoms less than the distortion', () => {
    for (const coordinates of [inPlaneCopy(), stretchedCopy()]) {
      const result = detectSymmetry(M.water.numbers, coordinates, { tolerance: 0.001 });
      const symmetric = symmetrize(coordinates, result);
      const check = detectSymmetry(M.water.numbers, symmetric, { tolerance: 1e-9 });
      expect(check.fullGroup).toBe('C2v');
      expect(check.maxDeviation).toBeLessThan(1e-12);
      expect(largestMove(symmetric, coordinates)).toBeLessThan(0.02);
      // Atom order: every atom stays much closer to its own old place than to any other atom.
      expect(largestMove(symmetric, coordinates)).toBeLessThan(0.1);
      expect(check.equivalentSets).toEqual([[0], [1, 2]]);
    }
  });

  it('leaves an exactly symmetric geometry where it is', () => {
    for (const molecule of [M.water, M.benzene, M.c60, M.carbonDioxide, M.s4Example]) {
      const result = detectSymmetry(molecule.numbers, molecule.coordinates);
      expect(largestMove(symmetrize(molecule.coordinates, result), molecule.coordinates)).toBeLessThan(1e-12);
    }
  });

  it.each([M.benzene, M.methane, M.sulfurHexafluoride, M.c60, M.allene, M.staggeredEthane, M.carbonDioxide, M.s4Example, M.cubicCluster('T'), M.chiralIcosahedral, M.eclipsedFerrocene].map((m) => [m.name, m] as const))(
    '%s with every coordinate jittered by up to 0.005 Å: the near group, then exactly symmetric',
    (_name, molecule) => {
      const next = random(17);
      const jittered = molecule.coordinates.map((value) => value + 0.01 * next());
      const exact = detectSymmetry(molecule.numbers, molecule.coordinates);
      const result = detectSymmetry(molecule.numbers, jittered, { tolerance: 0.001 });
      expect(result.nearGroup?.group).toBe(exact.fullGroup);
      const symmetric = symmetrize(jittered, result);
      const check = detectSymmetry(molecule.numbers, symmetric, { tolerance: 1e-9 });
      expect(check.fullGroup).toBe(exact.fullGroup);
      expect(largestMove(symmetric, jittered)).toBeLessThan(0.02);
    },
  );

  it('keeps the centre of mass', () => {
    const coordinates = shifted(M.water, 1, [0.02, 0.01, 0]);
    const result = detectSymmetry(M.water.numbers, coordinates, { tolerance: 0.001 });
    const symmetric = symmetrize(coordinates, result);
    const again = detectSymmetry(M.water.numbers, symmetric);
    for (let k = 0; k < 3; k++) expect(again.frame.origin[k]).toBeCloseTo(result.frame.origin[k]!, 12);
  });
});
