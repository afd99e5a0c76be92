/**
 * Point groups of textbook molecules built in molecules.ts (idealised, invented geometries). The
 * expected full groups are the textbook assignments (F. A. Cotton, Chemical Applications of Group
 * Theory, 3rd ed., Wiley 1990, ch. 3, for water, ammonia, methane, benzene, ethylene, allene,
 * ethane, SF6, CO2, HCN, H2O2, XeF4, ferrocene; the B12H12(2−) and C60 Ih and the constructed
 * clusters follow from their construction — from memory). The abelian subgroups follow the rule
 * documented in server/src/chemistry/symmetry/abelian.ts.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { detectSymmetry, type SymmetryResult } from '../../../server/src/chemistry/symmetry';
import * as M from './molecules';

interface Expectation {
  readonly molecule: M.TestMolecule;
  readonly full: string;
  readonly order: number | null;
  readonly abelian: string;
  /** Sizes of the sets of equivalent atoms, sorted. */
  readonly orbits: readonly number[];
  /** Where the full group comes from: Cotton's chapter 3 examples, or the construction in molecules.ts. */
  readonly source: string;
}

/*
 * Orders h are the numbers of operations in the character tables of Cotton 1990, Appendix IIA (null
 * for the infinite linear groups); the sets of equivalent atoms follow by construction from each
 * builder in molecules.ts.
 */

const CASES: readonly Expectation[] = [
  { molecule: M.water, full: 'C2v', order: 4, abelian: 'C2v', orbits: [1, 2], source: 'Cotton 1990, ch. 3' },
  { molecule: M.ammonia, full: 'C3v', order: 6, abelian: 'Cs', orbits: [1, 3], source: 'Cotton 1990, ch. 3' },
  { molecule: M.methane, full: 'Td', order: 24, abelian: 'D2', orbits: [1, 4], source: 'Cotton 1990, ch. 3' },
  { molecule: M.benzene, full: 'D6h', order: 24, abelian: 'D2h', orbits: [6, 6], source: 'Cotton 1990, ch. 3' },
  { molecule: M.ethylene, full: 'D2h', order: 8, abelian: 'D2h', orbits: [2, 4], source: 'Cotton 1990, ch. 3' },
  { molecule: M.allene, full: 'D2d', order: 8, abelian: 'D2', orbits: [1, 2, 4], source: 'Cotton 1990, ch. 3' },
  { molecule: M.staggeredEthane, full: 'D3d', order: 12, abelian: 'C2h', orbits: [2, 6], source: 'Cotton 1990, ch. 3' },
  { molecule: M.eclipsedEthane, full: 'D3h', order: 12, abelian: 'C2v', orbits: [2, 6], source: 'Cotton 1990, ch. 3' },
  { molecule: M.sulfurHexafluoride, full: 'Oh', order: 48, abelian: 'D2h', orbits: [1, 6], source: 'Cotton 1990, ch. 3' },
  { molecule: M.c60, full: 'Ih', order: 120, abelian: 'D2h', orbits: [60], source: 'by construction (truncated icosahedron), from memory' },
  { molecule: M.dodecaborate, full: 'Ih', order: 120, abelian: 'D2h', orbits: [12, 12], source: 'by construction (icosahedron and its radial H), from memory' },
  { molecule: M.carbonDioxide, full: 'D∞h', order: null, abelian: 'D2h', orbits: [1, 2], source: 'Cotton 1990, ch. 3' },
  { molecule: M.hydrogenCyanide, full: 'C∞v', order: null, abelian: 'C2v', orbits: [1, 1, 1], source: 'Cotton 1990, ch. 3' },
  { molecule: M.hydrogenPeroxide, full: 'C2', order: 2, abelian: 'C2', orbits: [2, 2], source: 'Cotton 1990, ch. 3' },
  { molecule: M.transPeroxide, full: 'C2h', order: 4, abelian: 'C2h', orbits: [2, 2], source: 'by construction (planar trans: C2 ⊥ the plane, σh, i)' },
  { molecule: M.bromochlorofluoromethane, full: 'C1', order: 1, abelian: 'C1', orbits: [1, 1, 1, 1, 1], source: 'by construction (four different substituents: no element but E)' },
  { molecule: M.hypochlorousAcid, full: 'Cs', order: 2, abelian: 'Cs', orbits: [1, 1, 1], source: 'by construction (planar, three different atoms: the plane only)' },
  { molecule: M.chlorofluoromethane, full: 'Cs', order: 2, abelian: 'Cs', orbits: [1, 1, 1, 2], source: 'by construction (the F–C–Cl plane is the only mirror)' },
  { molecule: M.s4Example, full: 'S4', order: 4, abelian: 'C2', orbits: [1, 4, 4], source: 'by construction (see molecules.ts)' },
  { molecule: M.s6Example, full: 'S6', order: 6, abelian: 'Ci', orbits: [1, 6, 6], source: 'by construction (see molecules.ts)' },
  { molecule: M.xenonTetrafluoride, full: 'D4h', order: 16, abelian: 'D2h', orbits: [1, 4], source: 'Cotton 1990, ch. 3' },
  { molecule: M.sulfurChloridePentafluoride, full: 'C4v', order: 8, abelian: 'C2v', orbits: [1, 1, 1, 4], source: 'by construction (square pyramid of F with F and Cl on the axis)' },
  { molecule: M.boricAcid, full: 'C3h', order: 6, abelian: 'Cs', orbits: [1, 3, 3], source: 'by construction (planar, the OH groups turned one way)' },
  { molecule: M.eclipsedFerrocene, full: 'D5h', order: 20, abelian: 'C2v', orbits: [1, 10, 10], source: 'Cotton 1990, ch. 3' },
  { molecule: M.staggeredFerrocene, full: 'D5d', order: 20, abelian: 'C2h', orbits: [1, 10, 10], source: 'Cotton 1990, ch. 3' },
  { molecule: M.cubicCluster('T'), full: 'T', order: 12, abelian: 'D2', orbits: [1, 12], source: 'by construction (see molecules.ts)' },
  { molecule: M.cubicCluster('Td'), full: 'Td', order: 24, abelian: 'D2', orbits: [1, 24], source: 'by construction (see molecules.ts)' },
  { molecule: M.cubicCluster('Th'), full: 'Th', order: 24, abelian: 'D2h', orbits: [1, 24], source: 'by construction (see molecules.ts)' },
  { molecule: M.cubicCluster('O'), full: 'O', order: 24, abelian: 'D2', orbits: [1, 24], source: 'by construction (see molecules.ts)' },
  { molecule: M.cubicCluster('Oh'), full: 'Oh', order: 48, abelian: 'D2h', orbits: [1, 48], source: 'by construction (see molecules.ts)' },
  { molecule: M.chiralIcosahedral, full: 'I', order: 60, abelian: 'D2', orbits: [1, 60], source: 'by construction (see molecules.ts)' },
];

