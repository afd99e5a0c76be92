/**
 * Dense matrix kernels on row-major Float64Array storage: element (i, j) of an r×c matrix is
 * `a[i * c + j]`. Every product writes into a caller-owned output, so loops that repeat them
 * (SCF iterations, integral transformations) allocate nothing. Loop orders keep the innermost
 * loop on contiguous memory (i–k–j for A·B).
 */

/** out (n×m) = A (n×k) · B (k×m). `out` must not alias A or B. */
export function multiply(a: Float64Array, b: Float64Array, n: number, k: number, m: number, out: Float64Array): Float64Array {
  out.fill(0, 0, n * m);
  for (let i = 0; i < n; i++) {
    const rowOut = i * m;
    const rowA = i * k;
    for (let p = 0; p < k; p++) {
      const factor = a[rowA + p]!;
      if (factor === 0) continue;
      const rowB = p * m;
      for (let j = 0; j < m; j++) out[rowOut + j]! += factor * b[rowB + j]!;
    }
  }
  return out;
}

/** out (n×m) = Aᵀ · B with A stored k×n and B stored k×m. `out` must not alias A or B. */
export function multiplyTransposeA(a: Float64Array, b: Float64Array, k: number, n: number, m: number, out: Float64Array): Float64Array {
  out.fill(0, 0, n * m);
  for (let p = 0; p < k; p++) {
    const rowA = p * n;
    const rowB = p * m;
    for (let i = 0; i < n; i++) {
      const factor = a[rowA + i]!;
      if (factor === 0) continue;
      const rowOut = i * m;
      for (let j = 0; j < m; j++) out[rowOut + j]! += factor * b[rowB + j]!;
    }
  }
  return out;
}

/** out (n×m) = A · Bᵀ with A stored n×k and B stored m×k. `out` must not alias A or B. */
export function multiplyTransposeB(a: Float64Array, b: Float64Array, n: number, k: number, m: number, out: Float64Array): Float64Array {
  for (let i = 0; i < n; i++) {
    const rowA = i * k;
    for (let j = 0; j < m; j++) {
      const rowB = j * k;
      let sum = 0;
      for (let p = 0; p < k; p++) sum += a[rowA + p]! * b[rowB + p]!;
      out[i * m + j] = sum;
    }
  }
  return out;
}

/**
 * out (m×m) = Xᵀ · F · X for F (n×n) and X (n×m); `scratch` holds n·m numbers.
 * The change of basis of an operator matrix into the functions that are X's columns.
 */
export function congruence(x: Float64Array, f: Float64Array, n: number, m: number, out: Float64Array, scratch: Float64Array): Float64Array {
  multiply(f, x, n, n, m, scratch);
  return multiplyTransposeA(x, scratch, n, m, m, out);
}

/**
 * out (n×n) = X · A · Xᵀ for A (m×m) and X (n×m); `scratch` holds n·m numbers.
 * The way back from the functions that are X's columns to the underlying basis.
 */
export function backTransform(x: Float64Array, a: Float64Array, n: number, m: number, out: Float64Array, scratch: Float64Array): Float64Array {
  multiply(x, a, n, m, m, scratch);
  return multiplyTransposeB(scratch, x, n, m, n, out);
}

/** Σ_ij A_ij B_ij over n×m matrices: tr(A·Bᵀ), which is tr(A·B) when B is symmetric. */
export function dotMatrices(a: Float64Array, b: Float64Array, length: number): number {
  let sum = 0;
  for (let i = 0; i < length; i++) sum += a[i]! * b[i]!;
  return sum;
}

/** Largest |A_ij|. */
export function maxAbs(a: Float64Array, length = a.length): number {
  let max = 0;
  for (let i = 0; i < length; i++) {
    const value = Math.abs(a[i]!);
    if (value > max) max = value;
  }
  return max;
}

/** Root mean square of the entries. */
export function rms(a: Float64Array, length = a.length): number {
  if (length === 0) return 0;
  let sum = 0;
  for (let i = 0; i < length; i++) sum += a[i]! * a[i]!;
  return Math.sqrt(sum / length);
}

/** Replaces A (n×n) by (A + Aᵀ)/2, removing the rounding asymmetry of products. */
export function symmetrize(a: Float64Array, n: number): Float64Array {
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const mean = 0.5 * (a[i * n + j]! + a[j * n + i]!);
      a[i * n + j] = mean;
      a[j * n + i] = mean;
    }
  }
  return a;
}

/** The transpose of an r×c matrix into `out` (c×r). */
export function transpose(a: Float64Array, rows: number, columns: number, out: Float64Array): Float64Array {
  for (let i = 0; i < rows; i++) for (let j = 0; j < columns; j++) out[j * rows + i] = a[i * columns + j]!;
  return out;
}

/** The n×n identity. */
export function identityMatrix(n: number): Float64Array {
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) out[i * n + i] = 1;
  return out;
}

/**
 * out (n×n) = Σ_k w_k c_k c_kᵀ over the columns k < count of C (n×m) with weights w: a density
 * matrix from orbital coefficients and occupations. Columns with zero weight cost nothing.
 */
export function weightedOuterProducts(c: Float64Array, n: number, m: number, weights: ArrayLike<number>, count: number, out: Float64Array, column: Float64Array): Float64Array {
  out.fill(0, 0, n * n);
  for (let k = 0; k < count; k++) {
    const weight = weights[k]!;
    if (weight === 0) continue;
    for (let i = 0; i < n; i++) column[i] = c[i * m + k]!;
    for (let i = 0; i < n; i++) {
      const factor = weight * column[i]!;
      if (factor === 0) continue;
      const row = i * n;
      for (let j = 0; j < n; j++) out[row + j]! += factor * column[j]!;
    }
  }
  return out;
}
