/**
 * Measurements needed to estimate ⟨H⟩ = Σ_j c_j ⟨P_j⟩ to a target accuracy ε.
 *
 * Convention: ε is the standard deviation of the energy estimate (one standard error, not a
 * confidence interval), in hartree; chemical accuracy is 1.6 mHa (common practice). A "shot" is one
 * preparation and measurement of the state in one basis. The identity needs no measurement.
 *
 * 1. Each string measured on its own, shots allocated optimally (M_j ∝ |c_j| σ_j minimises
 *    Σ c_j² σ_j² / M_j at fixed Σ M_j): M = (Σ_j |c_j| σ_j)² / ε². With σ_j² = 1 − ⟨P_j⟩² ≤ 1 this is
 *    at most (λ/ε)², λ = Σ|c_j| over non-identity strings: an upper bound that holds for every state
 *    (D. Wecker, M. B. Hastings, M. Troyer, Phys. Rev. A 92, 042303 (2015); N. C. Rubin,
 *    R. Babbush, J. McClean, New J. Phys. 20, 053020 (2018)).
 *
 * 2. Qubit-wise commuting groups measured together: group g is read out in one product basis per
 *    shot, giving a sample of H_g = Σ_{j∈g} c_j P_j whose variance Var_g includes the covariances
 *    of its strings. Optimal allocation M_g ∝ √Var_g gives M = (Σ_g √Var_g)² / ε² (the same
 *    Lagrange argument, per group). The variances are those of the mean-field reference
 *    determinant |b⟩ in the mapping's own encoding: for a string P = i^|x∧z| X^x Z^z,
 *    P|b⟩ = i^|x∧z| (−1)^|z∧b| |b ⊕ x⟩, so ⟨P⟩ = 0 unless x = 0, strings with different x never
 *    correlate, and within a group the strings sharing one x carry the same letters on x's qubits.
 *    Hence
 *        Var_g = Σ_{x ≠ 0} ( Σ_{j∈g, x_j = x} c_j (−1)^|z_j∧b| )²,
 *    and the diagonal (x = 0) part of every group contributes nothing. An estimate: a correlated
 *    state has variance in the diagonal strings too, so real budgets are larger.
 */
import { CHEMICAL_ACCURACY_HARTREE, ENERGY_UNITS_IN_HARTREE, type EnergyUnit } from '../../chemistry/units';
import type { QwcGroups } from '../hamiltonian/grouping';
import type { PauliSum } from '../hamiltonian/pauli';
import { popcount } from '../hamiltonian/pauli';
import { PauliAccumulator } from '../hamiltonian/pauliTable';
import { oneNorm } from '../hamiltonian/summary';

/** Chemical accuracy, 1.6 mHa (common practice: 1 kcal/mol ≈ 1.594 mHa). */
export const CHEMICAL_ACCURACY = CHEMICAL_ACCURACY_HARTREE;

export const SHOT_CONVENTION =
  'ε is one standard deviation of the energy estimate (hartree); shots allocated optimally across what is measured (Wecker, Hastings & Troyer 2015; Rubin, Babbush & McClean 2018); the identity is not measured';

/** (λ/ε)², the shots that suffice for any state when every string is measured on its own. */
export function separateMeasurementBound(lambda: number, epsilon: number): number {
  checkAccuracy(epsilon);
  return Math.ceil((lambda / epsilon) ** 2);
}

/** Var_g of every group in the computational basis state `reference` (bit q = qubit q). */
export function groupVariances(sum: PauliSum, groups: QwcGroups, reference: number): Float64Array {
  // Σ c_j (−1)^|z_j∧b| per (group, x), keyed in a Pauli table as (x, group).
  const classes = new PauliAccumulator(sum.qubits, Math.max(16, groups.count));
  for (let j = 0; j < sum.length; j++) {
    const g = groups.assignment[j]!;
    const x = sum.x[j]!;
    if (g < 0 || x === 0) continue;
    const sign = popcount(sum.z[j]! & reference) & 1 ? -1 : 1;
    classes.add(x, g, sign * sum.coefficients[j]!);
  }
  const variances = new Float64Array(groups.count);
  const entries = classes.toSum(-1);
  for (let k = 0; k < entries.length; k++) variances[entries.z[k]!]! += entries.coefficients[k]! ** 2;
  return variances;
}

/** Shots with optimal allocation across groups of the given variances, and each group's share. */
export function groupedShots(variances: Float64Array, epsilon: number): { shots: number; perGroup: Float64Array } {
  checkAccuracy(epsilon);
  let sumRoot = 0;
  for (const v of variances) sumRoot += Math.sqrt(v);
  const perGroup = new Float64Array(variances.length);
  for (let g = 0; g < variances.length; g++) perGroup[g] = (Math.sqrt(variances[g]!) * sumRoot) / epsilon ** 2;
  return { shots: Math.ceil(sumRoot ** 2 / epsilon ** 2), perGroup };
}

