/**
 * Geometries along angle and dihedral scans, against values computed by hand: the law of cosines
 * for the H···H distance of water, the IUPAC definition of a torsion angle's sign, and rigid motion
 * (bond lengths and the angles the scan does not touch stay as written).
 */
import { describe, expect, it } from 'vitest';
import { angleOf, dihedralOf, distanceOf, scanFrames, ScanMotion } from '../../server/src/chemistry/scan';

const DEGREE = Math.PI / 180;

/** Water with r(O–H) = 0.9572 Å and H–O–H = 104.52° (experimental equilibrium geometry; CRC Handbook of Chemistry and Physics, from memory), O first. */
function water(angle: number, r = 0.9572): Float64Array {
  const half = (angle / 2) * DEGREE;
  return Float64Array.from([0, 0, 0, r * Math.sin(half), 0, r * Math.cos(half), -r * Math.sin(half), 0, r * Math.cos(half)]);
}

/**
 * H2O2 built from internal coordinates (gas phase, from memory: r(O–O) 1.475 Å, r(O–H) 0.950 Å,
 * O–O–H 94.8°, H–O–O–H 111.5°), atoms H1 O1 O2 H2. O1 at the origin, O2 on +z; H1 in the xz
 * plane; H2 turned by the dihedral about z (right-handed, so that the IUPAC dihedral is +φ).
 */
function peroxide(phi = 111.5): Float64Array {
  const rOO = 1.475;
  const rOH = 0.95;
  const theta = 94.8 * DEGREE;
  const h1 = [rOH * Math.sin(theta), 0, rOH * Math.cos(theta)];
  const h2 = [rOH * Math.sin(theta) * Math.cos(phi * DEGREE), rOH * Math.sin(theta) * Math.sin(phi * DEGREE), rOO - rOH * Math.cos(theta)];
  return Float64Array.from([...h1, 0, 0, 0, 0, 0, rOO, ...h2]);
}

describe('measuring internal coordinates', () => {
  it('reads back the angle and dihedral a geometry was built with (by construction)', () => {
    expect(angleOf(water(104.52), 1, 0, 2)).toBeCloseTo(104.52, 10);
    expect(dihedralOf(peroxide(), 0, 1, 2, 3)).toBeCloseTo(111.5, 10);
    expect(angleOf(peroxide(), 0, 1, 2)).toBeCloseTo(94.8, 10);
  });

  it('gives a dihedral the IUPAC sign: +60° when, seen along B→C, A–B turns clockwise by 60° to eclipse C–D (IUPAC, "torsion angle"; G. P. Moss, Pure Appl. Chem. 68, 2193 (1996))', () => {
    // B at the origin, C on +z; A along +x; D turned by +60° about +z (counterclockwise seen from +z,
    // so clockwise for a viewer looking along B→C, i.e. along +z).
    const c = Float64Array.from([1, 0, 0, 0, 0, 0, 0, 0, 1, Math.cos(60 * DEGREE), Math.sin(60 * DEGREE), 1]);
    expect(dihedralOf(c, 0, 1, 2, 3)).toBeCloseTo(60, 12);
    const mirrored = Float64Array.from(c);
    mirrored[10] = -mirrored[10]!;
    expect(dihedralOf(mirrored, 0, 1, 2, 3)).toBeCloseTo(-60, 12);
  });
});