function detect(molecule: M.TestMolecule, tolerance?: number): SymmetryResult {
  return detectSymmetry(molecule.numbers, molecule.coordinates, tolerance === undefined ? {} : { tolerance });
}

const orbitSizes = (result: SymmetryResult) => result.equivalentSets.map((set) => set.length).sort((a, b) => a - b);

/** Checks the operations independently of the detection code: orthogonal matrices (by definition, rows of norm 1 and mutually orthogonal) whose images land on the partners. */
function checkOperations(molecule: M.TestMolecule, result: SymmetryResult): void {
  const origin = result.frame.origin;
  const count = molecule.numbers.length;
  for (const operation of result.abelianOperations) {
    const m = operation.matrix;
    for (let r = 0; r < 3; r++) {
      for (let c = 0; c < 3; c++) {
        const dotRows = m[r]![0] * m[c]![0] + m[r]![1] * m[c]![1] + m[r]![2] * m[c]![2];
        expect(dotRows).toBeCloseTo(r === c ? 1 : 0, 10); // orthonormal rows, by definition of an orthogonal matrix
      }
    }
    expect([...operation.permutation].sort((a, b) => a - b)).toEqual(Array.from({ length: count }, (_, i) => i));
    for (let i = 0; i < count; i++) {
      const j = operation.permutation[i]!;
      expect(molecule.numbers[j]).toBe(molecule.numbers[i]);
      const p = [0, 1, 2].map((k) => molecule.coordinates[3 * i + k]! - origin[k]!);
      const image = [0, 1, 2].map((k) => origin[k]! + m[k]![0] * p[0]! + m[k]![1] * p[1]! + m[k]![2] * p[2]!);
      const distance = Math.hypot(...[0, 1, 2].map((k) => image[k]! - molecule.coordinates[3 * j + k]!));
      expect(distance).toBeLessThanOrEqual(result.tolerance);
    }
  }
}

