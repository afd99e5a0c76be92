/**
 * Centre of mass and inertia tensor of a set of atoms, with atomic masses from the element table.
 *
 * Formulas (H. Goldstein, C. Poole, J. Safko, Classical Mechanics, 3rd ed., Addison-Wesley 2002,
 * §5.3 — section from memory):
 *   centre of mass  R = Σ m_i r_i / Σ m_i,
 *   inertia tensor  I = Σ m_i (|r_i − R|² 1 − (r_i − R)(r_i − R)ᵀ).
 * The principal moments are its eigenvalues and the principal axes its eigenvectors.
 */
import { elementByNumber } from '../elements';
import { symmetricEigen, type Mat } from './linalg';

/**
 * Mass of an atom in daltons: the standard atomic weight of the element table. An atomic number
 * the table does not know (or an element without a weight) counts as its own atomic number
 * (common practice, no source: any positive value works, equivalent atoms only need equal masses).
 */
export function atomicMass(z: number): number {
  const weight = elementByNumber(z)?.weight;
  return weight !== undefined && weight !== null && weight > 0 ? weight : Math.max(z, 1);
}

export function massesOf(atomicNumbers: ArrayLike<number>): Float64Array {
  return Float64Array.from({ length: atomicNumbers.length }, (_, i) => atomicMass(atomicNumbers[i]!));
}

export function centreOfMass(coordinates: ArrayLike<number>, masses: ArrayLike<number>): Float64Array {
  const centre = new Float64Array(3);
  let total = 0;
  for (let i = 0; i < masses.length; i++) {
    const m = masses[i]!;
    total += m;
    centre[0]! += m * coordinates[3 * i]!;
    centre[1]! += m * coordinates[3 * i + 1]!;
    centre[2]! += m * coordinates[3 * i + 2]!;
  }
  if (total > 0) for (let k = 0; k < 3; k++) centre[k]! /= total;
  return centre;
}

/** Coordinates relative to `origin`, as a new flat array. */
export function centred(coordinates: ArrayLike<number>, origin: ArrayLike<number>): Float64Array {
  const count = coordinates.length / 3;
  const out = new Float64Array(3 * count);
  for (let i = 0; i < count; i++) {
    out[3 * i] = coordinates[3 * i]! - origin[0]!;
    out[3 * i + 1] = coordinates[3 * i + 1]! - origin[1]!;
    out[3 * i + 2] = coordinates[3 * i + 2]! - origin[2]!;
  }
  return out;
}

/** Inertia tensor (row-major, amu·Å²) of coordinates already relative to the centre of mass. */
export function inertiaTensor(centredCoordinates: ArrayLike<number>, masses: ArrayLike<number>): Mat {
  let xx = 0;
  let yy = 0;
  let zz = 0;
  let xy = 0;
  let xz = 0;
  let yz = 0;
  for (let i = 0; i < masses.length; i++) {
    const m = masses[i]!;
    const x = centredCoordinates[3 * i]!;
    const y = centredCoordinates[3 * i + 1]!;
    const z = centredCoordinates[3 * i + 2]!;
    xx += m * x * x;
    yy += m * y * y;
    zz += m * z * z;
    xy += m * x * y;
    xz += m * x * z;
    yz += m * y * z;
  }
  return Float64Array.of(yy + zz, -xy, -xz, -xy, xx + zz, -yz, -xz, -yz, xx + yy);
}

export type TopKind = 'asymmetric' | 'symmetric' | 'spherical';

export interface PrincipalAxes {
  /** Principal moments, ascending (amu·Å²). */
  readonly moments: Float64Array;
  /** Row k is the principal axis of moments[k]. */
  readonly axes: Mat;
  readonly kind: TopKind;
  /** For a symmetric top: the index (0..2) of the moment that differs from the other two. */
  readonly uniqueAxis: number;
}

/**
 * Principal moments and the kind of top. Two moments count as equal when they differ by less than
 * 8·δ·Σ m_i |r_i|: moving every atom by at most δ changes the tensor by at most
 * 4·δ·Σ m_i |r_i| (+ O(δ²)) in norm, and each eigenvalue by no more than that (Weyl's inequality,
 * Golub & Van Loan §8.1.2), so a geometry symmetric within δ cannot split a degenerate pair by
 * more; the factor 2 on top is slack. Calling moments equal too readily only costs time: the
 * symmetric- and spherical-top searches find every element an asymmetric top has.
 */
export function principalAxes(centredCoordinates: ArrayLike<number>, masses: ArrayLike<number>, tolerance: number): PrincipalAxes {
  const { values, vectors } = symmetricEigen(inertiaTensor(centredCoordinates, masses));
  let weighted = 0;
  for (let i = 0; i < masses.length; i++) {
    const x = centredCoordinates[3 * i]!;
    const y = centredCoordinates[3 * i + 1]!;
    const z = centredCoordinates[3 * i + 2]!;
    weighted += masses[i]! * Math.sqrt(x * x + y * y + z * z);
  }
  const threshold = 8 * tolerance * weighted + 1e-9 * Math.max(values[2]!, 1e-12);
  const low = values[1]! - values[0]! <= threshold;
  const high = values[2]! - values[1]! <= threshold;
  if (low && high) return { moments: values, axes: vectors, kind: 'spherical', uniqueAxis: -1 };
  if (low) return { moments: values, axes: vectors, kind: 'symmetric', uniqueAxis: 2 };
  if (high) return { moments: values, axes: vectors, kind: 'symmetric', uniqueAxis: 0 };
  return { moments: values, axes: vectors, kind: 'asymmetric', uniqueAxis: -1 };
}
