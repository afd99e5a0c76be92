/**
 * Geometries along a scan of one internal coordinate. The moving atoms undergo one rigid motion
 * per point, chosen so that the scanned coordinate takes each value in turn while the moving atoms
 * keep their distances among themselves:
 *  - distance A–B: a translation along the line from A to B;
 *  - angle A–B–C (vertex B): a rotation about the axis through B normal to the plane A, B, C;
 *  - dihedral A–B–C–D: a rotation about the axis through B and C.
 * Rotations by Rodrigues' formula (O. Rodrigues, J. Math. Pures Appl. 5, 380 (1840)); the dihedral
 * follows the IUPAC sign convention (IUPAC Gold Book, "torsion angle"): seen along B→C, positive
 * when the bond A–B has to turn clockwise to eclipse C–D.
 */

/** The coordinate a scan varies: a distance (2 atoms, Å), a bond angle (3 atoms, degrees) or a dihedral (4 atoms, degrees). */
export type ScanCoordinate = 'distance' | 'angle' | 'dihedral';

/** How many atoms each coordinate names. */
export const SCAN_ATOM_COUNTS: Readonly<Record<ScanCoordinate, number>> = { distance: 2, angle: 3, dihedral: 4 };

/** The unit of each coordinate's values. */
export const SCAN_UNITS: Readonly<Record<ScanCoordinate, 'angstrom' | 'degree'>> = { distance: 'angstrom', angle: 'degree', dihedral: 'degree' };

export interface ScanFrame {
  /** The scanned value of this frame: Å for a distance, degrees for an angle or dihedral. */
  readonly value: number;
  /** x, y, z of every atom, Å. */
  readonly coordinates: Float64Array;
}

/** The coordinate and its atoms (indices into the coordinates). */
export interface ScanGeometry {
  readonly coordinate: ScanCoordinate;
  readonly atoms: readonly number[];
}

const DEGREE = Math.PI / 180;

function vector(c: ArrayLike<number>, from: number, to: number): [number, number, number] {
  return [c[3 * to]! - c[3 * from]!, c[3 * to + 1]! - c[3 * from + 1]!, c[3 * to + 2]! - c[3 * from + 2]!];
}

function cross(a: readonly number[], b: readonly number[]): [number, number, number] {
  return [a[1]! * b[2]! - a[2]! * b[1]!, a[2]! * b[0]! - a[0]! * b[2]!, a[0]! * b[1]! - a[1]! * b[0]!];
}

function dot(a: readonly number[], b: readonly number[]): number {
  return a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;
}

function norm(a: readonly number[]): number {
  return Math.hypot(a[0]!, a[1]!, a[2]!);
}

/** The distance A–B in the coordinates' unit. */
export function distanceOf(c: ArrayLike<number>, a: number, b: number): number {
  return norm(vector(c, a, b));
}

/** The angle A–B–C at the vertex B, degrees in [0, 180]. */
export function angleOf(c: ArrayLike<number>, a: number, b: number, cAtom: number): number {
  const u = vector(c, b, a);
  const v = vector(c, b, cAtom);
  // atan2 of |u × v| and u·v keeps full precision near 0° and 180°, where acos does not.
  return Math.atan2(norm(cross(u, v)), dot(u, v)) / DEGREE;
}

/**
 * The dihedral A–B–C–D, degrees in (−180, 180], IUPAC sign:
 * φ = atan2(|b2| b1·(b2 × b3), (b1 × b2)·(b2 × b3)) with b1 = B − A, b2 = C − B, b3 = D − C
 * (E. Blondel, M. Karplus, J. Comput. Chem. 17, 1132 (1996), eq. 14 and after).
 */
export function dihedralOf(c: ArrayLike<number>, a: number, b: number, cAtom: number, d: number): number {
  const b1 = vector(c, a, b);
  const b2 = vector(c, b, cAtom);
  const b3 = vector(c, cAtom, d);
  const n1 = cross(b1, b2);
  const n2 = cross(b2, b3);
  return Math.atan2(norm(b2) * dot(b1, n2), dot(n1, n2)) / DEGREE;
}

/** The scanned coordinate measured in a geometry (Å or degrees). */
export function measureScanCoordinate(c: ArrayLike<number>, geometry: ScanGeometry): number {
  const [a, b, cAtom, d] = geometry.atoms as [number, number, number, number];
  if (geometry.coordinate === 'distance') return distanceOf(c, a, b);
  if (geometry.coordinate === 'angle') return angleOf(c, a, b, cAtom);
  return dihedralOf(c, a, b, cAtom, d);
}

