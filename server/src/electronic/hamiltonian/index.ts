/** The active-space Hamiltonian: integrals, qubit strings under three mappings, and their figures. */
export { activeSpaceIntegrals, activeWindow, ActiveSpaceError, type ActiveSpaceInput, type ActiveSpaceIntegrals, type ElectronCount, type RestrictedOrbitals } from './activeSpace';
export { PACKED_FUNCTION_LIMIT, type AoTwoElectronInput, type PackedAoIntegrals } from './aoSource';
export { applyBinary, encodingMatrix, inverseBinary, reencode, taperParity } from './encodings';
export { GROUPING_METHOD, qubitWiseCommutingGroups, type QwcGroups } from './grouping';
export { packedLength, pairCount, pairIndex, pairPairIndex, quartetIndex } from './pairs';
export { commutes, MAX_MASK_QUBITS, parsePauliLabel, pauliLabel, type PauliSum } from './pauli';
export {
  ActiveSpaceTooLarge,
  canBuildExplicitly,
  COEFFICIENT_THRESHOLD,
  explicitLimitNote,
  MAX_EXPLICIT_ORBITALS,
  qubitHamiltonian,
  qubitHamiltonians,
  unreducedParity,
  type QubitHamiltonian,
  type QubitHamiltonianOptions,
  type QubitHamiltonians,
} from './qubitHamiltonian';
export { identityCoefficient, largestTerms, oneNorm, summarizeQubitHamiltonian, type PauliTerm, type QubitHamiltonianSummary } from './summary';
export { DEFAULT_TRANSFORM_MEMORY, type TransformOptions, type TransformStatistics } from './transform';
