/**
 * Small 3-vector and 3×3-matrix helpers for the symmetry code. Matrices are row-major
 * Float64Array(9); a matrix M acts on a column vector r as M·r.
 *
 * Formulas:
 * - rotation by θ about a unit axis u (Rodrigues' formula):
 *   R = cos θ·1 + sin θ·[u]× + (1 − cos θ)·u uᵀ
 *   (H. Goldstein, C. Poole, J. Safko, Classical Mechanics, 3rd ed., Addison-Wesley 2002, eq. 4.62
 *   — equation number from memory);
 * - reflection through the plane with unit normal n (a Householder matrix): σ = 1 − 2 n nᵀ
 *   (G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed., Johns Hopkins 2013, §5.1.2);
 * - improper rotation S(θ) about u = σ(u)·R(u, θ) (F. A. Cotton, Chemical Applications of Group
 *   Theory, 3rd ed., Wiley 1990, §2.2 — section from memory);
 * - eigenvalues of a real symmetric 3×3 matrix by cyclic Jacobi rotations
 *   (Golub & Van Loan, §8.5, "Jacobi methods").
 */

export type Vec3 = readonly [number, number, number];
export type Matrix3 = readonly [Vec3, Vec3, Vec3];
/** Row-major 3×3 matrix. */
export type Mat = Float64Array;

export function dot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  return a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;
}

export function cross(a: ArrayLike<number>, b: ArrayLike<number>): Float64Array {
  return Float64Array.of(a[1]! * b[2]! - a[2]! * b[1]!, a[2]! * b[0]! - a[0]! * b[2]!, a[0]! * b[1]! - a[1]! * b[0]!);
}

export function norm(a: ArrayLike<number>): number {
  return Math.sqrt(dot(a, a));
}

/** The unit vector along `a`, or undefined when `a` is shorter than `minimum`. */
export function normalized(a: ArrayLike<number>, minimum = 1e-12): Float64Array | undefined {
  const length = norm(a);
  if (!(length > minimum)) return undefined;
  return Float64Array.of(a[0]! / length, a[1]! / length, a[2]! / length);
}

export function identity(): Mat {
  return Float64Array.of(1, 0, 0, 0, 1, 0, 0, 0, 1);
}

export function multiply(a: Mat, b: Mat): Mat {
  const out = new Float64Array(9);
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      out[3 * i + j] = a[3 * i]! * b[j]! + a[3 * i + 1]! * b[3 + j]! + a[3 * i + 2]! * b[6 + j]!;
    }
  }
  return out;
}

export function transpose(a: Mat): Mat {
  return Float64Array.of(a[0]!, a[3]!, a[6]!, a[1]!, a[4]!, a[7]!, a[2]!, a[5]!, a[8]!);
}

export function apply(m: Mat, v: ArrayLike<number>): Float64Array {
  return Float64Array.of(
    m[0]! * v[0]! + m[1]! * v[1]! + m[2]! * v[2]!,
    m[3]! * v[0]! + m[4]! * v[1]! + m[5]! * v[2]!,
    m[6]! * v[0]! + m[7]! * v[1]! + m[8]! * v[2]!,
  );
}

/** Rodrigues' rotation formula (see the file header); `u` must be a unit vector. */
export function rotation(u: ArrayLike<number>, angle: number): Mat {
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  const t = 1 - c;
  const [x, y, z] = [u[0]!, u[1]!, u[2]!];
  return Float64Array.of(
    c + t * x * x, t * x * y - s * z, t * x * z + s * y,
    t * x * y + s * z, c + t * y * y, t * y * z - s * x,
    t * x * z - s * y, t * y * z + s * x, c + t * z * z,
  );
}

/** Reflection through the plane with unit normal `n`: 1 − 2 n nᵀ. */
export function reflection(n: ArrayLike<number>): Mat {
  const [x, y, z] = [n[0]!, n[1]!, n[2]!];
  return Float64Array.of(1 - 2 * x * x, -2 * x * y, -2 * x * z, -2 * x * y, 1 - 2 * y * y, -2 * y * z, -2 * x * z, -2 * y * z, 1 - 2 * z * z);
}

export function inversion(): Mat {
  return Float64Array.of(-1, 0, 0, 0, -1, 0, 0, 0, -1);
}

/** Improper rotation: rotation by `angle` about `u` followed by reflection through the plane ⊥ u. */
export function improperRotation(u: ArrayLike<number>, angle: number): Mat {
  return multiply(reflection(u), rotation(u, angle));
}

export function toMatrix3(m: Mat): Matrix3 {
  return [
    [m[0]!, m[1]!, m[2]!],
    [m[3]!, m[4]!, m[5]!],
    [m[6]!, m[7]!, m[8]!],
  ];
}

