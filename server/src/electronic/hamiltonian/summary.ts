/**
 * The figures of one qubit Hamiltonian: strings counted with |c| above the threshold (identity
 * included), the 1-norm λ = Σ|c| over the non-identity strings, the identity coefficient, the
 * largest coefficients and the qubit-wise commuting groups (grouping.ts). All computed from the
 * explicit strings, not estimated.
 */
import type { Mapping } from '../../chemistry/qubits';
import { qubitWiseCommutingGroups, type QwcGroups } from './grouping';
import { pauliLabel, type PauliSum } from './pauli';
import type { QubitHamiltonian } from './qubitHamiltonian';

export interface PauliTerm {
  /** Letters I, X, Y, Z, qubit 0 first. */
  readonly label: string;
  readonly coefficient: number;
}

export interface QubitHamiltonianSummary {
  readonly mapping: Mapping;
  readonly qubits: number;
  /** Strings with |c| > threshold, identity included. */
  readonly terms: number;
  /** Coefficient of the identity string (hartree). */
  readonly identity: number;
  /** λ = Σ|c| over the non-identity strings (hartree). */
  readonly oneNorm: number;
  readonly threshold: number;
  /** The largest non-identity coefficients by magnitude (order of the Hamiltonian). */
  readonly largest: readonly PauliTerm[];
  readonly groups: number;
  readonly groupMethod: string;
}

export function identityCoefficient(sum: PauliSum): number {
  for (let k = 0; k < sum.length; k++) if (sum.x[k] === 0 && sum.z[k] === 0) return sum.coefficients[k]!;
  return 0;
}

export function oneNorm(sum: PauliSum): number {
  let total = 0;
  for (let k = 0; k < sum.length; k++) if (sum.x[k] !== 0 || sum.z[k] !== 0) total += Math.abs(sum.coefficients[k]!);
  return total;
}

export function largestTerms(sum: PauliSum, count: number): PauliTerm[] {
  const out: PauliTerm[] = [];
  for (let k = 0; k < sum.length && out.length < count; k++) {
    if (sum.x[k] === 0 && sum.z[k] === 0) continue;
    out.push({ label: pauliLabel(sum.x[k]!, sum.z[k]!, sum.qubits), coefficient: sum.coefficients[k]! });
  }
  return out;
}

export function summarizeQubitHamiltonian(hamiltonian: QubitHamiltonian, options: { largest?: number; groups?: QwcGroups } = {}): QubitHamiltonianSummary {
  const groups = options.groups ?? qubitWiseCommutingGroups(hamiltonian);
  return {
    mapping: hamiltonian.mapping,
    qubits: hamiltonian.qubits,
    terms: hamiltonian.length,
    identity: identityCoefficient(hamiltonian),
    oneNorm: oneNorm(hamiltonian),
    threshold: hamiltonian.threshold,
    largest: largestTerms(hamiltonian, options.largest ?? 10),
    groups: groups.count,
    groupMethod: groups.method,
  };
}
