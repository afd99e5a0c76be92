/**
 * The small linear-algebra helpers of the symmetry code against constructed cases (check values
 * follow from the construction: a matrix built from known eigenvalues and an orthogonal matrix).
 */
import { describe, expect, it } from 'vitest';
import { improperRotation, multiply, reflection, rotation, symmetricEigen, transpose } from '../../../server/src/chemistry/symmetry/linalg';

function determinant(m: Float64Array): number {
  return m[0]! * (m[4]! * m[8]! - m[5]! * m[7]!) - m[1]! * (m[3]! * m[8]! - m[5]! * m[6]!) + m[2]! * (m[3]! * m[7]! - m[4]! * m[6]!);
}

describe('linear algebra helpers', () => {
  it('symmetricEigen recovers eigenvalues and eigenvectors of Qᵀ·diag·Q', () => {
    const q = rotation([0.36, 0.48, 0.8], 0.9);
    for (const values of [
      [1, 2, 3],
      [5, 5, 7],
      [0, 4, 4],
      [2, 2, 2],
    ]) {
      const diagonal = Float64Array.of(values[0]!, 0, 0, 0, values[1]!, 0, 0, 0, values[2]!);
      const matrix = multiply(transpose(q), multiply(diagonal, q));
      const { values: found, vectors } = symmetricEigen(matrix);
      [...values].sort((a, b) => a - b).forEach((value, k) => expect(found[k]).toBeCloseTo(value, 12));
      for (let k = 0; k < 3; k++) {
        const v = vectors.subarray(3 * k, 3 * k + 3);
        const mv = [0, 1, 2].map((r) => matrix[3 * r]! * v[0]! + matrix[3 * r + 1]! * v[1]! + matrix[3 * r + 2]! * v[2]!);
        for (let c = 0; c < 3; c++) expect(mv[c]).toBeCloseTo(found[k]! * v[c]!, 12);
      }
    }
  });

  it('rotations are proper, reflections and improper rotations are not, and C_n^n = E (by definition: det = +1 and −1)', () => {
    const axis = [0, 0.6, 0.8];
    expect(determinant(rotation(axis, 1.234))).toBeCloseTo(1, 14);
    expect(determinant(reflection(axis))).toBeCloseTo(-1, 14);
    expect(determinant(improperRotation(axis, Math.PI / 2))).toBeCloseTo(-1, 14);
    let power: Float64Array = Float64Array.of(1, 0, 0, 0, 1, 0, 0, 0, 1);
    const c5 = rotation(axis, (2 * Math.PI) / 5);
    for (let k = 0; k < 5; k++) power = multiply(c5, power);
    [1, 0, 0, 0, 1, 0, 0, 0, 1].forEach((value, k) => expect(power[k]).toBeCloseTo(value, 14));
    // S4² = C2 about the same axis.
    const s4 = improperRotation(axis, Math.PI / 2);
    const squared = multiply(s4, s4);
    const c2 = rotation(axis, Math.PI);
    for (let k = 0; k < 9; k++) expect(squared[k]).toBeCloseTo(c2[k]!, 14);
  });
});
