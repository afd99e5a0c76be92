/**
 * The mean-field result of one part as plain data (JSON-safe numbers, strings and arrays), with the
 * field names of the estimate report's `meanField` object. Energies in hartree.
 */
import type { AbelianGroupName } from '../../chemistry/symmetry';
import { multiply, multiplyTransposeA } from '../linalg';
import type { ScfWavefunction } from './engine';
import type { ScfReference } from './options';
import { lowdinCharges, mullikenCharges, mullikenSpinPopulations } from './population';
import type { MolecularBasis } from '../contracts';

export interface MeanFieldResult {
  readonly reference: ScfReference;
  /** Total energy, nuclear repulsion included: the last iteration's when not converged. */
  readonly energy: number;
  readonly electronicEnergy: number;
  readonly nuclearRepulsion: number;
  readonly converged: boolean;
  readonly iterations: number;
  readonly convergence: { readonly energyChange: number | null; readonly gradient: number; readonly energyTolerance: number; readonly gradientTolerance: number };
  readonly electrons: { readonly alpha: number; readonly beta: number };
  readonly functionCount: number;
  /** Molecular orbitals (functions less linear dependencies dropped). */
  readonly orbitalCount: number;
  /** Ascending; β equals α for RHF and ROHF. */
  readonly orbitalEnergies: { readonly alpha: readonly number[]; readonly beta: readonly number[] };
  /** 1 or 0 per orbital of each spin (same order as orbitalEnergies). */
  readonly occupations: { readonly alpha: readonly number[]; readonly beta: readonly number[] };
  /** Irrep of each orbital in the abelian point group; null where none can be assigned. */
  readonly irreps: { readonly alpha: readonly (string | null)[]; readonly beta: readonly (string | null)[] };
  readonly pointGroup: AbelianGroupName;
  /** True when the SCF ran in symmetry blocks (labels exact by construction). */
  readonly symmetryBlocked: boolean;
  /** Highest occupied orbital energy over both spins. */
  readonly homo: number | null;
  /** Lowest unoccupied orbital energy over both spins. */
  readonly lumo: number | null;
  readonly gap: number | null;
  /** Per atom, in the order of the centres. */
  readonly charges: { readonly mulliken: readonly number[]; readonly lowdin: readonly number[] };
  /** Mulliken spin populations per atom (α − β); zeros for RHF. */
  readonly spinPopulations: readonly number[];
  /** ⟨S²⟩ of the determinant(s) (exact S(S+1) for RHF and ROHF). */
  readonly spinSquared: number;
  readonly linearDependencies: { readonly dropped: number; readonly threshold: number; readonly smallestEigenvalue: number };
}

/** ⟨S²⟩ = S_z(S_z + 1) + N_β − Σ_ij |⟨i_α|j_β⟩|² (Szabo & Ostlund eq. 3.5.?; A. T. Amos, G. G. Hall, Proc. R. Soc. A 263, 483 (1961)). */
function spinSquared(wavefunction: ScfWavefunction, overlap: Float64Array, n: number): number {
  const { alpha, beta } = wavefunction.electrons;
  const sz = (alpha - beta) / 2;
  if (wavefunction.reference !== 'uhf') return sz * (sz + 1);
  const m = wavefunction.orbitalEnergies.alpha.length;
  const pick = (c: Float64Array, occ: Float64Array, count: number) => {
    const out = new Float64Array(n * count);
    let column = 0;
    for (let k = 0; k < m; k++) {
      if (occ[k] !== 1) continue;
      for (let i = 0; i < n; i++) out[i * count + column] = c[i * m + k]!;
      column++;
    }
    return out;
  };
  const ca = pick(wavefunction.coefficients.alpha, wavefunction.occupations.alpha, alpha);
  const cb = pick(wavefunction.coefficients.beta, wavefunction.occupations.beta, beta);
  const scb = multiply(overlap, cb, n, n, beta, new Float64Array(n * beta));
  const cross = multiplyTransposeA(ca, scb, n, alpha, beta, new Float64Array(alpha * beta));
  let sum = 0;
  for (const value of cross) sum += value * value;
  return sz * (sz + 1) + beta - sum;
}

export function summarize(
  wavefunction: ScfWavefunction,
  basis: MolecularBasis,
  overlap: Float64Array,
  context: { pointGroup: AbelianGroupName; symmetryBlocked: boolean; energyTolerance: number; gradientTolerance: number; irreps: { alpha: readonly (string | null)[]; beta: readonly (string | null)[] } },
): MeanFieldResult {
  const n = basis.functionCount;
  const { densities } = wavefunction;
  const total = densities.alpha.map((value, k) => value + densities.beta[k]!);
  let homo: number | null = null;
  let lumo: number | null = null;
  for (const spin of ['alpha', 'beta'] as const) {
    const energies = wavefunction.orbitalEnergies[spin];
    const occupations = wavefunction.occupations[spin];
    energies.forEach((energy, k) => {
      if (occupations[k] === 1) homo = homo === null ? energy : Math.max(homo, energy);
      else lumo = lumo === null ? energy : Math.min(lumo, energy);
    });
  }
  return {
    reference: wavefunction.reference,
    energy: wavefunction.energy,
    electronicEnergy: wavefunction.electronicEnergy,
    nuclearRepulsion: wavefunction.nuclearRepulsion,
    converged: wavefunction.converged,
    iterations: wavefunction.iterations,
    convergence: { energyChange: wavefunction.energyChange, gradient: wavefunction.gradient, energyTolerance: context.energyTolerance, gradientTolerance: context.gradientTolerance },
    electrons: wavefunction.electrons,
    functionCount: n,
    orbitalCount: wavefunction.orbitalEnergies.alpha.length,
    orbitalEnergies: { alpha: Array.from(wavefunction.orbitalEnergies.alpha), beta: Array.from(wavefunction.orbitalEnergies.beta) },
    occupations: { alpha: Array.from(wavefunction.occupations.alpha), beta: Array.from(wavefunction.occupations.beta) },
    irreps: { alpha: [...context.irreps.alpha], beta: [...context.irreps.beta] },
    pointGroup: context.pointGroup,
    symmetryBlocked: context.symmetryBlocked,
    homo,
    lumo,
    gap: homo !== null && lumo !== null ? (lumo as number) - (homo as number) : null,
    charges: { mulliken: mullikenCharges(basis, total, overlap), lowdin: lowdinCharges(basis, total, overlap) },
    spinPopulations: mullikenSpinPopulations(basis, densities.alpha, densities.beta, overlap),
    spinSquared: spinSquared(wavefunction, overlap, n),
    linearDependencies: wavefunction.space.linearDependencies,
  };
}
