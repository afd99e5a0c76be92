import { describe, expect, it } from 'vitest';
import { canonicalOrthogonalization, congruence, multiply, multiplyTransposeA, multiplyTransposeB, orthonormalizeColumns, symmetricEigen } from '../../server/src/electronic/linalg';

/** A reproducible pseudo-random stream (Park–Miller minimal standard generator). */
function random(seed: number): () => number {
  let state = seed;
  return () => {
    state = (state * 48271) % 2147483647;
    return state / 2147483647 - 0.5;
  };
}

function randomSymmetric(n: number, seed: number): Float64Array {
  const next = random(seed);
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) a[i * n + j] = a[j * n + i] = next();
  return a;
}

function naiveProduct(a: Float64Array, b: Float64Array, n: number, k: number, m: number): Float64Array {
  const out = new Float64Array(n * m);
  for (let i = 0; i < n; i++) for (let j = 0; j < m; j++) for (let p = 0; p < k; p++) out[i * m + j]! += a[i * k + p]! * b[p * m + j]!;
  return out;
}

describe('dense products', () => {
  it('A·B, Aᵀ·B and A·Bᵀ agree with the textbook triple loop', () => {
    const next = random(7);
    const a = Float64Array.from({ length: 4 * 3 }, next);
    const b = Float64Array.from({ length: 3 * 5 }, next);
    const expected = naiveProduct(a, b, 4, 3, 5);
    const direct = multiply(a, b, 4, 3, 5, new Float64Array(20));
    const at = new Float64Array(12);
    for (let i = 0; i < 4; i++) for (let p = 0; p < 3; p++) at[p * 4 + i] = a[i * 3 + p]!;
    const viaTransposeA = multiplyTransposeA(at, b, 3, 4, 5, new Float64Array(20));
    const bt = new Float64Array(15);
    for (let p = 0; p < 3; p++) for (let j = 0; j < 5; j++) bt[j * 3 + p] = b[p * 5 + j]!;
    const viaTransposeB = multiplyTransposeB(a, bt, 4, 3, 5, new Float64Array(20));
    for (let i = 0; i < 20; i++) {
      expect(direct[i]).toBeCloseTo(expected[i]!, 14);
      expect(viaTransposeA[i]).toBeCloseTo(expected[i]!, 14);
      expect(viaTransposeB[i]).toBeCloseTo(expected[i]!, 14);
    }
  });
});

describe('symmetric eigensolver (Householder + implicit QL)', () => {
  it('reproduces the closed-form spectrum of tridiag(−1, 2, −1): λ_k = 2 − 2 cos(kπ/(n+1))', () => {
    // Closed form: G. Strang, Introduction to Applied Mathematics, Wellesley-Cambridge 1986, §1.5
    // (the second-difference matrix; section from memory).
    const n = 60;
    const a = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      a[i * n + i] = 2;
      if (i > 0) a[i * n + i - 1] = a[(i - 1) * n + i] = -1;
    }
    const { values } = symmetricEigen(a, n);
    for (let k = 1; k <= n; k++) expect(values[k - 1]).toBeCloseTo(2 - 2 * Math.cos((k * Math.PI) / (n + 1)), 13);
  });

  it('gives orthonormal vectors with A·v = λ·v for a random matrix, values ascending', () => {
    const n = 73;
    const a = randomSymmetric(n, 11);
    const { values, vectors } = symmetricEigen(a, n);
    const av = multiply(a, vectors, n, n, n, new Float64Array(n * n));
    let residual = 0;
    for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) residual = Math.max(residual, Math.abs(av[i * n + k]! - values[k]! * vectors[i * n + k]!));
    expect(residual).toBeLessThan(1e-12);
    const vtv = multiplyTransposeA(vectors, vectors, n, n, n, new Float64Array(n * n));
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(Math.abs(vtv[i * n + j]! - (i === j ? 1 : 0))).toBeLessThan(1e-13);
    for (let k = 1; k < n; k++) expect(values[k]!).toBeGreaterThanOrEqual(values[k - 1]!);
  });

  it('handles exact degeneracy, a diagonal matrix and the 1×1 and 0×0 cases', () => {
    const n = 6;
    // Q·diag(1,1,1,5,5,-2)·Qᵀ with Q a product of plane rotations.
    const d = [1, 1, 1, 5, 5, -2];
    const q = new Float64Array(n * n);
    for (let i = 0; i < n; i++) q[i * n + i] = 1;
    const next = random(3);
    for (let r = 0; r < 10; r++) {
      const i = Math.floor((next() + 0.5) * n) % n;
      const j = (i + 1 + (r % (n - 1))) % n;
      const angle = next() * 3;
      for (let row = 0; row < n; row++) {
        const qi = q[row * n + i]!;
        const qj = q[row * n + j]!;
        q[row * n + i] = Math.cos(angle) * qi - Math.sin(angle) * qj;
        q[row * n + j] = Math.sin(angle) * qi + Math.cos(angle) * qj;
      }
    }
    const a = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) a[i * n + j]! += q[i * n + k]! * d[k]! * q[j * n + k]!;
    const { values } = symmetricEigen(a, n);
    expect(Array.from(values).map((v) => Number(v.toFixed(12)))).toEqual([-2, 1, 1, 1, 5, 5]);
    expect(Array.from(symmetricEigen(Float64Array.of(3, 0, 0, -1), 2).values)).toEqual([-1, 3]);
    expect(Array.from(symmetricEigen(Float64Array.of(4), 1).values)).toEqual([4]);
    expect(symmetricEigen(new Float64Array(0), 0).values.length).toBe(0);
  });
});

describe('canonical orthogonalisation', () => {
  it('drops an exact linear dependency and makes XᵀSX the identity', () => {
    // Three unit vectors in a plane as "functions" (the third is the sum of the first two,
    // normalised): the overlap has rank 2.
    const vectors = [
      [1, 0, 0],
      [0.6, 0.8, 0],
      [1.6 / Math.hypot(1.6, 0.8), 0.8 / Math.hypot(1.6, 0.8), 0],
      [0, 0, 1],
    ];
    const n = vectors.length;
    const s = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) s[i * n + j] = vectors[i]!.reduce((sum, v, c) => sum + v * vectors[j]![c]!, 0);
    const result = canonicalOrthogonalization(s, n);
    expect(result.dropped).toBe(1);
    expect(result.m).toBe(3);
    const identity = congruence(result.x, s, n, result.m, new Float64Array(9), new Float64Array(n * 3));
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(identity[i * 3 + j]).toBeCloseTo(i === j ? 1 : 0, 12);
  });

  it('orthonormalises chosen combinations in the metric S', () => {
    const s = Float64Array.of(1, 0.5, 0.5, 1);
    const b = Float64Array.of(1, 1); // the symmetric combination only
    const result = orthonormalizeColumns(b, s, 2, 1);
    expect(result.m).toBe(1);
    expect(result.x[0]).toBeCloseTo(1 / Math.sqrt(3), 14);
  });
});
