/**
 * Eigenvalues and eigenvectors of a real symmetric matrix: Householder reduction to tridiagonal
 * form followed by the implicit QL algorithm with Wilkinson-type shifts, accumulating the
 * transformations (R. S. Martin, C. Reinsch, J. H. Wilkinson, "Householder's tridiagonalization of
 * a symmetric matrix", Numer. Math. 11, 181 (1968), procedure tred2; H. Bowdler, R. S. Martin,
 * C. Reinsch, J. H. Wilkinson, "The QR and QL algorithms for symmetric matrices", Numer. Math. 11,
 * 293 (1968), procedure tql2; both reprinted in J. H. Wilkinson, C. Reinsch, Handbook for Automatic
 * Computation II, Linear Algebra, Springer 1971; see also G. H. Golub, C. F. Van Loan, Matrix
 * Computations, 4th ed., Johns Hopkins 2013, §8.3).
 *
 * The work array holds the transpose of the procedures' V, so that every inner loop (the
 * Householder updates and the plane rotations of QL) runs over contiguous memory: row j of the
 * work array is column j of V. For a symmetric input the transpose is the input itself.
 * Cost about 9n³ flops with vectors; a 300×300 matrix takes tens of milliseconds.
 */

export interface SymmetricEigen {
  /** Ascending. */
  readonly values: Float64Array;
  /** n×n row-major; column k (vectors[i * n + k], i = 0 … n−1) belongs to values[k]. */
  readonly vectors: Float64Array;
}

export class EigenConvergenceError extends Error {
  constructor(n: number) {
    super(`The symmetric eigensolver did not converge for a ${n}×${n} matrix (non-finite entries?).`);
    this.name = 'EigenConvergenceError';
  }
}

/** Reusable storage for repeated decompositions of the same size (SCF iterations). */
export class EigenWorkspace {
  readonly work: Float64Array;
  readonly d: Float64Array;
  readonly e: Float64Array;
  readonly order: Int32Array;
  constructor(readonly n: number) {
    this.work = new Float64Array(n * n);
    this.d = new Float64Array(n);
    this.e = new Float64Array(n);
    this.order = new Int32Array(n);
  }
}

/**
 * Decomposes the symmetric n×n matrix `a` (only symmetric input is meaningful; `a` is not changed)
 * as a = V·diag(values)·Vᵀ. Outputs may be passed in to avoid allocation.
 */
export function symmetricEigen(
  a: Float64Array,
  n: number,
  out: { values?: Float64Array; vectors?: Float64Array; workspace?: EigenWorkspace } = {},
): SymmetricEigen {
  const space = out.workspace && out.workspace.n === n ? out.workspace : new EigenWorkspace(n);
  const values = out.values ?? new Float64Array(n);
  const vectors = out.vectors ?? new Float64Array(n * n);
  if (n === 0) return { values, vectors };
  const w = space.work;
  w.set(a.subarray(0, n * n));
  tridiagonalize(w, space.d, space.e, n);
  diagonalizeTridiagonal(w, space.d, space.e, n);
  // Sort ascending (the procedures leave the values nearly sorted) and copy V = wᵀ out.
  const order = space.order;
  for (let i = 0; i < n; i++) order[i] = i;
  order.sort((i, j) => space.d[i]! - space.d[j]!);
  for (let k = 0; k < n; k++) {
    const source = order[k]!;
    values[k] = space.d[source]!;
    const row = source * n;
    for (let i = 0; i < n; i++) vectors[i * n + k] = w[row + i]!;
  }
  return { values, vectors };
}

