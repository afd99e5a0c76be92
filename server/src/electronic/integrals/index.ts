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
export { createTwoElectronIntegrals, type DirectTwoElectronIntegrals, type JkStatistics } from './twoElectron';
export { UnsupportedEcpError, assertNoEcp } from './ecp';
