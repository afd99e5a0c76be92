/**
 * Atomic charges from a density: Mulliken (R. S. Mulliken, J. Chem. Phys. 23, 1833 (1955)),
 * q_A = Z_A − Σ_{μ∈A} (P S)_μμ, and Löwdin (P.-O. Löwdin, J. Chem. Phys. 18, 365 (1950)),
 * q_A = Z_A − Σ_{μ∈A} (S^½ P S^½)_μμ, with P = Dα + Dβ and Z the charge the electrons feel (less
 * ECP core electrons). Both depend on the basis (Szabo & Ostlund §3.4.4); Löwdin's less so.
 */
import type { MolecularBasis } from '../contracts';
import { multiply, symmetricEigen } from '../linalg';

/** Electrons per centre: Σ_{μ∈A} (P·S)_μμ for a symmetric P. */
function populations(basis: MolecularBasis, p: Float64Array, s: Float64Array): number[] {
  const n = basis.functionCount;
  const out = basis.centers.map(() => 0);
  for (let mu = 0; mu < n; mu++) {
    let sum = 0;
    for (let nu = 0; nu < n; nu++) sum += p[mu * n + nu]! * s[nu * n + mu]!;
    out[basis.functionCenter[mu]!]! += sum;
  }
  return out;
}

export function mullikenCharges(basis: MolecularBasis, total: Float64Array, overlap: Float64Array): number[] {
  const electrons = populations(basis, total, overlap);
  return basis.centers.map((center, a) => center.charge - electrons[a]!);
}

/** Mulliken spin populations Σ_{μ∈A} ((Dα − Dβ) S)_μμ. */
export function mullikenSpinPopulations(basis: MolecularBasis, alpha: Float64Array, beta: Float64Array, overlap: Float64Array): number[] {
  const spin = alpha.map((value, k) => value - beta[k]!);
  return populations(basis, spin, overlap);
}

/** S^½ by its eigendecomposition (eigenvalues below zero, from rounding, taken as zero). */
export function overlapSquareRoot(overlap: Float64Array, n: number): Float64Array {
  const { values, vectors } = symmetricEigen(overlap, n);
  const scaled = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) scaled[i * n + k] = vectors[i * n + k]! * Math.sqrt(Math.max(0, values[k]!));
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
    let sum = 0;
    for (let k = 0; k < n; k++) sum += scaled[i * n + k]! * vectors[j * n + k]!;
    out[i * n + j] = sum;
  }
  return out;
}

export function lowdinCharges(basis: MolecularBasis, total: Float64Array, overlap: Float64Array, root = overlapSquareRoot(overlap, basis.functionCount)): number[] {
  const n = basis.functionCount;
  const half = multiply(total, root, n, n, n, new Float64Array(n * n));
  // diag(S^½ P S^½)_μ = Σ_ν root[μ][ν] (P root)[ν][μ].
  const electrons = basis.centers.map(() => 0);
  for (let mu = 0; mu < n; mu++) {
    let sum = 0;
    for (let nu = 0; nu < n; nu++) sum += root[mu * n + nu]! * half[nu * n + mu]!;
    electrons[basis.functionCenter[mu]!]! += sum;
  }
  return basis.centers.map((center, a) => center.charge - electrons[a]!);
}

/** Sums per-atom values over fragments given as lists of atom indices (e.g. charges per fragment). */
export function sumPerFragment(values: readonly number[], fragments: readonly (readonly number[])[]): number[] {
  return fragments.map((atoms) => atoms.reduce((sum, atom) => {
    const value = values[atom];
    if (value === undefined) throw new RangeError(`Atom index ${atom} is outside the ${values.length} atoms.`);
    return sum + value;
  }, 0));
}
