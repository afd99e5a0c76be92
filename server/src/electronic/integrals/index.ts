/** Integrals over contracted Gaussian shells: one-electron matrices, nuclear repulsion, direct two-electron integrals. */
export { boys, BOYS_MAX_ORDER } from './boys';
export {
  overlapMatrix,
  kineticMatrix,
  nuclearAttractionMatrix,
  coreHamiltonian,
  oneElectronBlock,
  oneElectronMatrix,
  nuclearRepulsionEnergy,
  type OneElectronKind,
  type PointCharge,
} from './oneElectron';
export {
  createTwoElectronIntegrals,
  DEFAULT_STORAGE_LIMIT_BYTES,
  STORED_QUARTET_BOUND,
  type DirectTwoElectronIntegrals,
  type JkStatistics,
  type TwoElectronOptions,
} from './twoElectron';
export { UnsupportedEcpError, assertEcpSupported, MAX_ECP_PROJECTOR_L } from './ecpSupport';
export { ecpMatrix, ecpBlock, EcpIntegrals, ECP_SCREENING_THRESHOLD, type EcpOptions, type EcpStatistics } from './ecp';