/** tred2 on w = Vᵀ: on return d holds the diagonal, e the subdiagonal (e[0] = 0), w the transformation. */
function tridiagonalize(w: Float64Array, d: Float64Array, e: Float64Array, n: number): void {
  // V[r][c] is w[c * n + r].
  for (let j = 0; j < n; j++) d[j] = w[j * n + (n - 1)]!;
  for (let i = n - 1; i > 0; i--) {
    let scale = 0;
    let h = 0;
    for (let k = 0; k < i; k++) scale += Math.abs(d[k]!);
    if (scale === 0) {
      e[i] = d[i - 1]!;
      for (let j = 0; j < i; j++) {
        d[j] = w[j * n + (i - 1)]!;
        w[j * n + i] = 0;
        w[i * n + j] = 0;
      }
    } else {
      for (let k = 0; k < i; k++) {
        d[k]! /= scale;
        h += d[k]! * d[k]!;
      }
      let f = d[i - 1]!;
      let g = Math.sqrt(h);
      if (f > 0) g = -g;
      e[i] = scale * g;
      h -= f * g;
      d[i - 1] = f - g;
      for (let j = 0; j < i; j++) e[j] = 0;
      for (let j = 0; j < i; j++) {
        f = d[j]!;
        const rowJ = j * n;
        w[i * n + j] = f; // V[j][i]
        g = e[j]! + w[rowJ + j]! * f;
        for (let k = j + 1; k <= i - 1; k++) {
          const v = w[rowJ + k]!; // V[k][j]
          g += v * d[k]!;
          e[k]! += v * f;
        }
        e[j] = g;
      }
      f = 0;
      for (let j = 0; j < i; j++) {
        e[j]! /= h;
        f += e[j]! * d[j]!;
      }
      const hh = f / (h + h);
      for (let j = 0; j < i; j++) e[j]! -= hh * d[j]!;
      for (let j = 0; j < i; j++) {
        f = d[j]!;
        g = e[j]!;
        const rowJ = j * n;
        for (let k = j; k <= i - 1; k++) w[rowJ + k]! -= f * e[k]! + g * d[k]!;
        d[j] = w[rowJ + (i - 1)]!;
        w[rowJ + i] = 0; // V[i][j]
      }
    }
    d[i] = h;
  }
  // Accumulate the transformations.
  for (let i = 0; i < n - 1; i++) {
    w[i * n + (n - 1)] = w[i * n + i]!; // V[n-1][i] = V[i][i]
    w[i * n + i] = 1;
    const h = d[i + 1]!;
    const rowNext = (i + 1) * n;
    if (h !== 0) {
      for (let k = 0; k <= i; k++) d[k] = w[rowNext + k]! / h;
      for (let j = 0; j <= i; j++) {
        const rowJ = j * n;
        let g = 0;
        for (let k = 0; k <= i; k++) g += w[rowNext + k]! * w[rowJ + k]!;
        for (let k = 0; k <= i; k++) w[rowJ + k]! -= g * d[k]!;
      }
    }
    for (let k = 0; k <= i; k++) w[rowNext + k] = 0;
  }
  for (let j = 0; j < n; j++) {
    d[j] = w[j * n + (n - 1)]!;
    w[j * n + (n - 1)] = 0;
  }
  w[(n - 1) * n + (n - 1)] = 1;
  e[0] = 0;
}

/** tql2 on the tridiagonal (d, e) with w = Vᵀ accumulating the rotations. */
function diagonalizeTridiagonal(w: Float64Array, d: Float64Array, e: Float64Array, n: number): void {
  for (let i = 1; i < n; i++) e[i - 1] = e[i]!;
  e[n - 1] = 0;
  let f = 0;
  let tst1 = 0;
  const eps = 2 ** -52;
  for (let l = 0; l < n; l++) {
    tst1 = Math.max(tst1, Math.abs(d[l]!) + Math.abs(e[l]!));
    let m = l;
    while (m < n) {
      if (Math.abs(e[m]!) <= eps * tst1) break;
      m++;
    }
    if (m === n) m = n - 1;
    if (m > l) {
      let iterations = 0;
      do {
        if (++iterations > 60) throw new EigenConvergenceError(n);
        let g = d[l]!;
        let p = (d[l + 1]! - g) / (2 * e[l]!);
        let r = Math.hypot(p, 1);
        if (p < 0) r = -r;
        d[l] = e[l]! / (p + r);
        d[l + 1] = e[l]! * (p + r);
        const dl1 = d[l + 1]!;
        let h = g - d[l]!;
        for (let i = l + 2; i < n; i++) d[i]! -= h;
        f += h;
        p = d[m]!;
        let c = 1;
        let c2 = c;
        let c3 = c;
        const el1 = e[l + 1]!;
        let s = 0;
        let s2 = 0;
        for (let i = m - 1; i >= l; i--) {
          c3 = c2;
          c2 = c;
          s2 = s;
          g = c * e[i]!;
          h = c * p;
          r = Math.hypot(p, e[i]!);
          e[i + 1] = s * r;
          s = e[i]! / r;
          c = p / r;
          p = c * d[i]! - s * g;
          d[i + 1] = h + s * (c * g + s * d[i]!);
          const rowI = i * n;
          const rowNext = rowI + n;
          for (let k = 0; k < n; k++) {
            const hk = w[rowNext + k]!;
            const vk = w[rowI + k]!;
            w[rowNext + k] = s * vk + c * hk;
            w[rowI + k] = c * vk - s * hk;
          }
        }
        p = (-s * s2 * c3 * el1 * e[l]!) / dl1;
        e[l] = s * p;
        d[l] = c * p;
        if (!Number.isFinite(p)) throw new EigenConvergenceError(n);
      } while (Math.abs(e[l]!) > eps * tst1);
    }
    d[l] = d[l]! + f;
    e[l] = 0;
  }
}