/** Why a scan's motion is undefined in the structure as written, or undefined when it is defined. */
export function scanMotionProblem(c: ArrayLike<number>, geometry: ScanGeometry): string | undefined {
  try {
    new ScanMotion(c, geometry);
    return undefined;
  } catch (error) {
    return (error as Error).message;
  }
}

/** Below this |sin| (of the angle, or of either bond angle of a dihedral) the rotation axis is undefined. */
const COLLINEAR_SINE = 1e-6;

/**
 * The rigid motion of one scan, prepared once from the structure: `transform(value, out)` writes the
 * 3 × 4 affine map [R | t] (row-major, x' = R x + t) that takes the structure to the point where the
 * coordinate has `value`; `apply` moves one atom with it. No allocation per point or per atom.
 */
export class ScanMotion {
  /** The coordinate's value in the structure as written (Å or degrees). */
  readonly current: number;
  private readonly axis: Float64Array = new Float64Array(3);
  private readonly pivot: Float64Array = new Float64Array(3);
  private readonly coordinate: ScanCoordinate;

  /** Throws a RangeError when the motion is undefined (coinciding atoms, or a linear angle whose plane is undefined). */
  constructor(c: ArrayLike<number>, geometry: ScanGeometry) {
    const [a, b, cAtom, d] = geometry.atoms as [number, number, number, number];
    this.coordinate = geometry.coordinate;
    if (geometry.coordinate === 'distance') {
      const direction = vector(c, a, b);
      const length = norm(direction);
      if (length === 0) throw new RangeError('The two scanned atoms sit on the same point, so the scan has no direction.');
      this.axis.set(direction.map((x) => x / length));
      this.current = length;
      return;
    }
    const ba = vector(c, b, a);
    const bc = vector(c, b, cAtom);
    if (norm(ba) === 0 || norm(bc) === 0) throw new RangeError('Two of the scanned atoms sit on the same point, so the scan has no axis.');
    if (geometry.coordinate === 'angle') {
      const normal = cross(ba, bc);
      const length = norm(normal);
      if (length < COLLINEAR_SINE * norm(ba) * norm(bc)) throw new RangeError('The three atoms of the angle lie on one line, so the plane to turn in is undefined; start from a bent geometry.');
      // Turning C about a × c (right-handed) carries it away from A: the angle grows.
      this.axis.set(normal.map((x) => x / length));
      this.pivot.set([c[3 * b]!, c[3 * b + 1]!, c[3 * b + 2]!]);
      this.current = angleOf(c, a, b, cAtom);
      return;
    }
    const cd = vector(c, cAtom, d);
    const length = norm(bc);
    if (norm(cd) === 0) throw new RangeError('Two of the scanned atoms sit on the same point, so the scan has no axis.');
    const sinB = norm(cross(ba, bc)) / (norm(ba) * length);
    const sinC = norm(cross(bc, cd)) / (norm(cd) * length);
    if (sinB < COLLINEAR_SINE || sinC < COLLINEAR_SINE) throw new RangeError('Three consecutive atoms of the dihedral lie on one line, so the dihedral is undefined; start from a bent geometry.');
    this.axis.set(bc.map((x) => x / length));
    this.pivot.set([c[3 * b]!, c[3 * b + 1]!, c[3 * b + 2]!]);
    this.current = dihedralOf(c, a, b, cAtom, d);
  }

  /** Writes into `out` (12 numbers) the affine map of the point where the coordinate is `value`. */
  transform(value: number, out: Float64Array): void {
    const [ux, uy, uz] = this.axis as unknown as [number, number, number];
    if (this.coordinate === 'distance') {
      const shift = value - this.current;
      out.set([1, 0, 0, shift * ux, 0, 1, 0, shift * uy, 0, 0, 1, shift * uz]);
      return;
    }
    // A right-handed turn about B→C by δ adds δ to the IUPAC dihedral; about a × c it opens the angle by δ.
    const theta = (value - this.current) * DEGREE;
    const cos = Math.cos(theta);
    const sin = Math.sin(theta);
    const k = 1 - cos;
    // Rodrigues: R = cos I + sin [u]× + (1 − cos) u uᵀ.
    const r00 = cos + k * ux * ux;
    const r01 = k * ux * uy - sin * uz;
    const r02 = k * ux * uz + sin * uy;
    const r10 = k * uy * ux + sin * uz;
    const r11 = cos + k * uy * uy;
    const r12 = k * uy * uz - sin * ux;
    const r20 = k * uz * ux - sin * uy;
    const r21 = k * uz * uy + sin * ux;
    const r22 = cos + k * uz * uz;
    const [px, py, pz] = this.pivot as unknown as [number, number, number];
    // x' = R (x − p) + p, so t = p − R p.
    out[0] = r00; out[1] = r01; out[2] = r02; out[3] = px - (r00 * px + r01 * py + r02 * pz);
    out[4] = r10; out[5] = r11; out[6] = r12; out[7] = py - (r10 * px + r11 * py + r12 * pz);
    out[8] = r20; out[9] = r21; out[10] = r22; out[11] = pz - (r20 * px + r21 * py + r22 * pz);
  }

