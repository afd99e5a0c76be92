/**
 * Fault-tolerant tier: logical qubits and Toffoli gates of qubitized quantum phase estimation of
 * the qubit Hamiltonian written as a linear combination of its L non-identity Pauli strings,
 * H = Σ_j c_j P_j + c_0, λ = Σ_j |c_j|. An estimate of the plain Pauli LCU: no factorisation of the
 * two-electron tensor (single, double or tensor-hypercontraction factorisations need far fewer
 * Toffolis, J. Lee et al., PRX Quantum 2, 030305 (2021)), Clifford gates and distillation not
 * counted.
 *
 * Walk. PREPARE|0⟩ = Σ_j √(|c_j|/λ) |j⟩ and SELECT = Σ_j |j⟩⟨j| ⊗ sign(c_j) P_j block-encode H/λ;
 * the walk W = (2|0⟩⟨0| − 1)·PREPARE†·SELECT·PREPARE has eigenphases ±arccos(E_k/λ), and phase
 * estimation on W to energy accuracy ε takes
 *     K = ⌈π λ / (2 ε)⌉ walk steps
 * (R. Babbush et al., Phys. Rev. X 8, 041015 (2018), §II; the count as written in J. Lee et al.,
 * PRX Quantum 2, 030305 (2021), where the total cost is K × (cost of one step)).
 *
 * One step costs SELECT + 2·PREPARE (Babbush et al. 2018, Eq. (27): S + 2P) plus the reflection,
 * in Toffoli gates (a Toffoli is an AND costing 4 T; uncomputing an AND by measurement is free):
 *   SELECT    L           unary iteration over L terms: 4L − 4 T = L − 1 ANDs (Babbush et al. 2018,
 *                         §III A), one more for the phase-estimation control;
 *   PREPARE   (L − 1) + μ + 3⌈log₂L⌉
 *                         coherent alias sampling (§III D): QROM of (alt, keep, sign) over L entries,
 *                         4L − 4 T = L − 1 ANDs (§III C); comparison of the μ-bit keep and random
 *                         registers, μ; controlled swap of index and alternate, ⌈log₂L⌉; uniform
 *                         superposition over L, 2⌈log₂L⌉ (the papers give O(log L); this constant
 *                         is Tessera's assumption);
 *   reflection ⌈log₂L⌉ + μ − 1   a multiply-controlled Z on the index and keep-comparison registers.
 * μ = ⌈log₂(λ N² / ε)⌉ bits of precision for the keep probabilities, N the system qubits
 * (Babbush et al. 2018, Eq. (36), written there for their Hamiltonian; used here as it stands).
 *
 * Logical qubits: the N system qubits; the phase register, ⌈log₂ K⌉ + 1 qubits; the index and the
 * alternate index, ⌈log₂L⌉ each; keep and random registers, μ each; the comparison result and two
 * sign qubits; ⌈log₂L⌉ − 1 AND ancillas of unary iteration (Babbush et al. 2018, §III A).
 */

export interface QubitizationInput {
  /** Qubits of the system register (2n for Jordan–Wigner). */
  readonly systemQubits: number;
  /** L: non-identity Pauli strings. */
  readonly terms: number;
  /** λ = Σ|c| over non-identity strings (hartree). */
  readonly oneNorm: number;
  /** Target accuracy ε (hartree). */
  readonly epsilon: number;
}

export interface QubitizationEstimate {
  readonly walkSteps: number;
  readonly precisionBits: number;
  readonly toffolisPerStep: number;
  readonly toffolis: number;
  readonly logicalQubits: number;
  readonly ancillaQubits: number;
  readonly formula: string;
  readonly references: readonly string[];
  readonly label: 'estimate';
}

export const QUBITIZATION_REFERENCES = [
  'R. Babbush, C. Gidney, D. W. Berry, N. Wiebe, J. McClean, A. Paler, A. Fowler, H. Neven, Phys. Rev. X 8, 041015 (2018)',
  'J. Lee, D. W. Berry, C. Gidney, W. J. Huggins, J. R. McClean, N. Wiebe, R. Babbush, PRX Quantum 2, 030305 (2021)',
] as const;

export const QUBITIZATION_FORMULA =
  'Toffolis = ⌈πλ/(2ε)⌉ × [L + 2(L − 1 + μ + 3⌈log₂L⌉) + ⌈log₂L⌉ + μ − 1], μ = ⌈log₂(λN²/ε)⌉; logical qubits = N + ⌈log₂K⌉ + 1 + 3⌈log₂L⌉ − 1 + 2μ + 3 (Pauli LCU, no factorisation)';

export function qubitizedPhaseEstimation(input: QubitizationInput): QubitizationEstimate {
  const { systemQubits: N, terms: L, oneNorm: lambda, epsilon } = input;
  if (!(epsilon > 0)) throw new RangeError(`target accuracy must be a positive energy in hartree, not ${epsilon}`);
  if (!Number.isInteger(L) || L < 1) throw new RangeError(`qubitization needs at least one non-identity term, not ${L}`);
  if (!(lambda > 0)) throw new RangeError(`the 1-norm λ must be positive, not ${lambda}`);
  const log2L = Math.max(1, Math.ceil(Math.log2(L)));
  const walkSteps = Math.ceil((Math.PI * lambda) / (2 * epsilon));
  const precisionBits = Math.max(1, Math.ceil(Math.log2((lambda * N * N) / epsilon)));
  const select = L;
  const prepare = L - 1 + precisionBits + 3 * log2L;
  const reflection = log2L + precisionBits - 1;
  const toffolisPerStep = select + 2 * prepare + reflection;
  const phaseRegister = Math.ceil(Math.log2(walkSteps)) + 1;
  const ancillaQubits = phaseRegister + 2 * log2L + 2 * precisionBits + 3 + (log2L - 1);
  return {
    walkSteps,
    precisionBits,
    toffolisPerStep,
    toffolis: walkSteps * toffolisPerStep,
    logicalQubits: N + ancillaQubits,
    ancillaQubits,
    formula: QUBITIZATION_FORMULA,
    references: QUBITIZATION_REFERENCES,
    label: 'estimate',
  };
}
