/**
 * Intrinsic atomic orbitals (G. Knizia, J. Chem. Theory Comput. 9, 4834 (2013), eqs. 1–2 and
 * appendix A): a minimal set of atom-centred orthonormal orbitals that spans the occupied space of
 * a restricted determinant exactly. With the main basis B1 (overlap S1, n1 functions), a minimal
 * basis B2 (S2, n2 functions, STO-3G by default here: Knizia notes that the IAOs hardly depend on
 * which minimal basis is used) and their mixed overlap S12:
 *
 *   P12 = S1⁻¹ S12, P21 = S2⁻¹ S21                 (projections between the bases)
 *   C̃   = orth(P12 P21 C)                          (depolarised occupied orbitals)
 *   O   = C Cᵀ S1, Õ = C̃ C̃ᵀ S1
 *   A   = orth[(O Õ + (1 − O)(1 − Õ)) P12]          (n1 × n2: the IAOs in B1)
 *
 * where orth is Löwdin's symmetric orthonormalisation in the metric S1, X (Xᵀ S1 X)^−½. Each IAO
 * belongs to the atom of its minimal-basis function. The occupied space lies in their span, so a
 * spin's density in them, Aᵀ S1 P S1 A (n2 × n2), is idempotent and carries every electron; the
 * complement of the IAOs (polarisation and diffuse functions) is empty and belongs to no fragment.
 *
 * Closed shells only: the construction needs one occupied space, and for UHF the β occupied
 * orbitals are not in the span of IAOs built from the α ones.
 */
import { multiply, multiplyTransposeA, symmetricEigen } from '../linalg';

/** The minimal basis the IAOs are built from, unless a caller chooses another. */
export const DEFAULT_MINIMAL_BASIS = 'STO-3G';

/** Eigenvalues of an overlap below this are dropped from its inverse (as the SCF's canonical orthogonalisation does). */
const PSEUDO_INVERSE_THRESHOLD = 1e-7;

/** S⁻¹ of a symmetric positive semi-definite n×n matrix, near-null directions dropped. */
function pseudoInverse(s: Float64Array, n: number): Float64Array {
  const { values, vectors } = symmetricEigen(s, n);
  const out = new Float64Array(n * n);
  for (let k = 0; k < n; k++) {
    if (values[k]! < PSEUDO_INVERSE_THRESHOLD) continue;
    const w = 1 / values[k]!;
    for (let i = 0; i < n; i++) {
      const factor = w * vectors[i * n + k]!;
      if (factor === 0) continue;
      for (let j = 0; j < n; j++) out[i * n + j]! += factor * vectors[j * n + k]!;
    }
  }
  return out;
}

/** X (Xᵀ S X)^−½ for X (n×k) in the metric S (n×n). */
export function symmetricOrthonormalize(x: Float64Array, s: Float64Array, n: number, k: number): Float64Array {
  const sx = multiply(s, x, n, n, k, new Float64Array(n * k));
  const metric = multiplyTransposeA(x, sx, n, k, k, new Float64Array(k * k));
  const { values, vectors } = symmetricEigen(metric, k);
  const root = new Float64Array(k * k);
  for (let m = 0; m < k; m++) {
    if (!(values[m]! > 0)) throw new RangeError('Intrinsic atomic orbitals: a set of orbitals to orthonormalise is linearly dependent.');
    const w = 1 / Math.sqrt(values[m]!);
    for (let i = 0; i < k; i++) {
      const factor = w * vectors[i * k + m]!;
      for (let j = 0; j < k; j++) root[i * k + j]! += factor * vectors[j * k + m]!;
    }
  }
  return multiply(x, root, n, k, k, new Float64Array(n * k));
}

export interface IaoInput {
  /** Overlap of the main basis (n1×n1), of the minimal basis (n2×n2), and between them (n1×n2). */
  readonly overlap: Float64Array;
  readonly minimalOverlap: Float64Array;
  readonly mixedOverlap: Float64Array;
  /** Occupied orbitals of the determinant in the main basis (n1×occupied, row-major). */
  readonly occupied: Float64Array;
  readonly n1: number;
  readonly n2: number;
  readonly occupiedCount: number;
}

/** The IAOs A (n1×n2, row-major, column j belongs to minimal-basis function j). */
export function intrinsicAtomicOrbitals(input: IaoInput): Float64Array {
  const { n1, n2, occupiedCount: k } = input;
  const p12 = multiply(pseudoInverse(input.overlap, n1), input.mixedOverlap, n1, n1, n2, new Float64Array(n1 * n2));
  // P21 = S2⁻¹ S21 (n2×n1), then P12 P21 C.
  const s21 = new Float64Array(n2 * n1);
  for (let i = 0; i < n1; i++) for (let j = 0; j < n2; j++) s21[j * n1 + i] = input.mixedOverlap[i * n2 + j]!;
  const p21 = multiply(pseudoInverse(input.minimalOverlap, n2), s21, n2, n2, n1, new Float64Array(n2 * n1));
  const p21c = multiply(p21, input.occupied, n2, n1, k, new Float64Array(n2 * k));
  const depolarised = symmetricOrthonormalize(multiply(p12, p21c, n1, n2, k, new Float64Array(n1 * k)), input.overlap, n1, k);
  // (O Õ + (1 − O)(1 − Õ)) P12 = P12 − O P12 − Õ P12 + 2 O Õ P12, with O Y = C (Cᵀ S1 Y).
  const s1 = input.overlap;
  const project = (c: Float64Array, y: Float64Array) => {
    const sy = multiply(s1, y, n1, n1, n2, new Float64Array(n1 * n2));
    const cty = multiplyTransposeA(c, sy, n1, k, n2, new Float64Array(k * n2));
    return multiply(c, cty, n1, k, n2, new Float64Array(n1 * n2));
  };
  const op = project(input.occupied, p12);
  const tp = project(depolarised, p12);
  const otp = project(input.occupied, tp);
  const a = new Float64Array(n1 * n2);
  for (let i = 0; i < n1 * n2; i++) a[i] = p12[i]! - op[i]! - tp[i]! + 2 * otp[i]!;
  return symmetricOrthonormalize(a, s1, n1, n2);
}

/** A spin's density in the IAOs, Aᵀ S1 P S1 A (n2×n2). */
export function iaoDensity(iao: Float64Array, overlap: Float64Array, density: Float64Array, n1: number, n2: number): Float64Array {
  const sa = multiply(overlap, iao, n1, n1, n2, new Float64Array(n1 * n2));
  const psa = multiply(density, sa, n1, n1, n2, new Float64Array(n1 * n2));
  const out = multiplyTransposeA(sa, psa, n1, n2, n2, new Float64Array(n2 * n2));
  for (let i = 0; i < n2; i++) {
    for (let j = 0; j < i; j++) {
      const mean = 0.5 * (out[i * n2 + j]! + out[j * n2 + i]!);
      out[i * n2 + j] = mean;
      out[j * n2 + i] = mean;
    }
  }
  return out;
}