  /** Moves atom `atom` of `c` by the map `m`, writing x, y, z at out[offset..offset + 2]. */
  static apply(m: Float64Array, c: ArrayLike<number>, atom: number, out: Float64Array, offset: number): void {
    const x = c[3 * atom]!;
    const y = c[3 * atom + 1]!;
    const z = c[3 * atom + 2]!;
    out[offset] = m[0]! * x + m[1]! * y + m[2]! * z + m[3]!;
    out[offset + 1] = m[4]! * x + m[5]! * y + m[6]! * z + m[7]!;
    out[offset + 2] = m[8]! * x + m[9]! * y + m[10]! * z + m[11]!;
  }
}

/**
 * Frames of a scan. `moving` lists the atoms that move (the last scanned atom and those that go
 * with it); everything else stays. Throws a RangeError when the motion is undefined.
 */
export function scanFrames(coordinates: Float64Array, geometry: ScanGeometry, moving: readonly number[], values: readonly number[]): ScanFrame[] {
  return [...eachScanFrame(coordinates, geometry, moving, values)];
}

/**
 * The same frames one at a time, each made when it is asked for: a scan of many points over many
 * atoms is written out with one frame in memory (exports stream them). Throws as scanFrames does,
 * before the first frame.
 */
export function eachScanFrame(coordinates: Float64Array, geometry: ScanGeometry, moving: readonly number[], values: readonly number[]): Iterable<ScanFrame> {
  const motion = new ScanMotion(coordinates, geometry);
  return (function* frames(): Generator<ScanFrame> {
    const map = new Float64Array(12);
    for (const value of values) {
      const frame = Float64Array.from(coordinates);
      motion.transform(value, map);
      for (const atom of moving) ScanMotion.apply(map, coordinates, atom, frame, 3 * atom);
      yield { value, coordinates: frame };
    }
  })();
}

function neighbourLists(atomCount: number, bonds: readonly { i: number; j: number }[]): number[][] {
  const neighbours: number[][] = Array.from({ length: atomCount }, () => []);
  for (const { i, j } of bonds) {
    neighbours[i]!.push(j);
    neighbours[j]!.push(i);
  }
  return neighbours;
}

/**
 * The atoms that move with `second` when no fragment says: its bonded component, unless that
 * component also holds `first` (then the second atom moves alone).
 */
export function bondedGroup(atomCount: number, bonds: readonly { i: number; j: number }[], first: number, second: number): number[] {
  const group = bondedSide(atomCount, bonds, second, -1);
  return group.includes(first) ? [second] : group;
}

/**
 * The atoms reached from `start` through bonds without passing `blocked` (sorted): the side of a
 * molecule that turns with `start` about a bond to `blocked` or about the vertex `blocked`.
 */
export function bondedSide(atomCount: number, bonds: readonly { i: number; j: number }[], start: number, blocked: number): number[] {
  const neighbours = neighbourLists(atomCount, bonds);
  const seen = new Uint8Array(atomCount);
  if (blocked >= 0) seen[blocked] = 1;
  const stack = [start];
  seen[start] = 1;
  const group: number[] = [];
  while (stack.length > 0) {
    const atom = stack.pop()!;
    group.push(atom);
    for (const next of neighbours[atom]!) {
      if (!seen[next]) {
        seen[next] = 1;
        stack.push(next);
      }
    }
  }
  return group.sort((a, b) => a - b);
}

/** A scanned value with its unit, to six decimals at most: `0.9572 Å`, `104.5°`. */
export function formatScanValue(value: number, coordinate: ScanCoordinate): string {
  const text = Number(value.toFixed(6)).toString();
  return coordinate === 'distance' ? `${text} Å` : `${text}°`;
}
