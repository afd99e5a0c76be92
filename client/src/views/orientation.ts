/**
 * How the structure view turns the atoms before drawing them (drawing only: the spec's
 * coordinates are not changed). The camera looks along −z with x across the screen and y up.
 *
 * - Without a scan the view faces the molecule's largest plane: the atoms' principal axes (the
 *   eigenvectors of the second-moment matrix of their positions about the centroid) go onto the
 *   screen's axes, the largest spread across (x), the next up (y), and the smallest, the normal of
 *   the least-squares plane, along the line of sight (z). A planar molecule lies in the screen.
 * - With a scan the scanned distance lies across the screen (+x), turned about it so that the
 *   atoms spread most along the screen's height and least in depth.
 *
 * Pure arithmetic on plain objects (no DOM, no editor): the view's script and the tests use it.
 */

export type Vector = { x: number; y: number; z: number };
/** A rotation as a row-major 3 × 3 matrix. */
export type Matrix = [number, number, number, number, number, number, number, number, number];

export const IDENTITY: Matrix = [1, 0, 0, 0, 1, 0, 0, 0, 1];

/** Product of two matrices (row-major). */
export function times(a: Matrix, b: Matrix): Matrix {
  const c: number[] = [];
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) c.push(a[3 * i]! * b[j]! + a[3 * i + 1]! * b[3 + j]! + a[3 * i + 2]! * b[6 + j]!);
  return c as Matrix;
}

/** The rotation by `angle` about the x axis. */
function aboutX(angle: number): Matrix {
  return [1, 0, 0, 0, Math.cos(angle), -Math.sin(angle), 0, Math.sin(angle), Math.cos(angle)];
}

export function apply(m: Matrix, v: Vector): Vector {
  return { x: m[0] * v.x + m[1] * v.y + m[2] * v.z, y: m[3] * v.x + m[4] * v.y + m[5] * v.z, z: m[6] * v.x + m[7] * v.y + m[8] * v.z };
}

/**
 * Eigenvalues and eigenvectors of a symmetric 3 × 3 matrix by cyclic Jacobi rotations (Golub &
 * Van Loan, Matrix Computations, §8.5); returns the vectors as the columns' order of `values`.
 */
export function symmetricEigen3(matrix: Matrix): { values: [number, number, number]; vectors: [Vector, Vector, Vector] } {
  const a = [...matrix];
  const v = [...IDENTITY];
  for (let sweep = 0; sweep < 50; sweep++) {
    const off = a[1]! ** 2 + a[2]! ** 2 + a[5]! ** 2;
    const scale = a[0]! ** 2 + a[4]! ** 2 + a[8]! ** 2;
    if (off <= 1e-30 * Math.max(scale, 1e-300)) break;
    for (const [p, q] of [
      [0, 1],
      [0, 2],
      [1, 2],
    ] as const) {
      const apq = a[3 * p + q]!;
      if (apq === 0) continue;
      const theta = (a[3 * q + q]! - a[3 * p + p]!) / (2 * apq);
      const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
      const c = 1 / Math.sqrt(t * t + 1);
      const s = t * c;
      // A ← Jᵀ A J with J the rotation in the (p, q) plane.
      for (let k = 0; k < 3; k++) {
        const akp = a[3 * k + p]!;
        const akq = a[3 * k + q]!;
        a[3 * k + p] = c * akp - s * akq;
        a[3 * k + q] = s * akp + c * akq;
      }
      for (let k = 0; k < 3; k++) {
        const apk = a[3 * p + k]!;
        const aqk = a[3 * q + k]!;
        a[3 * p + k] = c * apk - s * aqk;
        a[3 * q + k] = s * apk + c * aqk;
      }
      for (let k = 0; k < 3; k++) {
        const vkp = v[3 * k + p]!;
        const vkq = v[3 * k + q]!;
        v[3 * k + p] = c * vkp - s * vkq;
        v[3 * k + q] = s * vkp + c * vkq;
      }
    }
  }
  const column = (j: number): Vector => ({ x: v[j]!, y: v[3 + j]!, z: v[6 + j]! });
  return { values: [a[0]!, a[4]!, a[8]!], vectors: [column(0), column(1), column(2)] };
}

function cross(a: Vector, b: Vector): Vector {
  return { x: a.y * b.z - a.z * b.y, y: a.z * b.x - a.x * b.z, z: a.x * b.y - a.y * b.x };
}

