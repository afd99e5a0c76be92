/**
 * Singular values and left singular vectors (server/src/electronic/linalg/singular.ts) of
 * matrices built from known factors, A = U diag(σ) Vᵀ with U and V products of plane rotations:
 * the σ are known by construction.
 */
import { describe, expect, it } from 'vitest';
import { singularPairs } from '../../../server/src/electronic/linalg';

/** An n×n orthogonal matrix: a product of plane rotations by the given seed's angles. */
function rotations(n: number, seed: number): Float64Array {
  const q = new Float64Array(n * n);
  for (let i = 0; i < n; i++) q[i * n + i] = 1;
  let angle = seed;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      angle = (angle * 1.7 + 0.37) % 3.1;
      const c = Math.cos(angle);
      const s = Math.sin(angle);
      for (let r = 0; r < n; r++) {
        const a = q[r * n + i]!;
        const b = q[r * n + j]!;
        q[r * n + i] = c * a - s * b;
        q[r * n + j] = s * a + c * b;
      }
    }
  }
  return q;
}

function compose(m: number, n: number, sigma: number[]): Float64Array {
  const u = rotations(m, 0.3);
  const v = rotations(n, 1.1);
  const a = new Float64Array(m * n);
  for (let i = 0; i < m; i++) for (let j = 0; j < n; j++) for (let k = 0; k < sigma.length; k++) a[i * n + j]! += u[i * m + k]! * sigma[k]! * v[j * n + k]!;
  return a;
}

describe('singularPairs', () => {
  it('recovers σ of a tall matrix, tiny ones to an absolute 1e-15 (by construction)', () => {
    const sigma = [0.5, 0.3, 1e-4, 1e-9, 0];
    const { values, left } = singularPairs(compose(9, 5, sigma), 9, 5);
    sigma.forEach((value, k) => expect(Math.abs(values[k]! - value)).toBeLessThan(1e-15));
    // The left vectors of the non-zero σ are orthonormal.
    for (let a = 0; a < 3; a++) {
      for (let b = 0; b <= a; b++) {
        let dot = 0;
        for (let p = 0; p < 9; p++) dot += left[p * 5 + a]! * left[p * 5 + b]!;
        expect(Math.abs(dot - (a === b ? 1 : 0))).toBeLessThan(1e-12);
      }
    }
  });

  it('a wide matrix has min(m, n) singular values (by definition)', () => {
    const { values } = singularPairs(compose(3, 6, [0.4, 0.2, 0.1]), 3, 6);
    expect(values).toHaveLength(3);
    [0.4, 0.2, 0.1].forEach((value, k) => expect(Math.abs(values[k]! - value)).toBeLessThan(1e-14));
  });
});
