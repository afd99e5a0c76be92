/**
 * Canonical orthogonalisation (P.-O. Löwdin, "Quantum theory of cohesive properties of solids",
 * Adv. Phys. 5, 1 (1956); A. Szabo, N. S. Ostlund, Modern Quantum Chemistry, Macmillan 1982,
 * §3.4.5, eq. 3.169–3.172): with S = U s Uᵀ, the columns of X = U_kept s_kept^(−1/2) are
 * orthonormal functions, XᵀSX = 1. Eigenvectors whose overlap eigenvalue is below the threshold
 * are dropped: they are (near) linear dependencies, and keeping them would amplify rounding
 * errors by 1/√s.
 *
 * Threshold: 1e-7 on the eigenvalues of the overlap of unit-norm functions (common practice;
 * values between 1e-8 and 1e-5 are in use). Bases of the usual families on well-separated atoms
 * stay far above it (smallest eigenvalues 1e-2 … 1e-4); diffuse functions on close atoms do not.
 */
import { multiply } from './dense';
import { symmetricEigen } from './eigen';

export const DEFAULT_LINEAR_DEPENDENCY_THRESHOLD = 1e-7;

export interface CanonicalOrthogonalization {
  /** n×m row-major: column k is orthonormal function k (ascending overlap eigenvalue). */
  readonly x: Float64Array;
  readonly n: number;
  /** Functions kept. */
  readonly m: number;
  /** Eigenvectors of the overlap dropped for eigenvalues below the threshold. */
  readonly dropped: number;
  readonly smallestEigenvalue: number;
  readonly threshold: number;
}

/** X for the symmetric positive semi-definite overlap `s` (n×n). */
export function canonicalOrthogonalization(s: Float64Array, n: number, threshold = DEFAULT_LINEAR_DEPENDENCY_THRESHOLD): CanonicalOrthogonalization {
  const { values, vectors } = symmetricEigen(s, n);
  let first = 0;
  while (first < n && values[first]! < threshold) first++;
  const m = n - first;
  const x = new Float64Array(n * m);
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < m; k++) x[i * m + k] = vectors[i * n + first + k]! / Math.sqrt(values[first + k]!);
  }
  return { x, n, m, dropped: first, smallestEigenvalue: n > 0 ? values[0]! : Infinity, threshold };
}

/**
 * Orthonormal functions for the columns of B (n×k) in the metric S (n×n): X = B·Y with Y from the
 * canonical orthogonalisation of BᵀSB. Used for symmetry-adapted combinations of basis functions.
 */
export function orthonormalizeColumns(b: Float64Array, s: Float64Array, n: number, k: number, threshold = DEFAULT_LINEAR_DEPENDENCY_THRESHOLD): CanonicalOrthogonalization {
  const sb = multiply(s, b, n, n, k, new Float64Array(n * k));
  const metric = new Float64Array(k * k);
  for (let p = 0; p < n; p++) {
    for (let i = 0; i < k; i++) {
      const factor = b[p * k + i]!;
      if (factor === 0) continue;
      for (let j = 0; j < k; j++) metric[i * k + j]! += factor * sb[p * k + j]!;
    }
  }
  const inner = canonicalOrthogonalization(metric, k, threshold);
  const x = multiply(b, inner.x, n, k, inner.m, new Float64Array(n * inner.m));
  return { ...inner, x, n };
}