describe('point groups of textbook molecules', () => {
  it.each(CASES.map((c) => [`${c.molecule.name}: ${c.full} (${c.source})`, c] as const))('%s', (_name, expectation) => {
    const result = detect(expectation.molecule);
    expect(result.fullGroup).toBe(expectation.full);
    expect(result.order).toBe(expectation.order);
    expect(result.abelianGroup).toBe(expectation.abelian);
    expect(orbitSizes(result)).toEqual(expectation.orbits);
    expect(result.maxDeviation).toBeLessThan(1e-9);
    expect(result.nearGroup).toBeUndefined();
    checkOperations(expectation.molecule, result);
  });

  it.each(CASES.map((c) => [c.molecule.name, c] as const))('%s: the same after a rotation and a shift', (_name, expectation) => {
    const moved = M.moved(expectation.molecule, [0.3, -0.5, 0.8], 0.77, [1.2, -2.0, 0.5]);
    const result = detect(moved);
    expect(result.fullGroup).toBe(expectation.full);
    expect(result.abelianGroup).toBe(expectation.abelian);
    expect(orbitSizes(result)).toEqual(expectation.orbits);
    checkOperations(moved, result);
  });

  it('keeps the group under random rigid motions (property test)', () => {
    const molecules = [M.water, M.ammonia, M.methane, M.allene, M.staggeredEthane, M.s4Example, M.c60];
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: molecules.length - 1 }),
        fc.tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: 0.1, max: 1, noNaN: true })),
        fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
        fc.tuple(fc.double({ min: -20, max: 20, noNaN: true }), fc.double({ min: -20, max: 20, noNaN: true }), fc.double({ min: -20, max: 20, noNaN: true })),
        (index, axis, angle, shift) => {
          const molecule = molecules[index]!;
          const expected = detect(molecule);
          const result = detect(M.moved(molecule, axis, angle, shift));
          expect(result.fullGroup).toBe(expected.fullGroup);
          expect(result.abelianGroup).toBe(expected.abelianGroup);
        },
      ),
      { numRuns: 25, seed: 20240611 },
    );
  });

  it('the equivalent atoms of water, methane and benzene by index (by construction: O, C and the ring atoms first in molecules.ts)', () => {
    expect(detect(M.water).equivalentSets).toEqual([[0], [1, 2]]);
    expect(detect(M.methane).equivalentSets).toEqual([[0], [1, 2, 3, 4]]);
    expect(detect(M.benzene).equivalentSets).toEqual([
      [0, 1, 2, 3, 4, 5],
      [6, 7, 8, 9, 10, 11],
    ]);
  });

  it('builds C60 correctly: every atom has three neighbours at 1.4 Å (checks the test geometry itself, by construction)', () => {
    const { coordinates } = M.c60;
    for (let i = 0; i < 60; i++) {
      let neighbours = 0;
      for (let j = 0; j < 60; j++) {
        const d = Math.hypot(coordinates[3 * i]! - coordinates[3 * j]!, coordinates[3 * i + 1]! - coordinates[3 * j + 1]!, coordinates[3 * i + 2]! - coordinates[3 * j + 2]!);
        if (i !== j && Math.abs(d - 1.4) < 1e-9) neighbours++;
      }
      expect(neighbours).toBe(3);
    }
  });
});

describe('special cases', () => {
  // An atom's group is the full rotation–reflection group Kh, a linear molecule's D∞h or C∞v
  // (Cotton 1990, ch. 3, from memory); the input axes and the atom's position are kept by definition
  // of the frame for an atom.
  it('a single atom is Kh, with D2h in the input axes', () => {
    const result = detectSymmetry([26], [1, 2, 3]);
    expect(result.fullGroup).toBe('Kh');
    expect(result.order).toBeNull();
    expect(result.abelianGroup).toBe('D2h');
    expect(result.frame.axes).toEqual([
      [1, 0, 0],
      [0, 1, 0],
      [0, 0, 1],
    ]);
    expect(result.frame.origin).toEqual([1, 2, 3]);
    expect(result.abelianOperations.every((operation) => operation.permutation[0] === 0)).toBe(true);
  });

  it('no atoms is C1', () => {
    const result = detectSymmetry([], []);
    expect(result.fullGroup).toBe('C1');
    expect(result.equivalentSets).toEqual([]);
  });

  it('homonuclear and heteronuclear diatomics are D∞h and C∞v (Cotton 1990, ch. 3)', () => {
    expect(detectSymmetry([1, 1], [0, 0, 0, 0.3, 0.4, 0.5]).fullGroup).toBe('D∞h');
    expect(detectSymmetry([1, 9], [0, 0, 0, 0.3, 0.4, 0.5]).fullGroup).toBe('C∞v');
  });

  it('a linear molecule has z along its axis (Mulliken 1955)', () => {
    const result = detect(M.carbonDioxide);
    const z = result.frame.axes[2];
    expect(Math.abs(z[0] * 1 + z[1] * 2 + z[2] * 2) / 3).toBeCloseTo(1, 12);
  });

  it('a bent triatomic is not linear', () => {
    expect(detectSymmetry([8, 6, 8], [0, 0, -1.16, 0, 0.05, 0, 0, 0, 1.16]).fullGroup).toBe('C2v');
  });
});

