/**
 * Singular values and left singular vectors of a dense m×n matrix A, through the eigenvectors of
 * its Gram matrix: AᵀA = V diag(σ²) Vᵀ, then σ_k = ‖A v_k‖ and u_k = A v_k / σ_k (G. H. Golub,
 * C. F. Van Loan, Matrix Computations, 4th ed., Johns Hopkins 2013, §8.6.1 and §2.4).
 *
 * Why not √λ_k: the eigenvalues of AᵀA carry an absolute error of about ε‖A‖², so singular
 * values below √ε‖A‖ ≈ 1e-8‖A‖ are lost in it, and the eigenvectors of such a cluster mix. The
 * columns of B = A·V are nearly orthogonal already; one-sided Jacobi rotations (M. R. Hestenes,
 * J. SIAM 6, 51 (1958); J. Demmel, K. Veselić, SIAM J. Matrix Anal. Appl. 13, 1204 (1992)) make
 * them orthogonal to working precision, usually in one or two sweeps, after which the column norms
 * are the singular values with an absolute error near ε‖A‖, however small. Left vectors of zero σ
 * are returned as zero (callers keep only σ above a threshold).
 */
import { symmetricEigen } from './eigen';

export interface SingularPairs {
  /** min(m, n) singular values, descending. */
  readonly values: Float64Array;
  /** m×min(m, n) row-major: column k is the left singular vector of values[k] (zero where values[k] is zero). */
  readonly left: Float64Array;
}

/** The singular values and left singular vectors of A (m×n, row-major). */
export function singularPairs(a: Float64Array, m: number, n: number): SingularPairs {
  const rank = Math.min(m, n);
  const gram = new Float64Array(n * n);
  for (let p = 0; p < m; p++) {
    const row = p * n;
    for (let i = 0; i < n; i++) {
      const factor = a[row + i]!;
      if (factor === 0) continue;
      const out = i * n;
      for (let j = 0; j < n; j++) gram[out + j]! += factor * a[row + j]!;
    }
  }
  const { vectors } = symmetricEigen(gram, n);
  // A·V (m×n): column k's norm is σ_k.
  const av = new Float64Array(m * n);
  for (let p = 0; p < m; p++) {
    const row = p * n;
    for (let q = 0; q < n; q++) {
      const factor = a[row + q]!;
      if (factor === 0) continue;
      const vrow = q * n;
      for (let k = 0; k < n; k++) av[row + k]! += factor * vectors[vrow + k]!;
    }
  }
  orthogonalizeColumns(av, m, n);
  const norms = new Float64Array(n);
  for (let p = 0; p < m; p++) for (let k = 0; k < n; k++) norms[k]! += av[p * n + k]! ** 2;
  for (let k = 0; k < n; k++) norms[k] = Math.sqrt(norms[k]!);
  const order = Array.from({ length: n }, (_, k) => k).sort((x, y) => norms[y]! - norms[x]!);
  const values = new Float64Array(rank);
  const left = new Float64Array(m * rank);
  for (let r = 0; r < rank; r++) {
    const k = order[r]!;
    const sigma = norms[k]!;
    values[r] = sigma;
    if (sigma === 0) continue;
    for (let p = 0; p < m; p++) left[p * rank + r] = av[p * n + k]! / sigma;
  }
  return { values, left };
}

/** Jacobi sweeps over column pairs of B (m×n) until every pair is orthogonal to working precision. */
function orthogonalizeColumns(b: Float64Array, m: number, n: number): void {
  const MAX_SWEEPS = 30;
  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    let rotated = false;
    for (let i = 0; i < n - 1; i++) {
      for (let j = i + 1; j < n; j++) {
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let p = 0; p < m; p++) {
          const x = b[p * n + i]!;
          const y = b[p * n + j]!;
          alpha += x * x;
          beta += y * y;
          gamma += x * y;
        }
        if (gamma === 0 || Math.abs(gamma) <= 1e-15 * Math.sqrt(alpha * beta)) continue;
        rotated = true;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = c * t;
        for (let p = 0; p < m; p++) {
          const x = b[p * n + i]!;
          const y = b[p * n + j]!;
          b[p * n + i] = c * x - s * y;
          b[p * n + j] = s * x + c * y;
        }
      }
    }
    if (!rotated) return;
  }
}
