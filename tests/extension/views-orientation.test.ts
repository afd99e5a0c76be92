/**
 * The structure view's initial orientation (client/src/views/orientation.ts): it faces the
 * molecule's largest plane, i.e. the camera looks along the principal axis of smallest second
 * moment of the atom positions (the normal of the least-squares plane, Pearson 1901), and with a
 * scan the scanned distance lies across the screen.
 */
import { describe, expect, it } from 'vitest';
import { apply, facingLargestPlane, symmetricEigen3, viewRotation, type Matrix, type Vector } from '../../client/src/views/orientation';

/**
 * Benzene, D6h: r(C–C) 1.397 Å, r(C–H) 1.084 Å (gas-phase structure, from memory of the
 * electron-diffraction/spectroscopic value quoted in handbooks), in the xy plane about the origin.
 */
function benzene(): Vector[] {
  const atoms: Vector[] = [];
  for (let k = 0; k < 6; k++) {
    const angle = (k * Math.PI) / 3;
    atoms.push({ x: 1.397 * Math.cos(angle), y: 1.397 * Math.sin(angle), z: 0 });
    atoms.push({ x: (1.397 + 1.084) * Math.cos(angle), y: (1.397 + 1.084) * Math.sin(angle), z: 0 });
  }
  return atoms;
}

/** A proper rotation from Euler angles (z, y, z), to tilt test molecules into general position. */
function euler(alpha: number, beta: number, gamma: number): Matrix {
  const rz = (t: number): Matrix => [Math.cos(t), -Math.sin(t), 0, Math.sin(t), Math.cos(t), 0, 0, 0, 1];
  const ry = (t: number): Matrix => [Math.cos(t), 0, Math.sin(t), 0, 1, 0, -Math.sin(t), 0, Math.cos(t)];
  const m = (a: Matrix, b: Matrix): Matrix => {
    const c: number[] = [];
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) c.push(a[3 * i]! * b[j]! + a[3 * i + 1]! * b[3 + j]! + a[3 * i + 2]! * b[6 + j]!);
    return c as Matrix;
  };
  return m(rz(alpha), m(ry(beta), rz(gamma)));
}

function spread(points: readonly Vector[], axis: 'x' | 'y' | 'z'): number {
  const values = points.map((p) => p[axis]);
  return Math.max(...values) - Math.min(...values);
}

function determinant(m: Matrix): number {
  return m[0] * (m[4] * m[8] - m[5] * m[7]) - m[1] * (m[3] * m[8] - m[5] * m[6]) + m[2] * (m[3] * m[7] - m[4] * m[6]);
}

function expectRotation(m: Matrix): void {
  for (let i = 0; i < 3; i++)
    for (let j = 0; j < 3; j++) {
      const dot = m[3 * i]! * m[3 * j]! + m[3 * i + 1]! * m[3 * j + 1]! + m[3 * i + 2]! * m[3 * j + 2]!;
      expect(dot).toBeCloseTo(i === j ? 1 : 0, 12);
    }
  expect(determinant(m)).toBeCloseTo(1, 12);
}