describe('standard orientation', () => {
  const near = (v: readonly number[], w: readonly number[]) => Math.abs(v[0]! * w[0]! + v[1]! * w[1]! + v[2]! * w[2]!);

  it('water (given in the yz plane) keeps the input axes: the plane is yz, x ⊥ it (Mulliken 1955)', () => {
    const axes = detect(M.water).frame.axes;
    [
      [1, 0, 0],
      [0, 1, 0],
      [0, 0, 1],
    ].forEach((expected, k) => expected.forEach((value, c) => expect(axes[k]![c]).toBeCloseTo(value, 12)));
  });

  it('water given in the xz plane is turned so that its plane becomes yz (Mulliken 1955)', () => {
    const turned = M.molecule('water xz', [
      ['O', 0, 0, 0],
      ['H', 0.75695, 0, 0.585882],
      ['H', -0.75695, 0, 0.585882],
    ]);
    const axes = detect(turned).frame.axes;
    expect(near(axes[0], [0, 1, 0])).toBeCloseTo(1, 12);
    expect(near(axes[2], [0, 0, 1])).toBeCloseTo(1, 12);
  });

  it('ethylene (given in the xy plane, C=C along x): z along C=C, x ⊥ the plane (Mulliken 1955)', () => {
    const axes = detect(M.ethylene).frame.axes;
    expect(near(axes[2], [1, 0, 0])).toBeCloseTo(1, 12);
    expect(near(axes[0], [0, 0, 1])).toBeCloseTo(1, 12);
  });

  it('benzene: z ⊥ the ring, x through atoms (Mulliken 1955)', () => {
    const axes = detect(M.benzene).frame.axes;
    expect(near(axes[2], [0, 0, 1])).toBeCloseTo(1, 12);
    expect(near(axes[0], [1, 0, 0])).toBeCloseTo(1, 12);
  });

  it('ammonia → Cs: the mirror is σ(xy), a σv of the molecule holding N and one H (by construction: two atoms lie in it)', () => {
    const result = detect(M.ammonia);
    expect(result.abelianOperations.map((operation) => operation.name)).toEqual(['E', 'σ(xy)']);
    const mirror = result.abelianOperations[1]!;
    expect(mirror.permutation.filter((j, i) => j === i)).toHaveLength(2);
  });

  it('frame axes are orthonormal and right-handed (by definition of a frame)', () => {
    for (const { molecule } of CASES) {
      const [x, y, z] = detect(M.moved(molecule, [1, 2, 3], 1.1, [0, 0, 0])).frame.axes;
      const cross = [x[1] * y[2] - x[2] * y[1], x[2] * y[0] - x[0] * y[2], x[0] * y[1] - x[1] * y[0]];
      expect(near(cross, z)).toBeCloseTo(1, 10);
      expect(cross[0]! * z[0] + cross[1]! * z[1] + cross[2]! * z[2]).toBeGreaterThan(0);
    }
  });

  it('each operation is diagonal in the frame with the signs its name says', () => {
    const signs: Record<string, number[]> = { E: [1, 1, 1], 'C2(z)': [-1, -1, 1], 'C2(y)': [-1, 1, -1], 'C2(x)': [1, -1, -1], i: [-1, -1, -1], 'σ(xy)': [1, 1, -1], 'σ(xz)': [1, -1, 1], 'σ(yz)': [-1, 1, 1] };
    const result = detect(M.moved(M.benzene, [1, 2, 3], 0.4, [0, 0, 0]));
    for (const operation of result.abelianOperations) {
      result.frame.axes.forEach((axis, k) => {
        const image = [0, 1, 2].map((r) => operation.matrix[r]![0] * axis[0] + operation.matrix[r]![1] * axis[1] + operation.matrix[r]![2] * axis[2]);
        for (let c = 0; c < 3; c++) expect(image[c]).toBeCloseTo(signs[operation.name]![k]! * axis[c]!, 12);
      });
    }
  });
});