describe('angle scans', () => {
  it('opens water from 104.5° to 120°: the angle hits every step to 1e-10, O–H stays, H···H follows the law of cosines (by construction; r from Hoy & Bunker 1979)', () => {
    const start = water(104.5);
    const values = Array.from({ length: 32 }, (_, k) => 104.5 + 0.5 * k); // 104.5 … 120 in 0.5° steps
    const frames = scanFrames(start, { coordinate: 'angle', atoms: [1, 0, 2] }, [2], values);
    expect(frames).toHaveLength(32);
    for (const frame of frames) {
      expect(Math.abs(angleOf(frame.coordinates, 1, 0, 2) - frame.value)).toBeLessThan(1e-10);
      expect(Math.abs(distanceOf(frame.coordinates, 0, 1) - 0.9572)).toBeLessThan(1e-12);
      expect(Math.abs(distanceOf(frame.coordinates, 0, 2) - 0.9572)).toBeLessThan(1e-12);
      // d(H···H) = 2 r sin(θ/2): the law of cosines with two equal sides.
      expect(Math.abs(distanceOf(frame.coordinates, 1, 2) - 2 * 0.9572 * Math.sin((frame.value / 2) * DEGREE))).toBeLessThan(1e-12);
      // The atoms that stay, stay.
      expect(Array.from(frame.coordinates.subarray(0, 6))).toEqual(Array.from(start.subarray(0, 6)));
    }
    // At 120°, H···H = √3 r (hand-computed).
    expect(distanceOf(frames[31]!.coordinates, 1, 2)).toBeCloseTo(Math.sqrt(3) * 0.9572, 12);
  });

  it('keeps the moving group rigid and in the plane of the three atoms (by construction)', () => {
    // Methanol-like: C at the origin, O along +x, H on O; the angle C–O–H turns the H with a ghost atom bonded to it.
    const c = Float64Array.from([0, 0, 0, 1.43, 0, 0, 1.43 + 0.96 * Math.cos(71 * DEGREE), 0.96 * Math.sin(71 * DEGREE), 0, 2.0, 1.5, 0.3]);
    const frames = scanFrames(c, { coordinate: 'angle', atoms: [0, 1, 2] }, [2, 3], [90, 120, 150, 179.5]);
    for (const frame of frames) {
      expect(angleOf(frame.coordinates, 0, 1, 2)).toBeCloseTo(frame.value, 10);
      expect(distanceOf(frame.coordinates, 2, 3)).toBeCloseTo(distanceOf(c, 2, 3), 12);
      expect(distanceOf(frame.coordinates, 1, 3)).toBeCloseTo(distanceOf(c, 1, 3), 12);
      expect(frame.coordinates[8]).toBeCloseTo(0, 12); // H stays in the plane z = 0
    }
  });

  it('refuses a linear angle, whose plane is undefined', () => {
    const linear = Float64Array.from([0, 0, 0, 1.16, 0, 0, 2.32, 0, 0]);
    expect(() => new ScanMotion(linear, { coordinate: 'angle', atoms: [0, 1, 2] })).toThrow(/one line/);
  });
});

describe('dihedral scans', () => {
  it('turns H2O2 about O–O: the measured dihedral equals the requested one, bonds and O–O–H angles stay (by construction from the internal coordinates, from memory)', () => {
    const start = peroxide();
    const values = [111.5, 150, 180, -150, -90, 0, 90, -179.9];
    const frames = scanFrames(start, { coordinate: 'dihedral', atoms: [0, 1, 2, 3] }, [2, 3], values);
    for (const frame of frames) {
      const measured = dihedralOf(frame.coordinates, 0, 1, 2, 3);
      // Equal modulo 360° (180 and −180 are one geometry).
      const difference = ((measured - frame.value + 540) % 360) - 180;
      expect(Math.abs(difference)).toBeLessThan(1e-10);
      expect(distanceOf(frame.coordinates, 2, 3)).toBeCloseTo(0.95, 12);
      expect(distanceOf(frame.coordinates, 1, 2)).toBeCloseTo(1.475, 12);
      expect(angleOf(frame.coordinates, 1, 2, 3)).toBeCloseTo(94.8, 10);
    }
    // Trans (180°) puts both H in one plane on opposite sides: H···H = hand-computed from the Z-matrix.
    const trans = frames[2]!.coordinates;
    const rOH = 0.95;
    const s = rOH * Math.sin(94.8 * DEGREE);
    const dz = 1.475 - 2 * rOH * Math.cos(94.8 * DEGREE);
    expect(distanceOf(trans, 0, 3)).toBeCloseTo(Math.hypot(2 * s, dz), 12);
  });

  it('refuses a dihedral whose three atoms lie on one line', () => {
    const c = Float64Array.from([0, 0, -1, 0, 0, 0, 0, 0, 1, 1, 0, 1]);
    expect(() => new ScanMotion(c, { coordinate: 'dihedral', atoms: [0, 1, 2, 3] })).toThrow(/one line/);
  });
});