describe('the structure view faces the largest plane', () => {
  const tilts: [number, number, number][] = [
    [0, 0, 0],
    [0.3, 1.1, -0.7],
    [2.0, Math.PI / 2, 0.4], // the ring stands edge-on to the default camera
    [-1.2, 2.9, 1.7],
  ];
  for (const [alpha, beta, gamma] of tilts) {
    it(`puts benzene in the view plane, however it is tilted (${alpha}, ${beta}, ${gamma})`, () => {
      const tilt = euler(alpha, beta, gamma);
      const atoms = benzene().map((p) => apply(tilt, { x: p.x + 0.5, y: p.y - 2, z: p.z + 3 }));
      const rotation = facingLargestPlane(atoms);
      expectRotation(rotation);
      const seen = atoms.map((p) => apply(rotation, p));
      // Every atom at the same depth: the ring lies in the screen.
      expect(spread(seen, 'z')).toBeLessThan(1e-9);
      // In the screen the ring keeps its full size: each atom's distance from the centre, measured
      // across and up only, is its radius, 1.397 Å (C) or 1.397 + 1.084 = 2.481 Å (H). (The ring's
      // in-plane second moment is isotropic, so which way it turns in the screen is arbitrary.)
      const centre = { x: seen.reduce((s, p) => s + p.x, 0) / 12, y: seen.reduce((s, p) => s + p.y, 0) / 12 };
      seen.forEach((p, i) => expect(Math.hypot(p.x - centre.x, p.y - centre.y)).toBeCloseTo(i % 2 === 0 ? 1.397 : 2.481, 9));
    });
  }

  it('a long molecule lies across the screen: largest spread in x, then y, least in depth', () => {
    // An all-trans zigzag chain of 8 carbons (C–C 1.54 Å, C–C–C 112°: common practice for alkanes)
    // with a slight out-of-plane pucker, tilted into general position.
    const chain: Vector[] = [];
    const half = (112 / 2) * (Math.PI / 180);
    for (let k = 0; k < 8; k++) chain.push({ x: k * 1.54 * Math.sin(half), y: (k % 2) * 1.54 * Math.cos(half), z: 0.05 * Math.sin(k) });
    const tilt = euler(0.9, 0.6, -2.2);
    const seen = chain.map((p) => apply(tilt, p)).map((p, _, all) => apply(facingLargestPlane(all), p));
    expect(spread(seen, 'x')).toBeGreaterThan(spread(seen, 'y'));
    expect(spread(seen, 'y')).toBeGreaterThan(spread(seen, 'z'));
    expect(spread(seen, 'x')).toBeCloseTo(7 * 1.54 * Math.sin(half), 1);
  });

  it('keeps a scan across the screen when there is one', () => {
    const atoms = benzene().map((p) => apply(euler(0.3, 1.1, -0.7), p));
    const rotation = viewRotation(atoms, { first: 0, second: 6 });
    expectRotation(rotation);
    const a = apply(rotation, atoms[0]!);
    const b = apply(rotation, atoms[6]!);
    expect(b.x - a.x).toBeCloseTo(2 * 1.397, 9); // para carbons, across the ring
    expect(b.y - a.y).toBeCloseTo(0, 9);
    expect(b.z - a.z).toBeCloseTo(0, 9);
    // The ring contains the scan, so turning the spread onto the screen's height lays it flat too.
    expect(spread(atoms.map((p) => apply(rotation, p)), 'z')).toBeLessThan(1e-9);
  });

  it('leaves one atom alone and copes with a line of atoms', () => {
    expect(facingLargestPlane([{ x: 1, y: 2, z: 3 }])).toEqual([1, 0, 0, 0, 1, 0, 0, 0, 1]);
    const line = [0, 1.1, 2.2].map((t) => ({ x: 0.6 * t, y: 0, z: 0.8 * t }));
    const rotation = facingLargestPlane(line);
    expectRotation(rotation);
    const seen = line.map((p) => apply(rotation, p));
    expect(spread(seen, 'x')).toBeCloseTo(2.2, 12);
    expect(spread(seen, 'y')).toBeLessThan(1e-12);
    expect(spread(seen, 'z')).toBeLessThan(1e-12);
  });
});

describe('the symmetric 3 × 3 eigensolver', () => {
  it('satisfies A v = λ v with orthonormal vectors, against the characteristic polynomial', () => {
    // A matrix with known eigenvalues 1, 2, 4 (diag(1, 2, 4) turned by a rotation).
    const r = euler(0.4, 1.3, -0.8);
    const d = [1, 2, 4];
    const a = [0, 1, 2].flatMap((i) => [0, 1, 2].map((j) => [0, 1, 2].reduce((sum, k) => sum + r[3 * i + k]! * d[k]! * r[3 * j + k]!, 0))) as Matrix;
    const { values, vectors } = symmetricEigen3(a);
    expect([...values].sort((x, y) => x - y).map((v) => Number(v.toFixed(12)))).toEqual([1, 2, 4]);
    values.forEach((lambda, k) => {
      const v = vectors[k]!;
      const av = apply(a, v);
      expect(Math.hypot(av.x - lambda * v.x, av.y - lambda * v.y, av.z - lambda * v.z)).toBeLessThan(1e-12);
      expect(Math.hypot(v.x, v.y, v.z)).toBeCloseTo(1, 12);
    });
  });
});