export interface MeasurementBudget {
  /** Target accuracy ε (hartree). */
  readonly epsilon: number;
  readonly oneNorm: number;
  /** (λ/ε)²: separate measurement, optimal allocation, an upper bound for any state. */
  readonly separateBound: number;
  /** (Σ_g √Var_g)² / ε² with variances of the reference determinant: an estimate. */
  readonly groupedEstimate: number;
  readonly groups: number;
  /** Groups whose reference variance is zero (diagonal in the reference). */
  readonly silentGroups: number;
  /** Σ_g √Var_g (hartree): the grouped estimate is (this / ε)², so a budget can be re-targeted. */
  readonly rootVarianceSum: number;
  readonly convention: string;
}

export function measurementBudget(sum: PauliSum, groups: QwcGroups, reference: number, epsilon: number): MeasurementBudget {
  const lambda = oneNorm(sum);
  const variances = groupVariances(sum, groups, reference);
  let silent = 0;
  let rootVarianceSum = 0;
  for (const v of variances) {
    if (v === 0) silent++;
    rootVarianceSum += Math.sqrt(v);
  }
  return {
    epsilon,
    oneNorm: lambda,
    separateBound: separateMeasurementBound(lambda, epsilon),
    groupedEstimate: groupedShots(variances, epsilon).shots,
    groups: groups.count,
    silentGroups: silent,
    rootVarianceSum,
    convention: `${SHOT_CONVENTION}; grouped: sorted-insertion QWC groups, variances of the mean-field reference determinant in the mapping's encoding (an estimate; correlated states need more)`,
  };
}

/**
 * The same budget at another target accuracy: both figures scale as 1/ε² (their numerators, λ and
 * Σ_g √Var_g, do not depend on ε), so a Hamiltonian built once serves every accuracy a spec asks for.
 */
export function budgetAtAccuracy(budget: MeasurementBudget, epsilon: number): MeasurementBudget {
  checkAccuracy(epsilon);
  return {
    ...budget,
    epsilon,
    separateBound: separateMeasurementBound(budget.oneNorm, epsilon),
    groupedEstimate: Math.ceil((budget.rootVarianceSum / epsilon) ** 2),
  };
}

export interface VqeRunInput {
  readonly shotsPerEvaluation: number;
  /** Variational parameters P. */
  readonly parameters: number;
  /** Optimisation steps (a setting). */
  readonly steps: number;
  /** Geometries of a scan (1 without one). */
  readonly scanPoints: number;
  /** Shots per second of the device, when known. */
  readonly shotRate?: number;
}

export interface VqeRun {
  /** 2P + 1: the energy plus two shifted energies per parameter (parameter-shift gradient). */
  readonly evaluationsPerStep: number;
  readonly evaluations: number;
  readonly shots: number;
  /** Seconds at the shot rate; undefined without one. */
  readonly seconds: number | undefined;
  readonly convention: string;
}

/**
 * Shots of a VQE run: each optimisation step evaluates the energy once and the gradient by the
 * parameter-shift rule, two energies per parameter (K. Mitarai, M. Negoro, M. Kitagawa, K. Fujii,
 * Phys. Rev. A 98, 032309 (2018); M. Schuld, V. Bergholm, C. Gogolin, J. Izaac, N. Killoran,
 * Phys. Rev. A 99, 032331 (2019)), for every scan point. Exact for gates generated by operators
 * with two eigenvalues ±½; UCCSD excitations compiled to Pauli rotations are such gates.
 */
export function vqeRun(input: VqeRunInput): VqeRun {
  for (const [name, value] of [['shots per evaluation', input.shotsPerEvaluation], ['parameters', input.parameters], ['steps', input.steps], ['scan points', input.scanPoints]] as const) {
    if (!Number.isFinite(value) || value < 0) throw new RangeError(`VQE run: ${name} must be a non-negative number, not ${value}`);
  }
  if (input.shotRate !== undefined && !(input.shotRate > 0)) throw new RangeError(`VQE run: a shot rate must be positive, not ${input.shotRate} per second`);
  const evaluationsPerStep = 2 * input.parameters + 1;
  const evaluations = evaluationsPerStep * input.steps * input.scanPoints;
  const shots = evaluations * input.shotsPerEvaluation;
  return {
    evaluationsPerStep,
    evaluations,
    shots,
    seconds: input.shotRate === undefined ? undefined : shots / input.shotRate,
    convention: 'energy evaluations per step = 2 × parameters + 1 (parameter-shift gradient plus the energy), times steps and scan points; time = shots / shot rate, device overheads (compilation, reset, queue) not included',
  };
}

function checkAccuracy(epsilon: number): void {
  if (!(epsilon > 0) || !Number.isFinite(epsilon)) throw new RangeError(`target accuracy must be a positive energy in hartree, not ${epsilon}`);
}

/** Hartree per unit of the target-accuracy statement (CODATA 2018 conversion factors, chemistry/units.ts). */
export { ENERGY_UNITS_IN_HARTREE };

export type AccuracyUnit = EnergyUnit;

export function accuracyInHartree(value: number, unit: AccuracyUnit): number {
  return value * ENERGY_UNITS_IN_HARTREE[unit];
}