/** The sign that makes the vector's largest component positive (so the view does not flip at random). */
function canonical(v: Vector): Vector {
  const largest = [v.x, v.y, v.z].reduce((best, value) => (Math.abs(value) > Math.abs(best) + 1e-12 ? value : best), 0);
  return largest < 0 ? { x: -v.x, y: -v.y, z: -v.z } : v;
}

/**
 * The rotation that puts the atoms' principal axes onto the screen: largest spread along x, the
 * next along y, the normal of the best-fit plane along z (towards the viewer). A proper rotation
 * (determinant +1). The identity for fewer than two atoms.
 */
export function facingLargestPlane(points: readonly Vector[]): Matrix {
  if (points.length < 2) return IDENTITY;
  const n = points.length;
  const mean = points.reduce((sum, p) => ({ x: sum.x + p.x / n, y: sum.y + p.y / n, z: sum.z + p.z / n }), { x: 0, y: 0, z: 0 });
  let xx = 0, yy = 0, zz = 0, xy = 0, xz = 0, yz = 0; // prettier-ignore
  for (const p of points) {
    const dx = p.x - mean.x;
    const dy = p.y - mean.y;
    const dz = p.z - mean.z;
    xx += dx * dx;
    yy += dy * dy;
    zz += dz * dz;
    xy += dx * dy;
    xz += dx * dz;
    yz += dy * dz;
  }
  const { values, vectors } = symmetricEigen3([xx, xy, xz, xy, yy, yz, xz, yz, zz]);
  const order = [0, 1, 2].sort((i, j) => values[j]! - values[i]!);
  const across = canonical(vectors[order[0]!]!);
  const up = canonical(vectors[order[1]!]!);
  const towards = cross(across, up);
  return [across.x, across.y, across.z, up.x, up.y, up.z, towards.x, towards.y, towards.z];
}

/**
 * The rotation that puts the scanned distance from `a` to `b` across the screen (+x), turned
 * about it so that the points spread most along y and least in depth; undefined when the two
 * atoms coincide.
 */
export function alongScan(points: readonly Vector[], a: Vector, b: Vector): Matrix | undefined {
  const length = Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z);
  if (length < 1e-6) return undefined;
  const u = { x: (b.x - a.x) / length, y: (b.y - a.y) / length, z: (b.z - a.z) / length };
  // Rodrigues: the rotation about u × x̂ by the angle between u and x̂.
  const cos = u.x;
  let align: Matrix;
  if (cos > 1 - 1e-9) align = IDENTITY;
  else if (cos < -1 + 1e-9) align = [-1, 0, 0, 0, 1, 0, 0, 0, -1];
  else {
    const sin = Math.hypot(u.y, u.z);
    const k = { x: 0, y: u.z / sin, z: -u.y / sin };
    const t = 1 - cos;
    align = [
      cos + k.x * k.x * t, k.x * k.y * t - k.z * sin, k.x * k.z * t + k.y * sin,
      k.y * k.x * t + k.z * sin, cos + k.y * k.y * t, k.y * k.z * t - k.x * sin,
      k.z * k.x * t - k.y * sin, k.z * k.y * t + k.x * sin, cos + k.z * k.z * t,
    ]; // prettier-ignore
  }
  // The principal axis of the atoms' spread across the scan, turned onto the screen's y axis.
  const turned = points.map((p) => apply(align, p));
  const meanY = turned.reduce((sum, p) => sum + p.y, 0) / turned.length;
  const meanZ = turned.reduce((sum, p) => sum + p.z, 0) / turned.length;
  let yy = 0;
  let zz = 0;
  let yz = 0;
  for (const p of turned) {
    yy += (p.y - meanY) ** 2;
    zz += (p.z - meanZ) ** 2;
    yz += (p.y - meanY) * (p.z - meanZ);
  }
  const axis = 0.5 * Math.atan2(2 * yz, yy - zz);
  return times(aboutX(-axis), align);
}

/** The view's rotation of a structure: along its scan when it has one, else facing its largest plane. */
export function viewRotation(points: readonly Vector[], scan: { first: number; second: number } | null): Matrix {
  if (scan) {
    const a = points[scan.first];
    const b = points[scan.second];
    const rotation = a && b ? alongScan(points, a, b) : undefined;
    if (rotation) return rotation;
  }
  return facingLargestPlane(points);
}