export function fromMatrix3(m: Matrix3): Mat {
  return Float64Array.of(...m[0], ...m[1], ...m[2]);
}

export function toVec3(v: ArrayLike<number>): Vec3 {
  return [v[0]!, v[1]!, v[2]!];
}

export interface SymmetricEigen {
  /** Ascending. */
  readonly values: Float64Array;
  /** Row k is the unit eigenvector of values[k]. */
  readonly vectors: Mat;
}

/**
 * Eigenvalues and eigenvectors of a real symmetric 3×3 matrix by cyclic Jacobi rotations
 * (Golub & Van Loan, Matrix Computations, §8.5). Converges quadratically; 50 sweeps is far more
 * than a 3×3 matrix ever needs.
 */
export function symmetricEigen(matrix: ArrayLike<number>): SymmetricEigen {
  const a = Float64Array.from({ length: 9 }, (_, k) => matrix[k]!);
  // v accumulates the rotations; its columns become the eigenvectors.
  const v = identity();
  const scale = Math.max(1e-300, ...Array.from(a, Math.abs));
  for (let sweep = 0; sweep < 50; sweep++) {
    const off = Math.abs(a[1]!) + Math.abs(a[2]!) + Math.abs(a[5]!);
    if (off <= 1e-15 * scale) break;
    for (const [p, q] of [
      [0, 1],
      [0, 2],
      [1, 2],
    ] as const) {
      const apq = a[3 * p + q]!;
      if (Math.abs(apq) <= 1e-300) continue;
      const app = a[3 * p + p]!;
      const aqq = a[3 * q + q]!;
      // Choose the rotation angle that zeroes a[p][q] (the smaller of the two roots).
      const theta = (aqq - app) / (2 * apq);
      const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
      const c = 1 / Math.sqrt(t * t + 1);
      const s = t * c;
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
  const order = [0, 1, 2].sort((i, j) => a[4 * i]! - a[4 * j]!);
  const values = Float64Array.from(order, (i) => a[4 * i]!);
  const vectors = new Float64Array(9);
  order.forEach((column, row) => {
    for (let k = 0; k < 3; k++) vectors[3 * row + k] = v[3 * k + column]!;
  });
  return { values, vectors };
}

/**
 * Distance of point r from the line through the origin along unit u, from the perpendicular
 * component itself (not √(|r|² − (r·u)²), which loses half the digits near the axis).
 */
export function distanceFromAxis(r: ArrayLike<number>, u: ArrayLike<number>): number {
  const h = r[0]! * u[0]! + r[1]! * u[1]! + r[2]! * u[2]!;
  return Math.hypot(r[0]! - h * u[0]!, r[1]! - h * u[1]!, r[2]! - h * u[2]!);
}

/** Row k of a row-major matrix as a new vector. */
export function row(m: Mat, k: number): Float64Array {
  return m.slice(3 * k, 3 * k + 3);
}

/** Top eigenvector (largest eigenvalue) of a symmetric matrix. */
export function topEigenvector(matrix: ArrayLike<number>): Float64Array {
  return row(symmetricEigen(matrix).vectors, 2);
}

/** The matrix whose rows are the given axes: maps input coordinates to frame coordinates. */
export function frameMatrix(x: ArrayLike<number>, y: ArrayLike<number>, z: ArrayLike<number>): Mat {
  return Float64Array.of(x[0]!, x[1]!, x[2]!, y[0]!, y[1]!, y[2]!, z[0]!, z[1]!, z[2]!);
}

/** Aᵀ·D·A for a frame A (rows = axes) and diagonal signs D: a D2h-type operation in input coordinates. */
export function diagonalInFrame(frame: Mat, d: readonly [number, number, number]): Mat {
  const out = new Float64Array(9);
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      out[3 * i + j] = d[0] * frame[i]! * frame[j]! + d[1] * frame[3 + i]! * frame[3 + j]! + d[2] * frame[6 + i]! * frame[6 + j]!;
    }
  }
  return out;
}

/** A unit vector perpendicular to unit `u`, as close as possible to `preferred` (projected). */
export function perpendicularTowards(u: ArrayLike<number>, preferred: ArrayLike<number>): Float64Array {
  const candidates = [preferred, [1, 0, 0], [0, 1, 0], [0, 0, 1]];
  for (const p of candidates) {
    const projection = dot(p, u);
    const v = normalized([p[0]! - projection * u[0]!, p[1]! - projection * u[1]!, p[2]! - projection * u[2]!], 1e-6);
    if (v) return v;
  }
  return Float64Array.of(1, 0, 0);
}
