/** Basis functions of the electronic-structure layer: library data, normalisation, molecular basis. */
export { buildMolecularBasis, normalizedCoefficients, shellSize, MissingBasisDataError, InvalidAtomError, type BasisAtom } from './build';
export {
  loadBasisSetData,
  jkfitBasisFor,
  basisDataKeys,
  loadedBasisSets,
  setBasisDataFolder,
  UnknownBasisError,
  BasisDataUnavailableError,
  type BasisSetData,
  type ElementBasisData,
  type ShellData,
  type EcpData,
  type EcpChannelData,
} from './data';
export { cartesianCount, cartesianCountUpTo, cartesianIndex, cartesianExponents, cartesianComponentFactor } from './cartesian';
export { sphericalTransform } from './solidHarmonics';
